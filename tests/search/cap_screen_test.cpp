// Evidence for the search's cap-area screen (lib/skein/search/cap_screen): the weight of the grid points a
// satellite sees at once, computed with the coverage evaluator's own visibility test (elevation from the
// geodetic vertical of each WGS-84 grid point, coverage/ground_geometry.hpp) on the real global grid, never
// exceeds cap_weight_bound, for satellites at random places and altitudes from 400 to 1500 km, masks 0 to 30
// deg and grid spacings 2 to 15 deg. The bound must hold for every sample (it is what lets the search skip a
// layout); it is also checked not to be vacuous (below 1.6 times the largest sampled weight for a 5 deg grid).
#include <doctest/doctest.h>

#include <cmath>
#include <random>
#include <utility>
#include <vector>

#include "skein/constants.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/search/cap_screen.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/requirement_check.hpp"
#include "skein/design/coverage_spec.hpp"
#include "skein/input/search_file.hpp"
#include "skein/sweep/evaluate_layout.hpp"

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

// Band and region grids (cap_screen.hpp): the weight a satellite sees on the grid's own normalised weights stays
// under region_cap_weight_bound, and a satellite whose geocentric latitude is farther from the points' latitudes
// than the widened footprint sees nothing; on the regional search case's polygon and on a band, same sampling.
TEST_CASE("cap screen: on band and region grids, the weight seen and the latitude reach stay within the bound") {
  std::mt19937 rng(11);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const EarthModel earth = wgs84;
  CoverageSpec region;
  region.grid = GridKind::region;
  region.spacing_deg = 5.0;
  region.region = {{-12, 34}, {4, 34}, {8, 44}, {-2, 52}, {-12, 46}};
  CoverageSpec band;
  band.grid = GridKind::band;
  band.spacing_deg = 3.0;
  band.band_lat_min_deg = 51.0;
  band.band_lat_max_deg = 72.0;
  for (const CoverageSpec& spec : {region, band}) {
    const Grid grid = build_grid(spec, earth);
    double area = 0.0, lat_min = 90.0, lat_max = -90.0;
    for (const GridPoint& p : grid.points) {
      area += zone_area_fraction(earth.flattening, p.cell->lat_min_deg * rad_per_deg, p.cell->lat_max_deg * rad_per_deg) *
              (p.cell->lon_max_deg - p.cell->lon_min_deg) / 360.0;
      lat_min = std::min(lat_min, p.lat_deg);
      lat_max = std::max(lat_max, p.lat_deg);
    }
    int seen_any = 0, outside = 0;
    double excess_deg = -90.0;  // how far past lambda a seeing satellite's latitude lay (the allowance's use)
    for (int k = 0; k < 4000; ++k) {
      const double alt_km = 400.0 + 1100.0 * u(rng);
      const double mask_deg = 30.0 * u(rng);
      // Half the samples near the grid (where the caps reach it), half anywhere.
      const double lat = k % 2 ? std::asin(2.0 * u(rng) - 1.0)
                               : (std::max(-90.0, lat_min - 30.0) +
                                  (std::min(90.0, lat_max + 30.0) - std::max(-90.0, lat_min - 30.0)) * u(rng)) *
                                     rad_per_deg;
      const double lon = k % 2 ? two_pi * u(rng) : (-40.0 + 80.0 * u(rng)) * rad_per_deg;
      const double r = earth.radius_km + alt_km;
      const Eigen::Vector3d sat(r * std::cos(lat) * std::cos(lon), r * std::cos(lat) * std::sin(lon), r * std::sin(lat));
      double seen = 0.0;
      for (const GridPoint& p : grid.points)
        if (elevation_rad(p.r_km, p.up, sat) >= mask_deg * rad_per_deg) seen += p.area_weight;
      const double lambda = footprint_central_angle_rad(earth.radius_km, r, mask_deg * rad_per_deg);
      CHECK(seen <= region_cap_weight_bound(lambda, spec.spacing_deg, area));
      const double reach = lambda + (cap_screen_angle_allowance_deg + cap_screen_geocentric_allowance_deg) * rad_per_deg;
      if (lat < lat_min * rad_per_deg - reach || lat > lat_max * rad_per_deg + reach) {
        ++outside;
        CHECK(seen == 0.0);
      }
      seen_any += seen > 0.0;
      if (seen > 0.0) {
        const double beyond = std::max(lat_min * rad_per_deg - lat, lat - lat_max * rad_per_deg);
        excess_deg = std::max(excess_deg, (beyond - lambda) / rad_per_deg);
      }
    }
    CHECK(seen_any > 200);  // not vacuous: many samples see the grid
    CHECK(outside > 200);   // and many lie beyond its reach
    MESSAGE(to_string(spec.grid) << ": " << seen_any << " samples see the grid, " << outside
                                 << " beyond its reach; largest latitude past the footprint while seeing it: "
                                 << excess_deg << " deg (allowance "
                                 << cap_screen_angle_allowance_deg + cap_screen_geocentric_allowance_deg << " deg)");
  }
}

