// Names from input are data in every writer: Markdown and HTML escape them, CSV text cells that a
// spreadsheet would run as formulas get a leading quote, and OEM KVN values that cannot stay on one line
// are refused. The inputs here are legal names (the reader refuses control characters before any writer).
#include <doctest/doctest.h>

#include <string>

#include "skein/error.hpp"
#include "skein/export/oem.hpp"
#include "skein/report/table.hpp"

using namespace skein;

TEST_SUITE("names as data") {

TEST_CASE("a <script> name stays text in Markdown and HTML") {
  const std::string name = "<script>alert(1)</script> *bold* [link](x) | pipe";
  const std::string md = markdown_escape(name);
  CHECK(md.find("<script>") == std::string::npos);
  CHECK(md.find("&lt;script&gt;") != std::string::npos);
  CHECK(md.find("\\*bold\\*") != std::string::npos);
  CHECK(md.find("\\[link\\]") != std::string::npos);
  CHECK(md.find("\\|") != std::string::npos);
  const std::string html = html_escape(name + " 'q' \"d\" &");
  CHECK(html.find('<') == std::string::npos);
  CHECK(html.find('\'') == std::string::npos);
  CHECK(html.find("&amp;") != std::string::npos);

  Table t;
  t.title = "Sites of <b>x</b>";
  t.columns = {{"name", "site", "", 0}, {"lat_deg", "latitude", "deg", 1}};
  t.add_row({name, -12.5});
  const std::string table_md = render_markdown(t);
  CHECK(table_md.find("<script>") == std::string::npos);
  CHECK(table_md.find("<b>") == std::string::npos);
  CHECK(table_md.find("-12.5") != std::string::npos);  // numbers keep their sign
  CHECK(render_html(t).find("<script>") == std::string::npos);
}

TEST_CASE("a site name starting with = + - @ is neutralised in CSV, and numbers are not") {
  Table t;
  t.columns = {{"name", "site", "", 0}, {"lon_deg", "longitude", "deg", 1}};
  t.add_row({std::string("=HYPERLINK(\"http://x\",\"y\")"), -70.5});
  t.add_row({std::string("+1"), 10.0});
  t.add_row({std::string("-2"), 10.0});
  t.add_row({std::string("@SUM(A1)"), 10.0});
  t.add_row({std::string("North"), 10.0});
  const std::string csv = render_csv(t);
  CHECK(csv.find("\"'=HYPERLINK(\"\"http://x\"\",\"\"y\"\")\",-70.5\n") != std::string::npos);
  CHECK(csv.find("\n'+1,10.0\n") != std::string::npos);
  CHECK(csv.find("\n'-2,10.0\n") != std::string::npos);
  CHECK(csv.find("\n'@SUM(A1),10.0\n") != std::string::npos);
  CHECK(csv.find("\nNorth,10.0\n") != std::string::npos);
}

TEST_CASE("OEM values that cannot stay on one KVN line are refused") {
  OemMessage m;
  m.creation_date = "2027-03-01T00:00:00";
  m.originator = "skein";
  OemSegment seg;
  seg.object_name = "Kestrel\nORIGINATOR = someone else";
  seg.object_id = "imaging-p01-s01";
  seg.samples.push_back({});
  m.segments.push_back(seg);
  CHECK_THROWS_AS(render_oem(m), InputError);
  m.segments[0].object_name = "Kestrel";
  m.comments = {"Design: Kestrel\x1b[31m"};
  CHECK_THROWS_AS(render_oem(m), InputError);
  m.comments = {"Design: Kestrel \xc2\x85 NEL"};  // C1 control U+0085
  CHECK_THROWS_AS(render_oem(m), InputError);
  m.comments = {"Design: Kestrel phase-A"};
  const std::string kvn = render_oem(m);
  CHECK(kvn.find("OBJECT_NAME = Kestrel\n") != std::string::npos);
}

}  // TEST_SUITE
