#include "skein/search/search_plan.hpp"

#include <algorithm>
#include <map>
#include <optional>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/parallel_items.hpp"
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

std::string cap_text(const Search& search, int satellites, const CapScreen& s) {
  return fmt::format("the caps of {} satellites hold at most {:.6g} of the grid's weight {}, below the "
                     "{:.6g} that fold {} at {:.6g} % needs",
                     satellites, s.supply,
                     s.time_average ? "on time average (each cap counted only while its sub-satellite latitude "
                                      "is within reach of the grid)"
                                    : "at once",
                     s.need, search.space.requirement.fold, s.threshold_percent);
}

PlannedLayout plan_one(const Search& search, const Layout& layout, bool defer_caps) {
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
  if (defer_caps) return p;
  p.cap_evaluated = true;
  if (const auto s = cap_screen(design, space.requirement); s && s->rules_out()) {
    p.skip = SkipReason::cap_area;
    p.bound = cap_text(search, m.design_satellites, *s);
  }
  return p;
}

// The layouts' values the global cap bound reads, but the first varied shell's altitude: every varied shell's
// T, the other varied shells' altitudes, the elevation mask and the nadir half-angle.
std::vector<double> cap_group_key(const Layout& l) {
  std::vector<double> k;
  for (size_t s = 0; s < l.shells.size(); ++s) {
    k.push_back(static_cast<double>(l.shells[s].shell_index));
    k.push_back(static_cast<double>(l.shells[s].satellites));
    if (s > 0) k.push_back(l.shells[s].altitude_km);
  }
  k.push_back(l.min_elevation_deg);
  k.push_back(l.nadir_half_angle_deg ? *l.nadir_half_angle_deg : -1.0);
  return k;
}

// Bracketing of the global cap bound in the first varied shell's altitude (PlanOptions::bracket_altitude).
void bracket_caps(const Search& search, const LayoutSet& set, SearchPlan& plan) {
  std::map<std::vector<double>, std::vector<size_t>> grouped;
  for (const Layout& l : set.layouts) grouped[cap_group_key(l)].push_back(l.index);
  std::vector<std::vector<size_t>> groups;
  for (auto& [key, members] : grouped) groups.push_back(std::move(members));
  std::vector<long> evaluations(groups.size(), 0);
  parallel_items(groups.size(), [&](size_t g) {
    std::vector<size_t>& members = groups[g];
    const auto alt = [&](size_t i) { return set.layouts[i].shells.front().altitude_km; };
    std::stable_sort(members.begin(), members.end(), [&](size_t a, size_t b) { return alt(a) < alt(b); });
    std::vector<size_t> rep;  // the first member at each distinct altitude, lowest first
    for (size_t i : members)
      if (rep.empty() || alt(rep.back()) != alt(i)) rep.push_back(i);
    // Invariant: the altitudes below lo are ruled out, those from hi on are not.
    size_t lo = 0, hi = rep.size();
    std::optional<CapScreen> highest_out;
    int satellites = 0;
    while (lo < hi) {
      const size_t mid = lo + (hi - lo) / 2;
      const Design design = layout_design(search.space, set.layouts[rep[mid]]);
      const auto s = cap_screen(design, search.space.requirement);
      ++evaluations[g];
      if (!s) return;  // the bound does not apply (the same for every layout of the space)
      if (s->rules_out()) {
        lo = mid + 1;
        highest_out = s;
        LayoutMetrics m;
        fill_count_metrics(design, m);
        satellites = m.design_satellites;
      } else {
        hi = mid;
      }
    }
    if (lo == 0) return;
    const double top = alt(rep[lo - 1]);
    for (size_t i : members) {
      if (alt(i) > top) break;
      PlannedLayout& p = plan.layouts[i];
      if (p.skip != SkipReason::none) continue;
      p.skip = SkipReason::cap_area;
      p.bound = alt(i) == top
                    ? cap_text(search, satellites, *highest_out)
                    : fmt::format("bracketed in altitude: at {:g} km, the highest altitude ruled out among the layouts "
                                  "that differ from this one only in altitude, inclination, P, F or budget inputs, {}; "
                                  "the bound does not decrease with altitude (the footprint grows with the orbit "
                                  "radius), so it rules out {:g} km too",
                                  top, cap_text(search, satellites, *highest_out), alt(i));
    }
  });
  for (long e : evaluations) plan.cap_evaluations += e;
}

}  // namespace

SearchPlan plan_search(const Search& search, const LayoutSet& set, const PlanOptions& options) {
  SearchPlan plan;
  plan.layouts.resize(set.layouts.size());
  const bool bracket = options.bracket_altitude && !set.layouts.empty() && !set.layouts.front().shells.empty() &&
                       search.space.base.coverage.grid == GridKind::global;
  parallel_items(set.layouts.size(), [&](size_t i) { plan.layouts[i] = plan_one(search, set.layouts[i], bracket); });
  for (const PlannedLayout& p : plan.layouts) plan.cap_evaluations += p.cap_evaluated;
  if (bracket) bracket_caps(search, set, plan);
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
