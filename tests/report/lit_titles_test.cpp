// Evidence that with the daylight mask (coverage.min_sun_elevation_deg) every coverage plot says "lit" in its
// title, as the tables' titles and headings do (issue 18 item 1: "the report says so in every heading"), and
// that without it no plot does (the designs have a station, so the cells' data-age map is among them).
// Reference: the titles written by report_plots.cpp, read from the SVG's text.
#include <doctest/doctest.h>

#include <regex>
#include <string>
#include <vector>

#include "skein/coverage/evaluate.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/report_plots.hpp"

using namespace skein;

namespace {

std::string design_text(const std::string& grid, bool daylight) {
  return "ground_stations:\n  - {name: North Rig, lat_deg: 70, lon_deg: 20}\n"
         "name: lit titles\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n"
         "  drag_coefficient: 2.2\nshells:\n  - name: w\n    pattern: walker-delta\n    satellites: 6\n    planes: 3\n"
         "    phasing: 1\n    altitude_km: 650\n    inclination_deg: 97.9\ncoverage:\n  grid:\n" +
         grid + (daylight ? "  min_sun_elevation_deg: 10\n" : "") + "  span_h: 6\n  step_s: 60\n  max_fold: 1\n";
}

// The first <text> of a figure: its title.
std::string title_of(const std::string& svg) {
  std::smatch m;
  REQUIRE(std::regex_search(svg, m, std::regex("<text[^>]*>([^<]*)</text>")));
  return m[1].str();
}

std::vector<std::string> coverage_titles(const std::string& grid, bool daylight) {
  const Design d = read_design_text(design_text(grid, daylight), "lit.yaml");
  const CoverageResult r = evaluate_coverage(d);
  const MapContext maps{nullptr, "no land outlines"};
  std::vector<std::string> out;
  if (d.coverage.grid == GridKind::sites) {
    out.push_back(title_of(sites_map_svg(d, r, maps)));
  } else {
    out.push_back(title_of(coverage_map_svg(d, r, maps)));
    out.push_back(title_of(max_gap_map_svg(d, r, maps)));
    REQUIRE(r.data_age.has_value());
    out.push_back(title_of(data_age_map_svg(d, r, maps)));
    out.push_back(title_of(coverage_by_latitude_svg(r)));
  }
  out.push_back(title_of(in_view_histogram_svg(r)));
  out.push_back(title_of(gap_cdf_svg(r)));
  return out;
}

}  // namespace

TEST_CASE("lit plot titles: every coverage plot's title says lit with the daylight mask, none without") {
  const std::string global = "    spacing_deg: 15\n";
  const std::string sites = "    kind: sites\n    sites:\n      - {name: amber field, lat_deg: 44, lon_deg: 5}\n";
  for (const std::string& grid : {global, sites}) {
    for (const std::string& t : coverage_titles(grid, true)) {
      CAPTURE(t);
      const bool says_lit = t.find("Lit ") != std::string::npos || t.find(" lit ") != std::string::npos;
      CHECK(says_lit);
    }
    for (const std::string& t : coverage_titles(grid, false)) {
      CAPTURE(t);
      CHECK(t.find("Lit ") == std::string::npos);
      CHECK(t.find(" lit ") == std::string::npos);
    }
  }
}
