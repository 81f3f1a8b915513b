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
};

struct SearchPlan {
  std::vector<PlannedLayout> layouts;  // one per layout, in layout order
  std::vector<size_t> order;           // the candidates' layout indices, by costs (exactly, in cost order), then index
  long skipped_budget = 0;
  long skipped_cap_area = 0;
};

// Cost order between two planned layouts: costs compared in order, exactly, then the layout index. The sweep
// breaks a cost tie by the requirement figure before the index (ranking.hpp), which needs the coverage: the
// search evaluates every layout of a cost tie before naming the answer.
bool cost_before(const PlannedLayout& a, const PlannedLayout& b);
bool same_costs(const PlannedLayout& a, const PlannedLayout& b);

// Costs and screens of every layout (in parallel; the result does not depend on the thread count).
SearchPlan plan_search(const Search& search, const LayoutSet& set);

}  // namespace skein