// The time share in a latitude band, against a brute force over u uniform in time: sin(lat) = sin i sin u on a
// circular orbit, sampled at 200000 instants over the span from a random phase; the closed form bounds the
// sampled share for any span and phase (sampling error under 2e-5 for these bands), and equals it for whole
// numbers of revolutions (within 1e-3).
TEST_CASE("cap screen: the latitude time share of a circular orbit against a brute force") {
  std::mt19937 rng(5);
  std::uniform_real_distribution<double> u01(0.0, 1.0);
  const double period = 6000.0;
  for (double inc_deg : {30.0, 53.0, 87.0, 120.0}) {
    for (const auto& [lo, hi] : std::vector<std::pair<double, double>>{{20.0, 40.0}, {-10.0, 5.0}, {45.0, 80.0}, {-90.0, -50.0}}) {
      for (double span : {6000.0, 18000.0, 7000.0, 2500.0, 14321.0}) {
        const double phase = two_pi * u01(rng);
        const int n = 200000;
        long in = 0;
        for (int j = 0; j < n; ++j) {
          const double t = (j + 0.5) * span / n;
          const double lat = std::asin(std::sin(inc_deg * rad_per_deg) * std::sin(phase + two_pi * t / period)) / rad_per_deg;
          in += lat >= lo && lat <= hi;
        }
        const double share = static_cast<double>(in) / n;
        const double bound = latitude_time_fraction_bound(inc_deg * rad_per_deg, lo * rad_per_deg, hi * rad_per_deg, period, span);
        CHECK(share <= bound + 2e-5);
        if (std::fmod(span, period) == 0.0) CHECK(std::abs(share - bound) < 1e-3);
      }
    }
  }
  // Hand values: i = 90 deg, band [0, 30 deg]: asin(sin 30) / pi = 1/6 of each revolution; i = 30 deg never
  // reaches 45 deg: 0.
  CHECK(latitude_time_fraction_bound(pi / 2, 0.0, pi / 6, period, 2 * period) == doctest::Approx(1.0 / 6.0).epsilon(1e-12));
  CHECK(latitude_time_fraction_bound(pi / 6, pi / 4, pi / 2, period, 2 * period) == 0.0);
}

// The regional bounds against the coverage evaluator itself, on the northern regional search case's region grid
// (tests/search/cases/regional-north.yaml): for every 5th layout of its space, the evaluated percent covered
// (area-weighted time average) and worst-point percent stay under the time-averaged supply, and the worst
// instant under the instantaneous supply (each times 100 / k). Layouts the bound rules out must cover less
// than the threshold: checked here directly, and for the whole space against a full sweep in search.exhaustive.
TEST_CASE("cap screen: the regional bounds hold on real coverage of a region grid") {
  const Search search = read_search_file(std::string(SKEIN_SOURCE_DIR) + "/tests/search/cases/regional-north.yaml");
  const Sweep& space = search.space;
  const LayoutSet set = expand_layouts(space, 100000);
  const int fold = space.requirement.fold;
  Requirement time_req = space.requirement, instant_req = space.requirement;
  time_req.thresholds = {{RequirementFigure::percent_covered, 50.0}};
  instant_req.thresholds = {{RequirementFigure::worst_instant_percent, 50.0}};
  int layouts = 0, ruled_out = 0, zero_reach = 0;
  double tightest = 0.0;  // largest percent covered / time bound
  for (size_t i = 0; i < set.layouts.size(); i += 5) {
    const Design design = layout_design(space, set.layouts[i]);
    const auto t = cap_screen(design, time_req);
    const auto n = cap_screen(design, instant_req);
    REQUIRE(t);
    REQUIRE(n);
    CHECK(t->time_average);
    CHECK_FALSE(n->time_average);
    const CoverageResult cov = evaluate_coverage(design, sweep_coverage_options(space, {}));
    const double k = static_cast<double>(fold);
    CHECK(grid_figure(cov, RequirementFigure::percent_covered, fold) <= 100.0 * t->supply / k + 1e-9);
    CHECK(grid_figure(cov, RequirementFigure::worst_point_percent, fold) <= 100.0 * t->supply / k + 1e-9);
    CHECK(grid_figure(cov, RequirementFigure::worst_instant_percent, fold) <= 100.0 * n->supply / k + 1e-9);
    if (t->supply > 0.0)
      tightest = std::max(tightest, grid_figure(cov, RequirementFigure::percent_covered, fold) / (100.0 * t->supply / k));
    zero_reach += t->supply == 0.0;
    const auto screen = cap_screen(design, space.requirement);
    if (screen && screen->rules_out()) {
      ++ruled_out;
      CHECK(grid_figure(cov, RequirementFigure::percent_covered, fold) < space.requirement.thresholds.front().value);
    }
    ++layouts;
  }
  CHECK(layouts >= 50);
  CHECK(ruled_out > 10);    // the bound is not vacuous on this case
  CHECK(zero_reach > 0);    // low inclinations never reach the region
  MESSAGE(layouts << " layouts, " << ruled_out << " ruled out (" << zero_reach << " never in reach); largest "
                  << "percent covered / time-averaged bound: " << tightest);
}
