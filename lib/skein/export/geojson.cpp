#include "skein/export/geojson.hpp"

#include <cassert>
#include <cmath>

namespace skein {

std::string render_geojson(const std::vector<GeoCell>& cells, double edge_step_deg) {
  nlohmann::ordered_json fc;
  fc["type"] = "FeatureCollection";
  fc["features"] = nlohmann::ordered_json::array();
  for (const auto& c : cells) {
    assert(c.lon_max_deg > c.lon_min_deg && c.lat_max_deg > c.lat_min_deg);
    nlohmann::ordered_json ring = nlohmann::ordered_json::array();
    const int n = std::max(1, static_cast<int>(std::ceil((c.lon_max_deg - c.lon_min_deg) / edge_step_deg)));
    // Counterclockwise: along the southern edge eastwards, up the east edge, the northern edge westwards, down.
    for (int k = 0; k < n; ++k) ring.push_back({c.lon_min_deg + (c.lon_max_deg - c.lon_min_deg) * k / n, c.lat_min_deg});
    ring.push_back({c.lon_max_deg, c.lat_min_deg});
    for (int k = 0; k < n; ++k) ring.push_back({c.lon_max_deg - (c.lon_max_deg - c.lon_min_deg) * k / n, c.lat_max_deg});
    ring.push_back({c.lon_min_deg, c.lat_max_deg});
    ring.push_back({c.lon_min_deg, c.lat_min_deg});
    nlohmann::ordered_json f;
    f["type"] = "Feature";
    f["geometry"] = {{"type", "Polygon"}, {"coordinates", nlohmann::ordered_json::array({ring})}};
    f["properties"] = c.properties;
    fc["features"].push_back(std::move(f));
  }
  return fc.dump() + "\n";
}

}  // namespace skein
