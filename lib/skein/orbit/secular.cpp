#include "skein/orbit/secular.hpp"

#include <cassert>
#include <cmath>

namespace skein {

SecularRates secular_rates(const EarthModel& earth, double a_km, double e, double i_rad) {
  assert(a_km > 0.0 && e >= 0.0 && e < 1.0);
  const double n = std::sqrt(earth.mu_km3_s2 / (a_km * a_km * a_km));
  const double p = a_km * (1.0 - e * e);
  const double k = earth.j2 * (earth.radius_km / p) * (earth.radius_km / p);
  const double c = std::cos(i_rad);
  SecularRates r;
  r.mean_motion_rad_s = n;
  r.raan_rad_s = -1.5 * n * k * c;
  r.argp_rad_s = 0.75 * n * k * (5.0 * c * c - 1.0);
  r.mean_anomaly_rad_s = n + 0.75 * n * k * std::sqrt(1.0 - e * e) * (3.0 * c * c - 1.0);
  return r;
}

double anomalistic_period_s(const EarthModel& earth, double a_km, double e, double i_rad) {
  return two_pi / secular_rates(earth, a_km, e, i_rad).mean_anomaly_rad_s;
}

double nodal_period_s(const EarthModel& earth, double a_km, double e, double i_rad) {
  const SecularRates r = secular_rates(earth, a_km, e, i_rad);
  return two_pi / (r.mean_anomaly_rad_s + r.argp_rad_s);
}

double kepler_period_s(const EarthModel& earth, double a_km) {
  return two_pi * std::sqrt(a_km * a_km * a_km / earth.mu_km3_s2);
}

double critical_inclination_rad() { return std::asin(std::sqrt(0.8)); }

NodeRateSensitivity node_rate_sensitivity(const EarthModel& earth, double a_km, double e, double i_rad) {
  const SecularRates r = secular_rates(earth, a_km, e, i_rad);
  const double n = r.mean_motion_rad_s;
  const double p = a_km * (1.0 - e * e);
  const double k = earth.j2 * (earth.radius_km / p) * (earth.radius_km / p);
  NodeRateSensitivity s;
  s.per_km = -3.5 * r.raan_rad_s / a_km;
  s.per_rad = 1.5 * n * k * std::sin(i_rad);
  s.per_unit_e = 4.0 * e / (1.0 - e * e) * r.raan_rad_s;
  return s;
}

}  // namespace skein
