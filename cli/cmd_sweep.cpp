// skein sweep SWEEP.yaml: evaluate many layouts of one or several shells (coverage and budget), keep every row in a
// journal as it finishes, and write the results table, the best front (meets requirement) and the trade front
// (all layouts). The run is the library's (sweep/sweep_driver.hpp), on the cores of one machine and, started by
// an MPI launcher, over the ranks of a cluster (sweep/rank_group.hpp); here: options, progress and printing.
#include <atomic>
#include <filesystem>
#include <memory>

#include <fmt/format.h>

#include "commands.hpp"
#include "progress.hpp"
#include "skein/input/sweep_file.hpp"
#include "skein/error.hpp"
#include "skein/sweep/sweep_driver.hpp"

namespace skein::cli {
namespace {

struct Options {
  SweepRunOptions run;
  std::string out;
  std::string format = "table";
  bool exhaustive = false;
  int threads = 0;
};

// The opening line on rank 0: what is to be done, and how long the coverage work alone is estimated to take.
std::string plan_text(const SweepPlan& p) {
  std::string shells;
  for (const ShellAxes& a : p.sweep.axes.shells)
    shells += (shells.empty() ? "" : ", ") + p.sweep.base.shells[a.shell_index].name;
  return fmt::format("sweep {}: {} layouts of shell{} {}, {} to evaluate{}{}\n", p.sweep.name, p.set.layouts.size(),
                     p.sweep.axes.shells.size() > 1 ? "s" : "", shells, p.pending,
                     p.ranks > 1 ? fmt::format(" over {} ranks", p.ranks) : "",
                     p.pending_estimate_s >= 60.0 ? fmt::format("; the coverage work alone is estimated at about {} on 2 cores",
                                                                format_duration(p.pending_estimate_s))
                                                  : "");
}

void run(Options opt) {
  const std::unique_ptr<RankGroup> group = join_rank_group();
  const auto threads = limit_threads(opt.threads);
  opt.run.out_dir = !opt.out.empty() ? opt.out : std::filesystem::path(opt.run.folder.sweep_file).stem().string() + "-results";
  opt.run.evaluation.mode = opt.exhaustive ? CoverageMode::exhaustive : CoverageMode::culled;
  SweepReadOptions read;
  read.max_layouts = opt.run.evaluation.force ? hard_max_layouts : default_max_layouts;
  opt.run.read_sweep = [read](const std::string& file) { return read_sweep_file(file, read); };
  std::atomic<long> finished{0};
  std::unique_ptr<Progress> bar;
  SweepRunHooks hooks;
  hooks.started = [&](const SweepPlan& p) {
    print_stderr(plan_text(p));
    bar = std::make_unique<Progress>("sweep", [&finished] { return static_cast<double>(finished.load()); },
                                     static_cast<double>(p.pending), "layouts");
  };
  hooks.row_kept = [&] { finished.fetch_add(1); };
  hooks.ending_all = [](int rank, const std::string& what) {
    print_stderr(rank == 0 ? fmt::format("skein: error: {}\n", what) : fmt::format("skein: rank {}: {}\n", rank, what));
  };
  const SweepRunResult r = run_sweep(opt.run, *group, hooks);
  bar.reset();
  if (r.role == SweepRole::root_reports) throw ReportedElsewhere{};
  if (r.role != SweepRole::wrote_outputs) return;
  print_stderr(sweep_summary_text(r));
  print_caution();
  // Standard output: the best front (meets requirement), cheapest first.
  const OutputFormat f = format_of(opt.format);
  print_stdout(render(r.outputs.best_front, f) + (f == OutputFormat::json ? "\n" : ""));
}

}  // namespace

void add_sweep_command(CLI::App& app) {
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "sweep", "Trade sweep: evaluate coverage and budget for every layout of a sweep file's axes (per varied shell: "
               "T, P, F, pattern, altitude, inclination or sun-synchronous node times; design-wide: elevation mask, "
               "nadir half-angle, drag area, dry mass, mission life, solar activity), mark the layouts meeting the requirement, "
               "name the cheapest layout meeting the requirement and the best front (meets requirement) of requirement figure "
               "against cost, beside the trade front over all layouts. Start it with an MPI launcher "
               "(mpirun -n N skein sweep ...) to split the layouts over ranks");
  cmd->add_option("sweep", opt->run.folder.sweep_file, "Sweep file (YAML)")->required();
  cmd->add_option("--out", opt->out, "Output folder (default: SWEEP-NAME-results in the current folder)");
  add_format_option(*cmd, opt->format);
  add_journal_flags(*cmd, opt->run.folder, "sweep");
  cmd->add_flag("--force", opt->run.evaluation.force,
                "Run above the layout limit (20000) and the coverage work and memory limits of each layout");
  cmd->add_flag("--exhaustive", opt->exhaustive, "Test every (satellite, point) pair instead of culling footprints");
  add_threads_option(*cmd, opt->threads, "Worker threads per process (default: all cores); rows do not depend on it");
  cmd->callback([opt] {
    check_journal_flags(opt->run.folder);
    run(*opt);
  });
}

}  // namespace skein::cli
