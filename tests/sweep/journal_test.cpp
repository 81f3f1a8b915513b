// Evidence for lib/skein/sweep journal and checksums: published check values, and that a cut-short or
// damaged line is never taken for a finished row.
#include <doctest/doctest.h>

#include <sys/stat.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "skein/input/sweep_file.hpp"
#include "skein/error.hpp"
#include "skein/io/checksum.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/results_rows.hpp"

using namespace skein;

TEST_CASE("sweep: CRC-32 and FNV-1a match their published check values") {
  // CRC-32/ISO-HDLC check value of "123456789": 0xCBF43926 (G. Cook, "Catalogue of parametrised CRC algorithms",
  // entry CRC-32/ISO-HDLC; also RFC 1952 sec. 8 gives the same CRC as used by gzip).
  CHECK(crc32("123456789") == 0xCBF43926U);
  CHECK(crc32("") == 0U);
  // FNV-1a 64 of "a" is 0xaf63dc4c8601ec8c and of "" is the offset basis (Fowler, Noll, Vo: FNV test vectors,
  // draft-eastlake-fnv, appendix C).
  CHECK(fnv1a64("") == 14695981039346656037ULL);
  CHECK(fnv1a64("a") == 0xaf63dc4c8601ec8cULL);
  CHECK(hex32(0xCBF43926U) == "cbf43926");
}

TEST_CASE("sweep: journal lines parse back, and cut-short, damaged and foreign lines are ignored") {
  const std::string header = journal_header("0123456789abcdef", 5);
  JournalReadOptions five;
  five.layouts = 5;
  five.columns = 3;
  const std::string row0 = "[0,1.5,\"ok\"]", row3 = "[3,2.5,null]";
  std::string text = header + journal_line(0, row0) + journal_line(3, row3);
  JournalContents j = parse_journal(text, header, five, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.rows.at(0) == row0);
  CHECK(j.rows.at(3) == row3);
  CHECK(j.damaged_lines == 0);

  // A line cut short by a kill (no newline): ignored, so layout 4 is recomputed.
  std::string cut = journal_line(4, "[4,9.5,\"ok\"]");
  j = parse_journal(text + cut.substr(0, cut.size() - 3), header, five, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 1);
  // Even a complete-looking line whose row lost a byte (checksum differs).
  std::string bad = journal_line(4, "[4,9.5,\"ok\"]");
  bad[bad.size() - 4] = '7';
  j = parse_journal(text + bad, header, five, "j.txt");
  CHECK(j.rows.count(4) == 0);
  CHECK(j.damaged_lines == 1);
  // An index beyond the layout count, or a row of the wrong width.
  j = parse_journal(text + journal_line(9, "[9,1.0,null]") + journal_line(2, "[2,1.0]"), header, five, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 2);
  // A journal of another sweep.
  CHECK_THROWS_AS(parse_journal(journal_header("ffffffffffffffff", 5) + journal_line(0, row0), header, five, "j.txt"),
                  InputError);
  CHECK_THROWS_AS(parse_journal("", header, five, "j.txt"), InputError);
}

