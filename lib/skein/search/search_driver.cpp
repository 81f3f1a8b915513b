#include "skein/search/search_driver.hpp"

#include <algorithm>
#include <cassert>
#include <exception>
#include <filesystem>
#include <mutex>
#include <set>
#include <stdexcept>
#include <thread>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/parallel_items.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/rank_share.hpp"
#include "skein/sweep/sweep_run.hpp"

namespace skein {
namespace {

SearchRunResult role_only(SearchRole role) {
  SearchRunResult r;
  r.role = role;
  return r;
}

RowSummary summary_of(const Sweep& space, const std::string& row) {
  const auto cells = decode_row(row, sweep_columns(space).size());
  assert(cells && "rows are checked when read");
  return summarize_row(space, *cells);
}

// The status after the batches before position `through` of the cost order.
SearchStatus status_of(const Search& search, const SearchPlan& plan, const std::map<size_t, RowSummary>& sums,
                       const SearchAnswer& a, size_t screened) {
  SearchStatus s;
  s.candidates = plan.order.size();
  s.screened = screened;
  s.evaluated = sums.size() - screened;
  s.open_from = a.settled ? a.decided_through : a.open_from;
  const auto ranked = meeting_in_rank_order(search, sums);
  if (!ranked.empty()) s.best = ranked.front();
  if (s.open_from < plan.order.size()) s.bound = plan.layouts[plan.order[s.open_from]].costs;
  return s;
}

}  // namespace

SearchRunResult run_search(const SearchRunOptions& options, RankGroup& group, const SearchRunHooks& hooks) {
  const int rank = group.rank(), ranks = group.size();
  SearchRunResult result;
  result.dir = options.out_dir;
  Search& search = result.search;
  LayoutSet& set = result.set;
  try {
    assert(options.read_search && "SearchRunOptions::read_search is required");
    search = options.read_search(options.folder.sweep_file);
    set = expand_layouts(search.space, hard_max_layouts);
    result.plan = plan_search(search, set);
  } catch (const InputError&) {
    if (rank != 0) return role_only(SearchRole::root_reports);
    throw;
  }
  const Sweep& space = search.space;
  const SearchPlan& plan = result.plan;

  const RankJournal journaled =
      open_journal_over_ranks(options.folder, options.out_dir, space, set, group, hooks.ending_all);
  if (!journaled.ok) return role_only(SearchRole::root_reports);
  std::map<size_t, std::string>& rows = result.rows;
  rows = journaled.rows;
  result.damaged_lines = journaled.damaged_lines;
  const LayoutEvaluationOptions& eval = options.evaluation;
  result.resumed = static_cast<long>(rows.size());
  if (rank == 0 && hooks.started) hooks.started(search, set, plan, rows.size(), ranks);

  std::unique_ptr<JournalWriter> journal;
  if (rank == 0) journal = std::make_unique<JournalWriter>(journal_path(options.out_dir));
  std::mutex rows_mutex;
  long fresh = 0;
  auto keep = [&](size_t i, const std::string& row) {
    std::lock_guard<std::mutex> lock(rows_mutex);
    if (rows.count(i)) return;
    journal->append(journal_line(i, row));
    rows.emplace(i, row);
    ++fresh;
    if (hooks.row_kept) hooks.row_kept();
  };

  const size_t batch = std::max<size_t>(1, search.settings.batch);
  std::map<size_t, RowSummary> sums;  // rows of the batches before `position` only
  size_t position = 0;
  bool stopped = false;
  while (true) {
    std::string command = "go";
    if (rank == 0) {
      for (size_t p = position > batch ? position - batch : 0; p < std::min(position, plan.order.size()); ++p) {
        const size_t i = plan.order[p];
        if (sums.count(i)) continue;
        if (result.screened.count(i)) {
          RowSummary ruled_out;  // the screen proved it fails: it never meets
          ruled_out.layout = i;
          ruled_out.costs = plan.layouts[i].costs;
          sums.emplace(i, ruled_out);
        } else {
          sums.emplace(i, summary_of(space, rows.at(i)));
        }
      }
      result.answer = settle_answer(search, plan, sums);
      if (position > 0 && hooks.batch_done) hooks.batch_done(status_of(search, plan, sums, result.answer, result.screened.size()));
      if (result.answer.settled)
        command = "stop";
      else if (options.stop_after > 0 && fresh >= options.stop_after)
        command = "halt";
    }
    group.broadcast_from_root(command);
    if (command == "halt") stopped = true;
    if (command != "go") break;
    std::vector<size_t> pending;
    for (size_t p = position; p < std::min(position + batch, plan.order.size()); ++p)
      if (journaled.finished[plan.order[p]] == '0') pending.push_back(plan.order[p]);
    position += batch;
    if (search.settings.screen.enabled) {
      std::string ruled_out;  // rank 0's screen of the pending layouts: the indices it rules out
      if (rank == 0) {
        std::vector<ScreenOutcome> outcomes(pending.size());
        parallel_items(pending.size(), [&](size_t q) {
          outcomes[q] = screen_layout(space, set.layouts[pending[q]], search.settings.screen, eval);
        });
        for (size_t q = 0; q < pending.size(); ++q) {
          result.coarse_runs += outcomes[q].coarse_runs;
          if (!outcomes[q].rules_out) continue;
          result.screened.emplace(pending[q], outcomes[q]);
          ruled_out += fmt::format("{} ", pending[q]);
        }
      }
      group.broadcast_from_root(ruled_out);
      std::set<size_t> out;
      size_t start = 0;
      while (start < ruled_out.size()) {
        const size_t end = ruled_out.find(' ', start);
        out.insert(static_cast<size_t>(std::stoull(ruled_out.substr(start, end - start))));
        start = end + 1;
      }
      std::vector<size_t> kept;
      for (size_t i : pending)
        if (!out.count(i)) kept.push_back(i);
      pending = std::move(kept);
    }
    const std::vector<size_t> share = round_robin_share(pending, rank, ranks);
    if (rank != 0) {
      send_share(space, set, share, group, eval, hooks.ending_all);
      continue;
    }
    keep_share_and_receive(space, set, share, group, keep, eval, hooks.ending_all);
    for (size_t i : pending)
      if (!rows.count(i)) throw std::runtime_error(fmt::format("the row of layout {} did not arrive", i));
  }
  if (rank != 0) return role_only(SearchRole::sent_rows);
  if (stopped) {
    result.role = SearchRole::stopped_early;
    return result;
  }
  // Only rows of the batches run take part (a journal never holds others: it is this search's, same file).
  std::map<size_t, std::string> used;
  for (const auto& [i, s] : sums)
    if (!result.screened.count(i)) used.emplace(i, rows.at(i));
  rows = std::move(used);
  result.outputs = assemble_search_outputs(search, set, plan, rows, result.answer, result.screened);
  for (const auto& [name, text] : result.outputs.files()) {
    write_file_atomic((std::filesystem::path(result.dir) / name).string(), *text);
    result.written.push_back(name);
  }
  return result;
}

}  // namespace skein
