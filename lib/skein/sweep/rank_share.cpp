#include "skein/sweep/rank_share.hpp"

#include <exception>
#include <mutex>
#include <thread>

#include <fmt/format.h>

namespace skein {

RankJournal open_journal_over_ranks(const SweepFolderOptions& folder, const std::string& out_dir, const Sweep& sweep,
                                    const LayoutSet& set, RankGroup& group, const RankFailure& ending_all) {
  RankJournal out;
  std::string status;
  std::exception_ptr setup_error;
  if (group.rank() == 0) {
    try {
      JournalResume j = open_sweep_journal(folder, out_dir, sweep, set);
      out.rows = std::move(j.rows);
      out.damaged_lines = j.damaged_lines;
      std::string mask(set.layouts.size(), '0');
      for (const auto& r : out.rows) mask[r.first] = '1';
      status = "ok" + mask;
    } catch (...) {
      setup_error = std::current_exception();
      status = "error";
    }
  }
  group.broadcast_from_root(status);
  if (status.rfind("ok", 0) != 0) {
    if (setup_error) std::rethrow_exception(setup_error);
    return out;
  }
  if (status.size() != 2 + set.layouts.size()) {  // rank 0 read another file (files differ between machines)
    if (ending_all)
      ending_all(group.rank(), fmt::format("{} layouts here, {} on rank 0; expected the same input and base design "
                                           "files on every rank",
                                           set.layouts.size(), status.size() - 2));
    group.abort_all(3);
  }
  out.ok = true;
  out.finished = status.substr(2);
  return out;
}

void send_share(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& share, RankGroup& group,
                const LayoutEvaluationOptions& options, const RankFailure& ending_all) {
  try {
    evaluate_layouts(sweep, set, share, [&](size_t i, const std::string& row) { group.send_row(i, row); }, options);
    group.send_done();
  } catch (const std::exception& e) {
    if (ending_all) ending_all(group.rank(), e.what());
    group.abort_all(3);
  }
}

void keep_share_and_receive(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& share,
                            RankGroup& group, const RowSink& keep, const LayoutEvaluationOptions& options,
                            const RankFailure& ending_all) {
  if (group.size() == 1) {
    evaluate_layouts(sweep, set, share, keep, options);
    return;
  }
  // The sink is called from the worker (own rows) and from this thread (received rows): serialise them.
  std::mutex m;
  const RowSink serial = [&](size_t i, const std::string& row) {
    std::lock_guard<std::mutex> lock(m);
    keep(i, row);
  };
  // Rank 0's own share on a worker thread while this thread receives the others' rows. The jthread joins
  // when it goes out of scope, also when abort_all throws (a group that cannot end the other processes).
  std::exception_ptr worker_error;
  {
    std::jthread worker([&] {
      try {
        evaluate_layouts(sweep, set, share, serial, options);
      } catch (...) {
        worker_error = std::current_exception();
      }
    });
    try {
      group.receive_rows(serial);
    } catch (const std::exception& e) {  // e.g. the journal cannot be written: end every rank
      if (ending_all) ending_all(0, e.what());
      group.abort_all(2);
    }
  }
  if (worker_error) std::rethrow_exception(worker_error);
}

}  // namespace skein
