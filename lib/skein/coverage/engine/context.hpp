#pragma once
// What a row sweep or a point scan reads and writes, and the partial sums a worker returns.
#include <cstdint>
#include <vector>

#include "skein/coverage/engine/position_buffer.hpp"
#include "skein/coverage/engine/settings.hpp"
#include "skein/coverage/engine/timeline.hpp"

namespace skein::coverage_engine {

// Work counters and the area share covered at each instant of a chunk (integer weight units: in culled mode
// the change since the previous instant, in exhaustive mode the value).
struct Partial {
  std::vector<std::int64_t> covered;  // [local step * K + k-1]
  std::int64_t pair_tests = 0;      // visibility tests
  std::int64_t distance_tests = 0;  // central-angle evaluations for the k-th nearest satellite
  std::int64_t fallbacks = 0;
  std::int64_t hidden_passes = 0;   // passes found wholly between two instants
  std::int64_t events = 0;          // rises and sets applied to point timelines
};

// Everything a row sweep or a point scan reads, and the per-point results it writes.
struct EvaluationContext {
  const PositionBuffer& buf;
  const Sampling& smp;
  const Geometry& gm;
  const std::vector<PointGeo>& geo;
  const std::vector<std::int64_t>& weight_q;
  int K = 1;
  int T = 0;
  double search_rad = 0.0;     // k-th nearest search radius
  double search_cos = 0.0;     // its cosine: when the k-th best found is at least this, it is exact
  std::vector<PointState>& state;
  std::vector<double>& worst_cos;
  std::vector<double>& hist;
  std::vector<double>& fold_gap_start;  // [p * (K - 1) + k - 2]: start of the open gap at fold k >= 2
  std::vector<int>& nearest;  // culled mode: the K nearest satellites when the point was last searched (-1: never)
  double track_eps_rad = 0.0;               // deviation bound of a ground direction from its chord over a step
  const std::vector<double>& sat_r_apo_km;  // largest orbit radius of each satellite
  const std::vector<double>& sat_sin_limit; // exhaustive mode: cross-track limit of each satellite, any point
  const std::vector<double>& sat_widened_cos; // exhaustive mode: cos(outer angle + track deviation), any point
  const DaylightMask* daylight = nullptr;   // set: only lit coverage counts (coverage.min_sun_elevation_deg)
  PointSums sums(size_t p) const {
    return {&hist[p * in_view_bins], K > 1 ? &fold_gap_start[p * static_cast<size_t>(K - 1)] : nullptr, K,
            daylight, &geo[p], smp.span};
  }
};

inline void add_covered(Partial& acc, size_t local_step, int K, int before, int after, std::int64_t wq) {
  for (int k = 0; k < K; ++k) {
    const bool a = after > k, b = before > k;
    if (a != b) acc.covered[local_step * static_cast<size_t>(K) + static_cast<size_t>(k)] += a ? wq : -wq;
  }
}


}  // namespace skein::coverage_engine
