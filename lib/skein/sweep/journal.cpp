#include "skein/sweep/journal.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <charconv>
#include <cstring>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/sweep/checksum.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {

std::string journal_header(std::string_view fingerprint, size_t layouts) {
  return fmt::format("skein-sweep-journal 1 {} {}\n", fingerprint, layouts);
}

std::string journal_line(size_t index, std::string_view row) {
  const std::string body = fmt::format("{} {}", index, row);
  return fmt::format("{} {} {}\n", index, hex32(crc32(body)), row);
}

JournalContents parse_journal(std::string_view text, std::string_view expected_header, size_t layouts, size_t columns,
                              const std::string& path) {
  JournalContents out;
  const size_t first_end = text.find('\n');
  if (first_end == std::string_view::npos || text.substr(0, first_end + 1) != expected_header)
    throw InputError(fmt::format("{}: the journal belongs to another sweep (the sweep file, its base design or the "
                                 "program version changed since it was written); expected the journal of this sweep, "
                                 "or pass --restart to discard it",
                                 path));
  size_t pos = first_end + 1;
  while (pos < text.size()) {
    const size_t end = text.find('\n', pos);
    if (end == std::string_view::npos) {  // the last line was cut short
      ++out.damaged_lines;
      break;
    }
    const std::string_view line = text.substr(pos, end - pos);
    pos = end + 1;
    size_t index = 0;
    const auto [p1, ec1] = std::from_chars(line.data(), line.data() + line.size(), index);
    const size_t sp1 = static_cast<size_t>(p1 - line.data());
    if (ec1 != std::errc() || sp1 + 10 > line.size() || line[sp1] != ' ' || line[sp1 + 9] != ' ' || index >= layouts) {
      ++out.damaged_lines;
      continue;
    }
    const std::string_view crc = line.substr(sp1 + 1, 8);
    const std::string_view row = line.substr(sp1 + 10);
    const std::string body = fmt::format("{} {}", index, row);
    if (crc != hex32(crc32(body)) || !decode_row(row, columns)) {
      ++out.damaged_lines;
      continue;
    }
    out.rows.emplace(index, std::string(row));
  }
  return out;
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
