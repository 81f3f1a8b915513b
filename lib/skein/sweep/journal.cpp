#include "skein/sweep/journal.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <charconv>
#include <cstring>
#include <set>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/checksum.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {
namespace {

constexpr std::string_view header_word = "skein-sweep-journal 1 ";

// One line of the text (without its LF and a CR before it); `complete` false when no LF ends it.
struct Line {
  std::string_view text;
  bool complete = true;
  bool crlf = false;
};

std::vector<Line> split_lines(std::string_view text) {
  std::vector<Line> out;
  size_t pos = 0;
  while (pos < text.size()) {
    const size_t end = text.find('\n', pos);
    Line l;
    if (end == std::string_view::npos) {
      l.text = text.substr(pos);
      l.complete = false;
      pos = text.size();
    } else {
      l.text = text.substr(pos, end - pos);
      pos = end + 1;
    }
    if (l.complete && !l.text.empty() && l.text.back() == '\r') {
      l.text.remove_suffix(1);
      l.crlf = true;
    }
    out.push_back(l);
  }
  return out;
}

// "skein-sweep-journal 1 <16 hex digits> <count>": a header, of this sweep or another.
bool is_header_form(std::string_view line) {
  if (line.substr(0, header_word.size()) != header_word) return false;
  const std::string_view rest = line.substr(header_word.size());
  if (rest.size() < 18 || rest[16] != ' ') return false;
  for (size_t i = 0; i < 16; ++i)
    if (!std::isxdigit(static_cast<unsigned char>(rest[i]))) return false;
  const std::string_view count = rest.substr(17);
  return std::all_of(count.begin(), count.end(), [](char c) { return c >= '0' && c <= '9'; });
}

// What was found, for a message: at most 60 bytes, printable ASCII as is, the rest as \xHH.
std::string shown(std::string_view text) {
  std::string out = "\"";
  for (size_t i = 0; i < text.size() && i < 60; ++i) {
    const auto c = static_cast<unsigned char>(text[i]);
    if (c >= 0x20 && c < 0x7f && c != '"' && c != '\\')
      out += static_cast<char>(c);
    else
      out += fmt::format("\\x{:02x}", c);
  }
  return out + (text.size() > 60 ? "...\"" : "\"");
}

// The row of a journal line when the line is whole and valid for `options`; nullopt otherwise.
std::optional<std::pair<size_t, std::string_view>> valid_line(const Line& l, const JournalReadOptions& options) {
  if (!l.complete) return std::nullopt;
  const std::string_view line = l.text;
  size_t index = 0;
  const auto [p1, ec1] = std::from_chars(line.data(), line.data() + line.size(), index);
  const size_t sp1 = static_cast<size_t>(p1 - line.data());
  if (ec1 != std::errc() || sp1 == 0 || sp1 + 10 > line.size() || line[sp1] != ' ' || line[sp1 + 9] != ' ' ||
      index >= options.layouts)
    return std::nullopt;
  const std::string_view crc = line.substr(sp1 + 1, 8);
  const std::string_view row = line.substr(sp1 + 10);
  if (crc != hex32(crc32(fmt::format("{} {}", index, row)))) return std::nullopt;
  const auto cells = decode_row(row, options.columns);
  if (!cells) return std::nullopt;
  if (options.belongs && !options.belongs(index, *cells)) return std::nullopt;
  return std::make_pair(index, row);
}

}  // namespace

std::string journal_header(std::string_view fingerprint, size_t layouts) {
  return fmt::format("{}{} {}\n", header_word, fingerprint, layouts);
}

std::string journal_line(size_t index, std::string_view row) {
  const std::string body = fmt::format("{} {}", index, row);
  return fmt::format("{} {} {}\n", index, hex32(crc32(body)), row);
}

