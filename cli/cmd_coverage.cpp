// skein coverage DESIGN.yaml: k-fold coverage, revisit gaps and required radius over the design's ground grid.
#include <unistd.h>

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <memory>
#include <mutex>
#include <thread>

#include <fmt/format.h>

#include "commands.hpp"
#include "progress.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/io/output_file.hpp"
#include "skein/report/coverage_tables.hpp"

namespace skein::cli {
namespace {


}  // namespace

void add_coverage_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string format = "table";
    std::optional<double> spacing, span_h, step, elevation;
    std::optional<int> fold;
    bool exhaustive = false, force = false, overwrite = false;
    int threads = 0;
    std::string points_file;
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "coverage", "Percent of time each ground point sees at least k satellites above the elevation mask, revisit gaps, "
                  "mean response time, satellites in view and the required coverage radius, area-weighted over the grid "
                  "and by latitude band");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  add_format_option(*cmd, opt->format);
  cmd->add_option("--spacing", opt->spacing, "Grid cell size in degrees (overrides coverage.grid.spacing_deg)");
  cmd->add_option("--span", opt->span_h, "Time span in hours from the epoch (overrides coverage.span_h)");
  cmd->add_option("--step", opt->step, "Time step in seconds (overrides coverage.step_s)");
  cmd->add_option("--elevation", opt->elevation, "Minimum elevation in degrees (overrides coverage.min_elevation_deg)");
  cmd->add_option("--fold", opt->fold, "Largest fold K reported (overrides coverage.max_fold)");
  cmd->add_flag("--exhaustive", opt->exhaustive, "Test every (satellite, point) pair instead of culling footprints");
  add_threads_option(*cmd, opt->threads, "Worker threads (default: all cores); results do not depend on it");
  cmd->add_flag("--force", opt->force, "Run even when the memory or work estimate exceeds the limits");
  cmd->add_option("--points", opt->points_file,
                  "Also write the per-point table (with cell bounds) to this CSV file; an existing file is replaced "
                  "only when it is empty or a points file skein wrote before");
  cmd->add_flag("--overwrite", opt->overwrite, "Replace the --points file even when skein did not write it");
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    OutputFileCheck points_check{"--points", std::string(point_table_csv_signature), opt->overwrite, {opt->design}};
    if (!opt->points_file.empty()) check_output_file(opt->points_file, points_check);  // before any work
    CoverageOptions options;
    options.spacing_deg = opt->spacing;
    if (opt->span_h) options.span_s = *opt->span_h * 3600.0;
    options.step_s = opt->step;
    options.min_elevation_deg = opt->elevation;
    options.max_fold = opt->fold;
    options.mode = opt->exhaustive ? CoverageMode::exhaustive : CoverageMode::culled;
    options.force = opt->force;
    const auto threads = limit_threads(opt->threads);
    std::atomic<std::int64_t> done{0};
    CoverageResult result;
    const CoveragePlan plan = naming_flags(
        {{"coverage.grid.spacing_deg", "--spacing", opt->spacing.has_value()},
         {"coverage.span_h", "--span", opt->span_h.has_value()},
         {"coverage.step_s", "--step", opt->step.has_value()},
         {"coverage.min_elevation_deg", "--elevation", opt->elevation.has_value()},
         {"coverage.max_fold", "--fold", opt->fold.has_value()}},
        [&] { return plan_coverage(design, options); });  // settings, guard and grid, once
    if (isatty(STDERR_FILENO)) {
      options.progress = &done;
      Progress line("coverage", [&done] { return static_cast<double>(done.load()); },
                    std::max(1.0, plan.estimate.point_steps));
      result = evaluate_coverage(design, plan, options);
    } else {
      result = evaluate_coverage(design, plan, options);
    }
    const Table overview = coverage_overview_table(result), folds = coverage_fold_table(result),
                bands = coverage_band_table(result);
    if (!opt->points_file.empty()) check_output_file(opt->points_file, points_check);  // again: it may have appeared
    if (!opt->points_file.empty()) write_file_atomic(opt->points_file, render_csv(coverage_point_table(result)));
    const OutputFormat f = format_of(opt->format);
    if (f == OutputFormat::json) {
      nlohmann::ordered_json j = coverage_json(result);
      // Site grids: every pass over every site (the report's tables/site_passes.*).
      if (result.grid == GridKind::sites)
        j["site_passes"] = rows_to_json(site_pass_table(result, find_site_passes(design, result), design.epoch));
      print_stdout(j.dump(2) + "\n");
    } else if (f == OutputFormat::csv) {
      print_stdout(render_csv(result.grid == GridKind::sites ? coverage_site_table(result) : bands));
    } else {
      std::string requirement;
      if (result.requirement)
        requirement = render_text(coverage_requirement_table(result)) + coverage_requirement_line(result) + "\n\n";
      print_stdout(render_text(overview) + "\n" + coverage_between_instants_note(result) + "\n\n" + requirement +
                   render_text(folds) + "\n" +
                   render_text(result.grid == GridKind::sites ? coverage_site_table(result) : bands) + "\n" +
                   render_text(in_view_distribution_table(result)) +
                   (result.data_age ? "\n" + render_text(data_age_table(result)) : std::string()));
    }
    print_caution();
  });
}

}  // namespace skein::cli
