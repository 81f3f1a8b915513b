#pragma once
// The `coverage` block of a design: which ground points, the visibility conditions and the time sampling.
// Every field has a stated default, used when the block or the key is absent.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/constants.hpp"
#include "skein/design/requirement.hpp"

namespace skein {

// The kind of ground grid.
enum class GridKind {
  global,  // latitude/longitude cells over the whole Earth, area-weighted
  band,    // the same cells between two latitudes
  region,  // the cells whose centre lies inside a longitude/latitude polygon
  sites    // a list of named points, equally weighted
};
std::string_view to_string(GridKind kind);
std::optional<GridKind> grid_kind_from_string(std::string_view text);

struct GeoVertex {
  double lon_deg = 0.0;
  double lat_deg = 0.0;
};

struct Site {
  std::string name;
  double lat_deg = 0.0;  // geodetic latitude
  double lon_deg = 0.0;
  double height_km = 0.0;  // above the ellipsoid
};

struct CoverageSpec {
  bool present = false;                 // the design has a coverage block
  GridKind grid = GridKind::global;     // grid.kind, default global
  double spacing_deg = 2.0;             // grid.spacing_deg: cell size in latitude and longitude; must divide 180
  double band_lat_min_deg = -90.0;      // grid.lat_min_deg (band)
  double band_lat_max_deg = 90.0;       // grid.lat_max_deg (band)
  std::vector<GeoVertex> region;        // grid.vertices as [lon, lat] pairs (region); open ring, no repeat
  std::vector<Site> sites;              // grid.sites (sites)
  double min_elevation_deg = 10.0;      // elevation mask from the local (geodetic) horizontal, 0 to 89
  std::optional<double> nadir_half_angle_deg;  // payload cone half-angle at the satellite; none by default
  // Daylight at the target: a point counts as covered only while the Sun's centre stands at least this high
  // above its local (geodetic) horizontal (geometric, no refraction), -18 to 90 deg; none by default.
  std::optional<double> min_sun_elevation_deg;
  double span_s = 86400.0;              // span_h (default 24 h) from the design epoch
  double step_s = 60.0;                 // step_s, default 60 s
  std::optional<int> max_fold;          // max_fold K; default min(3, satellites)
  double band_width_deg = 10.0;         // latitude_band_deg: width of the reporting latitude bands
  // requirement: judged by `skein coverage` and the report; the evaluation reaches its fold even when
  // max_fold is lower
  std::optional<Requirement> requirement;
};


}  // namespace skein
