// Evidence for the TopoJSON decoder (lib/skein/report/land_outlines.cpp) and the land outlines of the maps.
// Reference for the format: the TopoJSON specification 1.0 (github.com/topojson/topojson-specification,
// sections 2.1.2 transforms, 2.1.3 arcs, 2.1.4 arc indexes): quantized positions are delta-encoded and decoded
// as (running sum) * scale + translate; arc index ~i (= -i - 1) is arc i reversed; consecutive arcs of a ring
// share their end point. The hand-made topologies below are decoded by hand in the comments; the values are
// exact in binary (multiples of 0.5), so the checks are exact.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <string>

#include "skein/constants.hpp"
#include "skein/error.hpp"
#include "skein/report/land_outlines.hpp"
#include "skein/report/map_plot.hpp"

using namespace skein;

namespace {

// Two arcs forming one square ring, quantized with scale (0.5, 0.5) and translate (-10, 20):
//  arc 0: [0,0] [20,0] [0,20]  -> sums (0,0) (20,0) (20,20) -> (-10,20) (0,20) (0,30)
//  arc 1: [20,20] [-20,0] [0,-20] -> sums (20,20) (0,20) (0,0) -> (0,30) (-10,30) (-10,20)
// Ring [0, 1]: (-10,20) (0,20) (0,30) (-10,30) (-10,20), the shared (0,30) kept once.
// Ring [~1, ~0] (the same ring reversed): (-10,20) (-10,30) (0,30) (0,20) (-10,20).
const char* square = R"({"type":"Topology",
  "transform":{"scale":[0.5,0.5],"translate":[-10,20]},
  "objects":{"land":{"type":"GeometryCollection","geometries":[
     {"type":"Polygon","arcs":[[0,1]]},
     {"type":"MultiPolygon","arcs":[[[-2,-1]]]},
     {"type":"LineString","arcs":[0]}]}},
  "arcs":[[[0,0],[20,0],[0,20]],[[20,20],[-20,0],[0,-20]]]})";

void check_ring(const Ring& r, const std::vector<LonLat>& want) {
  REQUIRE(r.size() == want.size());
  for (size_t k = 0; k < r.size(); ++k) {
    CHECK(r[k].lon_deg == want[k].lon_deg);
    CHECK(r[k].lat_deg == want[k].lat_deg);
  }
}

}  // namespace

TEST_CASE("topojson: quantized, delta-encoded arcs decode to the hand-computed positions, stitched and reversed") {
  const LandOutlines land = decode_topojson(square, "square.json");
  REQUIRE(land.polygons.size() == 2);  // the LineString carries no area: skipped
  check_ring(land.polygons[0].rings.at(0), {{-10, 20}, {0, 20}, {0, 30}, {-10, 30}, {-10, 20}});
  check_ring(land.polygons[1].rings.at(0), {{-10, 20}, {-10, 30}, {0, 30}, {0, 20}, {-10, 20}});
  // Area of the 10 x 10 deg box between 20 and 30 deg north on the unit sphere: dlon (sin 30 - sin 20)
  // (the zone-area formula, e.g. Snyder, "Map Projections: A Working Manual", 1987, ch. 10), exact for the
  // edges along parallels; the meridian edges add nothing. The two rings run in opposite directions.
  const double want = 10.0 * rad_per_deg * (std::sin(30 * rad_per_deg) - std::sin(20 * rad_per_deg));
  CHECK(ring_signed_area_sr(land.polygons[0].rings[0]) == doctest::Approx(want).epsilon(1e-12));
  CHECK(ring_signed_area_sr(land.polygons[1].rings[0]) == doctest::Approx(-want).epsilon(1e-12));
}

TEST_CASE("topojson: without a transform the positions are taken as they are") {
  const LandOutlines land = decode_topojson(
      R"({"type":"Topology","objects":{"a":{"type":"Polygon","arcs":[[0]]}},
          "arcs":[[[1.5,2],[3,2],[3,4],[1.5,2]]]})", "plain.json");
  check_ring(land.polygons.at(0).rings.at(0), {{1.5, 2}, {3, 2}, {3, 4}, {1.5, 2}});
}

TEST_CASE("topojson: malformed files are refused with the file named") {
  for (const char* text : {"not json", R"({"type":"FeatureCollection"})",
                           R"({"type":"Topology","objects":{"a":{"type":"Polygon","arcs":[[3]]}},"arcs":[]})",
                           R"({"type":"Topology","objects":{},"arcs":[]})"}) {
    CHECK_THROWS_WITH_AS(decode_topojson(text, "bad.json"), doctest::Contains("bad.json: "), InputError);
  }
}

