#pragma once
// The report folder: one design in, every table, figure and export out (the content of `skein report`).
// Pure: hands the files as text to a sink; cli/cmd_report.cpp writes them with a FolderWriter.
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/budget/budget.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/design/design.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/report/land_outlines.hpp"
#include "skein/report/run_record.hpp"

#include "skein/caution.hpp"

namespace skein {


struct ReportOptions {
  CoverageOptions coverage;              // as for `skein coverage` (defaults: the design's coverage block)
  BudgetOptions budget;                  // as for `skein budget` (defaults: the design's budget block)
  std::string creation_date;             // OEM CREATION_DATE (ISO 8601 UTC); the only time stamp written
  std::string originator = "skein";      // OEM ORIGINATOR
  double ephemeris_span_s = 86400.0;     // OEM span from the epoch (1 day)
  double ephemeris_step_s = 60.0;        // OEM sample step
  RunRecordInputs record;                // the command line and the design file's bytes, for the run record
  // Land outlines for the maps (load_land_outlines); without them the maps are drawn bare and say why.
  std::optional<LandOutlines> land;
  std::string land_note = "land outlines missing: no outline file was given";
};

struct Report {
  std::vector<OutputFile> files;         // the two-argument build_report only; paths relative to the folder
  long files_written = 0;                // files handed to the sink
  double bytes_written = 0.0;
  CoverageResult coverage;
  BudgetResult budget;
};

// The size of a report, estimated from the design before anything is computed: files, and bytes (dominated
// by the OEM ephemerides, one per satellite, and by the per-point tables, maps and GeoJSON cells).
struct ReportSizeEstimate {
  double files = 0.0;
  double bytes = 0.0;
};
// Stated limits on a report (common practice: a report meant to be opened and read; --force lifts them).
constexpr double max_report_files = 50000;
constexpr double max_report_bytes = 2.0 * 1024 * 1024 * 1024;  // 2 GiB
ReportSizeEstimate estimate_report_size(const Design& design, const ReportOptions& options);

// Receives each file of the report as it is made (the CLI writes it straight into the staging folder).
using ReportSink = std::function<void(const std::string& relative_path, std::string_view content)>;

// Build every file of the report and hand each to `sink` as soon as it is made, so the ephemerides are
// never all in memory. Deterministic: the same design and options give the same bytes in the same order.
// Throws InputError before any work when the size estimate exceeds max_report_files or max_report_bytes
// (unless options.coverage.force), and for whatever the coverage and budget refuse.
Report build_report(const Design& design, const ReportOptions& options, const ReportSink& sink);
// The same, collecting the files in Report::files (for tests and small designs).
Report build_report(const Design& design, const ReportOptions& options);

}  // namespace skein
