#pragma once
// The sweep's output files, assembled from the finished rows in layout order (so they are the same, byte for
// byte, whatever the order the rows finished in, the thread count or the MPI rank count): the results table
// (CSV and JSON lines, with a column for each front), the best front (meets requirement) and the trade front
// (all layouts) as tables, and an SVG scatter plot with both fronts.
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/report/table.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/results_rows.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

// The two sets' names, as written in table titles, the plot legend and the command's summary.
constexpr std::string_view best_front_name = "best front (meets requirement)";
constexpr std::string_view trade_front_name = "trade front (all layouts)";

struct SweepSummary {
  size_t layouts = 0;
  size_t evaluated = 0;     // status ok
  size_t errors = 0;        // refused by an evaluator (kept, status error)
  size_t meeting = 0;       // meet the requirement
  size_t best_front = 0;    // on the best front (meets requirement)
  size_t trade_front = 0;   // on the trade front (all layouts)
  SkippedCounts skipped;
  // The cheapest layout meeting the requirement (cheapest_meeting in ranking.hpp): its row's layout index,
  // requirement figure and costs; nullopt when no layout meets the requirement.
  std::optional<RowSummary> cheapest_meeting;
};

struct SweepOutputs {
  Table results;            // every layout, in layout order, with a best_front and a trade_front column
  Table best_front;         // best front (meets requirement), ranked by ranks_before: the first row is the cheapest
  Table trade_front;        // trade front (all layouts), ranked by ranks_before
  std::string results_csv;
  std::string results_jsonl;  // one JSON object per line
  std::string best_front_csv;
  std::string trade_front_csv;
  std::string fronts_svg;   // every evaluated layout, both fronts drawn as their own series; "" when none
  SweepSummary summary;
};

// A table of layouts in the front tables' form: front_layout_cells, the requirement figure, each cost, and with
// `with_meets` whether the layout meets the requirement; one row per entry of `members` (positions in `sums`),
// in the given order. `name` enters the title.
Table front_table(const Sweep& sweep, const LayoutSet& set, const std::vector<RowSummary>& sums,
                  const std::vector<size_t>& members, std::string_view name, bool with_meets);

// `rows` holds the encoded row of every layout of `set` (asserted). Two Pareto sets, each on the objectives
// (requirement figure, every cost):
//  - the best front (meets requirement): the non-dominated layouts among those that meet the requirement;
//  - the trade front (all layouts): the non-dominated layouts among all evaluated ones, passing or not.
// A layout failing the requirement is never on the best front, so it cannot hide a cheaper passing layout.
// The cheapest layout meeting the requirement is the lexicographic minimum of ranking.hpp, and is the first
// row of the best front.
SweepOutputs assemble_outputs(const Sweep& sweep, const LayoutSet& set, const std::map<size_t, std::string>& rows);

}  // namespace skein
