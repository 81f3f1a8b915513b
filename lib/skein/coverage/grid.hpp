#pragma once
// Ground grids for coverage: latitude/longitude cells (global, a band, or inside a region polygon) with
// area weights, or a list of sites.
#include <optional>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "skein/constants.hpp"
#include "skein/design/coverage_spec.hpp"

namespace skein {

// A grid cell's bounds in geodetic latitude and longitude (deg); kept for maps and GeoJSON polygons.
struct CellBounds {
  double lat_min_deg = 0.0, lat_max_deg = 0.0, lon_min_deg = 0.0, lon_max_deg = 0.0;
};

struct GridPoint {
  std::string name;        // site name, or "" for cells
  double lat_deg = 0.0;    // geodetic latitude of the point (cell centre)
  double lon_deg = 0.0;    // longitude, -180..180
  double height_km = 0.0;  // above the ellipsoid
  double area_weight = 0.0;  // share of the grid's area (sums to 1 over the grid); sites: 1/N
  std::optional<CellBounds> cell;  // none for sites
  Eigen::Vector3d r_km = Eigen::Vector3d::Zero();  // Earth-fixed position
  Eigen::Vector3d up = Eigen::Vector3d::UnitZ();   // geodetic vertical
};

struct Grid {
  GridKind kind = GridKind::global;
  double spacing_deg = 0.0;  // 0 for sites
  std::vector<GridPoint> points;
};

// The area of the ellipsoid zone between geodetic latitudes phi1 < phi2, as a fraction of the whole
// ellipsoid's area: (q(phi2) - q(phi1)) / (2 q(pi/2)), with the authalic function
// q(phi) = (1 - e^2) [ sin phi / (1 - e^2 sin^2 phi) - ln((1 - e sin phi)/(1 + e sin phi)) / (2 e) ].
// Source: J.P. Snyder, "Map Projections - A Working Manual", USGS Prof. Paper 1395 (1987), eq. 3-12.
// Reduces to (sin phi2 - sin phi1)/2 for a sphere (e = 0).
double zone_area_fraction(double flattening, double lat1_rad, double lat2_rad);

// The number of points build_grid would make, computed from the spacing and extent without building
// anything: exact for global, band and site grids; for a region, the cells of the latitude rows its
// vertices span (an upper bound). Lets the coverage guard refuse a huge grid before it is built.
double grid_point_count_bound(const CoverageSpec& spec);

// Build the grid of a coverage spec. Cells are spacing x spacing deg, rows centred at -90 + (i + 1/2) spacing
// (band: from lat_min_deg), columns at -180 + (j + 1/2) spacing. Throws InputError when a region holds no
// cell centre at that spacing.
Grid build_grid(const CoverageSpec& spec, const EarthModel& earth);

}  // namespace skein
