#pragma once
// One whole sweep run over a rank group (rank_group.hpp): every rank reads and expands the same sweep, so every
// rank holds the same numbered layouts; rank 0 checks the folder and resumes the journal (sweep_folder.hpp) and
// tells the others which layouts are finished; the pending layouts are shared round-robin; each rank evaluates
// its share (TBB); rank 0 journals every row as it finishes, its own and those the others send, and writes the
// output files (sweep_outputs.hpp) when all have arrived. The rows, and so the files, do not depend on the
// number of ranks or threads. Nothing is printed: the caller gets hooks and the result.
#include <functional>
#include <string>
#include <vector>

#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/rank_group.hpp"
#include "skein/sweep/sweep_folder.hpp"
#include "skein/sweep/sweep_outputs.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

struct SweepRunOptions {
  SweepFolderOptions folder;            // the sweep file, and the resume choices
  // Reads the sweep file (called with folder.sweep_file on every rank): the input edge's reader
  // (input/sweep_file.hpp), given by the caller so that this layer does not read files itself. Required.
  std::function<Sweep(const std::string& sweep_file)> read_sweep;
  std::string out_dir;                  // the output folder
  LayoutEvaluationOptions evaluation;   // coverage mode and --force (also lifts the layout limit)
};

// What rank 0 knows once the journal is read, before the first layout is evaluated.
struct SweepPlan {
  const Sweep& sweep;
  const LayoutSet& set;
  size_t pending = 0;               // layouts to evaluate, over all ranks
  int ranks = 1;
  double pending_estimate_s = 0.0;  // estimate_sweep_seconds, for the pending share of the layouts
};

struct SweepRunHooks {
  std::function<void(const SweepPlan&)> started;  // rank 0, once
  std::function<void()> row_kept;                 // rank 0, after each row is journaled (calls never overlap)
  // An error that ends every rank (the group's abort_all follows): a rank other than 0 failed evaluating, or
  // rank 0 failed keeping a row another rank sent.
  std::function<void(int rank, const std::string& what)> ending_all;
};

enum class SweepRole {
  wrote_outputs,  // rank 0: every row is journaled and the files are written
  sent_rows,      // another rank: its share was evaluated and sent to rank 0
  root_reports,   // another rank: the sweep was refused, and rank 0 reports why (it throws the error)
};

struct SweepRunResult {
  SweepRole role = SweepRole::wrote_outputs;
  // The rest is filled on rank 0 only.
  Sweep sweep;
  LayoutSet set;
  SweepOutputs outputs;
  long resumed = 0;                 // rows kept from the journal
  long damaged_lines = 0;           // journal lines dropped when resuming
  std::string dir;                  // the output folder
  std::vector<std::string> written; // the files written into it, in order
};

// Runs the sweep on this rank of `group`. Throws InputError on rank 0 for a bad sweep file, a refused folder or
// journal, or limits exceeded without --force (before any layout is evaluated).
SweepRunResult run_sweep(const SweepRunOptions& options, RankGroup& group, const SweepRunHooks& hooks = {});

// The summary of a finished run for the user (several lines, each ending in a newline): counts, skipped
// combinations, the cheapest layout meeting the requirement with its figures, the files written.
std::string sweep_summary_text(const SweepRunResult& result);

}  // namespace skein
