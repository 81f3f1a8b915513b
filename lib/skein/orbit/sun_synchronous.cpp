#include "skein/orbit/sun_synchronous.hpp"

#include <cmath>

namespace skein {

std::optional<double> sun_synchronous_inclination_rad(const EarthModel& earth, double a_km, double e) {
  const double n = std::sqrt(earth.mu_km3_s2 / (a_km * a_km * a_km));
  const double p = a_km * (1.0 - e * e);
  const double k = earth.j2 * (earth.radius_km / p) * (earth.radius_km / p);
  const double cos_i = -sun_mean_motion_rad_s / (1.5 * n * k);
  if (cos_i < -1.0) return std::nullopt;
  return std::acos(cos_i);
}

std::optional<double> sun_synchronous_semi_major_axis_km(const EarthModel& earth, double i_rad, double e) {
  const double c = std::cos(i_rad);
  if (!(c < 0.0)) return std::nullopt;
  const double one_e2 = 1.0 - e * e;
  const double x = -1.5 * std::sqrt(earth.mu_km3_s2) * earth.j2 * earth.radius_km * earth.radius_km * c /
                   (sun_mean_motion_rad_s * one_e2 * one_e2);
  return std::pow(x, 2.0 / 7.0);
}

double ltan_drift_min_per_year(double raan_rate_rad_s) {
  const double drift_deg_per_year = (raan_rate_rad_s - sun_mean_motion_rad_s) * deg_per_rad * seconds_per_julian_year;
  return drift_deg_per_year * 4.0;  // 24 h = 1440 min per 360 deg
}

}  // namespace skein
