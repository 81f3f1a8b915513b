// Evidence for lib/skein/export/geojson.hpp against the rules of RFC 7946.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include "skein/export/geojson.hpp"

using namespace skein;

TEST_CASE("geojson: cells are closed, counterclockwise [lon, lat] polygons (RFC 7946 sec. 3.1.6, 4)") {
  std::vector<GeoCell> cells = {{-180.0, -150.0, -90.0, -60.0, {{"percent_covered", 12.5}}},
                                {10.0, 11.0, 45.0, 46.0, {{"percent_covered", 99.0}}}};
  const auto doc = nlohmann::json::parse(render_geojson(cells, 10.0));
  CHECK(doc["type"] == "FeatureCollection");
  REQUIRE(doc["features"].size() == 2);
  for (size_t k = 0; k < 2; ++k) {
    const auto& f = doc["features"][k];
    CHECK(f["type"] == "Feature");
    CHECK(f["geometry"]["type"] == "Polygon");
    const auto& ring = f["geometry"]["coordinates"][0];
    REQUIRE(ring.size() >= 4);                        // a linear ring has at least four positions
    CHECK(ring.front() == ring.back());               // closed
    double twice_area = 0;                            // shoelace: positive for counterclockwise
    for (size_t j = 0; j + 1 < ring.size(); ++j) {
      const double x0 = ring[j][0], y0 = ring[j][1], x1 = ring[j + 1][0], y1 = ring[j + 1][1];
      twice_area += x0 * y1 - x1 * y0;
      CHECK(x0 >= -180.0); CHECK(x0 <= 180.0);        // longitude first
      CHECK(y0 >= -90.0); CHECK(y0 <= 90.0);
    }
    CHECK(twice_area > 0);
    const double w = cells[k].lon_max_deg - cells[k].lon_min_deg, h = cells[k].lat_max_deg - cells[k].lat_min_deg;
    CHECK(twice_area / 2 == doctest::Approx(w * h));
  }
  CHECK(doc["features"][1]["properties"]["percent_covered"] == 99.0);
  // Densified: the 30 deg wide cell has 3 points along each parallel.
  CHECK(doc["features"][0]["geometry"]["coordinates"][0].size() == 9);
}
