#pragma once
// The order in which a sweep ranks its layouts by what they cost, and the answer the user acts on: the
// cheapest layout that meets the requirement.
#include <cstddef>
#include <optional>
#include <vector>

#include "skein/sweep/results_rows.hpp"

namespace skein {

// True when row a ranks before row b: the costs compared in their stated order (the first cost, then the next
// to break a tie, ...), then the requirement figure best first (higher first for percent figures, lower first
// for gaps and response time), then the lower layout index (the earlier layout in the fixed numbering, so the
// order is total and does not depend on the order rows finished in). Values are compared exactly, as stored.
bool ranks_before(const RowSummary& a, const RowSummary& b, RequirementFigure figure);

// The position in `rows` of the cheapest layout meeting the requirement: the minimum of ranks_before over the
// evaluated rows that meet it; nullopt when none does. Rows failing the requirement never take part, so they
// cannot hide a cheaper passing layout.
std::optional<size_t> cheapest_meeting(const std::vector<RowSummary>& rows, RequirementFigure figure);

}  // namespace skein
