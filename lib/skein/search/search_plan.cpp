#include "skein/search/search_plan.hpp"

#include <algorithm>

#include <fmt/format.h>
#include <tbb/parallel_for.h>

#include "skein/error.hpp"
#include "skein/search/cap_screen.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {

std::string_view to_string(SkipReason r) {
  switch (r) {
    case SkipReason::none: return "candidate";
    case SkipReason::budget: return "budget";
    case SkipReason::cap_area: return "cap-area bound";
    case SkipReason::cost_order: return "cost order";
  }
  return "?";
}

bool same_costs(const PlannedLayout& a, const PlannedLayout& b) { return a.costs == b.costs; }

bool cost_before(const PlannedLayout& a, const PlannedLayout& b) {
  for (size_t k = 0; k < a.costs.size() && k < b.costs.size(); ++k)
    if (a.costs[k] != b.costs[k]) return a.costs[k] < b.costs[k];
  return a.layout < b.layout;
}

namespace {

PlannedLayout plan_one(const Search& search, const Layout& layout) {
  const Sweep& space = search.space;
  PlannedLayout p;
  p.layout = layout.index;
  const Design design = layout_design(space, layout);
  LayoutMetrics m;
  fill_count_metrics(design, m);
  try {
    fill_budget_metrics(design, space.shell_index, space.budget_percentile, m);
  } catch (const InputError& e) {
    // The sweep's row for this layout would be an error row (not evaluated): it never meets.
    p.costs = cost_values(space, m);
    p.skip = SkipReason::budget;
    p.bound = fmt::format("the budget refuses the layout: {}", e.what());
    return p;
  }
  p.costs = cost_values(space, m);
  const std::vector<std::string> fails = budget_failures(space.requirement, m);
  if (!fails.empty()) {
    p.skip = SkipReason::budget;
    std::string text;
    for (const auto& f : fails) text += (text.empty() ? "" : "; ") + f;
    for (const auto& f : m.cannot_fly) text += "; " + f;
    p.bound = text;
    return p;
  }
  if (const auto s = cap_screen(design, space.requirement); s && s->rules_out()) {
    p.skip = SkipReason::cap_area;
    p.bound = fmt::format("the caps of {} satellites hold at most {:.6g} of the grid's weight {}, below the "
                          "{:.6g} that fold {} at {:.6g} % needs",
                          m.design_satellites, s->supply,
                          s->time_average ? "on time average (each cap counted only while its sub-satellite latitude "
                                            "is within reach of the grid)"
                                          : "at once",
                          s->need, space.requirement.fold, s->threshold_percent);
  }
  return p;
}

}  // namespace

SearchPlan plan_search(const Search& search, const LayoutSet& set) {
  SearchPlan plan;
  plan.layouts.resize(set.layouts.size());
  tbb::parallel_for(size_t{0}, set.layouts.size(),
                    [&](size_t i) { plan.layouts[i] = plan_one(search, set.layouts[i]); });
  for (const PlannedLayout& p : plan.layouts) {
    if (p.skip == SkipReason::budget) ++plan.skipped_budget;
    if (p.skip == SkipReason::cap_area) ++plan.skipped_cap_area;
    if (p.skip == SkipReason::none) plan.order.push_back(p.layout);
  }
  std::sort(plan.order.begin(), plan.order.end(),
            [&](size_t a, size_t b) { return cost_before(plan.layouts[a], plan.layouts[b]); });
  return plan;
}

}  // namespace skein
