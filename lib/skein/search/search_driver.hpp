#pragma once
// One whole search run over a rank group (sweep/rank_group.hpp). Every rank reads the search file, expands the
// space (sweep/layouts.hpp) and plans it (search_plan.hpp: costs and screens, the same on every rank); rank 0
// checks the folder and resumes the journal (the sweep's journal and folder protocol, sweep/sweep_folder.hpp)
// and tells the others which layouts are finished. Then, batch after batch of `settings.batch` candidates in
// cost order, rank 0 settles the answer on the batches before (search_answer.hpp) and tells every rank to go on
// or stop; the pending layouts of a batch are shared round-robin, rows go to rank 0, which journals them. The
// batches and the stopping test use only the file and finished rows, so the layouts evaluated, the answer and
// the record do not depend on the thread or rank count, nor on a kill and resume. Nothing is printed.
// With the coarse screen (coarse_screen.hpp), rank 0 screens a batch's pending layouts first (in parallel over
// threads) and tells every rank which ones it ruled out; only the others are evaluated in full. A screened
// layout is not journaled: a resumed run screens it again, with the same result (the screen is deterministic).
#include <functional>
#include <map>
#include <string>
#include <vector>

#include "skein/search/coarse_screen.hpp"
#include "skein/search/search_answer.hpp"
#include "skein/search/search_outputs.hpp"
#include "skein/search/search_plan.hpp"
#include "skein/search/search_spec.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/rank_group.hpp"
#include "skein/sweep/sweep_folder.hpp"

namespace skein {

struct SearchRunOptions {
  SweepFolderOptions folder;  // folder.sweep_file is the search file; resume choices as for a sweep
  std::function<Search(const std::string& file)> read_search;  // the input edge's reader (required)
  std::string out_dir;
  LayoutEvaluationOptions evaluation;
  // For tests of resume: stop at the end of the first batch after which at least this many layouts were newly
  // evaluated, as if killed there (the journal holds them; nothing else is written). 0: run to the answer.
  long stop_after = 0;
};

// Where the search stands, after each batch (rank 0).
struct SearchStatus {
  size_t candidates = 0;       // layouts in cost order (not skipped by the plan)
  size_t evaluated = 0;        // of them, evaluated so far (with the resumed ones)
  size_t screened = 0;         // of them, ruled out by the coarse screen so far
  size_t open_from = 0;        // cost-order position of the first tie not yet decided
  std::optional<size_t> best;  // the best meeting layout evaluated so far (in the sweep's order)
  std::vector<double> bound;   // the costs at open_from: every cheaper candidate fails the requirement
};

struct SearchRunHooks {
  std::function<void(const Search&, const LayoutSet&, const SearchPlan&, size_t resumed, int ranks)> started;  // rank 0
  std::function<void()> row_kept;                      // rank 0, after each row is journaled
  std::function<void(const SearchStatus&)> batch_done;  // rank 0
  std::function<void(int rank, const std::string& what)> ending_all;
};

enum class SearchRole { wrote_outputs, stopped_early, sent_rows, root_reports };

struct SearchRunResult {
  SearchRole role = SearchRole::wrote_outputs;
  // Rank 0 only:
  Search search;
  LayoutSet set;
  SearchPlan plan;
  std::map<size_t, std::string> rows;  // evaluated layouts' encoded rows
  std::map<size_t, ScreenOutcome> screened;  // layouts the coarse screen ruled out (never evaluated in full)
  long coarse_runs = 0;                      // coarse coverage runs of the screen (this run, not resumed ones)
  SearchAnswer answer;
  SearchOutputs outputs;
  long resumed = 0, damaged_lines = 0;
  std::string dir;
  std::vector<std::string> written;
};

SearchRunResult run_search(const SearchRunOptions& options, RankGroup& group, const SearchRunHooks& hooks = {});

}  // namespace skein
