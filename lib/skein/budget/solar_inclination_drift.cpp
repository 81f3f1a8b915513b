#include "skein/budget/solar_inclination_drift.hpp"

#include <cmath>

namespace skein {

double solar_inclination_rate_rad_s(const EarthModel& earth, double a_km, double i_rad, double ltan_h) {
  const double n = std::sqrt(earth.mu_km3_s2 / (a_km * a_km * a_km));
  const double ns2 = sun_mu_km3_s2 / (astronomical_unit_km * astronomical_unit_km * astronomical_unit_km);
  const double offset = (ltan_h - 12.0) * 15.0 * rad_per_deg;
  const double ce = std::cos(obliquity_j2000_rad), se = std::sin(obliquity_j2000_rad);
  const double si = std::sin(i_rad), ci = std::cos(i_rad);
  // Midpoint rule over the year: the integrand is a trigonometric polynomial of low degree in lambda, so
  // 72 points are exact to rounding.
  constexpr int steps = 72;
  double sum = 0.0;
  for (int k = 0; k < steps; ++k) {
    const double lambda = two_pi * (k + 0.5) / steps;
    const double raan = lambda + offset;
    const double sx = std::cos(lambda), sy = std::sin(lambda) * ce, sz = std::sin(lambda) * se;
    const double h_dot_s = si * std::sin(raan) * sx - si * std::cos(raan) * sy + ci * sz;
    sum += h_dot_s * (std::cos(raan) * std::cos(lambda) + std::sin(raan) * std::sin(lambda) * ce);
  }
  return 1.5 * ns2 / n * sum / steps;
}

}  // namespace skein
