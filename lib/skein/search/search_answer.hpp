#pragma once
// When the search's answer is settled, and what it is. The candidates are walked in cost order, one cost tie
// (equal costs, exactly) at a time: a tie with an unevaluated member leaves the answer open; a tie whose
// members are all evaluated and some meet the requirement holds the answer, the best of them by the sweep's
// own order (ranking.hpp: the requirement figure best first, then the layout index); a tie where none meets
// passes to the next. Every candidate after the answer's tie costs more than the answer (its costs rank after),
// so no layout the search does not evaluate can rank before it: the answer is the sweep's cheapest layout
// meeting the requirement over the same space. The walk goes on through whole ties until settings.runners_up
// more meeting layouts are found: they are then the next meeting layouts of the sweep's order over the whole
// space (fewer when the space holds fewer).
#include <cstddef>
#include <map>
#include <optional>
#include <vector>

#include "skein/search/search_plan.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {

struct SearchAnswer {
  bool settled = false;           // the answer is known (an optimum, or none meets in the whole space)
  std::optional<size_t> optimum;  // layout index
  std::vector<size_t> runners_up; // the next meeting layouts in the sweep's order (layout indices)
  size_t decided_through = 0;     // positions of plan.order up to here (exclusive) were needed (the ties of the
                                  // optimum and runners-up); the rest is skipped by cost order once settled
  size_t open_from = 0;           // the first position whose tie is not fully evaluated (when not settled)
};

// `rows`: the summaries of the evaluated layouts, by layout index.
SearchAnswer settle_answer(const Search& search, const SearchPlan& plan, const std::map<size_t, RowSummary>& rows);

// Evaluated layouts meeting the requirement, in the sweep's order (ranks_before), the optimum first.
std::vector<size_t> meeting_in_rank_order(const Search& search, const std::map<size_t, RowSummary>& rows);

}  // namespace skein
