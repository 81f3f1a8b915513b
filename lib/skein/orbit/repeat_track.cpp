#include "skein/orbit/repeat_track.hpp"

#include <cmath>

#include "skein/orbit/secular.hpp"
#include "skein/orbit/sun_synchronous.hpp"

namespace skein {

std::optional<double> repeat_track_semi_major_axis_km(const EarthModel& earth, int revolutions, int days, double e,
                                                      double i_rad, bool sun_synchronous) {
  if (revolutions <= 0 || days <= 0) return std::nullopt;
  // Kepler start: n = revolutions/days * omega_earth.
  double n = static_cast<double>(revolutions) / days * earth.rotation_rad_s;
  double a = std::cbrt(earth.mu_km3_s2 / (n * n));
  for (int iter = 0; iter < 100; ++iter) {
    double inc = i_rad;
    if (sun_synchronous) {
      const auto sso = sun_synchronous_inclination_rad(earth, a, e);
      if (!sso) return std::nullopt;
      inc = *sso;
    }
    const SecularRates r = secular_rates(earth, a, e, inc);
    // Required nodal angular rate (M + omega rate) so that the track repeats.
    const double required = static_cast<double>(revolutions) / days * (earth.rotation_rad_s - r.raan_rad_s);
    // Scale a by the ratio of rates; the J2 terms are small so this converges geometrically.
    const double actual = r.mean_anomaly_rad_s + r.argp_rad_s;
    const double a_new = a * std::pow(actual / required, 2.0 / 3.0);
    if (std::abs(a_new - a) < 1e-9) {
      if (a_new * (1.0 - e) < earth.radius_km) return std::nullopt;
      return a_new;
    }
    a = a_new;
  }
  return std::nullopt;
}

}  // namespace skein