TEST_CASE("topojson: a missing file leaves the outlines out and says why") {
  const LandOutlineLoad l = load_land_outlines("/nonexistent/land-110m.json");
  CHECK(!l.outlines);
  CHECK(l.note.find("land outlines missing") != std::string::npos);
  CHECK(l.note.find("/nonexistent/land-110m.json") != std::string::npos);
}

TEST_CASE("antimeridian: a ring across 180 deg is unwrapped into one piece, and a ring round a pole is closed along it") {
  // A box from 170 E to 170 W written as the data carries it (longitudes in [-180, 180]).
  const Ring across = {{170, 0}, {-170, 0}, {-170, 10}, {170, 10}, {170, 0}};
  const Ring u = unwrap_longitudes(across);
  CHECK(u[1].lon_deg == 190.0);
  CHECK(u[2].lon_deg == 190.0);
  CHECK(u[4].lon_deg == 170.0);
  // Its area: 20 deg of longitude between 0 and 10 deg north.
  CHECK(std::abs(ring_signed_area_sr(across)) ==
        doctest::Approx(20.0 * rad_per_deg * std::sin(10 * rad_per_deg)).epsilon(1e-12));
  // A ring along 60 S all the way round (as Antarctica's outline runs): it closes along the south pole,
  // enclosing the cap south of 60 S, area 2 pi (1 - sin 60) on the unit sphere.
  Ring polar;
  for (int lon = -180; lon <= 180; lon += 30) polar.push_back({static_cast<double>(lon == 180 ? -180 : lon), -60.0});
  const Ring f = fillable_ring(polar);
  CHECK(f.back().lon_deg == f.front().lon_deg);
  CHECK(f[f.size() - 2].lat_deg == -90.0);
  CHECK(std::abs(ring_signed_area_sr(polar)) == doctest::Approx(two_pi * (1 - std::sin(60 * rad_per_deg))).epsilon(1e-12));
}

TEST_CASE("zoomed map view: points across the antimeridian keep together, and spread points fall back to the world") {
  const MapView v = zoomed_view({{170, -10}, {-170, 10}}, 0.15, 2.0);
  // Span 20 deg of longitude plus 3 deg each side (15 %), not the 340 deg the raw longitudes would give.
  CHECK(v.lon_min_deg == doctest::Approx(167.0));
  CHECK(v.lon_max_deg == doctest::Approx(193.0));
  CHECK(v.lat_min_deg == doctest::Approx(-13.0));
  CHECK(v.tick_deg == 5.0);  // 26 deg / 5 = 5.2 ticks, the finest step giving at most 8
  const MapView w = zoomed_view({{-170, -80}, {0, 80}, {170, 0}}, 0.15, 2.0);
  CHECK(w.lon_max_deg - w.lon_min_deg == 360.0);
}

TEST_CASE("land outlines: the installed Natural Earth 1:110m land covers about 29 % of the Earth's surface") {
  // Reference: land is 148.94 million km^2 of the Earth's 510.072 million km^2, 29.2 % (CIA World Factbook,
  // "World: Geography", FROM MEMORY; geography texts round it to "about 29 %"). Tolerance: 2 percentage points.
  // Why: the 1:110m outlines are generalised for a small-scale map (vertices every 50-100 km), which moves the
  // coast in and out across whole bays and drops small islands; the land polygons include inland water bodies
  // that the reference counts as land anyway; the fraction is taken on a sphere with edges drawn straight in
  // longitude and latitude (as the map draws them). A decoder error (a lost or reversed arc, a wrong delta sum,
  // Antarctica's ring left open) moves the figure by far more: Antarctica alone is about 2.8 % and Eurasia about 10.7 % (areas FROM MEMORY).
  const std::string path = std::string(SKEIN_SOURCE_DIR) + "/third_party/world-atlas/node_modules/world-atlas/land-110m.json";
  if (!std::filesystem::exists(path)) {
    MESSAGE("land-110m.json not installed (scripts/setup.sh installs it): skipped");
    return;
  }
  const LandOutlineLoad l = load_land_outlines(path);
  REQUIRE(l.outlines);
  const double f = land_area_fraction(*l.outlines);
  MESSAGE("land area fraction of land-110m.json: " << 100.0 * f << " %");
  CHECK(f == doctest::Approx(0.292).epsilon(0.02 / 0.292));
  // Every decoded position is a longitude and latitude.
  for (const auto& p : l.outlines->polygons)
    for (const auto& r : p.rings)
      for (const auto& q : r) {
        REQUIRE(std::abs(q.lon_deg) <= 180.0 + 1e-9);
        REQUIRE(std::abs(q.lat_deg) <= 90.0 + 1e-9);
      }
}
