#include "skein/input/yaml_reader.hpp"

#include "skein/io/read_file.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <unordered_map>

#include <fmt/format.h>
#include <yaml-cpp/depthguard.h>
#include <yaml-cpp/eventhandler.h>

namespace skein::yaml {
namespace {

// One UTF-8 character at text[i]: its code point and length, or length 0 when the bytes are not a
// well-formed UTF-8 sequence (RFC 3629 section 4: no overlong forms, no surrogates D800-DFFF, nothing
// above U+10FFFF, no stray continuation bytes).
struct Utf8Char {
  char32_t code = 0;
  size_t length = 0;
};
Utf8Char decode_utf8(std::string_view text, size_t i) {
  const auto b0 = static_cast<unsigned char>(text[i]);
  if (b0 < 0x80) return {b0, 1};
  size_t len = 0;
  char32_t cp = 0, min = 0;
  if ((b0 & 0xE0) == 0xC0) { len = 2; cp = b0 & 0x1F; min = 0x80; }
  else if ((b0 & 0xF0) == 0xE0) { len = 3; cp = b0 & 0x0F; min = 0x800; }
  else if ((b0 & 0xF8) == 0xF0) { len = 4; cp = b0 & 0x07; min = 0x10000; }
  else return {};
  if (i + len > text.size()) return {};
  for (size_t k = 1; k < len; ++k) {
    const auto b = static_cast<unsigned char>(text[i + k]);
    if ((b & 0xC0) != 0x80) return {};
    cp = (cp << 6) | (b & 0x3F);
  }
  if (cp < min || cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF)) return {};
  return {cp, len};
}

// C0 controls, DEL and C1 controls (U+0000-001F, U+007F-009F).
bool is_control(char32_t c) { return c < 0x20 || (c >= 0x7F && c <= 0x9F); }

// A control character or a malformed UTF-8 sequence in a parsed text value (after YAML escapes such as
// "\x1b" or "\uD800" are decoded): the offset and what it is, or nullopt when the text is clean.
std::optional<std::string> bad_text(std::string_view text) {
  for (size_t i = 0; i < text.size();) {
    const Utf8Char u = decode_utf8(text, i);
    if (u.length == 0)
      return fmt::format("malformed UTF-8 (byte 0x{:02X}: an overlong form, a surrogate or beyond U+10FFFF)",
                         static_cast<unsigned char>(text[i]));
    if (is_control(u.code)) return fmt::format("the control character U+{:04X}", static_cast<unsigned>(u.code));
    i += u.length;
  }
  return std::nullopt;
}


// Text from the input made safe and short for a message: control bytes and quotes escaped, cut to about
// 40 characters at a UTF-8 character boundary ("..." marks the cut).
std::string clip(std::string_view text) {
  constexpr size_t keep = 37;
  std::string_view shown = text;
  bool cut = false;
  if (text.size() > 40) {
    size_t end = keep;
    while (end > 0 && (static_cast<unsigned char>(text[end]) & 0xC0) == 0x80) --end;  // not mid-character
    shown = text.substr(0, end);
    cut = true;
  }
  std::string out;
  for (size_t i = 0; i < shown.size();) {
    const Utf8Char u = decode_utf8(shown, i);
    if (u.length == 0) {
      out += fmt::format("\\x{:02X}", static_cast<unsigned char>(shown[i]));
      ++i;
      continue;
    }
    if (is_control(u.code))
      out += fmt::format("\\x{:02X}", static_cast<unsigned>(u.code));
    else
      out.append(shown.substr(i, u.length));
    i += u.length;
  }
  return cut ? out + "..." : out;
}

// A description of a node for messages: a scalar's text in quotes, or the node's kind.
std::string describe(const YAML::Node& n) {
  if (!n.IsDefined() || n.IsNull()) return "nothing";
  if (n.IsMap()) return "a mapping";
  if (n.IsSequence()) return "a list";
  return quote_for_message(n.Scalar());
}

// The spellings YAML 1.2 and common habit give to not-a-number and infinity.
bool is_nan_or_inf_word(std::string_view s) {
  if (!s.empty() && (s[0] == '+' || s[0] == '-')) s.remove_prefix(1);
  if (!s.empty() && s[0] == '.') s.remove_prefix(1);
  std::string lower;
  for (char c : s) lower += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return lower == "nan" || lower == "inf" || lower == "infinity";
}

// [+-] digits [. digits] [(e|E) [+-] digits], at least one digit before the exponent. Written by hand:
// std::regex recurses once per character and overflows the stack on a long scalar.
bool has_plain_number_syntax(std::string_view s) {
  auto digits = [&](size_t& i) {
    const size_t start = i;
    while (i < s.size() && s[i] >= '0' && s[i] <= '9') ++i;
    return i - start;
  };
  size_t i = 0;
  if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
  size_t mantissa = digits(i);
  if (i < s.size() && s[i] == '.') {
    ++i;
    mantissa += digits(i);
  }
  if (mantissa == 0) return false;
  if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
    ++i;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    if (digits(i) == 0) return false;
  }
  return i == s.size();
}

