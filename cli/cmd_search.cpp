// skein search SEARCH.yaml: the cheapest layout meeting a requirement over a space of layouts (the axes of a
// sweep file), found by evaluating layouts in cost order and skipping, with a stated bound for each, the layouts
// that cannot meet it or cannot rank before the answer. The run is the library's (search/search_driver.hpp); here:
// options, progress and printing.
#include <atomic>
#include <filesystem>
#include <memory>
#include <mutex>

#include <fmt/format.h>

#include "commands.hpp"
#include "progress.hpp"
#include "skein/error.hpp"
#include "skein/input/search_file.hpp"
#include "skein/search/search_driver.hpp"

namespace skein::cli {
namespace {

struct Options {
  SearchRunOptions run;
  std::string out;
  std::string format = "table";
  bool exhaustive = false;
  bool as_sweep = false;
  int threads = 0;
  int runners_up = -1;  // -1: the file's search.runners_up
};

std::string costs_short(const Sweep& space, const std::vector<double>& c) {
  std::string t;
  for (size_t k = 0; k < space.costs.size() && k < c.size(); ++k)
    t += fmt::format("{}{}", k ? "/" : "", space.costs[k] == CostFigure::satellites || space.costs[k] == CostFigure::planes
                                               ? fmt::format("{:.0f}", c[k])
                                               : fmt::format("{:.1f}", c[k]));
  return t;
}

void run(Options opt) {
  const SearchReadOptions read{opt.run.evaluation.force ? hard_max_layouts : search_max_layouts};
  if (opt.as_sweep) {
    print_stdout(equivalent_sweep_text(opt.run.folder.sweep_file, read));
    return;
  }
  const std::unique_ptr<RankGroup> group = join_rank_group();
  const auto threads = limit_threads(opt.threads);
  opt.run.out_dir =
      !opt.out.empty() ? opt.out : std::filesystem::path(opt.run.folder.sweep_file).stem().string() + "-search";
  opt.run.evaluation.mode = opt.exhaustive ? CoverageMode::exhaustive : CoverageMode::culled;
  const int runners = opt.runners_up;
  opt.run.read_search = [read, runners](const std::string& file) {
    Search s = read_search_file(file, read);
    if (runners >= 0) s.settings.runners_up = static_cast<size_t>(runners);
    return s;
  };
  // Progress: the share of the space settled (skipped, or before the first undecided cost), the best meeting
  // layout so far and the bound (the costs below which every candidate was evaluated and fails).
  std::mutex m;
  double settled = 0.0, layouts = 0.0;
  std::string note = "evaluating the cheapest layouts";
  std::unique_ptr<Progress> bar;
  const Search* search = nullptr;
  const SearchPlan* plan = nullptr;
  const LayoutSet* set = nullptr;
  SearchRunHooks hooks;
  hooks.started = [&](const Search& s, const LayoutSet& ls, const SearchPlan& p, size_t resumed, int ranks) {
    search = &s;
    plan = &p;
    set = &ls;
    layouts = static_cast<double>(ls.layouts.size());
    settled = static_cast<double>(p.skipped_budget + p.skipped_cap_area);
    print_stderr(fmt::format("search {}: {} layouts, {} skipped by the budget, {} by the cap-area bound, {} candidates "
                             "in cost order ({} resumed){}{}\n",
                             s.space.name, ls.layouts.size(), p.skipped_budget, p.skipped_cap_area, p.order.size(),
                             resumed, ranks > 1 ? fmt::format(" over {} ranks", ranks) : "",
                             s.settings.screen.enabled ? "; each screened first on a prefix span and a sub-grid" : ""));
    bar = std::make_unique<Progress>(
        "search",
        [&] {
          std::lock_guard<std::mutex> lock(m);
          return settled;
        },
        layouts, "", [&] {
          std::lock_guard<std::mutex> lock(m);
          return note;
        });
  };
  hooks.batch_done = [&](const SearchStatus& st) {
    std::lock_guard<std::mutex> lock(m);
    settled = layouts - static_cast<double>(st.candidates - std::min(st.candidates, st.open_from));
    note = fmt::format("best {}  bound {}  left {:.1f} %",
                       st.best ? fmt::format("{} ({})", *st.best, walker_label(set->layouts[*st.best])) : "none",
                       st.bound.empty() ? "-" : costs_short(search->space, st.bound),
                       layouts > 0 ? 100.0 * (layouts - settled) / layouts : 0.0);
  };
  hooks.ending_all = [](int rank, const std::string& what) {
    print_stderr(rank == 0 ? fmt::format("skein: error: {}\n", what) : fmt::format("skein: rank {}: {}\n", rank, what));
  };
  const SearchRunResult r = run_search(opt.run, *group, hooks);
  bar.reset();
  (void)plan;
  if (r.role == SearchRole::root_reports) throw ReportedElsewhere{};
  if (r.role == SearchRole::sent_rows) return;
  if (r.role == SearchRole::stopped_early) {
    print_stderr(fmt::format("search {}: stopped after {} rows as asked (--stop-after); resume with --resume\n",
                             r.search.space.name, r.rows.size()));
    return;
  }
  print_stderr(search_summary_text(r.search, r.set, r.outputs, r.resumed, r.dir, r.written));
  print_caution();
  const OutputFormat f = format_of(opt.format);
  print_stdout(render(r.outputs.answer_table, f) + (f == OutputFormat::json ? "\n" : ""));
}

}  // namespace

void add_search_command(CLI::App& app) {
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "search", "Layout search: the cheapest layout meeting the requirement over the space of a search file (a sweep "
                "file's axes plus a search block), with the fewest evaluations: layouts are evaluated in cost order, "
                "and those the budget or the cap-area bound rules out, or that cost more than the answer, are skipped "
                "with the bound recorded. Start it with an MPI launcher to split each batch over ranks");
  cmd->add_option("search", opt->run.folder.sweep_file, "Search file (YAML)")->required();
  cmd->add_option("--out", opt->out, "Output folder (default: SEARCH-NAME-search in the current folder)");
  add_format_option(*cmd, opt->format);
  cmd->add_flag("--as-sweep", opt->as_sweep,
                "Print the equivalent sweep file (the full sweep over the same space) and stop");
  cmd->add_option("--runners-up", opt->runners_up,
                  "Meeting layouts to list after the optimum (replaces search.runners_up; each costs evaluations)")
      ->check(CLI::Range(0, 1000));
  add_journal_flags(*cmd, opt->run.folder, "search");
  cmd->add_flag("--force", opt->run.evaluation.force,
                "Run above the layout limit (200000) and the coverage work and memory limits of each layout");
  cmd->add_flag("--exhaustive", opt->exhaustive, "Test every (satellite, point) pair instead of culling footprints");
  cmd->add_option("--stop-after", opt->run.stop_after,
                  "For tests: stop at the end of the batch in which N layouts were evaluated, as if killed")
      ->check(CLI::PositiveNumber)
      ->group("");
  add_threads_option(*cmd, opt->threads, "Worker threads per process (default: all cores); results do not depend on it");
  cmd->callback([opt] {
    check_journal_flags(opt->run.folder);
    run(*opt);
  });
}

}  // namespace skein::cli
