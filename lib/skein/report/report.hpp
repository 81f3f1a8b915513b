#pragma once
// The report folder: one design in, every table, figure and export out (the content of `skein report`).
// Pure: returns the files as text; cli/cmd_report.cpp writes them with write_folder_atomic.
#include <optional>
#include <string>
#include <vector>

#include "skein/budget/budget.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/design/design.hpp"
#include "skein/io/folder_write.hpp"

namespace skein {

// The usual caution printed with every report.
inline constexpr std::string_view report_caution =
    "These are preliminary design estimates; operations, collision avoidance and licensing follow the applicable "
    "national rules, international debris-mitigation standards and licensed flight-dynamics practice.";

struct ReportOptions {
  CoverageOptions coverage;              // as for `skein coverage` (defaults: the design's coverage block)
  BudgetOptions budget;                  // as for `skein budget` (defaults: the design's budget block)
  std::string creation_date;             // OEM CREATION_DATE (ISO 8601 UTC); the only time stamp written
  std::string originator = "skein";      // OEM ORIGINATOR
  double ephemeris_span_s = 86400.0;     // OEM span from the epoch (1 day)
  double ephemeris_step_s = 60.0;        // OEM sample step
};

struct Report {
  std::vector<OutputFile> files;         // in a fixed order; paths relative to the report folder
  CoverageResult coverage;
  BudgetResult budget;
};

// Build every file of the report. Deterministic: the same design and options give the same bytes.
Report build_report(const Design& design, const ReportOptions& options);

}  // namespace skein
