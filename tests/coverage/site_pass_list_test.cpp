// Evidence for the per-site pass list (site_passes.cpp, on the rate-bounded search of pass_search.cpp): each
// pass's rise, set and maximum elevation against a brute force over the same secular orbits sampled every
// second, with the elevation and off-nadir angle from ground_geometry (not the search's margin), and the list's
// pass count per site against the coverage evaluator's (the per-site table's passes).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "coverage_test_designs.hpp"
#include "skein/constants.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/site_passes.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

using namespace skein;

namespace {

struct BrutePass {
  size_t site;
  size_t sat;
  double first_in_s, last_in_s;  // first and last in-view samples
  double max_elevation_deg;      // highest sampled elevation
  double peak_s;                 // when
};

constexpr double brute_step_s = 1.0;

// Every pass seen at 1 s samples: in view when elevation >= mask and, with a cone, off-nadir <= half-angle.
std::vector<BrutePass> brute_passes(const Design& d, const CoverageResult& cov) {
  const auto sats = expand_constellation(d);
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(d.epoch));
  const long n = static_cast<long>(std::floor(cov.span_s / brute_step_s));
  std::vector<BrutePass> out;
  for (size_t s = 0; s < sats.size(); ++s) {
    const SecularOrbit orbit = make_secular_orbit(d.earth, sats[s].elements);
    std::vector<Eigen::Vector3d> r(static_cast<size_t>(n) + 1);
    for (long j = 0; j <= n; ++j) {
      const double t = static_cast<double>(j) * brute_step_s;
      r[static_cast<size_t>(j)] = earth_fixed_state_at(d.earth, orbit, theta0 + d.earth.rotation_rad_s * t, t).r_km;
    }
    for (size_t k = 0; k < cov.points.size(); ++k) {
      const GridPoint& p = cov.points[k].point;
      std::optional<BrutePass> open;
      for (long j = 0; j <= n; ++j) {
        const Eigen::Vector3d& x = r[static_cast<size_t>(j)];
        const double el = elevation_rad(p.r_km, p.up, x) * deg_per_rad;
        const bool in = el >= cov.min_elevation_deg &&
                        (!cov.nadir_half_angle_deg || off_nadir_angle_rad(p.r_km, x) * deg_per_rad <= *cov.nadir_half_angle_deg);
        const double t = static_cast<double>(j) * brute_step_s;
        if (in && !open) open = BrutePass{k, s, t, t, el, t};
        if (in) {
          open->last_in_s = t;
          if (el > open->max_elevation_deg) open->max_elevation_deg = el, open->peak_s = t;
        }
        if (!in && open) {
          out.push_back(*open);
          open.reset();
        }
      }
      if (open) out.push_back(*open);
    }
  }
  return out;
}

// The highest elevation (deg) sampled every 1 ms over [peak_s - 1 s, peak_s + 1 s] inside the span.
double refined_peak_deg(const Design& d, const GridPoint& p, const Satellite& sat, double peak_s, double span_s) {
  const SecularOrbit orbit = make_secular_orbit(d.earth, sat.elements);
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(d.epoch));
  double best = -90.0;
  for (int j = -1000; j <= 1000; ++j) {
    const double t = std::clamp(peak_s + 1e-3 * j, 0.0, span_s);
    const Eigen::Vector3d r = earth_fixed_state_at(d.earth, orbit, theta0 + d.earth.rotation_rad_s * t, t).r_km;
    best = std::max(best, elevation_rad(p.r_km, p.up, r) * deg_per_rad);
  }
  return best;
}

