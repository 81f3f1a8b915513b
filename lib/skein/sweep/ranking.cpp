#include "skein/sweep/ranking.hpp"

#include <cassert>

namespace skein {

bool ranks_before(const RowSummary& a, const RowSummary& b, RequirementFigure figure) {
  assert(a.costs.size() == b.costs.size());
  for (size_t k = 0; k < a.costs.size(); ++k)
    if (a.costs[k] != b.costs[k]) return a.costs[k] < b.costs[k];
  if (a.figure != b.figure) return higher_is_better(figure) ? a.figure > b.figure : a.figure < b.figure;
  return a.layout < b.layout;
}

std::optional<size_t> cheapest_meeting(const std::vector<RowSummary>& rows, RequirementFigure figure) {
  std::optional<size_t> best;
  for (size_t i = 0; i < rows.size(); ++i) {
    if (!rows[i].evaluated || !rows[i].meets) continue;
    if (!best || ranks_before(rows[i], rows[*best], figure)) best = i;
  }
  return best;
}

}  // namespace skein
