#pragma once
// Aggregation of per-point metrics over the grid and its latitude bands.
#include <utility>
#include <vector>

#include "skein/coverage/engine/timeline.hpp"
#include "skein/coverage/engine/settings.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/result.hpp"

namespace skein::coverage_engine {

// The weighted quantile q of a sample in any order (reordered in place): the smallest value whose cumulative
// weight, in ascending order of value, reaches q of the total. Expected O(n) (quickselect); 0 when empty.
double weighted_quantile(std::vector<std::pair<float, double>>& sample, double q);
// The pooled gap figures of a set of points at fold k = 1..K (entry k - 1): the area-weighted mean of all their
// gaps and the area-weighted 95th percentile of the pool (weighted_quantile); zero without gaps. `pooled` is
// scratch for the (gap, weight) pool. With `fold1_cdf` (gap_cdf of the same points) the fold-1 percentile is
// its 95 % entry, which follows the same rule (the smallest gap whose cumulative weight reaches 0.95 of the
// total, less 1e-12 of it), and no fold-1 pool is made.
struct PooledGaps {
  double mean_gap_s = 0.0, p95_gap_s = 0.0;
};
std::vector<PooledGaps> pooled_gaps(const Grid& grid, const std::vector<size_t>& members,
                                    const std::vector<PointState>& state, int K,
                                    std::vector<std::pair<float, double>>& pooled, const std::vector<double>* fold1_cdf);
// Area-weighted aggregate of the points `members` (metrics.cpp), with their pooled gap figures.
CoverageAggregate aggregate(const std::vector<PointCoverage>& pts, const std::vector<size_t>& members,
                            const std::vector<PooledGaps>& pooled, int K);
// The 0, 1, ..., 100 % area-weighted quantiles of every point's fold-1 gaps (empty when there are none): the
// value where the cumulative weight of the gaps in ascending order first reaches q of the total, as a walk
// over the sorted gaps gives it, but without sorting them all: the weights are summed into buckets of the
// float's bit pattern (2^-8 relative width), and only the gaps of the <= 101 buckets where a quantile falls
// are gathered and sorted. O(gaps) work and O(gaps in those buckets) memory beyond one 512 KiB table.
std::vector<double> gap_cdf(const std::vector<PointState>& state, const Grid& grid);

// The metrics of a finished run into `res` (whose run fields the driver set): per point (percent by fold from
// the in-view time bins, required radius from the worst k-th nearest cosine, gaps, response time, in view),
// the area-weighted total and latitude bands, the worst-instant share and the least-covered point by fold, and
// the pooled gap quantiles (fold 1). Gap figures are computed at every fold k = 1..K.
// The gaps open at the end of the span were closed by the driver (close_gaps).
void collect_metrics(CoverageResult& res, const Grid& grid, const std::vector<PointState>& state, const std::vector<double>& hist,
                     const std::vector<double>& worst_cos, const std::vector<std::int64_t>& worst_q, std::int64_t total_q,
                     const Sampling& smp, double band_width_deg);

}  // namespace skein::coverage_engine
