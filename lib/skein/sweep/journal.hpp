#pragma once
// The sweep journal: one line per finished layout, appended as each finishes, so that an interrupted sweep
// resumes without recomputing or losing a finished row. Format (text, one record per line):
//   skein-sweep-journal 1 FINGERPRINT LAYOUTS        first line: which sweep it belongs to
//   INDEX CRC32 ROW                                  ROW: the row's cells as a JSON array (encode_row)
// CRC32 (8 hex digits) covers "INDEX ROW". Lines end in LF; a CR before the LF (a journal that passed through
// a CRLF editor or file transfer) is ignored. A line is dropped, and its layout recomputed, when it has no
// newline (a write cut short by a kill), a bad checksum, an index out of range, a row that does not decode,
// a row that is not the one of the layout at INDEX in the fixed layout order, or an index already read with
// a different row (both are dropped then; an identical repeat is dropped and the first kept).
#include <cstddef>
#include <functional>
#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "skein/report/table.hpp"

namespace skein {

std::string journal_header(std::string_view fingerprint, size_t layouts);
std::string journal_line(size_t index, std::string_view row);

// True when the decoded row is the row of layout `index` (its layout cells are that layout's).
using JournalRowCheck = std::function<bool(size_t index, const std::vector<Cell>& cells)>;

struct JournalReadOptions {
  size_t layouts = 0;         // layouts of the sweep (an index must be below)
  size_t columns = 0;         // cells of a row
  JournalRowCheck belongs;    // when set, a row must pass it
  bool salvage = false;       // a damaged first line does not stop the read (a foreign one still does)
};

struct JournalContents {
  std::map<size_t, std::string> rows;  // layout index -> encoded row
  long damaged_lines = 0;              // lines dropped (see above), the header not counted
  bool header_damaged = false;         // only with salvage: the first line was not a journal header
  bool crlf = false;                   // some line ended in CR LF
  std::string compact;                 // the expected header and the kept lines, LF endings, in file order
};

// Parse a journal's text. Throws InputError when the header names another sweep (the sweep or base design
// file changed, or another program version), and, without options.salvage, when the first line is not a
// journal header: the message says what was found and how many rows are valid, and offers --salvage and
// --restart. `path` is for messages.
JournalContents parse_journal(std::string_view text, std::string_view expected_header, const JournalReadOptions& options,
                              const std::string& path);

// Make the file at `path`, whose content is `current`, hold `wanted` instead, in place: only the bytes from the
// first difference on are written, then the file is cut to size and synced. No second copy of the journal is
// made, so a resume on a nearly full disk needs no more room than the journal already takes (`wanted` is at
// most a header's length longer than the rows it keeps). A kill half-way leaves whole valid lines, at most one
// damaged line and identical repeats, which the next read drops. Throws InputError when it cannot write.
void rewrite_journal_in_place(const std::string& path, std::string_view current, std::string_view wanted);

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
