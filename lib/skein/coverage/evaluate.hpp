#pragma once
// The coverage evaluator: which ground points see at least k satellites above the elevation mask, for how
// long, how long they wait, and the required coverage radius. Pure: no printing; deterministic whatever
// the TBB thread count (each point is computed on its own, sums are made in a fixed order).
#include <atomic>
#include <cstdint>
#include <optional>

#include "skein/coverage/grid.hpp"
#include "skein/coverage/options.hpp"
#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"

namespace skein {

// Throws InputError for an override out of its domain (step <= 0, spacing not dividing 180, ...) and for a
// fold larger than the number of satellites (naming the YAML position or the option).
CoverageSettings resolve_coverage_settings(const Design& design, const CoverageOptions& options);

CoverageWorkEstimate estimate_coverage_work(const Design& design, const CoverageOptions& options);

// A run made ready: settings resolved, the guard passed, the grid built and the estimate made, once. The
// guard runs on the point count computed from spacing and extent before the grid is built.
struct CoveragePlan {
  CoverageSettings settings;
  Grid grid;
  CoverageWorkEstimate estimate;
};
// Throws InputError, before any work, for bad settings or (unless options.force) when the estimate exceeds
// options.memory_limit_bytes or options.pair_test_limit.
CoveragePlan plan_coverage(const Design& design, const CoverageOptions& options);

// Run a planned evaluation (the plan made from the same design and options).
CoverageResult evaluate_coverage(const Design& design, const CoveragePlan& plan, const CoverageOptions& options);
// Plan and run. Throws as plan_coverage.
CoverageResult evaluate_coverage(const Design& design, const CoverageOptions& options = {});

}  // namespace skein
