// Evidence for the region grid across the antimeridian: written with longitudes past 180 deg, a region is
// the small one meant (never its complement, which a jump from 170 to -170 would have given, and which the
// reader now refuses; tests/malformed/region_antimeridian_jump.yaml).
#include <doctest/doctest.h>

#include <cmath>

#include "coverage_test_designs.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/input/design_file.hpp"

using namespace skein;

TEST_CASE("region grid: a box from 170 to 190 deg of longitude holds exactly its 20 x 20 one-degree cells") {
  // Cells of 1 deg centred at -89.5 .. 89.5 and -179.5 .. 179.5: the box lon 170..190, lat -10..10 holds the
  // centres lon 170.5 .. 179.5 and -179.5 .. -170.5 (20 columns) and lat -9.5 .. 9.5 (20 rows), 400 in all,
  // counted by hand; the complement would hold 340 x 20 = 6800.
  const Design d = read_design_text(
      test::coverage_design_head() + test::equatorial_satellite(550.0, 0.0) +
          "coverage:\n  grid:\n    kind: region\n    spacing_deg: 1\n    vertices:\n      - [170, -10]\n"
          "      - [190, -10]\n      - [190, 10]\n      - [170, 10]\n",
      "box.yaml");
  const Grid g = build_grid(d.coverage, d.earth);
  CHECK(g.points.size() == 400);
  for (const GridPoint& p : g.points) {
    CHECK(std::abs(p.lat_deg) < 10.0);
    CHECK(std::abs(p.lon_deg) > 170.0);
  }
}
