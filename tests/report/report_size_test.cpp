// Evidence for estimate_report_size (lib/skein/report/report.cpp): the report's size guard runs on an
// estimate made before anything is computed, so the estimate must track what is written. Reference: the
// bytes and files build_report hands to its sink for the two example designs (3 and 20 satellites, the
// 2 deg grid of 16200 points). Tolerance: -20 %/+25 % on bytes, a guard limit rather than a measurement
// (the per-item sizes vary with the fold count and the number widths); files: never fewer than written,
// at most the unused solar-level tables and plots more.
#include <doctest/doctest.h>

#include <string>

#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/report/report.hpp"

using namespace skein;

TEST_CASE("report size: the estimate made before building matches the files and bytes written") {
  // With the land outlines of the maps when they are installed (scripts/setup.sh), as `skein report` runs.
  const std::string land = std::string(SKEIN_SOURCE_DIR) + "/third_party/world-atlas/node_modules/world-atlas/land-110m.json";
  for (const std::string& name : {std::string("small"), std::string("demo")}) {
    const Design d = read_design_file(std::string(SKEIN_SOURCE_DIR) + "/designs/" + name + ".yaml");
    ReportOptions o;
    o.creation_date = "2027-01-01T00:00:00.000";
    o.land = load_land_outlines(land).outlines;
    const ReportSizeEstimate e = estimate_report_size(d, o);
    const Report r = build_report(d, o);
    double bytes = 0.0;
    for (const auto& f : r.files) bytes += static_cast<double>(f.content.size());
    CHECK(r.files_written == static_cast<long>(r.files.size()));
    CHECK(r.bytes_written == bytes);
    INFO(name << ": estimated " << e.bytes << " bytes, " << e.files << " files; written " << bytes << " bytes, "
              << r.files.size() << " files");
    CHECK(e.bytes >= 0.8 * bytes);
    CHECK(e.bytes <= 1.25 * bytes);
    CHECK(e.files >= static_cast<double>(r.files.size()));
    CHECK(e.files <= static_cast<double>(r.files.size()) + 10.0);
  }
}

TEST_CASE("report size: an oversized report is refused before the coverage runs") {
  // 20000 satellites at one-day 60 s ephemerides: about 2.9 GB of OEM alone, above the 2 GiB limit. The
  // coverage grid here is global at 0.05 deg (25.9 million points): were the coverage run first, this test
  // would take minutes and gigabytes; refused first, it returns at once.
  const std::string text =
      "name: big\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n"
      "  drag_coefficient: 2.2\nshells:\n  - name: a\n    pattern: walker-delta\n    satellites: 20000\n"
      "    planes: 100\n    phasing: 1\n    altitude_km: 540\n    inclination_deg: 53\n"
      "coverage:\n  grid:\n    kind: global\n    spacing_deg: 0.05\n";
  const Design d = read_design_text(text, "big.yaml");
  ReportOptions o;
  std::string message;
  try {
    build_report(d, o, [](const std::string&, std::string_view) { FAIL("a file was made"); });
  } catch (const InputError& e) {
    message = e.what();
  }
  CHECK(message.find("the report would hold about") != std::string::npos);
  CHECK(message.find("above the limits of 50000 files and 2.0 GiB") != std::string::npos);
}