void check_against_brute_force(const Design& d) {
  const CoverageResult cov = evaluate_coverage(d, CoverageOptions{});
  const std::vector<SitePass> list = find_site_passes(d, cov);
  const std::vector<BrutePass> brute = brute_passes(d, cov);
  const auto sats = expand_constellation(d);
  REQUIRE(brute.size() > 30);
  // The span ends on a whole second here, so the brute force's last sample is the span's end.
  REQUIRE(std::fmod(cov.span_s, brute_step_s) == 0.0);
  std::vector<bool> matched(list.size(), false);
  for (const BrutePass& b : brute) {
    CAPTURE(cov.points[b.site].point.name);
    CAPTURE(sats[b.sat].id);
    CAPTURE(b.first_in_s);
    // The listed pass of the same site and satellite that holds the brute force's first in-view sample.
    size_t hit = list.size();
    for (size_t i = 0; i < list.size(); ++i)
      if (list[i].site == b.site && list[i].satellite == sats[b.sat].id && list[i].rise_s <= b.first_in_s + 1e-3 &&
          list[i].set_s >= b.first_in_s - 1e-3)
        hit = i;
    REQUIRE(hit < list.size());
    matched[hit] = true;
    const SitePass& p = list[hit];
    // Rise between the last sample out of view and the first in view (the search places it within 0.5 ms of the
    // crossing, hence 1 ms of slack); at the span's start the pass is cut there and the rise is 0.
    if (b.first_in_s == 0.0) CHECK(p.rise_s == 0.0);
    else CHECK((p.rise_s > b.first_in_s - brute_step_s - 1e-3 && p.rise_s <= b.first_in_s + 1e-3));
    if (b.last_in_s == cov.span_s) CHECK(p.set_s == cov.span_s);
    else CHECK((p.set_s >= b.last_in_s - 1e-3 && p.set_s < b.last_in_s + brute_step_s + 1e-3));
    // Maximum elevation against the brute force refined: resampled every 1 ms over the second either side of
    // the highest 1 s sample (the peak lies there: elevation rises to one peak and falls). Tolerance 0.002 deg:
    // the search stops within 1 ms of the peak and the resampling is 1 ms apart, and elevation changes no faster
    // than the line of sight turns, v / d <= 7.6 km/s / 500 km = 0.015 rad/s for these 500 km and higher orbits,
    // so each is within 1.5e-5 rad (0.00087 deg) of the true peak. (The 1 s samples alone are not close enough:
    // near the zenith the elevation peaks sharply, 0.01 deg and more within half a second.)
    const double peak = refined_peak_deg(d, cov.points[b.site].point, sats[b.sat], b.peak_s, cov.span_s);
    CHECK(p.max_elevation_deg >= b.max_elevation_deg - 1e-9);
    CHECK(std::abs(p.max_elevation_deg - peak) <= 0.002);
    CHECK((p.max_elevation_s >= p.rise_s && p.max_elevation_s <= p.set_s));
  }
  // A listed pass the brute force did not see lies between two 1 s samples: it is shorter than 1 s.
  for (size_t i = 0; i < list.size(); ++i)
    if (!matched[i]) CHECK(list[i].set_s - list[i].rise_s < brute_step_s);
  // The list's count per site equals the coverage evaluator's (the per-site table's passes per day x days).
  for (size_t k = 0; k < cov.points.size(); ++k) {
    long n = 0;
    for (const SitePass& p : list) n += p.site == k;
    CAPTURE(cov.points[k].point.name);
    CHECK(n == cov.points[k].passes);
  }
  // In order: by site, then rise.
  for (size_t i = 1; i < list.size(); ++i)
    CHECK((list[i - 1].site < list[i].site || (list[i - 1].site == list[i].site && list[i - 1].rise_s <= list[i].rise_s)));
}

const std::string sites =
    "coverage:\n  grid:\n    kind: sites\n    sites:\n"
    "      - {name: Quillon Point, lat_deg: 48.3, lon_deg: -4.6}\n"
    "      - {name: Varra Atoll, lat_deg: -3.2, lon_deg: 151.4, height_km: 0.05}\n"
    "      - {name: Noss Ridge, lat_deg: 71.0, lon_deg: 25.7, height_km: 0.4}\n";

}  // namespace

TEST_CASE("site pass list: rise, set and peak elevation against a 1 s brute force, and the counts equal the coverage evaluator counts") {
  // 8 satellites in 2 planes at 520 km plus an eccentric one, 12 h, 10 deg mask.
  const Design d = read_design_text(
      test::coverage_design_head() + test::walker_shell(8, 2, 1, 520.0, 72.0) +
          "  - name: ecc\n    pattern: walker-delta\n    satellites: 1\n    planes: 1\n    phasing: 0\n"
          "    semi_major_axis_km: 7400\n    eccentricity: 0.05\n    inclination_deg: 80\n" +
          sites + "  min_elevation_deg: 10\n  span_h: 12\n  step_s: 60\n  max_fold: 1\n",
      "pass-list.yaml");
  check_against_brute_force(d);
}

TEST_CASE("site pass list: with a payload cone the passes end where the cone cuts them") {
  // A 55 deg cone at 700 km reaches down to about 25 deg of elevation (sin eta = cos(el) sin(rho), sin rho =
  // Re / r, SMAD sec. 5.2), far above the 5 deg mask: the cone sets the pass ends, so the search's cone-rate
  // bound is what is tested.
  const Design d = read_design_text(
      test::coverage_design_head() + test::walker_shell(12, 3, 1, 700.0, 60.0) + sites +
          "  min_elevation_deg: 5\n  nadir_half_angle_deg: 55\n  span_h: 24\n  step_s: 60\n  max_fold: 1\n",
      "pass-list-cone.yaml");
  REQUIRE(d.coverage.nadir_half_angle_deg);
  check_against_brute_force(d);
}
