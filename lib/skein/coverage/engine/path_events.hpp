#pragma once
// Rises and sets found on the satellite's path between two instants: passes wholly between them, and
// crossing times where the margin's cubic in time is too coarse.
#include <optional>
#include <vector>

#include "skein/coverage/engine/geometry.hpp"
#include "skein/coverage/engine/position_buffer.hpp"
#include "skein/coverage/engine/hidden_pass.hpp"
#include "skein/orbit/propagate.hpp"

namespace skein::coverage_engine {

// A pass of (p, s) wholly inside (t_{j-1}, t_j] for a pair out of view at both instants (hidden_pass.hpp).
// sin_limit is the sine of an outer footprint angle of s valid for p over the step, widened by the track's
// deviation bound (see path_events.cpp). Both modes call this with the same arguments for every pair that can
// hold a pass, so they find the same passes to the bit.
std::optional<HiddenPass> hidden_pass(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g,
                                      double sin_limit, double t0, double t1);

// The time of the one rise or set of (p, s) inside (t_{j-1}, t_j), as the root of the true margin along the
// satellite's cubic path, to 1e-9 of the step (used when Geometry::roots_on_path is set).
double path_root(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g, double t0, double t1);

// Sine of the cross-track limit for hidden_pass from the cosine of an outer footprint angle and the track's
// deviation bound eps: sin(lambda + eps), or 2 (no limit) when lambda + eps reaches 90 deg.
double cross_track_sin_limit(double cos_lambda, double eps_rad);

// The bounds the search between instants rests on, for a run's satellites and step: the ground-direction rate
// bounds, each satellite's largest orbit radius, the track's deviation from its chord over a step and the
// cubic path's position error (path_events.cpp states the derivations).
struct PathBounds {
  TrackRates rates;
  std::vector<double> r_apo_km;
  double r_apo_max_km = 0.0;
  double track_eps_rad = 0.0;
  double path_error_m = 0.0;
};
PathBounds path_bounds(const EarthModel& earth, const std::vector<SecularOrbit>& orbits, double step_s);

}  // namespace skein::coverage_engine
