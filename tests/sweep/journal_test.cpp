// Evidence for lib/skein/sweep journal and checksums: published check values, and that a cut-short or
// damaged line is never taken for a finished row.
#include <doctest/doctest.h>

#include <string>

#include "skein/error.hpp"
#include "skein/sweep/checksum.hpp"
#include "skein/sweep/journal.hpp"

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

TEST_CASE("sweep: journal lines parse back; cut-short, damaged and foreign lines are ignored") {
  const std::string header = journal_header("0123456789abcdef", 5);
  const std::string row0 = "[0,1.5,\"ok\"]", row3 = "[3,2.5,null]";
  std::string text = header + journal_line(0, row0) + journal_line(3, row3);
  JournalContents j = parse_journal(text, header, 5, 3, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.rows.at(0) == row0);
  CHECK(j.rows.at(3) == row3);
  CHECK(j.damaged_lines == 0);

  // A line cut short by a kill (no newline): ignored, so layout 4 is recomputed.
  std::string cut = journal_line(4, "[4,9.5,\"ok\"]");
  j = parse_journal(text + cut.substr(0, cut.size() - 3), header, 5, 3, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 1);
  // Even a complete-looking line whose row lost a byte (checksum differs).
  std::string bad = journal_line(4, "[4,9.5,\"ok\"]");
  bad[bad.size() - 4] = '7';
  j = parse_journal(text + bad, header, 5, 3, "j.txt");
  CHECK(j.rows.count(4) == 0);
  CHECK(j.damaged_lines == 1);
  // An index beyond the layout count, or a row of the wrong width.
  j = parse_journal(text + journal_line(9, "[9,1.0,null]") + journal_line(2, "[2,1.0]"), header, 5, 3, "j.txt");
  CHECK(j.rows.size() == 2);
  CHECK(j.damaged_lines == 2);
  // A journal of another sweep.
  CHECK_THROWS_AS(parse_journal(journal_header("ffffffffffffffff", 5) + journal_line(0, row0), header, 5, 3, "j.txt"),
                  InputError);
  CHECK_THROWS_AS(parse_journal("", header, 5, 3, "j.txt"), InputError);
}
