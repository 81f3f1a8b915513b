#include "skein/search/search_answer.hpp"

#include <algorithm>

#include "skein/sweep/ranking.hpp"

namespace skein {

SearchAnswer settle_answer(const Search& search, const SearchPlan& plan, const std::map<size_t, RowSummary>& rows) {
  SearchAnswer a;
  const RequirementFigure figure = search.space.requirement.figure;
  const std::vector<size_t>& order = plan.order;
  const size_t wanted = 1 + search.settings.runners_up;  // the optimum and its runners-up
  size_t found = 0;
  size_t g = 0;
  while (g < order.size()) {
    size_t h = g + 1;
    while (h < order.size() && same_costs(plan.layouts[order[g]], plan.layouts[order[h]])) ++h;
    std::vector<RowSummary> meeting;
    for (size_t i = g; i < h; ++i) {
      const auto it = rows.find(order[i]);
      if (it == rows.end()) {
        a.open_from = g;
        return a;
      }
      if (it->second.evaluated && it->second.meets) meeting.push_back(it->second);
    }
    std::sort(meeting.begin(), meeting.end(),
              [&](const RowSummary& x, const RowSummary& y) { return ranks_before(x, y, figure); });
    for (const RowSummary& r : meeting) {
      if (!a.optimum)
        a.optimum = r.layout;
      else if (a.runners_up.size() < search.settings.runners_up)
        a.runners_up.push_back(r.layout);
    }
    found += meeting.size();
    g = h;
    if (found >= wanted) break;
  }
  a.settled = true;  // the optimum and its runners-up are known, or every candidate is evaluated
  a.decided_through = g;
  a.open_from = g;
  return a;
}

std::vector<size_t> meeting_in_rank_order(const Search& search, const std::map<size_t, RowSummary>& rows) {
  std::vector<RowSummary> meeting;
  for (const auto& [i, r] : rows)
    if (r.evaluated && r.meets) meeting.push_back(r);
  const RequirementFigure figure = search.space.requirement.figure;
  std::sort(meeting.begin(), meeting.end(),
            [&](const RowSummary& x, const RowSummary& y) { return ranks_before(x, y, figure); });
  std::vector<size_t> out;
  for (const RowSummary& r : meeting) out.push_back(r.layout);
  return out;
}

}  // namespace skein
