// Evidence for grid_point_count_bound (lib/skein/coverage/grid.cpp): the coverage guard estimates the grid's
// size from spacing and extent before building it. The count must equal what build_grid makes for global,
// band and site grids (the guard then refuses exactly what it refused before) and bound it from above for a
// region (a refused region is never one that would have fitted).
#include <doctest/doctest.h>

#include "skein/constants.hpp"
#include "skein/coverage/grid.hpp"

using namespace skein;

TEST_CASE("grid bound: equals the built grid for global and band grids, bounds a region from above") {
  const EarthModel earth = wgs84;
  for (double spacing : {30.0, 10.0, 5.0, 3.0, 2.0, 1.5, 1.0, 0.75, 0.5}) {
    CoverageSpec g;
    g.grid = GridKind::global;
    g.spacing_deg = spacing;
    CHECK(grid_point_count_bound(g) == static_cast<double>(build_grid(g, earth).points.size()));  // whole numbers: exact
    CoverageSpec b = g;
    b.grid = GridKind::band;
    b.band_lat_min_deg = -30.0;
    b.band_lat_max_deg = 60.0;
    CHECK(grid_point_count_bound(b) == static_cast<double>(build_grid(b, earth).points.size()));
    CoverageSpec r = g;
    r.grid = GridKind::region;
    r.region = {{-10.0, 35.0}, {30.0, 35.0}, {30.0, 60.0}, {-10.0, 60.0}};  // open ring
    if (spacing <= 10.0) {
      const double built = static_cast<double>(build_grid(r, earth).points.size());
      CHECK(grid_point_count_bound(r) >= built);
      // Not wildly loose: the rows of the region's 25 deg of latitude, two more either side (one for rounding,
      // one of margin) and one for a partial row, times every column.
      CHECK(grid_point_count_bound(r) <= (25.0 / spacing + 5.0) * 360.0 / spacing);
    }
  }
  // The grid of the issue: 0.01 deg, 18000 x 36000 = 648 million points, counted without building it.
  CoverageSpec fine;
  fine.grid = GridKind::global;
  fine.spacing_deg = 0.01;
  CHECK(grid_point_count_bound(fine) == 648e6);
  CoverageSpec sites;
  sites.grid = GridKind::sites;
  sites.sites = {Site{}, Site{}, Site{}};
  CHECK(grid_point_count_bound(sites) == 3.0);
}