bool has_whole_number_syntax(std::string_view s) {
  size_t i = (!s.empty() && (s[0] == '+' || s[0] == '-')) ? 1 : 0;
  if (i == s.size()) return false;
  for (; i < s.size(); ++i)
    if (s[i] < '0' || s[i] > '9') return false;
  return true;
}

constexpr size_t max_number_chars = 100;  // no design value needs more; keeps strtod's work bounded

// A first pass over the parser's events, before yaml-cpp builds nodes: counts the nodes a reader would visit
// with every alias expanded, the nesting depth, and aliases that point into the node that holds them (a
// cycle, which would make any walk endless). Throws InputError at the first node past a limit.
class EventGuard final : public YAML::EventHandler {
 public:
  explicit EventGuard(const std::string& file) : file_(file) {}

  void OnDocumentStart(const YAML::Mark& mark) override {
    if (++documents_ > 1)
      throw InputError(fmt::format("{}: a second YAML document starts here; expected one design per file",
                                   location(file_, mark)));
  }
  void OnDocumentEnd() override {}
  void OnNull(const YAML::Mark& mark, YAML::anchor_t anchor) override { leaf(mark, anchor); }
  // Every text value and key, after YAML's escapes are decoded: no control character (a name is data and
  // stays on one line) and well-formed UTF-8 ("\uD800" decodes to an encoded surrogate).
  void OnScalar(const YAML::Mark& mark, const std::string& tag, YAML::anchor_t anchor, const std::string& value) override {
    check_tag(mark, tag);
    if (const auto bad = bad_text(value))
      throw InputError(fmt::format("{}: the text {} holds {}; expected printable text on one line (names and strings "
                                   "are data)",
                                   location(file_, mark), quote_for_message(value), *bad));
    leaf(mark, anchor);
  }
  void OnAlias(const YAML::Mark& mark, YAML::anchor_t anchor) override {
    for (const Open& o : open_)
      if (o.anchor == anchor)
        throw InputError(fmt::format("{}: an alias refers to a node that contains it, an endless loop; expected "
                                     "aliases only to nodes defined before and outside them",
                                     location(file_, mark)));
    const auto it = size_.find(anchor);
    add(mark, it == size_.end() ? 1 : it->second);
  }
  void OnSequenceStart(const YAML::Mark& mark, const std::string& tag, YAML::anchor_t anchor,
                       YAML::EmitterStyle::value) override {
    check_tag(mark, tag);
    open(mark, anchor);
  }
  void OnSequenceEnd() override { close(); }
  void OnMapStart(const YAML::Mark& mark, const std::string& tag, YAML::anchor_t anchor,
                  YAML::EmitterStyle::value) override {
    check_tag(mark, tag);
    open(mark, anchor);
  }
  void OnMapEnd() override { close(); }

