#include "skein/coverage/pass_search.hpp"

#include <algorithm>
#include <cmath>

namespace skein {
namespace {

constexpr double event_resolution_s = 1e-3;  // brackets of rises and sets are closed to 1 ms

// The margin and the range |d| at one instant.
struct Sample {
  double margin = 0.0;
  double range_km = 0.0;
};

Sample sample_at(const ViewPoint& p, const Eigen::Vector3d& r_sat, const std::optional<double>& cos_cone) {
  const Eigen::Vector3d d = r_sat - p.r_km;
  const double range = d.norm();
  double m = d.dot(p.up) / range - p.sin_mask;
  if (cos_cone) m = std::min(m, d.dot(r_sat) / (range * r_sat.norm()) - *cos_cone);
  return {m, range};
}

// Upper bound of the Earth-fixed speed (km/s) of the J2 secular-model motion of one satellite. The model's
// velocity (propagate.hpp) is v_kep (dM/dt)/n + (domega/dt) h x r + (dOmega/dt) z x r in inertial axes, turned
// into the Earth-fixed frame and less w_E z x r; so |v| <= v_p |dM/dt| / n + (|domega/dt| + |dOmega/dt| + w_E) r_a,
// with the Kepler speed at most its perigee value v_p = sqrt(mu (1 + e) / (a (1 - e))) (vis-viva, Vallado 2013
// eq. 2-8) and r at most the apogee radius r_a = a (1 + e). A 1 % margin covers rounding.
double speed_bound_km_s(const EarthModel& earth, const SecularOrbit& orbit) {
  const MeanElements& el = orbit.epoch_elements;
  const double vp = std::sqrt(earth.mu_km3_s2 * (1.0 + el.e) / (el.a_km * (1.0 - el.e)));
  const double ra = el.a_km * (1.0 + el.e);
  const SecularRates& r = orbit.rates;
  const double v = vp * std::abs(r.mean_anomaly_rad_s) / r.mean_motion_rad_s +
                   (std::abs(r.argp_rad_s) + std::abs(r.raan_rad_s) + earth.rotation_rad_s) * ra;
  return 1.01 * v;
}

// One satellite over one point.
class PairSearch {
 public:
  PairSearch(const EarthModel& earth, const SecularOrbit& orbit, double theta0, const ViewPoint& point,
             const std::optional<double>& cos_cone, double v_max, double floor_km, double cone_rate)
      : earth_(earth), orbit_(orbit), theta0_(theta0), pt_(point), cone_(cos_cone), v_max_(v_max),
        floor_km_(floor_km), cone_rate_(cone_rate) {}

  Sample at(double t) const {
    const EarthFixedState ef = earth_fixed_state_at(earth_, orbit_, theta0_ + earth_.rotation_rad_s * t, t);
    return sample_at(pt_, ef.r_km, cone_);
  }

  // Appends to `events` the rises and sets strictly inside (a, b), in time order.
  void scan(double a, const Sample& sa, double b, const Sample& sb, std::vector<double>& events) const {
    const bool in_a = sa.margin >= 0.0, in_b = sb.margin >= 0.0;
    const double w = b - a;
    if (in_a == in_b) {
      const double d_low = std::max(floor_km_, 0.5 * (sa.range_km + sb.range_km - v_max_ * w));
      const double rate = v_max_ / d_low + cone_rate_;
      if (std::abs(sa.margin) + std::abs(sb.margin) > rate * w) return;  // no crossing can fit
      if (w <= event_resolution_s) return;  // a pass or gap under 1 ms is not counted
    } else if (w <= event_resolution_s) {
      events.push_back(0.5 * (a + b));
      return;
    }
    const double m = 0.5 * (a + b);
    const Sample sm = at(m);
    scan(a, sa, m, sm, events);
    scan(m, sm, b, sb, events);
  }

 private:
  const EarthModel& earth_;
  const SecularOrbit& orbit_;
  double theta0_;
  const ViewPoint& pt_;
  const std::optional<double>& cone_;
  double v_max_;
  double floor_km_;
  double cone_rate_;
};

}  // namespace

double view_speed_bound_km_s(const EarthModel& earth, const SecularOrbit& orbit) {
  return speed_bound_km_s(earth, orbit);
}

double view_margin(const ViewPoint& point, const Eigen::Vector3d& r_sat, const std::optional<double>& cos_cone) {
  return sample_at(point, r_sat, cos_cone).margin;
}

std::vector<double> pass_search_times(const PassSearchSpan& span) {
  const long steps = static_cast<long>(std::ceil(span.span_s / span.sample_step_s - 1e-9));
  std::vector<double> times(static_cast<size_t>(steps) + 1);
  for (long j = 0; j <= steps; ++j)
    times[static_cast<size_t>(j)] = std::min(span.span_s, static_cast<double>(j) * span.sample_step_s);
  return times;
}

std::vector<std::vector<ContactInterval>> find_view_intervals(const EarthModel& earth, const SecularOrbit& orbit,
                                                              double theta0, const std::vector<ViewPoint>& points,
                                                              const PassSearchSpan& span) {
  const std::vector<double> times = pass_search_times(span);
  const double v_max = speed_bound_km_s(earth, orbit);
  const double perigee_km = orbit.epoch_elements.a_km * (1.0 - orbit.epoch_elements.e);
  const double cone_rate = span.cos_cone ? v_max / perigee_km : 0.0;
  std::vector<Eigen::Vector3d> r(times.size());
  for (size_t j = 0; j < times.size(); ++j)
    r[j] = earth_fixed_state_at(earth, orbit, theta0 + earth.rotation_rad_s * times[j], times[j]).r_km;
  std::vector<std::vector<ContactInterval>> out;
  for (const ViewPoint& p : points) {
    // The range never falls below the perigee radius less the point's radius; floored at 1 km for a satellite
    // whose perigee passes below a high point (then the bound is loose, never wrong where it holds).
    const double floor_km = std::max(1.0, perigee_km - p.r_km.norm());
    const PairSearch search(earth, orbit, theta0, p, span.cos_cone, v_max, floor_km, cone_rate);
    std::vector<double> events;
    Sample prev = sample_at(p, r[0], span.cos_cone);
    const bool in_at_start = prev.margin >= 0.0;
    for (size_t j = 1; j < times.size(); ++j) {
      const Sample cur = sample_at(p, r[j], span.cos_cone);
      search.scan(times[j - 1], prev, times[j], cur, events);
      prev = cur;
    }
    std::vector<ContactInterval> intervals;
    bool in = in_at_start;
    double rise = 0.0;
    for (double e : events) {
      if (in) intervals.push_back({rise, e});
      else rise = e;
      in = !in;
    }
    if (in) intervals.push_back({rise, span.span_s});
    out.push_back(std::move(intervals));
  }
  return out;
}

}  // namespace skein
