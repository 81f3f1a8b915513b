#pragma once
// The search for the intervals in which one satellite is in view of ground points, shared by the ground
// contacts (contacts.hpp: stations, each with its elevation mask) and the per-site pass lists (site_passes.hpp:
// the coverage grid's sites, with the coverage mask and payload cone).
//
// Model: J2 secular mean elements (earth_fixed_state_at), the point on the ellipsoid with its geodetic vertical.
// In view while m(t) >= 0, with m = sin(elevation) - sin(mask), and with a payload cone the smaller of that and
// cos(off-nadir) - cos(half-angle) (the coverage evaluator's margin, engine/margin.hpp).
//
// Search: m is sampled every sample_step_s from the epoch to the span's end (the last sample at the end). An
// interval between two samples with the same sign of m at both ends is dropped when no crossing can fit under
// the rate bound |dm/dt| <= L, i.e. when |m(a)| + |m(b)| > L (b - a); otherwise it is halved and both halves
// examined. A sign change is followed down to a bracket of 1 ms and the event placed at its middle (within
// 0.5 ms). So every pass or gap longer than 1 ms is found, whatever the step. The bound:
//   mask term: sin(elevation) = d.up / |d| (d = r_sat - r_ground) changes at most as fast as the line of sight
//     turns, |v| / |d|, v the satellite's Earth-fixed velocity;
//   cone term: cos(off-nadir) = (d / |d|) . u with u = r_sat / |r_sat|; its rate is (d/|d|)' . u + (d/|d|) . u',
//     at most |v| / |d| + |v| / |r_sat|;
// the smaller of two functions changes no faster than the faster of them, so L = v_max / d_low (+ v_max / r_low
// with a cone), v_max bounding the speed (pass_search.cpp), d_low = max(perigee radius - point radius,
// (|d(a)| + |d(b)| - v_max (b - a)) / 2) and r_low the perigee radius. Intervals cut by the span's start or end
// count, with the part inside the span.
#include <optional>
#include <vector>

#include <Eigen/Core>

#include "skein/design/design.hpp"
#include "skein/orbit/propagate.hpp"

namespace skein {

struct ContactInterval {
  double rise_s = 0.0;  // from the epoch; 0 when in view at the start
  double set_s = 0.0;   // the span's end when in view at the end
};

struct ViewPoint {
  Eigen::Vector3d r_km = Eigen::Vector3d::Zero();  // Earth-fixed position
  Eigen::Vector3d up = Eigen::Vector3d::UnitZ();   // geodetic vertical
  double sin_mask = 0.0;                           // sin(elevation mask)
};

struct PassSearchSpan {
  double span_s = 86400.0;
  double sample_step_s = 60.0;         // the search refines below it (see above)
  std::optional<double> cos_cone;      // cos(payload cone half-angle); none: no cone
};

// The sample instants of the search: 0, step, 2 step, ..., the span's end.
std::vector<double> pass_search_times(const PassSearchSpan& span);

// One satellite over each point: the in-view intervals, in time order and disjoint, one list per point.
// theta0_rad is the Greenwich sidereal angle at the epoch.
std::vector<std::vector<ContactInterval>> find_view_intervals(const EarthModel& earth, const SecularOrbit& orbit,
                                                              double theta0_rad, const std::vector<ViewPoint>& points,
                                                              const PassSearchSpan& span);

// v_max of the bound above: an upper bound of the satellite's Earth-fixed speed (km/s) under the model.
double view_speed_bound_km_s(const EarthModel& earth, const SecularOrbit& orbit);

// The margin m of a satellite at r_sat seen from `point` (see above); in view when >= 0.
double view_margin(const ViewPoint& point, const Eigen::Vector3d& r_sat, const std::optional<double>& cos_cone);

}  // namespace skein
