#include "skein/search/cap_screen.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"
#include "skein/coverage/cap_bound.hpp"
#include "skein/coverage/ground_geometry.hpp"

namespace skein {

double cap_weight_bound(double central_angle_rad, double spacing_deg) {
  const double widened = std::min(pi, central_angle_rad + (spacing_deg + cap_screen_angle_allowance_deg) * rad_per_deg);
  return std::min(1.0, (1.0 + cap_screen_area_allowance) * cap_area_fraction(widened));
}

std::optional<CapScreen> cap_screen(const Design& design, const Requirement& requirement) {
  const CoverageSpec& c = design.coverage;
  if (c.grid != GridKind::global) return std::nullopt;
  double x = 0.0;
  bool any = false;
  for (const Threshold& t : requirement.thresholds) {
    if (t.figure == RequirementFigure::percent_covered || t.figure == RequirementFigure::worst_instant_percent ||
        t.figure == RequirementFigure::worst_point_percent) {
      x = std::max(x, t.value);
      any = true;
    }
  }
  if (!any) return std::nullopt;
  CapScreen s;
  s.threshold_percent = x;
  s.need = static_cast<double>(requirement.fold) * x / 100.0;
  const double re = design.earth.radius_km;
  const double eps = c.min_elevation_deg * rad_per_deg;
  for (const Shell& shell : design.shells) {
    const double r = shell.a_km * (1.0 + shell.e);
    const double lambda = c.nadir_half_angle_deg
                              ? footprint_central_angle_rad(re, r, eps, *c.nadir_half_angle_deg * rad_per_deg)
                              : footprint_central_angle_rad(re, r, eps);
    s.supply += static_cast<double>(shell.satellites) * cap_weight_bound(lambda, c.spacing_deg);
  }
  return s;
}

}  // namespace skein