namespace {

// Rows of the made-up width-3 journal: [INDEX, figure, text]; a row belongs to layout i when its first cell is i
// (the role row_is_layout plays for real rows).
JournalReadOptions checked_options() {
  JournalReadOptions o;
  o.layouts = 5;
  o.columns = 3;
  o.belongs = [](size_t i, const std::vector<Cell>& cells) {
    const long* l = std::get_if<long>(&cells.at(0));
    return l && *l == static_cast<long>(i);
  };
  return o;
}

std::string message_of(std::string_view text, std::string_view header, const JournalReadOptions& o) {
  try {
    parse_journal(text, header, o, "out/journal.txt");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("sweep: a journal line whose index is not its row's layout, or repeats an index, is dropped") {
  const std::string header = journal_header("0123456789abcdef", 5);
  const std::string row1 = "[1,1.5,\"ok\"]", row3 = "[3,2.5,\"ok\"]";
  // Layout 3's row filed under index 4 with a checksum computed for "4 ROW": the checksum is valid, the index
  // is not the row's. Before, it was kept under 4 and layout 3's own row went missing from the results.
  const std::string wrong = journal_line(4, row3);
  JournalContents j = parse_journal(header + journal_line(1, row1) + wrong, header, checked_options(), "j");
  CHECK(j.rows.size() == 1);
  CHECK(j.rows.count(4) == 0);
  CHECK(j.damaged_lines == 1);
  CHECK(j.compact == header + journal_line(1, row1));
  // An identical repeat: the repeat is dropped, the row kept.
  j = parse_journal(header + journal_line(1, row1) + journal_line(3, row3) + journal_line(1, row1), header,
                    checked_options(), "j");
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 1);
  CHECK(j.compact == header + journal_line(1, row1) + journal_line(3, row3));
  // A repeat with another row: which one is right cannot be told, so both go and layout 1 is recomputed; a third
  // line of index 1 is dropped too.
  const std::string other1 = "[1,7.5,\"ok\"]";
  j = parse_journal(header + journal_line(1, row1) + journal_line(3, row3) + journal_line(1, other1) +
                        journal_line(1, row1),
                    header, checked_options(), "j");
  CHECK(j.rows.size() == 1);
  CHECK(j.rows.count(1) == 0);
  CHECK(j.damaged_lines == 3);
}

TEST_CASE("sweep: a journal with CRLF line endings reads as with LF") {
  const std::string header = journal_header("0123456789abcdef", 5);
  const std::string row0 = "[0,1.5,\"ok\"]", row2 = "[2,2.5,null]";
  std::string lf = header + journal_line(0, row0) + journal_line(2, row2);
  std::string crlf;
  for (char c : lf) crlf += c == '\n' ? std::string("\r\n") : std::string(1, c);
  const JournalContents j = parse_journal(crlf, header, checked_options(), "j");
  CHECK(j.crlf);
  CHECK(j.damaged_lines == 0);
  CHECK(j.rows.size() == 2);
  CHECK(j.rows.at(2) == row2);
  CHECK(j.compact == lf);  // written back with LF
  // A CR inside a row is not a line ending: that line's checksum fails.
  std::string inner = journal_line(0, row0);
  inner.insert(3, "\r");
  CHECK(parse_journal(header + inner, header, checked_options(), "j").damaged_lines == 1);
}

TEST_CASE("sweep: a damaged journal header says what it found and --salvage keeps the valid rows") {
  const std::string header = journal_header("0123456789abcdef", 5);
  const std::string row0 = "[0,1.5,\"ok\"]", row2 = "[2,2.5,null]";
  const std::string body = journal_line(0, row0) + journal_line(2, row2) + "2 0badc0de [2,9.5,nul\n";
  const std::string damaged = "skein-sweep-jou\x01nal 1 0123\n" + body;
  const std::string m = message_of(damaged, header, checked_options());
  CHECK(m.find("out/journal.txt:1: the journal's first line is damaged: found \"skein-sweep-jou\\x01nal 1 0123\"") == 0);
  CHECK(m.find("expected \"skein-sweep-journal 1 0123456789abcdef 5\"") != std::string::npos);
  CHECK(m.find("2 of its lines are valid rows") != std::string::npos);
  CHECK(m.find("--salvage") != std::string::npos);
  CHECK(m.find("--restart") != std::string::npos);
  JournalReadOptions salvage = checked_options();
  salvage.salvage = true;
  JournalContents j = parse_journal(damaged, header, salvage, "j");
  CHECK(j.header_damaged);
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 1);
  CHECK(j.compact == header + journal_line(0, row0) + journal_line(2, row2));
  // The header removed altogether: the first line is a row, and is kept.
  j = parse_journal(body, header, salvage, "j");
  CHECK(j.rows.size() == 2);
  // The header alone without its LF is this sweep's header, holding no row.
  j = parse_journal(header.substr(0, header.size() - 1), header, checked_options(), "j");
  CHECK(j.rows.empty());
  CHECK(j.compact == header);
  // An empty file is a damaged header holding no row.
  CHECK(message_of("", header, checked_options()).find("found an empty file") != std::string::npos);
  // A well-formed header of another sweep is not damage: --salvage does not take its rows.
  const std::string foreign = journal_header("ffffffffffffffff", 5) + body;
  CHECK(message_of(foreign, header, salvage).find("belongs to another sweep") != std::string::npos);
  CHECK(message_of(journal_header("0123456789abcdef", 6) + body, header, salvage).find("another sweep") !=
        std::string::npos);
}

TEST_CASE("sweep: the journal is repaired in place, without a second copy") {
  const std::string path =
      (std::filesystem::temp_directory_path() / ("skein-journal-test-" + std::to_string(::getpid()) + ".txt")).string();
  const std::string header = journal_header("0123456789abcdef", 5);
  const std::string good = header + journal_line(0, "[0,1.5,\"ok\"]") + journal_line(3, "[3,2.5,null]");
  auto write = [&](const std::string& text) { std::ofstream(path, std::ios::binary) << text; };
  auto read = [&] {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
  };
  auto inode = [&] {
    struct stat st {};
    REQUIRE(::stat(path.c_str(), &st) == 0);
    return st.st_ino;
  };
  // A cut-short tail: the file is cut to its valid lines (same file, same inode).
  write(good + "4 0badc0de [4,1.");
  const auto ino = inode();
  rewrite_journal_in_place(path, good + "4 0badc0de [4,1.", good);
  CHECK(read() == good);
  CHECK(inode() == ino);
  // A damaged line in the middle and CRLF endings: rewritten from the first difference on, same inode.
  std::string crlf;
  for (char c : good) crlf += c == '\n' ? std::string("\r\n") : std::string(1, c);
  write(crlf);
  rewrite_journal_in_place(path, crlf, good);
  CHECK(read() == good);
  CHECK(inode() == ino);
  // Nothing to change: nothing written.
  rewrite_journal_in_place(path, good, good);
  CHECK(read() == good);
  std::remove(path.c_str());
}

TEST_CASE("sweep: row_is_layout tells a row of the example sweep from another layout's") {
  const Sweep s = read_sweep_file(std::string(SKEIN_SOURCE_DIR) + "/designs/sweeps/kestrel-small.yaml");
  const LayoutSet set = expand_layouts(s);
  LayoutMetrics m;
  m.evaluated = false;
  m.error = "made up";
  const std::vector<Cell> row3 = layout_row(s, set.layouts[3], m);
  CHECK(row_is_layout(s, set.layouts[3], row3));
  CHECK_FALSE(row_is_layout(s, set.layouts[4], row3));
  // The same cells with the index cell changed to 4: the layout cells (altitude, ...) still name layout 3.
  std::vector<Cell> renamed = row3;
  renamed[0] = Cell(4L);
  CHECK_FALSE(row_is_layout(s, set.layouts[4], renamed));
}
