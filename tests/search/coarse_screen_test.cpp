// Evidence for the search's coarse-to-fine screen (lib/skein/search/coarse_screen): the one-sided bounds it
// skips on, checked by brute force on real layouts of the two screened test cases (a region grid at fold 2, a
// global grid at fold 1; tests/search/cases): the coverage over the requirement's own grid and span against the
// coverage over the prefix span, over the sub-grid, and over both, point by point and for the grid figures.
//   - A point's longest gap over the prefix is at most its longest over the span (the prefix's gaps lie inside
//     the span's); the prefix's worst instant is at least the span's (its instants are some of the span's).
//   - A sub-grid point's figures are the grid's figures at that point: measured here, the difference stays
//     within the screen's allowances (screen_gap_allowance_s, screen_percent_allowance), so the worst point over
//     the sub-grid is at least the grid's and its max gap at most the grid's, up to the allowance.
// The layouts are every 23rd of each space (covering few to many satellites, both altitudes and inclinations).
// Measured: the sub-grid points' figures equal the grid's exactly (difference 0 s and 0 %) on these layouts.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <string>
#include <utility>

#include "skein/coverage/requirement_check.hpp"
#include "skein/input/search_file.hpp"
#include "skein/search/coarse_screen.hpp"

using namespace skein;

namespace {

const std::string cases = std::string(SKEIN_SOURCE_DIR) + "/tests/search/cases/";

std::pair<long, long> key_of(const GridPoint& p) {
  return {std::lround(p.lat_deg * 1000.0), std::lround(p.lon_deg * 1000.0)};
}

}  // namespace

TEST_CASE("coarse screen: the prefix span is whole steps, at least twice the gap threshold, shorter than the span") {
  CHECK(prefix_span_s(21600.0, 120.0, 0.25) == 5400.0);           // a quarter of 6 h, 45 steps
  CHECK(prefix_span_s(21600.0, 120.0, 0.25, 10800.0) == 10800.0); // twice a 5400 s threshold
  CHECK(prefix_span_s(1000.0, 120.0, 0.25) == 240.0);             // 250 s rounds down to 2 steps
  CHECK(prefix_span_s(1000.0, 300.0, 0.25) == 0.0);               // under one step: no prefix
  CHECK(prefix_span_s(21600.0, 120.0, 0.25, 30000.0) == 0.0);     // not shorter than the span: none
  CHECK(prefix_span_s(21600.0, 120.0, 0.0) == 0.0);               // span_share 0: none
}

TEST_CASE("coarse screen: the sub-grid of a global grid is the coarser grid's centres and the extremes, a subset") {
  // grid.hpp: rows centred at -90 + (i + 1/2) s, columns at -180 + (j + 1/2) s. With s = 10 and stride 3 the
  // kept rows i = 1, 4, ... and columns j = 1, 4, ... are centred at -90 + (i' + 1/2) 30 and -180 + (j' + 1/2) 30:
  // the 30 deg grid's 6 x 12 = 72 centres; besides them at most the 3 extreme points (radius, deflection).
  CoverageSpec spec;
  spec.grid = GridKind::global;
  spec.spacing_deg = 10.0;
  const Grid grid = build_grid(spec, wgs84);
  const Grid sub = sub_grid(grid, 10.0, -90.0, 3);
  std::map<std::pair<long, long>, int> all;
  for (const GridPoint& p : grid.points) all[key_of(p)] = 1;
  int lattice = 0;
  for (const GridPoint& p : sub.points) {
    CHECK(all.count(key_of(p)) == 1);
    const double i = (p.lat_deg + 90.0) / 30.0 - 0.5, j = (p.lon_deg + 180.0) / 30.0 - 0.5;
    lattice += std::abs(i - std::round(i)) < 1e-9 && std::abs(j - std::round(j)) < 1e-9;
  }
  CHECK(lattice == 72);
  CHECK(sub.points.size() <= 75);
  // The extremes are kept: the smallest and largest radius of the grid are the sub-grid's too.
  double lo = 1e300, hi = 0.0, sub_lo = 1e300, sub_hi = 0.0;
  for (const GridPoint& p : grid.points) lo = std::min(lo, p.r_km.norm()), hi = std::max(hi, p.r_km.norm());
  for (const GridPoint& p : sub.points) sub_lo = std::min(sub_lo, p.r_km.norm()), sub_hi = std::max(sub_hi, p.r_km.norm());
  CHECK(sub_lo == lo);
  CHECK(sub_hi == hi);
  CHECK(sub_grid(grid, 10.0, -90.0, 1).points.size() == grid.points.size());
}

