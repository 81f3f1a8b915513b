// Evidence for the search's cap-area screen (lib/skein/search/cap_screen): the weight of the grid points a
// satellite sees at once, computed with the coverage evaluator's own visibility test (elevation from the
// geodetic vertical of each WGS-84 grid point, coverage/ground_geometry.hpp) on the real global grid, never
// exceeds cap_weight_bound, for satellites at random places and altitudes from 400 to 1500 km, masks 0 to 30
// deg and grid spacings 2 to 15 deg. The bound must hold for every sample (it is what lets the search skip a
// layout); it is also checked not to be vacuous (below 1.6 times the largest sampled weight for a 5 deg grid).
#include <doctest/doctest.h>

#include <cmath>
#include <random>

#include "skein/constants.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/search/cap_screen.hpp"

using namespace skein;

TEST_CASE("cap screen: the weight one satellite sees on a global grid stays under the bound") {
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const EarthModel earth = wgs84;
  for (double spacing : {2.0, 5.0, 10.0, 15.0}) {
    CoverageSpec spec;
    spec.grid = GridKind::global;
    spec.spacing_deg = spacing;
    const Grid grid = build_grid(spec, earth);
    double worst_ratio = 0.0;
    for (int k = 0; k < 200; ++k) {
      const double alt_km = 400.0 + 1100.0 * u(rng);
      const double mask_deg = 30.0 * u(rng);
      // Uniform on the sphere, with extra samples at the poles and the equator (where cells are smallest/largest).
      double lat = std::asin(2.0 * u(rng) - 1.0);
      if (k % 10 == 0) lat = (k % 20 == 0 ? 1.0 : -1.0) * (pi / 2 - 0.01 * u(rng));
      if (k % 10 == 1) lat = 0.01 * (u(rng) - 0.5);
      const double lon = two_pi * u(rng);
      const double r = earth.radius_km + alt_km;
      const Eigen::Vector3d sat(r * std::cos(lat) * std::cos(lon), r * std::cos(lat) * std::sin(lon), r * std::sin(lat));
      double seen = 0.0;
      for (const GridPoint& p : grid.points)
        if (elevation_rad(p.r_km, p.up, sat) >= mask_deg * rad_per_deg) seen += p.area_weight;
      const double bound =
          cap_weight_bound(footprint_central_angle_rad(earth.radius_km, r, mask_deg * rad_per_deg), spacing);
      CHECK(seen <= bound);
      worst_ratio = std::max(worst_ratio, seen / bound);
    }
    if (spacing == 5.0) CHECK(worst_ratio > 1.0 / 1.6);
    MESSAGE("spacing " << spacing << " deg: largest seen weight / bound = " << worst_ratio);
  }
}
