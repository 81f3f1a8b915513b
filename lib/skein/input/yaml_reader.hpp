#pragma once
// Strict reading of YAML nodes for the design file and the files built on it (sweeps).
// Every failure throws InputError "FILE:LINE:COL: PATH: what was wrong; what was expected".
// yaml-cpp accepts duplicate keys and loose scalars (yes/no, 0x1F, .nan) silently; this reader does not.
// yaml-cpp 0.7's node code trips GCC 12's -Wdangling-pointer inside its own headers; silence it there only.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wdangling-pointer"
#include <yaml-cpp/yaml.h>
#pragma GCC diagnostic pop

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/error.hpp"

namespace skein::yaml {

// Where a node came from: "FILE:LINE:COL" (1-based), or "FILE" when yaml-cpp has no mark.
std::string location(const std::string& file, const YAML::Mark& mark);

// The closest of `candidates` to `word` by edit distance, or "" when none is reasonably close.
std::string closest_match(std::string_view word, const std::vector<std::string_view>& candidates);

// Parse a plain decimal number: digits, optional fraction and exponent. No hex, no yes/no, no nan or inf;
// the value must be finite. nullopt otherwise.
std::optional<double> parse_plain_number(std::string_view text);

// `text` in double quotes for a message: control bytes escaped as \xNN, cut to about 40 characters (at a
// UTF-8 character boundary) with "..." when longer.
std::string quote_for_message(std::string_view text);

// Resource guards applied while loading, before any reader walks the nodes: aliases may share one node many
// times, so a few kB of YAML can stand for billions of nodes ("billion laughs").
constexpr size_t max_expanded_nodes = 1'000'000;  // nodes counted with every alias expanded
constexpr int max_nesting_depth = 64;             // maps and lists inside each other
// Names are at most 64 characters: file names are built from them (tables/decay_SHELL_LEVEL.json,
// exports/oem/SHELL-pNN-sNN.oem), and 64 characters (at most 256 bytes of UTF-8) keep every such name far
// below the usual 255-byte file-name limit, so a report cannot fail late on a long name.
constexpr size_t max_name_chars = 64;

// The text of a file, read with the size guard first: at most max_file_bytes + 1 bytes are read, and a
// larger file (or an endless one such as /dev/zero) is refused at once. Throws InputError for a directory,
// an unreadable path or a file over the limit.
constexpr size_t max_file_bytes = 4u << 20;  // a design is a few kB; 4 MiB is a generous ceiling
std::string read_text_file(const std::string& path);

// Load a YAML file; throws InputError for an unreadable path, a directory, an empty document, a parse error
// (with its line and column), nesting too deep, more than one document, an alias inside the node it refers
// to, or aliases expanding beyond max_expanded_nodes.
YAML::Node load_file(const std::string& path);
// Load YAML from text (for tests and fuzzing); `name` stands for the file in messages.
YAML::Node load_text(const std::string& text, const std::string& name);

// A YAML mapping checked against the keys it may have.
class MapReader {
 public:
  // Throws when `node` is not a map, has a key not in `allowed` (naming the closest valid key), or has a
  // key twice (naming both lines). `path` is the YAML path of the node, such as "shells[1]".
  MapReader(std::string file, const YAML::Node& node, std::string path, std::vector<std::string_view> allowed);

  bool has(std::string_view key) const;
  YAML::Node node(std::string_view key) const;  // throws "missing key" when absent
  std::string path_of(std::string_view key) const;
  const std::string& file() const { return file_; }
  const std::string& path() const { return path_; }
  const YAML::Node& self() const { return node_; }

  // A finite number within [min, max]; `what` says what it is, e.g. "an altitude in km".
  double number(std::string_view key, double min, double max, std::string_view what) const;
  std::optional<double> optional_number(std::string_view key, double min, double max, std::string_view what) const;
  // A whole number within [min, max].
  long integer(std::string_view key, long min, long max, std::string_view what) const;
  std::optional<long> optional_integer(std::string_view key, long min, long max, std::string_view what) const;
  std::string string(std::string_view key, std::string_view what) const;
  // A name (design, shell, site): text of at most max_name_chars characters.
  std::string name(std::string_view key, std::string_view what) const;
  std::optional<std::string> optional_string(std::string_view key, std::string_view what) const;
  // One of the listed words.
  std::string choice(std::string_view key, const std::vector<std::string_view>& options) const;
  bool boolean(std::string_view key) const;  // true/false only
  // A nested map.
  MapReader map(std::string_view key, std::vector<std::string_view> allowed) const;
  // A sequence's items (throws when the value is not a sequence, or is empty and `allow_empty` is false).
  std::vector<YAML::Node> sequence(std::string_view key, bool allow_empty = false) const;

  // Throw an InputError at `at` (or at this map when `at` has no mark).
  [[noreturn]] void fail(const YAML::Node& at, const std::string& path, const std::string& message) const;
  [[noreturn]] void fail_key(std::string_view key, const std::string& message) const;

 private:
  std::string file_;
  YAML::Node node_;
  std::string path_;
};

// The key node of `key` in the mapping `map` (for the key's own position in a message), or an undefined node.
YAML::Node key_node(const YAML::Node& map, std::string_view key);

// Scalar helpers for items of sequences.
double scalar_number(const std::string& file, const YAML::Node& node, const std::string& path, double min, double max,
                     std::string_view what);
[[noreturn]] void fail_at(const std::string& file, const YAML::Node& at, const std::string& path,
                          const std::string& message);

}  // namespace skein::yaml
