#include "skein/orbit/ground_track.hpp"

#include <cassert>
#include <cmath>

namespace skein {

GeodeticPoint geodetic_from_earth_fixed(const EarthModel& earth, const Eigen::Vector3d& r) {
  const double a = earth.radius_km, f = earth.flattening;
  const double e2 = f * (2.0 - f);
  const double p = std::hypot(r.x(), r.y());
  GeodeticPoint g;
  g.lon_deg = std::atan2(r.y(), r.x()) * deg_per_rad;
  if (g.lon_deg >= 180.0) g.lon_deg -= 360.0;
  double lat = std::atan2(r.z(), p * (1.0 - e2));
  for (int k = 0; k < 20; ++k) {
    const double s = std::sin(lat);
    const double n = a / std::sqrt(1.0 - e2 * s * s);
    const double next = std::atan2(r.z() + n * e2 * s, p);
    const bool done = std::abs(next - lat) < 1e-12;
    lat = next;
    if (done) break;
  }
  const double s = std::sin(lat), c = std::cos(lat);
  const double n = a / std::sqrt(1.0 - e2 * s * s);
  g.lat_deg = lat * deg_per_rad;
  g.height_km = std::abs(c) > 1e-9 ? p / c - n : std::abs(r.z()) - n * (1.0 - e2);
  return g;
}

double greenwich_angle_at(const EarthModel& earth, const JulianDate& epoch_jd, double dt_s) {
  return wrap_two_pi(greenwich_mean_sidereal_angle_rad(epoch_jd) + earth.rotation_rad_s * dt_s);
}

std::vector<GeodeticPoint> ground_track(const EarthModel& earth, const SecularOrbit& orbit, const JulianDate& epoch_jd,
                                        double span_s, double step_s) {
  assert(step_s > 0.0 && span_s >= 0.0);
  std::vector<GeodeticPoint> out;
  const long n = static_cast<long>(std::floor(span_s / step_s + 1e-9));
  for (long k = 0; k <= n; ++k) {
    const double t = static_cast<double>(k) * step_s;
    const StateVector s = state_at(earth, orbit, t);
    out.push_back(geodetic_from_earth_fixed(earth, inertial_to_earth_fixed(s.r_km, greenwich_angle_at(earth, epoch_jd, t))));
  }
  return out;
}

}  // namespace skein
