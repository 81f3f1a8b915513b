#pragma once
// The sweep journal: one line per finished layout, appended as each finishes, so that an interrupted sweep
// resumes without recomputing or losing a finished row. Format (text, one record per line):
//   skein-sweep-journal 1 FINGERPRINT LAYOUTS        first line: which sweep it belongs to
//   INDEX CRC32 ROW                                  ROW: the row's cells as a JSON array (encode_row)
// CRC32 (8 hex digits) covers "INDEX ROW". A line without its newline, with a bad checksum, an index out of
// range or a row that does not decode (a write cut short by a kill) is ignored, and its layout recomputed.
#include <cstddef>
#include <map>
#include <string>
#include <string_view>

namespace skein {

std::string journal_header(std::string_view fingerprint, size_t layouts);
std::string journal_line(size_t index, std::string_view row);

struct JournalContents {
  std::map<size_t, std::string> rows;  // layout index -> encoded row (the first valid line of each index)
  long damaged_lines = 0;              // lines ignored (cut short, bad checksum, undecodable)
};

// Parse a journal's text. Throws InputError when the header is missing or names another sweep (the sweep or
// base design file changed, or another program version); `path` is for the message. `columns` is the row width.
JournalContents parse_journal(std::string_view text, std::string_view expected_header, size_t layouts, size_t columns,
                              const std::string& path);

// Appends lines to a journal file, each with one write(2) of the whole line (O_APPEND), so a kill leaves at
// most the last line cut short. Not thread-safe: callers serialize.
class JournalWriter {
 public:
  // Opens `path` for appending (creating it). Throws InputError when it cannot be opened.
  explicit JournalWriter(const std::string& path);
  ~JournalWriter();
  JournalWriter(const JournalWriter&) = delete;
  JournalWriter& operator=(const JournalWriter&) = delete;
  void append(std::string_view line);

 private:
  int fd_ = -1;
  std::string path_;
};

}  // namespace skein
