#include "skein/search/search_answer.hpp"

#include <algorithm>

#include "skein/sweep/ranking.hpp"

namespace skein {

SearchAnswer settle_answer(const Search& search, const SearchPlan& plan, const std::map<size_t, RowSummary>& rows) {
  SearchAnswer a;
  const RequirementFigure figure = search.space.requirement.figure;
  const std::vector<size_t>& order = plan.order;
  size_t g = 0;
  while (g < order.size()) {
    size_t h = g + 1;
    while (h < order.size() && same_costs(plan.layouts[order[g]], plan.layouts[order[h]])) ++h;
    std::optional<size_t> best;  // position in order
    for (size_t i = g; i < h; ++i) {
      const auto it = rows.find(order[i]);
      if (it == rows.end()) {
        a.open_from = g;
        return a;
      }
      const RowSummary& r = it->second;
      if (r.evaluated && r.meets && (!best || ranks_before(r, rows.at(order[*best]), figure))) best = i;
    }
    if (best) {
      a.settled = true;
      a.optimum = order[*best];
      a.decided_through = h;
      return a;
    }
    g = h;
  }
  a.settled = true;  // every candidate evaluated, none meets
  a.decided_through = order.size();
  a.open_from = order.size();
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
