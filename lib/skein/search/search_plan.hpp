#pragma once
// The search's plan before any coverage is run: every layout of the space with its costs (from the count and
// budget figures alone, the same functions a sweep's row uses), the layouts that cannot meet the requirement
// whatever their coverage (skipped, each with its reason and bound), and the others in cost order.
#include <cstddef>
#include <string>
#include <vector>

#include "skein/search/search_spec.hpp"
#include "skein/sweep/layouts.hpp"

namespace skein {

enum class SkipReason {
  none,        // a candidate: evaluated in cost order until the answer is settled
  budget,      // the budget alone fails the requirement or refuses the layout (exact: the sweep's row would fail)
  cap_area,    // the cap-area bound (cap_screen.hpp) rules the layout out
  cost_order,  // after the answer: its costs rank after the optimum's (set by the search, not the plan)
};
std::string_view to_string(SkipReason reason);

struct PlannedLayout {
  size_t layout = 0;
  std::vector<double> costs;  // one per space.costs (0 where the budget refused the layout)
  SkipReason skip = SkipReason::none;
  std::string bound;          // for a skip: the bound it cites, e.g. "cap weight 1.62 < needed 1.8 (fold 2 x 90 %)"
  bool cap_evaluated = false; // its own cap-area bound was computed
};

struct SearchPlan {
  std::vector<PlannedLayout> layouts;  // one per layout, in layout order
  std::vector<size_t> order;           // the candidates' layout indices, by costs (exactly, in cost order), then index
  long skipped_budget = 0;
  long skipped_cap_area = 0;
  long cap_evaluations = 0;            // cap-area bounds computed (fewer than the layouts when bracketed)
};

struct PlanOptions {
  // Global grids: find, for each group of layouts that differ only in the first varied shell's altitude (and
  // in what the cap bound does not read: inclination, P, F, budget inputs), the lowest altitude the cap-area
  // bound lets through by bisection over the group's sorted altitudes, instead of computing the bound for each
  // layout. Sound because the global bound does not decrease with altitude: the footprint's central angle
  // lambda = pi/2 - eps - asin(cos eps R / r) grows with the orbit radius r for a fixed mask eps (and the
  // cone-limited angle pi/2 - eta - acos(sin eta r / R) too, and the smaller of the two), cap_weight_bound
  // grows with lambda, and the supply is a sum of those. It changes only the planning work (a bound is a few
  // microseconds; the budget dominates the plan), never a skip: tests/search/search_plan_test.cpp compares it
  // with the bound computed for every layout. Band and region grids are not bracketed: their time-averaged
  // bound depends on the orbit period through the partial revolution, which is not monotone in altitude.
  bool bracket_altitude = true;
};

// Cost order between two planned layouts: costs compared in order, exactly, then the layout index. The sweep
// breaks a cost tie by the requirement figure before the index (ranking.hpp), which needs the coverage: the
// search evaluates every layout of a cost tie before naming the answer.
bool cost_before(const PlannedLayout& a, const PlannedLayout& b);
bool same_costs(const PlannedLayout& a, const PlannedLayout& b);

// Costs and screens of every layout (in parallel; the result does not depend on the thread count).
SearchPlan plan_search(const Search& search, const LayoutSet& set, const PlanOptions& options = {});

}  // namespace skein
