#include "skein/sweep/sweep_run.hpp"

#include <mutex>

#include <fmt/format.h>

#include "skein/coverage/evaluate.hpp"
#include "skein/error.hpp"
#include "skein/parallel_items.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {

void evaluate_layouts(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& todo, const RowSink& sink,
                      const LayoutEvaluationOptions& options, std::atomic<long>* finished) {
  std::mutex sink_mutex;
  parallel_items(todo.size(), [&](size_t k) {
    const Layout& l = set.layouts.at(todo[k]);
    const LayoutMetrics m = evaluate_layout(sweep, l, options);
    const std::string row = encode_row(layout_row(sweep, l, m));
    {
      std::lock_guard<std::mutex> lock(sink_mutex);
      sink(l.index, row);
    }
    if (finished) finished->fetch_add(1);
  });
}

std::vector<size_t> round_robin_share(const std::vector<size_t>& pending, int rank, int ranks) {
  std::vector<size_t> out;
  for (size_t k = static_cast<size_t>(rank); k < pending.size(); k += static_cast<size_t>(ranks)) out.push_back(pending[k]);
  return out;
}

double estimate_sweep_seconds(const Sweep& sweep, const LayoutSet& set, const LayoutEvaluationOptions& options) {
  const CoverageOptions copt = sweep_coverage_options(sweep, options);
  double seconds = 0.0;
  for (const Layout& l : set.layouts) {
    const Design d = layout_design(sweep, l);
    const CoverageWorkEstimate e = estimate_coverage_work(d, copt);
    if (!options.force && (e.memory_bytes > copt.memory_limit_bytes || e.pair_tests > copt.pair_test_limit))
      throw InputError(fmt::format("{}: layout {} ({}) needs about {:.3g} pair tests and {:.3g} MiB for coverage, above "
                                   "the limits ({:.3g} tests, {:.3g} MiB); expected a coarser coverage grid or step in "
                                   "the sweep's coverage block, or --force",
                                   sweep.file, l.index, walker_label(l), e.pair_tests, e.memory_bytes / 1048576.0,
                                   copt.pair_test_limit, copt.memory_limit_bytes / 1048576.0));
    seconds += e.seconds_2_cores;
  }
  return seconds;
}

}  // namespace skein
