#include "skein/coverage/grid.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/polygon.hpp"
#include "skein/error.hpp"

namespace skein {
namespace {

double authalic_q(double e, double s) {
  const double e2 = e * e;
  if (e < 1e-12) return 2.0 * s;  // sphere limit of the expression below
  return (1.0 - e2) * (s / (1.0 - e2 * s * s) - std::log((1.0 - e * s) / (1.0 + e * s)) / (2.0 * e));
}

GridPoint make_point(const EarthModel& earth, double lat_deg, double lon_deg, double height_km) {
  GridPoint p;
  p.lat_deg = lat_deg;
  p.lon_deg = lon_deg;
  p.height_km = height_km;
  p.r_km = geodetic_to_earth_fixed(earth, lat_deg * rad_per_deg, lon_deg * rad_per_deg, height_km);
  p.up = geodetic_up(lat_deg * rad_per_deg, lon_deg * rad_per_deg);
  return p;
}

void add_rows(Grid& g, const EarthModel& earth, double lat0_deg, double lat1_deg, double spacing,
              const std::vector<GeoVertex>* region) {
  const int rows = static_cast<int>(std::lround((lat1_deg - lat0_deg) / spacing));
  const int cols = static_cast<int>(std::lround(360.0 / spacing));
  for (int i = 0; i < rows; ++i) {
    const double lo = lat0_deg + i * spacing, hi = (i + 1 == rows) ? lat1_deg : lat0_deg + (i + 1) * spacing;
    const double lat = 0.5 * (lo + hi);
    const double zone = zone_area_fraction(earth.flattening, lo * rad_per_deg, hi * rad_per_deg) / cols;
    for (int j = 0; j < cols; ++j) {
      const double lon = -180.0 + (j + 0.5) * spacing;
      if (region && !point_in_polygon(lon, lat, *region)) continue;
      GridPoint p = make_point(earth, lat, lon, 0.0);
      p.area_weight = zone;
      p.cell = CellBounds{lo, hi, -180.0 + j * spacing, -180.0 + (j + 1) * spacing};
      g.points.push_back(std::move(p));
    }
  }
}

}  // namespace

double zone_area_fraction(double flattening, double lat1_rad, double lat2_rad) {
  const double e = std::sqrt(flattening * (2.0 - flattening));
  return (authalic_q(e, std::sin(lat2_rad)) - authalic_q(e, std::sin(lat1_rad))) / (2.0 * authalic_q(e, 1.0));
}

double grid_point_count_bound(const CoverageSpec& spec) {
  if (spec.grid == GridKind::sites) return static_cast<double>(spec.sites.size());
  const double cols = std::round(360.0 / spec.spacing_deg);
  double lat0 = -90.0, lat1 = 90.0;
  if (spec.grid == GridKind::band) {
    lat0 = spec.band_lat_min_deg;
    lat1 = spec.band_lat_max_deg;
  }
  const double rows = std::round((lat1 - lat0) / spec.spacing_deg);  // as add_rows counts them
  if (spec.grid != GridKind::region || spec.region.empty()) return rows * cols;
  double lo = 90.0, hi = -90.0;
  for (const GeoVertex& v : spec.region) {
    lo = std::min(lo, v.lat_deg);
    hi = std::max(hi, v.lat_deg);
  }
  // Rows whose centre latitude -90 + (i + 1/2) spacing lies in [lo, hi], plus one either side for rounding.
  const double first = std::max(0.0, std::floor((lo + 90.0) / spec.spacing_deg - 0.5) - 1.0);
  const double last = std::min(rows - 1.0, std::ceil((hi + 90.0) / spec.spacing_deg - 0.5) + 1.0);
  return std::max(0.0, last - first + 1.0) * cols;
}

Grid build_grid(const CoverageSpec& spec, const EarthModel& earth) {
  Grid g;
  g.kind = spec.grid;
  g.spacing_deg = spec.grid == GridKind::sites ? 0.0 : spec.spacing_deg;
  switch (spec.grid) {
    case GridKind::global: add_rows(g, earth, -90.0, 90.0, spec.spacing_deg, nullptr); break;
    case GridKind::band: add_rows(g, earth, spec.band_lat_min_deg, spec.band_lat_max_deg, spec.spacing_deg, nullptr); break;
    case GridKind::region:
      add_rows(g, earth, -90.0, 90.0, spec.spacing_deg, &spec.region);
      if (g.points.empty())
        throw InputError(fmt::format("coverage.grid.vertices: the region holds no cell centre of the {} deg grid; "
                                     "expected a larger region or a finer spacing_deg", spec.spacing_deg));
      break;
    case GridKind::sites:
      for (const Site& s : spec.sites) {
        const double lon = s.lon_deg >= 180.0 ? s.lon_deg - 360.0 : s.lon_deg;
        GridPoint p = make_point(earth, s.lat_deg, lon, s.height_km);
        p.name = s.name;
        g.points.push_back(std::move(p));
      }
      break;
  }
  if (g.points.empty()) throw InputError("coverage.grid: the grid has no points; expected at least one site or cell");
  // Normalise the weights so they sum to 1 over the grid (sites: equal weights).
  double total = 0.0;
  for (const GridPoint& p : g.points) total += p.area_weight;
  for (GridPoint& p : g.points)
    p.area_weight = spec.grid == GridKind::sites ? 1.0 / static_cast<double>(g.points.size()) : p.area_weight / total;
  return g;
}

}  // namespace skein
