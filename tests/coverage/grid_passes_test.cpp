// Evidence for the cells' pass search (coverage/grid_passes.*): every pass of every satellite over every cell
// against a 1 s brute-force scan of the elevation (the same secular J2 orbits, sidereal angle, ellipsoid and
// mask). A brute-force rise or set is the first in-view or out-of-view second, so within 1 s after the true one.
//  - At the production step (60 s) the search's path lies within about 0.3 m of the orbit (grid_passes.hpp),
//    so its rises and sets, within 0.5 ms of that path's, agree with the scan's within 1.1 s.
//  - At a 300 s step, five times longer, many passes are shorter than the step and must be found between
//    samples (the culling's motion margin, the rate and curvature bounds). The path then errs by about 0.2 km,
//    which moves a grazing pass's ends by seconds, so there each pass must overlap one on the other side.
// A pass under 2 s long may be seen by one side only (the scan misses passes under 1 s), so passes of 2 s or
// more on either side must be matched on the other.
#include <doctest/doctest.h>

#include <cmath>
#include <mutex>
#include <vector>

#include "coverage_test_designs.hpp"
#include "skein/constants.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/grid_passes.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

using namespace skein;

namespace {

struct Pass {
  double rise_s, set_s;
};

// Whether `p` is matched in `list`: rise and set within tol, or (tol < 0) overlapping.
bool matched(const Pass& p, const std::vector<Pass>& list, double tol) {
  for (const Pass& q : list) {
    if (tol < 0.0 && q.rise_s < p.set_s && p.rise_s < q.set_s) return true;
    if (std::abs(q.rise_s - p.rise_s) < tol && std::abs(q.set_s - p.set_s) < tol) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("grid passes: every pass over band cells against a 1 s brute-force scan, at 60 s and 300 s steps") {
  const Design d = read_design_text(test::coverage_design_head() + test::walker_shell(6, 3, 1, 650.0, 97.9) +
                                        "coverage:\n  grid:\n    kind: band\n    lat_min_deg: -60\n    lat_max_deg: 60\n"
                                        "    spacing_deg: 20\n  min_elevation_deg: 15\n  span_h: 12\n",
                                    "passes.yaml");
  const Grid grid = build_grid(d.coverage, d.earth);
  REQUIRE(grid.points.size() == 108);
  const size_t P = grid.points.size();
  const std::vector<Satellite> sats = expand_constellation(d);
  const size_t T = sats.size();
  const auto search = [&](double step_s) {
    GridPassOptions o;
    o.span_s = 12 * 3600.0;
    o.sample_step_s = step_s;
    o.min_elevation_deg = 15.0;
    std::vector<std::vector<std::vector<Pass>>> found(P, std::vector<std::vector<Pass>>(T));
    std::mutex m;
    for_each_grid_pass(d, grid, o, [&](size_t p, size_t s, double rise, double set) {
      const std::lock_guard<std::mutex> lock(m);
      found[p][s].push_back({rise, set});
    });
    return found;
  };

  // Brute force.
  std::vector<SecularOrbit> orbits;
  for (const Satellite& s : sats) orbits.push_back(make_secular_orbit(d.earth, s.elements));
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(d.epoch));
  const double sin_mask = std::sin(15.0 * rad_per_deg);
  const long n = 12 * 3600;
  std::vector<std::vector<std::vector<Pass>>> scanned(P, std::vector<std::vector<Pass>>(T));
  std::vector<std::vector<long>> open_at(P, std::vector<long>(T, -1));
  for (long j = 0; j <= n; ++j) {
    const double t = static_cast<double>(j);
    for (size_t s = 0; s < T; ++s) {
      const Eigen::Vector3d pos = earth_fixed_state_at(d.earth, orbits[s], theta0 + d.earth.rotation_rad_s * t, t).r_km;
      for (size_t p = 0; p < P; ++p) {
        const Eigen::Vector3d dv = pos - grid.points[p].r_km;
        const bool in = grid.points[p].up.dot(dv) >= sin_mask * dv.norm() && j < n;
        long& o0 = open_at[p][s];
        if (in && o0 < 0) o0 = j;
        if (!in && o0 >= 0) {
          scanned[p][s].push_back({static_cast<double>(o0), static_cast<double>(j)});
          o0 = -1;
        }
      }
    }
  }
  for (const double step_s : {60.0, 300.0}) {
    CAPTURE(step_s);
    const double tol = step_s == 60.0 ? 1.1 : -1.0;
    const auto found = search(step_s);
    long passes = 0, short_passes = 0, unmatched_scan = 0, unmatched_found = 0;
    for (size_t p = 0; p < P; ++p)
      for (size_t s = 0; s < T; ++s) {
        for (const Pass& q : scanned[p][s]) {
          if (q.set_s - q.rise_s < 2.0) continue;
          ++passes;
          if (q.set_s - q.rise_s < step_s) ++short_passes;
          if (!matched(q, found[p][s], tol)) ++unmatched_scan;
        }
        for (const Pass& q : found[p][s])
          if (q.set_s - q.rise_s >= 2.0 && !matched(q, scanned[p][s], tol)) ++unmatched_found;
      }
    CHECK(unmatched_scan == 0);
    CHECK(unmatched_found == 0);
    CHECK(passes > 300);  // the case is not empty
    if (step_s == 300.0) CHECK(short_passes >= 20);  // many passes are shorter than the step
  }
}
