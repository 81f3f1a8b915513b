#include "skein/search/cap_screen.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"
#include "skein/coverage/cap_bound.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"

namespace skein {

double cap_weight_bound(double central_angle_rad, double spacing_deg) {
  const double widened = std::min(pi, central_angle_rad + (spacing_deg + cap_screen_angle_allowance_deg) * rad_per_deg);
  return std::min(1.0, (1.0 + cap_screen_area_allowance) * cap_area_fraction(widened));
}

double region_cap_weight_bound(double central_angle_rad, double spacing_deg, double grid_area_fraction) {
  if (!(grid_area_fraction > 0.0)) return 1.0;
  return std::min(1.0, cap_weight_bound(central_angle_rad, spacing_deg) / grid_area_fraction);
}

double latitude_time_fraction_bound(double inclination_rad, double lat_lo_rad, double lat_hi_rad, double period_s,
                                    double span_s) {
  if (lat_hi_rad < lat_lo_rad) return 0.0;
  if (!(period_s > 0.0) || !(span_s > 0.0)) return 1.0;
  const double si = std::abs(std::sin(inclination_rad));
  double f = 0.0;
  if (si < 1e-12) {
    f = lat_lo_rad <= 0.0 && lat_hi_rad >= 0.0 ? 1.0 : 0.0;  // an equatorial orbit stays at latitude 0
  } else {
    const auto y = [&](double lat) { return std::clamp(std::sin(std::clamp(lat, -pi / 2, pi / 2)) / si, -1.0, 1.0); };
    f = (std::asin(y(lat_hi_rad)) - std::asin(y(lat_lo_rad))) / pi;
  }
  const double whole = std::floor(span_s / period_s);
  const double rest = span_s - whole * period_s;
  return std::min(1.0, (whole * period_s * f + std::min(rest, period_s * f)) / span_s);
}

namespace {

double footprint_of(const Design& design, double apogee_radius_km) {
  const CoverageSpec& c = design.coverage;
  const double eps = c.min_elevation_deg * rad_per_deg;
  return c.nadir_half_angle_deg
             ? footprint_central_angle_rad(design.earth.radius_km, apogee_radius_km, eps, *c.nadir_half_angle_deg * rad_per_deg)
             : footprint_central_angle_rad(design.earth.radius_km, apogee_radius_km, eps);
}

// Band and region grids: the instantaneous and the time-averaged bounds (the header's).
std::optional<CapScreen> regional_cap_screen(const Design& design, const Requirement& requirement,
                                             double x_time, bool any_time, double x_instant, bool any_instant) {
  const CoverageSpec& c = design.coverage;
  Grid grid;
  try {
    grid = build_grid(c, design.earth);
  } catch (const InputError&) {
    return std::nullopt;  // the evaluation reports it
  }
  if (grid.points.empty()) return std::nullopt;
  double area = 0.0, lat_min = 90.0, lat_max = -90.0;
  for (const GridPoint& p : grid.points) {
    const CellBounds& b = *p.cell;
    area += zone_area_fraction(design.earth.flattening, b.lat_min_deg * rad_per_deg, b.lat_max_deg * rad_per_deg) *
            (b.lon_max_deg - b.lon_min_deg) / 360.0;
    lat_min = std::min(lat_min, p.lat_deg);
    lat_max = std::max(lat_max, p.lat_deg);
  }
  const double span_s = c.span_s;
  double supply_time = 0.0, supply_instant = 0.0;
  for (const Satellite& s : expand_constellation(design)) {
    const MeanElements& el = s.elements;
    const double lambda = footprint_of(design, el.a_km * (1.0 + el.e));
    const double w = region_cap_weight_bound(lambda, c.spacing_deg, area);
    supply_instant += w;
    double f = 1.0;
    if (el.e == 0.0) {
      const SecularOrbit orbit = make_secular_orbit(design.earth, el);
      const double rate = orbit.rates.argp_rad_s + orbit.rates.mean_anomaly_rad_s;
      const double margin = lambda + (cap_screen_angle_allowance_deg + cap_screen_geocentric_allowance_deg) * rad_per_deg;
      if (rate > 0.0)
        f = latitude_time_fraction_bound(el.i_rad, lat_min * rad_per_deg - margin, lat_max * rad_per_deg + margin,
                                         two_pi / rate, span_s);
    }
    supply_time += w * f;
  }
  const double k = static_cast<double>(requirement.fold);
  std::optional<CapScreen> first;
  if (any_time) {
    CapScreen t;
    t.threshold_percent = x_time;
    t.need = k * x_time / 100.0;
    t.supply = supply_time;
    t.time_average = true;
    if (t.rules_out()) return t;
    first = t;
  }
  if (any_instant) {
    CapScreen t;
    t.threshold_percent = x_instant;
    t.need = k * x_instant / 100.0;
    t.supply = supply_instant;
    if (t.rules_out() || !first) return t;
  }
  return first;
}

}  // namespace

std::optional<CapScreen> cap_screen(const Design& design, const Requirement& requirement) {
  const CoverageSpec& c = design.coverage;
  if (c.grid == GridKind::sites) return std::nullopt;
  double x = 0.0, x_time = 0.0, x_instant = 0.0;
  bool any = false, any_time = false, any_instant = false;
  for (const Threshold& t : requirement.thresholds) {
    if (t.figure == RequirementFigure::percent_covered || t.figure == RequirementFigure::worst_instant_percent ||
        t.figure == RequirementFigure::worst_point_percent) {
      x = std::max(x, t.value);
      any = true;
    }
    if (t.figure == RequirementFigure::worst_instant_percent) {
      x_instant = std::max(x_instant, t.value);
      any_instant = true;
    } else if (t.figure == RequirementFigure::percent_covered || t.figure == RequirementFigure::worst_point_percent) {
      x_time = std::max(x_time, t.value);
      any_time = true;
    }
  }
  if (!any) return std::nullopt;
  if (c.grid != GridKind::global) return regional_cap_screen(design, requirement, x_time, any_time, x_instant, any_instant);
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