JournalContents parse_journal(std::string_view text, std::string_view expected_header, const JournalReadOptions& options,
                              const std::string& path) {
  JournalContents out;
  const std::vector<Line> lines = split_lines(text);
  const std::string_view want = expected_header.substr(0, expected_header.size() - 1);  // without its LF
  size_t first = 0;
  if (!lines.empty() && lines[0].text == want) {  // (a header without its LF is whole: the LF is written back)
    first = 1;
    out.crlf = lines[0].crlf;
  } else if (!lines.empty() && is_header_form(lines[0].text)) {
    throw InputError(fmt::format("{}: the journal belongs to another sweep (the sweep file, its base design or the "
                                 "program version changed since it was written); expected the journal of this sweep, "
                                 "or pass --restart to discard it",
                                 path));
  } else {
    // The first line is not a header: damaged (or removed). Say what is there and how much can be kept.
    out.header_damaged = true;
    const bool line1_is_row = !lines.empty() && valid_line(lines[0], options);
    first = line1_is_row ? 0 : 1;
    if (!options.salvage) {
      long valid = 0;
      for (size_t k = first; k < lines.size(); ++k) valid += valid_line(lines[k], options) ? 1 : 0;
      throw InputError(fmt::format(
          "{}:1: the journal's first line is damaged: found {}, expected {}; {} of its lines are valid rows of this "
          "sweep (checksum and layout index correct). Pass --salvage to keep those rows and compute the others, or "
          "--restart to discard the journal",
          path, lines.empty() ? std::string("an empty file") : shown(lines[0].text), shown(want), valid));
    }
  }
  out.compact = std::string(expected_header);
  std::map<size_t, std::string_view> kept;
  std::set<size_t> conflicting;  // indices read twice with different rows: every line of them dropped
  std::vector<size_t> order;
  for (size_t k = first; k < lines.size(); ++k) {
    out.crlf = out.crlf || lines[k].crlf;
    const auto v = valid_line(lines[k], options);
    if (!v || conflicting.count(v->first)) {
      ++out.damaged_lines;
      continue;
    }
    const auto it = kept.find(v->first);
    if (it == kept.end()) {
      kept.emplace(v->first, v->second);
      order.push_back(v->first);
      continue;
    }
    ++out.damaged_lines;  // a repeat: dropped; with a different row, the first goes too
    if (it->second != v->second) {
      conflicting.insert(v->first);
      kept.erase(it);
      ++out.damaged_lines;
    }
  }
  for (size_t index : order) {
    const auto it = kept.find(index);
    if (it == kept.end()) continue;
    out.rows.emplace(index, std::string(it->second));
    out.compact += journal_line(index, it->second);
  }
  return out;
}

void rewrite_journal_in_place(const std::string& path, std::string_view current, std::string_view wanted) {
  const auto diff = std::mismatch(current.begin(), current.end(), wanted.begin(), wanted.end());
  const size_t from = static_cast<size_t>(diff.second - wanted.begin());
  if (from == wanted.size() && wanted.size() == current.size()) return;  // nothing to change
  const int fd = ::open(path.c_str(), O_WRONLY | O_CLOEXEC);
  auto fail = [&](const char* what) {
    const int err = errno;
    if (fd >= 0) ::close(fd);
    throw InputError(fmt::format("{}: cannot {} the journal in place ({}); expected a writable journal", path, what,
                                 std::strerror(err)));
  };
  if (fd < 0) fail("open");
  size_t done = from;
  while (done < wanted.size()) {
    const ssize_t n = ::pwrite(fd, wanted.data() + done, wanted.size() - done, static_cast<off_t>(done));
    if (n < 0) {
      if (errno == EINTR) continue;
      fail("write");
    }
    done += static_cast<size_t>(n);
  }
  if (::ftruncate(fd, static_cast<off_t>(wanted.size())) != 0) fail("cut");
  if (::fsync(fd) != 0) fail("sync");
  ::close(fd);
}

JournalWriter::JournalWriter(const std::string& path) : path_(path) {
  fd_ = ::open(path.c_str(), O_WRONLY | O_APPEND | O_CREAT | O_CLOEXEC, 0644);
  if (fd_ < 0)
    throw InputError(fmt::format("{}: cannot open the journal for writing ({}); expected a writable folder", path,
                                 std::strerror(errno)));
}

JournalWriter::~JournalWriter() {
  if (fd_ >= 0) ::close(fd_);
}

void JournalWriter::append(std::string_view line) {
  size_t done = 0;
  while (done < line.size()) {
    const ssize_t n = ::write(fd_, line.data() + done, line.size() - done);
    if (n < 0) {
      if (errno == EINTR) continue;
      throw InputError(fmt::format("{}: cannot write the journal ({})", path_, std::strerror(errno)));
    }
    done += static_cast<size_t>(n);
  }
}

}  // namespace skein
