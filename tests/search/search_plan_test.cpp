// Evidence for the altitude bracketing of the global cap-area bound in the search plan (search_plan.hpp,
// PlanOptions::bracket_altitude): the plan with bisection over each group's altitudes skips exactly the layouts
// the bound computed for every layout skips, on the global search case and on a space with a fine altitude axis
// (300 to 1500 km every 25 km, where the bound's edge falls inside the axis), and computes fewer bounds. A
// difference would mean the bound is not monotone in altitude, which the bracketing's soundness rests on.
#include <doctest/doctest.h>

#include <string>

#include "skein/input/search_file.hpp"
#include "skein/search/search_plan.hpp"

using namespace skein;

namespace {

void check_same_skips(const Search& search, long& bracketed_evaluations, long& direct_evaluations, long& skipped) {
  const LayoutSet set = expand_layouts(search.space, 100000);
  PlanOptions direct;
  direct.bracket_altitude = false;
  const SearchPlan a = plan_search(search, set);
  const SearchPlan b = plan_search(search, set, direct);
  REQUIRE(a.layouts.size() == b.layouts.size());
  for (size_t i = 0; i < a.layouts.size(); ++i) {
    INFO("layout " << i << ": " << a.layouts[i].bound << " | " << b.layouts[i].bound);
    CHECK(a.layouts[i].skip == b.layouts[i].skip);
  }
  CHECK(a.order == b.order);
  CHECK(a.skipped_cap_area == b.skipped_cap_area);
  bracketed_evaluations = a.cap_evaluations;
  direct_evaluations = b.cap_evaluations;
  skipped = a.skipped_cap_area;
}

}  // namespace

TEST_CASE("search plan: altitude bracketing of the cap bound skips exactly what the bound per layout skips") {
  Search search = read_search_file(std::string(SKEIN_SOURCE_DIR) + "/tests/search/cases/global.yaml");
  long bracketed = 0, direct = 0, skipped = 0;
  check_same_skips(search, bracketed, direct, skipped);
  CHECK(skipped > 0);
  CHECK(bracketed <= direct);
  MESSAGE("global case: " << skipped << " skipped by the cap bound; " << bracketed << " bounds bracketed, " << direct
                          << " per layout");
  // A fine altitude axis, fewer T values: the edge of the bound falls between altitudes of the axis.
  search.space.axes.shells.front().altitude_km.clear();
  for (double h = 300.0; h <= 1500.0; h += 25.0) search.space.axes.shells.front().altitude_km.push_back(h);
  search.space.axes.shells.front().satellites = {4, 6, 8, 10, 12, 14, 16};
  check_same_skips(search, bracketed, direct, skipped);
  CHECK(skipped > 0);
  CHECK(bracketed < direct / 2);
  MESSAGE("fine altitude axis: " << skipped << " skipped by the cap bound; " << bracketed << " bounds bracketed, "
                                 << direct << " per layout");
}