 private:
  struct Open {
    YAML::anchor_t anchor;
    size_t count_before;
  };
  // Only YAML 1.2's core schema tags are read ("!!str", "!!int", "!!float", "!!bool", "!!null", "!!seq",
  // "!!map"), besides none at all ("?" for a plain node, "!" for a quoted one): a local or custom tag asks for a
  // type a design has no use for, and would otherwise be dropped without a word.
  void check_tag(const YAML::Mark& mark, const std::string& tag) const {
    if (tag.empty() || tag == "?" || tag == "!") return;
    static constexpr std::string_view core = "tag:yaml.org,2002:";
    if (tag.rfind(core, 0) == 0) {
      const std::string_view name = std::string_view(tag).substr(core.size());
      for (std::string_view ok : {"str", "int", "float", "bool", "null", "seq", "map"})
        if (name == ok) return;
    }
    throw InputError(fmt::format("{}: the tag {} is not one of YAML's core tags; expected a value without a tag",
                                 location(file_, mark), quote_for_message(tag)));
  }
  void add(const YAML::Mark& mark, size_t n) {
    count_ += n;
    if (count_ > max_expanded_nodes)
      throw InputError(fmt::format("{}: with its aliases expanded the document holds more than {} nodes; a design "
                                   "needs a few hundred, so expected fewer or smaller aliases",
                                   location(file_, mark), max_expanded_nodes));
  }
  void leaf(const YAML::Mark& mark, YAML::anchor_t anchor) {
    add(mark, 1);
    if (anchor != YAML::NullAnchor) size_[anchor] = 1;
  }
  void open(const YAML::Mark& mark, YAML::anchor_t anchor) {
    if (open_.size() >= static_cast<size_t>(max_nesting_depth))
      throw InputError(fmt::format("{}: YAML nesting is deeper than {} levels; expected a design of a few levels of "
                                   "maps and lists",
                                   location(file_, mark), max_nesting_depth));
    open_.push_back({anchor, count_});
    add(mark, 1);
  }
  void close() {
    const Open o = open_.back();
    open_.pop_back();
    if (o.anchor != YAML::NullAnchor) size_[o.anchor] = count_ - o.count_before;
  }

  const std::string& file_;
  int documents_ = 0;
  size_t count_ = 0;
  std::vector<Open> open_;
  std::unordered_map<YAML::anchor_t, size_t> size_;
};

size_t edit_distance(std::string_view a, std::string_view b) {
  std::vector<size_t> prev(b.size() + 1), cur(b.size() + 1);
  for (size_t j = 0; j <= b.size(); ++j) prev[j] = j;
  for (size_t i = 1; i <= a.size(); ++i) {
    cur[0] = i;
    for (size_t j = 1; j <= b.size(); ++j)
      cur[j] = std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1)});
    std::swap(prev, cur);
  }
  return prev[b.size()];
}

// yaml-cpp reports only the deepest failure; make the message say what to do.
[[noreturn]] void rethrow_parse(const YAML::Exception& ex, const std::string& file) {
  if (dynamic_cast<const YAML::DeepRecursion*>(&ex) != nullptr)
    throw InputError(fmt::format("{}: YAML nesting is too deep to be a design; expected a few levels of maps and lists",
                                 location(file, ex.mark)));
  throw InputError(fmt::format("{}: not valid YAML: {}", location(file, ex.mark), ex.msg));
}


}  // namespace

std::string location(const std::string& file, const YAML::Mark& mark) {
  if (mark.line < 0 || mark.is_null()) return file;
  return fmt::format("{}:{}:{}", file, mark.line + 1, mark.column + 1);
}

std::string closest_match(std::string_view word, const std::vector<std::string_view>& candidates) {
  std::string best;
  size_t best_d = std::max<size_t>(3, word.size() / 2) + 1;
  for (auto c : candidates) {
    const size_t d = edit_distance(word, c);
    if (d < best_d) {
      best_d = d;
      best = std::string(c);
    }
  }
  return best;
}

