#pragma once
// Aggregation of per-point metrics over the grid and its latitude bands.
#include <utility>
#include <vector>

#include "skein/coverage/engine/timeline.hpp"
#include "skein/coverage/result.hpp"

namespace skein::coverage_engine {

// The weighted quantile q of a sample sorted by value: the smallest value whose cumulative weight reaches q.
double weighted_quantile(std::vector<std::pair<float, double>>& sample, double q);
// Area-weighted aggregate of the points `members` (metrics.cpp).
CoverageAggregate aggregate(const std::vector<PointCoverage>& pts, const std::vector<size_t>& members,
                            const std::vector<PointState>& state, int K, double total_weight);

}  // namespace skein::coverage_engine
