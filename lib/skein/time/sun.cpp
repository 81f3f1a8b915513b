#include "skein/time/sun.hpp"

#include <cmath>

#include "skein/constants.hpp"
#include "skein/angles.hpp"

namespace skein {

SunPosition sun_position(const JulianDate& jd) {
  const double n = (jd.day - j2000_julian_date) + jd.fraction;
  const double mean_lon_deg = 280.460 + 0.9856474 * n;
  const double g = (357.528 + 0.9856003 * n) * rad_per_deg;
  const double lambda = (mean_lon_deg + 1.915 * std::sin(g) + 0.020 * std::sin(2.0 * g)) * rad_per_deg;
  const double eps = (23.439 - 0.0000004 * n) * rad_per_deg;
  SunPosition s;
  s.distance_au = 1.00014 - 0.01671 * std::cos(g) - 0.00014 * std::cos(2.0 * g);
  s.unit_eci = Eigen::Vector3d(std::cos(lambda), std::cos(eps) * std::sin(lambda), std::sin(eps) * std::sin(lambda));
  s.right_ascension_rad = wrap_two_pi(std::atan2(s.unit_eci.y(), s.unit_eci.x()));
  s.declination_rad = std::asin(s.unit_eci.z());
  return s;
}

double mean_sun_right_ascension_rad(const JulianDate& jd) {
  const double n = (jd.day - j2000_julian_date) + jd.fraction;
  return wrap_two_pi((280.460 + 0.9856474 * n) * rad_per_deg);
}

double local_time_of_node_h(double raan_rad, const JulianDate& jd) {
  const double h = 12.0 + wrap_pi(raan_rad - mean_sun_right_ascension_rad(jd)) * deg_per_rad / 15.0;
  return h >= 24.0 ? h - 24.0 : h;
}

double node_for_local_time_rad(double ltan_h, const JulianDate& jd) {
  return wrap_two_pi(mean_sun_right_ascension_rad(jd) + (ltan_h - 12.0) * 15.0 * rad_per_deg);
}

}  // namespace skein