std::string quote_for_message(std::string_view text) { return "\"" + clip(text) + "\""; }

std::optional<double> parse_plain_number(std::string_view text) {
  if (text.size() > max_number_chars || !has_plain_number_syntax(text)) return std::nullopt;
  const std::string s(text);
  char* end = nullptr;
  const double v = std::strtod(s.c_str(), &end);
  if (end != s.c_str() + s.size() || !std::isfinite(v)) return std::nullopt;
  return v;
}

static void check_text(const std::string& text, const std::string& file) {
  // YAML is UTF-8 here; reject bytes that are not, with the line and column (in characters) they sit on.
  // Control characters other than tab, line feed and carriage return (YAML's own white space) are refused
  // too: a name or string is data and never carries them (escaped ones are caught on the parsed values).
  size_t line = 1, column = 1;
  for (size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    const Utf8Char u = decode_utf8(text, i);
    if (u.length == 0)
      throw InputError(fmt::format("{}:{}:{}: the file is not UTF-8 text (byte 0x{:02X}: not a well-formed UTF-8 "
                                   "sequence, such as an overlong form, a surrogate or a code point beyond "
                                   "U+10FFFF); expected YAML saved as UTF-8",
                                   file, line, column, c));
    if (c == '\0')
      throw InputError(fmt::format("{}:{}:{}: the file holds a NUL byte; expected YAML text", file, line, column));
    if (is_control(u.code) && u.code != '\t' && u.code != '\n' && u.code != '\r')
      throw InputError(fmt::format("{}:{}:{}: the file holds the control character U+{:04X}; expected printable "
                                   "text (names and strings are data)",
                                   file, line, column, static_cast<unsigned>(u.code)));
    if (c == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
    i += u.length;
  }
}

YAML::Node load_text(const std::string& text, const std::string& file) {
  check_text(text, file);
  YAML::Node root;
  try {
    // Guard pass over the events first: yaml-cpp would build the nodes happily, but a reader walking a
    // billion-laughs document or a cyclic alias would not finish.
    {
      std::istringstream in(text);
      YAML::Parser parser(in);
      EventGuard guard(file);
      if (parser.HandleNextDocument(guard)) parser.HandleNextDocument(guard);  // throws on a second document
    }
    root = YAML::Load(text);
  } catch (const YAML::Exception& ex) {
    rethrow_parse(ex, file);
  }
  if (!root.IsDefined() || root.IsNull())
    throw InputError(fmt::format("{}: the file is empty; expected a design (a YAML mapping with name, epoch and shells)", file));
  return root;
}

std::string read_text_file(const std::string& path) {
  // The one file reader (io/read_file.hpp); "a design file" also names sweep files' limit, as before.
  try {
    return read_file_text(path, max_file_bytes, "a design file");
  } catch (const InputError& e) {
    const std::string m = e.what();
    // A folder given as a design: say what was expected in the words of the design commands.
    if (m.size() > path.size() && m.compare(path.size(), 16, ": is a directory") == 0)
      throw InputError(fmt::format("{}: is a directory; expected a YAML design file", path));
    throw;
  }
}

YAML::Node key_node(const YAML::Node& map, std::string_view key) {
  if (map.IsMap())
    for (auto it = map.begin(); it != map.end(); ++it)
      if (it->first.IsScalar() && it->first.Scalar() == key) return it->first;
  return YAML::Node(YAML::NodeType::Undefined);
}

YAML::Node load_file(const std::string& path) { return load_text(read_text_file(path), path); }

void fail_at(const std::string& file, const YAML::Node& at, const std::string& path, const std::string& message) {
  const YAML::Mark mark = at.IsDefined() ? at.Mark() : YAML::Mark::null_mark();
  throw InputError(fmt::format("{}: {}: {}", location(file, mark), path.empty() ? "(top level)" : path, message));
}

// A number must be written as a plain scalar: a quoted "510" or a !!str 510 is text, and reading it as a number
// would hide a slip (a value pasted from a spreadsheet, a unit left inside the quotes).
void reject_quoted_number(const std::string& file, const YAML::Node& node, const std::string& path, std::string_view what) {
  const std::string& tag = node.Tag();
  if (tag == "!" || tag == "tag:yaml.org,2002:str")
    fail_at(file, node, path, fmt::format("expected {}, got the text {} (quoted or tagged as a string); write numbers "
                                          "without quotes",
                                          what, quote_for_message(node.Scalar())));
}

double scalar_number(const std::string& file, const YAML::Node& node, const std::string& path, double min, double max,
                     std::string_view what) {
  if (!node.IsScalar()) fail_at(file, node, path, fmt::format("expected {}, got {}", what, describe(node)));
  reject_quoted_number(file, node, path, what);
  const std::string& s = node.Scalar();
  if (is_nan_or_inf_word(s))
    fail_at(file, node, path, fmt::format("expected {}, got {}: not-a-number and infinity are not accepted", what,
                                          describe(node)));
  if (!has_plain_number_syntax(s))
    fail_at(file, node, path, fmt::format("expected {} (a plain decimal number), got {}", what, describe(node)));
  if (s.size() > max_number_chars)
    fail_at(file, node, path, fmt::format("expected {} written in at most {} characters, got {} characters", what,
                                          max_number_chars, s.size()));
  const auto v = parse_plain_number(s);
  if (!v || *v < min || *v > max)  // !v: too large for a double, such as 1e400
    fail_at(file, node, path, fmt::format("{} is out of range; expected {} from {} to {}", s, what, min, max));
  return *v;
}

MapReader::MapReader(std::string file, const YAML::Node& node, std::string path, std::vector<std::string_view> allowed)
    : file_(std::move(file)), node_(node), path_(std::move(path)) {
  if (!node_.IsMap())
    fail_at(file_, node_, path_, fmt::format("expected a mapping of keys ({}), got {}",
                                             fmt::join(allowed, ", "), describe(node_)));
  std::map<std::string, YAML::Mark> seen;
  for (auto it = node_.begin(); it != node_.end(); ++it) {
    const YAML::Node k = it->first;  // a copy: the iterator yields a temporary pair
    if (!k.IsScalar()) fail_at(file_, k, path_, "a key must be a plain word");
    const std::string key = k.Scalar();
    if (std::find(allowed.begin(), allowed.end(), key) == allowed.end()) {
      const std::string near = closest_match(key, allowed);
      fail_at(file_, k, path_,
              near.empty() ? fmt::format("unknown key {}; valid keys here are: {}", quote_for_message(key), fmt::join(allowed, ", "))
                           : fmt::format("unknown key {}; did you mean \"{}\"?", quote_for_message(key), near));
    }
    auto [pos, fresh] = seen.emplace(key, k.Mark());
    if (!fresh)
      fail_at(file_, k, path_, fmt::format("key \"{}\" appears twice (first at line {}); keep one", key, pos->second.line + 1));
  }
}

bool MapReader::has(std::string_view key) const { return static_cast<bool>(node_[std::string(key)]); }

YAML::Node MapReader::node(std::string_view key) const {
  YAML::Node n = node_[std::string(key)];
  if (!n) fail(node_, path_.empty() ? std::string("(top level)") : path_, fmt::format("missing key \"{}\"", key));
  return n;
}

std::string MapReader::path_of(std::string_view key) const {
  return path_.empty() ? std::string(key) : path_ + "." + std::string(key);
}

void MapReader::fail(const YAML::Node& at, const std::string& path, const std::string& message) const {
  fail_at(file_, at.IsDefined() && at.Mark().line >= 0 ? at : node_, path, message);
}

void MapReader::fail_key(std::string_view key, const std::string& message) const {
  const YAML::Node n = node_[std::string(key)];
  fail(n ? n : node_, path_of(key), message);
}

double MapReader::number(std::string_view key, double min, double max, std::string_view what) const {
  const YAML::Node n = node(key);
  return scalar_number(file_, n, path_of(key), min, max, what);
}

std::optional<double> MapReader::optional_number(std::string_view key, double min, double max, std::string_view what) const {
  if (!has(key)) return std::nullopt;
  return number(key, min, max, what);
}

long MapReader::integer(std::string_view key, long min, long max, std::string_view what) const {
  const YAML::Node n = node(key);
  if (n.IsScalar()) reject_quoted_number(file_, n, path_of(key), what);
  if (!n.IsScalar() || !has_whole_number_syntax(n.Scalar()))
    fail(n, path_of(key), fmt::format("expected {} (a whole number), got {}", what, describe(n)));
  const std::string& s = n.Scalar();
  errno = 0;
  char* end = nullptr;
  const long v = std::strtol(s.c_str(), &end, 10);
  if (errno == ERANGE || v < min || v > max)
    fail(n, path_of(key), fmt::format("{} is out of range; expected {} from {} to {}", clip(s), what, min, max));
  return v;
}

std::optional<long> MapReader::optional_integer(std::string_view key, long min, long max, std::string_view what) const {
  if (!has(key)) return std::nullopt;
  return integer(key, min, max, what);
}

std::string MapReader::string(std::string_view key, std::string_view what) const {
  const YAML::Node n = node(key);
  if (!n.IsScalar() || n.Scalar().empty())
    fail(n, path_of(key), fmt::format("expected {} (text), got {}", what, describe(n)));
  return n.Scalar();
}

std::string MapReader::name(std::string_view key, std::string_view what) const {
  std::string s = string(key, what);
  size_t chars = 0;
  for (char ch : s) chars += (static_cast<unsigned char>(ch) & 0xC0) != 0x80;  // UTF-8 is checked on load
  if (chars > max_name_chars)
    fail(node(key), path_of(key), fmt::format("{} {} is {} characters long; expected at most {}", what,
                                              quote_for_message(s), chars, max_name_chars));
  return s;
}

std::optional<std::string> MapReader::optional_string(std::string_view key, std::string_view what) const {
  if (!has(key)) return std::nullopt;
  return string(key, what);
}

std::string MapReader::choice(std::string_view key, const std::vector<std::string_view>& options) const {
  const YAML::Node n = node(key);
  const std::string s = n.IsScalar() ? n.Scalar() : std::string();
  if (std::find(options.begin(), options.end(), s) == options.end()) {
    const std::string near = closest_match(s, options);
    fail(n, path_of(key), fmt::format("expected one of {}, got {}{}", fmt::join(options, ", "), describe(n),
                                      near.empty() ? "" : fmt::format(" (did you mean \"{}\"?)", near)));
  }
  return s;
}

bool MapReader::boolean(std::string_view key) const {
  const YAML::Node n = node(key);
  if (n.IsScalar() && n.Scalar() == "true") return true;
  if (n.IsScalar() && n.Scalar() == "false") return false;
  fail(n, path_of(key), fmt::format("expected true or false, got {}", describe(n)));
}

MapReader MapReader::map(std::string_view key, std::vector<std::string_view> allowed) const {
  return MapReader(file_, node(key), path_of(key), std::move(allowed));
}

std::vector<YAML::Node> MapReader::sequence(std::string_view key, bool allow_empty) const {
  const YAML::Node n = node(key);
  if (!n.IsSequence()) fail(n, path_of(key), fmt::format("expected a list, got {}", describe(n)));
  if (!allow_empty && n.size() == 0) fail(n, path_of(key), "the list is empty; expected at least one item");
  std::vector<YAML::Node> items;
  for (const auto& item : n) items.push_back(item);
  return items;
}

}  // namespace skein::yaml
