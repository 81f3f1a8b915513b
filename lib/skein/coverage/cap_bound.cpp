#include "skein/coverage/cap_bound.hpp"

#include <cassert>
#include <cmath>

#include "skein/constants.hpp"
#include "skein/coverage/ground_geometry.hpp"

namespace skein {

double cap_area_fraction(double central_angle_rad) { return 0.5 * (1.0 - std::cos(central_angle_rad)); }

double band_area_fraction(double lat_min_rad, double lat_max_rad) {
  return 0.5 * (std::sin(lat_max_rad) - std::sin(lat_min_rad));
}

long cap_bound_count(int fold, double area, double cap, double others) {
  assert(cap > 0.0);
  const double need = static_cast<double>(fold) * area - others;
  if (need <= 0.0) return 0;
  // A relative 1e-12 allowance, so that a quotient equal to a whole number up to rounding is not raised by one.
  return static_cast<long>(std::ceil(need / cap * (1.0 - 1e-12)));
}

std::optional<long> cap_bound_satellites(const Design& design, size_t shell, int fold) {
  const CoverageSpec& c = design.coverage;
  double area = 0.0;
  if (c.grid == GridKind::global)
    area = 1.0;
  else if (c.grid == GridKind::band)
    area = band_area_fraction(c.band_lat_min_deg * rad_per_deg, c.band_lat_max_deg * rad_per_deg);
  else
    return std::nullopt;
  const double re = design.earth.radius_km;
  auto cap_of = [&](const Shell& s) {
    const double r = s.a_km * (1.0 + s.e);
    const double eps = c.min_elevation_deg * rad_per_deg;
    const double lambda = c.nadir_half_angle_deg
                              ? footprint_central_angle_rad(re, r, eps, *c.nadir_half_angle_deg * rad_per_deg)
                              : footprint_central_angle_rad(re, r, eps);
    return cap_area_fraction(lambda);
  };
  double others = 0.0;
  for (size_t s = 0; s < design.shells.size(); ++s)
    if (s != shell) others += static_cast<double>(design.shells[s].satellites) * cap_of(design.shells[s]);
  return cap_bound_count(fold, area, cap_of(design.shells[shell]), others);
}

}  // namespace skein
