#include "skein/coverage/footprint.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"

namespace skein {

double fast_acos(double x) {
  x = std::clamp(x, -1.0, 1.0);
  const double ax = std::abs(x);
  // Abramowitz and Stegun 4.4.45 coefficients.
  const double r = std::sqrt(1.0 - ax) * (1.5707288 + ax * (-0.2121144 + ax * (0.0742610 + ax * -0.0187293)));
  return x >= 0.0 ? r : pi - r;
}

FootprintRow make_footprint_row(double min_radius_km, double max_radius_km, double max_deflection_rad,
                                double min_elevation_rad, std::optional<double> nadir_half_angle_rad) {
  FootprintRow row;
  row.min_radius_km = min_radius_km;
  row.max_radius_km = max_radius_km;
  row.max_deflection_rad = max_deflection_rad;
  const double e_out = min_elevation_rad - max_deflection_rad, e_in = min_elevation_rad + max_deflection_rad;
  row.cos_e_out = std::cos(e_out);
  row.sin_e_out = std::sin(e_out);
  row.cos_e_in = std::cos(e_in);
  row.sin_e_in = std::sin(e_in);
  if (nadir_half_angle_rad) {
    row.cone = true;
    row.sin_cone = std::sin(*nadir_half_angle_rad);
    row.cos_cone = std::cos(*nadir_half_angle_rad);
  }
  return row;
}

FootprintCosines footprint_cosines(const FootprintRow& row, double r_km) {
  constexpr double margin = 1e-9;
  FootprintCosines f;
  // cos(acos(x) - e) = x cos e + sin e sqrt(1 - x^2), with x = R cos e / r.
  const double xo = row.min_radius_km * row.cos_e_out / r_km;
  f.outer = xo >= 1.0 ? 1.0 - margin : xo * row.cos_e_out + row.sin_e_out * std::sqrt(1.0 - xo * xo) - margin;
  if (r_km <= row.max_radius_km) return f;  // no sure region for a satellite at or below the ground
  const double xi = row.max_radius_km * row.cos_e_in / r_km;
  if (xi >= 1.0 || row.sin_e_in >= 1.0) return f;
  double inner = xi * row.cos_e_in + row.sin_e_in * std::sqrt(1.0 - xi * xi);
  if (row.cone) {
    const double y = r_km * row.sin_cone / row.max_radius_km;
    if (y < 1.0) {
      // cos(90 deg - eta - acos y) = sin(eta + acos y) = sin eta y + cos eta sqrt(1 - y^2).
      inner = std::max(inner, row.sin_cone * y + row.cos_cone * std::sqrt(1.0 - y * y));
    }
  }
  f.inner = inner + margin;
  return f;
}

double row_half_width(double sin_r, double cos_r, double sin_s, double cos_s, double c, bool widen) {
  const double den = cos_r * cos_s;
  const double base = sin_r * sin_s;
  if (!(den > 0.0)) return base >= c ? pi : -1.0;  // a pole: the central angle does not depend on longitude
  if (base + den < c) return -1.0;  // q > 1 without the division: even dlon = 0 is outside
  const double q = (c - base) / den;
  if (q > 1.0) return -1.0;
  if (q <= -1.0) return pi;
  const double h = fast_acos(q);
  if (widen) return h + fast_acos_error_rad;
  const double narrowed = h - fast_acos_error_rad;
  return narrowed < 0.0 ? -1.0 : narrowed;
}

}  // namespace skein
