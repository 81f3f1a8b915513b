#pragma once
// The record of how a report was made, so that a reader can reproduce every figure: the skein version, the
// command line, the design file and a hash of its bytes (a copy is written beside the report), the Earth
// model, the coverage grid, span, step, mask, cone and fold, and the budget's atmosphere, solar level and
// mission life as they were used (options included).
#include <string>

#include "skein/budget/budget.hpp"
#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"
#include "skein/report/table.hpp"

namespace skein {

struct RunRecordInputs {
  std::string command_line;  // as the user typed it, the output folder written FOLDER (empty: not recorded)
  std::string design_text;   // the design file's bytes (empty: not recorded, no hash)
};

// Two columns, setting and value, one row per setting.
Table run_record_table(const Design& design, const CoverageResult& coverage, const BudgetResult& budget,
                       const RunRecordInputs& inputs);

}  // namespace skein
