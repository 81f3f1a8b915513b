#pragma once
// GeoJSON (RFC 7946) for per-cell results: a FeatureCollection of Polygon features, one per grid cell.
// RFC 7946 sec. 3.1.6: exterior rings are closed (first position repeated last) and counterclockwise
// (right-hand rule); positions are [longitude, latitude] in WGS-84 degrees (sec. 4).
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

namespace skein {

struct GeoCell {
  double lon_min_deg, lon_max_deg, lat_min_deg, lat_max_deg;
  nlohmann::ordered_json properties;
};

// The FeatureCollection as JSON text. Cell edges are densified every `edge_step_deg` of longitude so that
// long parallels keep their shape in projections that curve them.
std::string render_geojson(const std::vector<GeoCell>& cells, double edge_step_deg = 10.0);

}  // namespace skein
