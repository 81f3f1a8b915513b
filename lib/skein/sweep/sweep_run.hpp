#pragma once
// Evaluation of many layouts in parallel (TBB), each finished row handed to a callback as it finishes.
#include <atomic>
#include <cstddef>
#include <functional>
#include <string>
#include <vector>

#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"

namespace skein {

// Called once per finished layout with its index and encoded row (encode_row); calls never overlap.
using RowSink = std::function<void(size_t index, const std::string& row)>;

// Evaluate set.layouts[i] for every i in `todo`, in parallel over layouts (and, inside each, over ground
// points). Rows reach `sink` in the order they finish. The row content does not depend on the order or the
// thread count. `finished`, when set, counts finished layouts. When an evaluation or the sink throws, the
// layouts already running finish whole, no layout after the lowest failing one starts, and that failure is
// rethrown (parallel_items).
void evaluate_layouts(const Sweep& sweep, const LayoutSet& set, const std::vector<size_t>& todo, const RowSink& sink,
                      const LayoutEvaluationOptions& options = {}, std::atomic<long>* finished = nullptr);

// The layouts of `pending` that rank `rank` of `ranks` takes: every ranks-th one, from position rank.
std::vector<size_t> round_robin_share(const std::vector<size_t>& pending, int rank, int ranks);

// An estimate (s, on 2 cores) of evaluating the layouts' coverage, from estimate_coverage_work. Throws
// InputError, before any work, when one layout's coverage exceeds the evaluator's work or memory limits and
// options.force is not set.
double estimate_sweep_seconds(const Sweep& sweep, const LayoutSet& set, const LayoutEvaluationOptions& options);

}  // namespace skein