TEST_CASE("coarse screen: prefix and sub-grid figures bound the full figures on real layouts") {
  for (const char* name : {"screened-regional.yaml", "screened-global.yaml"}) {
    const Search search = read_search_file(cases + name);
    const Sweep& space = search.space;
    const LayoutSet set = expand_layouts(space, 100000);
    const int fold = space.requirement.fold;
    const size_t k = static_cast<size_t>(fold - 1);
    double worst_gap_diff = 0.0, worst_percent_diff = 0.0;
    int layouts = 0;
    for (size_t i = 0; i < set.layouts.size(); i += 23) {
      const Design design = layout_design(space, set.layouts[i]);
      const CoverageOptions options = sweep_coverage_options(space, {});
      const double prefix = prefix_span_s(design.coverage.span_s, design.coverage.step_s, 0.25);
      REQUIRE(prefix > 0.0);
      const CoverageResult full = evaluate_coarse(design, options, std::nullopt, 1);
      const CoverageResult head = evaluate_coarse(design, options, prefix, 1);
      const CoverageResult sub = evaluate_coarse(design, options, std::nullopt, 3);
      const CoverageResult both = evaluate_coarse(design, options, prefix, 3);
      REQUIRE(head.points.size() == full.points.size());
      REQUIRE(sub.points.size() < full.points.size());
      CHECK(head.span_s == prefix);
      // Prefix, point by point (same grid, same order): gaps cut at the prefix's end are no longer.
      for (size_t p = 0; p < full.points.size(); ++p)
        CHECK(head.points[p].gaps_by_fold[k].max_gap_s <= full.points[p].gaps_by_fold[k].max_gap_s);
      CHECK(grid_figure(head, RequirementFigure::max_gap_s, fold) <= grid_figure(full, RequirementFigure::max_gap_s, fold));
      CHECK(grid_figure(head, RequirementFigure::worst_instant_percent, fold) >=
            grid_figure(full, RequirementFigure::worst_instant_percent, fold));
      // Sub-grid: each point's figures against the same point of the grid.
      std::map<std::pair<long, long>, size_t> at;
      for (size_t p = 0; p < full.points.size(); ++p) at[key_of(full.points[p].point)] = p;
      for (const PointCoverage& q : sub.points) {
        REQUIRE(at.count(key_of(q.point)) == 1);
        const PointCoverage& f = full.points[at.at(key_of(q.point))];
        worst_gap_diff = std::max(worst_gap_diff, std::abs(q.gaps_by_fold[k].max_gap_s - f.gaps_by_fold[k].max_gap_s));
        worst_percent_diff = std::max(worst_percent_diff, std::abs(q.percent_by_fold[k] - f.percent_by_fold[k]));
      }
      for (const PointCoverage& q : both.points) {
        const PointCoverage& h = head.points[at.at(key_of(q.point))];
        worst_gap_diff = std::max(worst_gap_diff, std::abs(q.gaps_by_fold[k].max_gap_s - h.gaps_by_fold[k].max_gap_s));
      }
      // The grid figures the screen skips on, in the direction it uses them (up to the allowance).
      CHECK(grid_figure(sub, RequirementFigure::worst_point_percent, fold) >=
            grid_figure(full, RequirementFigure::worst_point_percent, fold) - screen_percent_allowance);
      CHECK(grid_figure(sub, RequirementFigure::max_gap_s, fold) <=
            grid_figure(full, RequirementFigure::max_gap_s, fold) + screen_gap_allowance_s);
      CHECK(grid_figure(both, RequirementFigure::max_gap_s, fold) <=
            grid_figure(full, RequirementFigure::max_gap_s, fold) + screen_gap_allowance_s);
      ++layouts;
    }
    CHECK(layouts >= 10);
    CHECK(worst_gap_diff <= screen_gap_allowance_s);
    CHECK(worst_percent_diff <= screen_percent_allowance);
    MESSAGE(std::string(name) << ": " << layouts << " layouts; largest sub-grid point difference: gap " << worst_gap_diff
                 << " s, percent " << worst_percent_diff);
  }
}

TEST_CASE("coarse screen: the search file's screen block") {
  // No screen key: off. `screen: {}`: on with the defaults (a quarter of the span, stride 3). Explicit values:
  // as written (the screened regional case: 0.25 and 3; the plain regional case has none).
  const Search plain = read_search_file(cases + "regional.yaml");
  CHECK_FALSE(plain.settings.screen.enabled);
  const Search defaults = read_search_file(cases + "screened-global.yaml");
  CHECK(defaults.settings.screen.enabled);
  CHECK(defaults.settings.screen.span_share == 0.25);
  CHECK(defaults.settings.screen.grid_stride == 3);
  const Search given = read_search_file(cases + "screened-regional.yaml");
  CHECK(given.settings.screen.enabled);
  CHECK(given.settings.screen.span_share == 0.25);
  CHECK(given.settings.screen.grid_stride == 3);
  // screen_applies: the regional case's max_gap_s threshold with a prefix of twice 5400 s inside its 6 h span.
  const LayoutSet set = expand_layouts(given.space, 100000);
  const Design design = layout_design(given.space, set.layouts.front());
  CHECK(screen_prefix_s(given.space, design, given.settings.screen) == 10800.0);
  CHECK(screen_applies(given.space, design, given.settings.screen));
  CHECK_FALSE(screen_applies(plain.space, design, plain.settings.screen));
}
