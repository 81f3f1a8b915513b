#pragma once
// One round of layouts evaluated over a rank group (rank_group.hpp): each rank evaluates its share (TBB) and
// the rows reach rank 0. Used by the sweep (one round) and the search (one round per batch).
#include <functional>
#include <map>
#include <string>
#include <vector>

#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/rank_group.hpp"
#include "skein/sweep/sweep_folder.hpp"
#include "skein/sweep/sweep_run.hpp"

namespace skein {

// Told of an error that ends every rank (abort_all follows).
using RankFailure = std::function<void(int rank, const std::string& what)>;

// The journal opened on rank 0 and its finished layouts told to every rank.
struct RankJournal {
  bool ok = false;                     // false on the other ranks when rank 0 refused (it throws the error)
  std::string finished;                // one '1' (finished) or '0' (pending) per layout, on every rank
  std::map<size_t, std::string> rows;  // rank 0: the finished rows
  long damaged_lines = 0;              // rank 0
};

// Rank 0 alone touches the folder (the others would race its marker): it opens the journal
// (open_sweep_journal) and broadcasts "ok" and the finished mask, or "error". A refusal is rethrown on rank 0
// after the broadcast and returns ok = false elsewhere, before any layout is evaluated or anything written. A
// rank whose layout count differs from rank 0's (other files there) ends every rank (ending_all, abort_all(3)).
RankJournal open_journal_over_ranks(const SweepFolderOptions& folder, const std::string& out_dir, const Sweep& sweep,
                                    const LayoutSet& set, RankGroup& group, const RankFailure& ending_all);

// A rank other than 0: evaluate `share`, send each row to rank 0, then done. An error ends every rank
// (ending_all, then abort_all(3)).
void send_share(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& share, RankGroup& group,
                const LayoutEvaluationOptions& options, const RankFailure& ending_all);

// Rank 0: evaluate its own `share` and hand every row, its own and those the other ranks send, to `keep`
// (calls never overlap). With other ranks, the own share runs on a worker thread while this thread receives;
// a failure to keep a received row ends every rank (ending_all, then abort_all(2)); an error of the own share
// is rethrown.
void keep_share_and_receive(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& share,
                            RankGroup& group, const RowSink& keep, const LayoutEvaluationOptions& options,
                            const RankFailure& ending_all);

}  // namespace skein
