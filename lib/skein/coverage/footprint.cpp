#include "skein/coverage/footprint.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"

namespace skein {

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

}  // namespace skein
