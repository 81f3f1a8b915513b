#include "skein/sweep/sweep_driver.hpp"

#include <algorithm>
#include <cassert>
#include <exception>
#include <filesystem>
#include <map>
#include <mutex>
#include <stdexcept>
#include <thread>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/rank_share.hpp"
#include "skein/sweep/sweep_run.hpp"

namespace skein {
namespace {

void write_outputs(SweepRunResult& r, const std::map<size_t, std::string>& rows) {
  r.outputs = assemble_outputs(r.sweep, r.set, rows);
  const std::vector<std::pair<std::string, const std::string*>> files = {
      {"results.csv", &r.outputs.results_csv},
      {"results.jsonl", &r.outputs.results_jsonl},
      {"best_front.csv", &r.outputs.best_front_csv},
      {"trade_front.csv", &r.outputs.trade_front_csv},
      {"fronts.svg", &r.outputs.fronts_svg}};
  for (const auto& [name, text] : files) {
    if (name == "fronts.svg" && text->empty()) continue;
    write_file_atomic((std::filesystem::path(r.dir) / name).string(), *text);
    r.written.push_back(name);
  }
}

// The result of a rank other than 0: its role alone.
SweepRunResult role_only(SweepRole role) {
  SweepRunResult r;
  r.role = role;
  return r;
}

// "satellites 32, fleet_dv_m_s 4325.12, percent_covered 57.3" for the summary line.
std::string figures_text(const Sweep& sweep, const RowSummary& row) {
  std::string text;
  for (size_t k = 0; k < sweep.costs.size(); ++k)
    text += fmt::format("{}{} {}", k ? ", " : "", to_string(sweep.costs[k]),
                        sweep.costs[k] == CostFigure::satellites || sweep.costs[k] == CostFigure::planes
                            ? fmt::format("{:.0f}", row.costs[k])
                            : fmt::format("{:.2f}", row.costs[k]));
  return text + fmt::format(", {} {:.3f}", to_string(sweep.requirement.figure), row.figure);
}

}  // namespace

SweepRunResult run_sweep(const SweepRunOptions& options, RankGroup& group, const SweepRunHooks& hooks) {
  const int rank = group.rank(), ranks = group.size();
  SweepRunResult result;
  result.dir = options.out_dir;
  Sweep& sweep = result.sweep;
  LayoutSet& set = result.set;
  const LayoutEvaluationOptions& eval = options.evaluation;
  double estimate_s = 0.0;
  try {
    assert(options.read_sweep && "SweepRunOptions::read_sweep is required");
    sweep = options.read_sweep(options.folder.sweep_file);
    set = expand_layouts(sweep, eval.force ? hard_max_layouts : default_max_layouts);
    estimate_s = estimate_sweep_seconds(sweep, set, eval);
  } catch (const InputError&) {
    if (rank != 0) return role_only(SweepRole::root_reports);  // every rank read the same file
    throw;
  }

  const RankJournal journaled =
      open_journal_over_ranks(options.folder, options.out_dir, sweep, set, group, hooks.ending_all);
  if (!journaled.ok) return role_only(SweepRole::root_reports);
  std::map<size_t, std::string> rows = journaled.rows;
  result.damaged_lines = journaled.damaged_lines;
  std::vector<size_t> pending;
  for (size_t i = 0; i < set.layouts.size(); ++i)
    if (journaled.finished[i] == '0') pending.push_back(i);
  const std::vector<size_t> share = round_robin_share(pending, rank, ranks);

  if (rank != 0) {
    send_share(sweep, set, share, group, eval, hooks.ending_all);
    return role_only(SweepRole::sent_rows);
  }

  result.resumed = static_cast<long>(set.layouts.size() - pending.size());
  if (hooks.started)
    hooks.started(SweepPlan{sweep, set, pending.size(), ranks,
                            estimate_s * static_cast<double>(pending.size()) /
                                static_cast<double>(std::max<size_t>(1, set.layouts.size()))});
  JournalWriter journal(journal_path(options.out_dir));
  std::mutex rows_mutex;
  auto keep = [&](size_t i, const std::string& row) {
    std::lock_guard<std::mutex> lock(rows_mutex);
    if (rows.count(i)) return;
    journal.append(journal_line(i, row));
    rows.emplace(i, row);
    if (hooks.row_kept) hooks.row_kept();
  };
  keep_share_and_receive(sweep, set, share, group, keep, eval, hooks.ending_all);
  if (rows.size() != set.layouts.size())
    throw std::runtime_error(fmt::format("{} of {} rows arrived", rows.size(), set.layouts.size()));
  write_outputs(result, rows);
  return result;
}

std::string sweep_summary_text(const SweepRunResult& r) {
  const SweepSummary& s = r.outputs.summary;
  std::string note = fmt::format(
      "sweep {}: {} layouts ({} resumed from the journal{}), {} evaluated, {} refused by an evaluator, {} meet the "
      "requirement; {} on the {}, {} on the {}\n",
      r.sweep.name, s.layouts, r.resumed,
      r.damaged_lines ? fmt::format(", {} damaged or repeated journal lines dropped", r.damaged_lines) : "",
      s.evaluated, s.errors, s.meeting, s.best_front, best_front_name, s.trade_front, trade_front_name);
  if (s.skipped.total() > 0)
    note += fmt::format("skipped combinations: {} (P not dividing T: {}, F outside 0..P-1: {}, no sun-synchronous "
                        "inclination: {}, fold above the satellite count: {})\n",
                        s.skipped.total(), s.skipped.planes_not_dividing, s.skipped.phasing_out_of_range,
                        s.skipped.no_sun_synchronous, s.skipped.fold_above_satellites);
  if (s.cheapest_meeting)
    note += fmt::format("cheapest layout meeting the requirement: {} ({}): {}\n", s.cheapest_meeting->layout,
                        walker_label(r.set.layouts[s.cheapest_meeting->layout]),
                        figures_text(r.sweep, *s.cheapest_meeting));
  else
    note += fmt::format("no layout meets the requirement: the best front is empty; the {} is in trade_front.csv\n",
                        trade_front_name);
  std::string files;
  for (size_t k = 0; k < r.written.size(); ++k) files += (k == 0 ? r.dir + "/" : ", ") + r.written[k];
  note += fmt::format("written: {}\n", files);
  return note;
}

}  // namespace skein
