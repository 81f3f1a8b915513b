#pragma once
// The settings of a run, resolved once: the evaluator's constants, the sample instants, the resource
// estimate and its guard, and the search and culling angles.
#include <cstdint>
#include <optional>

#include "skein/constants.hpp"
#include "skein/coverage/options.hpp"
#include "skein/design/design.hpp"

namespace skein::coverage_engine {

// Bins of the satellites-in-view distribution: 0 .. in_view_bins-2, and "in_view_bins-1 or more".
constexpr int in_view_bins = 33;
// The geodetic vertical departs from the geocentric radial by at most 0.1924 deg on WGS-84 (the largest
// difference of geodetic and geocentric latitude, at 45 deg; follows from tan psi = (1 - e^2) tan phi,
// Snyder 1987 eq. 3-28). The work estimate widens the mask by this much, plus a safety margin.
constexpr double vertical_deflection_rad = 0.2 * rad_per_deg;
constexpr double cull_margin_rad = 0.25 * rad_per_deg;
// Scratch memory of culled mode, a bound used by the work estimate.
constexpr double culled_scratch_bytes = 8e7;
// Sample instants held at once: at most 64 (exhaustive) or, in culled mode, as many as fill about 1 MiB of
// buffer (the row sweep reads the buffer once per row, so it should stay in a core's cache; 1 MiB is this
// machine's L2 per core, a usual size), between 16 and 256 instants; fewer for very large constellations
// (about 256 MB of buffers). Only speed depends on the chunk: each step's work reads instants j-1 and j alone,
// and a point's remembered nearest satellites carry over from one chunk to the next.
constexpr double buffer_budget_bytes = 2.56e8;
constexpr double culled_cache_bytes = 1048576.0;
constexpr long culled_chunk_min = 16, culled_chunk_max = 256;
// Area weights in integer units: the weight share times 2^53 (exact sums in any order).
constexpr double weight_units = 9007199254740992.0;

// Sample instants t_j = j * step for j < n - 1 and t_{n-1} = span.
struct Sampling {
  long n = 0;
  double step = 0.0, span = 0.0;
  double time(long j) const { return j == n - 1 ? span : static_cast<double>(j) * step; }
};

inline Sampling make_sampling(double span_s, double step_s) {
  Sampling s;
  s.step = step_s;
  s.span = span_s;
  s.n = static_cast<long>(std::ceil(span_s / step_s - 1e-9)) + 1;
  return s;
}

// The central angle inside which the k-th nearest satellite is searched first (see settings.cpp).
double radius_search_rad(int k, int satellites);
// Central angle of the widest footprint of a satellite at orbit radius r, made conservative for the ellipsoid.
double visibility_cull_rad(double r_km, double min_ground_radius_km, const CoverageSettings& st);

// The work and memory estimate for a grid of `points`, shared by the guard and the CLI's progress line.
CoverageWorkEstimate estimate(const Design& design, const CoverageSettings& st, long points, CoverageMode mode);
// True when the estimate passes the options' memory or pair-test limit.
bool over_limits(const CoverageWorkEstimate& est, const CoverageOptions& options);
// Throws InputError when the estimate passes a limit (unless options.force).
void check_limits(const CoverageWorkEstimate& est, const CoverageOptions& options);
// The estimate from the grid's point count computed from spacing and extent, before any grid is built.
CoverageWorkEstimate estimate_before_grid(const Design& design, const CoverageSettings& st, CoverageMode mode);

}  // namespace skein::coverage_engine
