#include "skein/coverage/site_passes.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/pass_search.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

constexpr double max_sample_step_s = 60.0;  // as the ground contacts (contacts.cpp)
constexpr double peak_sample_s = 10.0;
constexpr double peak_resolution_s = 1e-3;

// Highest elevation (deg) of `orbit` seen from `site` over [a, b], and when.
std::pair<double, double> peak_elevation(const EarthModel& earth, const SecularOrbit& orbit, double theta0,
                                         const GridPoint& site, double a, double b) {
  auto elevation = [&](double t) {
    const Eigen::Vector3d r = earth_fixed_state_at(earth, orbit, theta0 + earth.rotation_rad_s * t, t).r_km;
    return elevation_rad(site.r_km, site.up, r);
  };
  const int n = std::max(16, static_cast<int>(std::ceil((b - a) / peak_sample_s)));
  const double h = (b - a) / n;
  int best = 0;
  double best_el = elevation(a);
  for (int j = 1; j <= n; ++j) {
    const double e = elevation(a + j * h);
    if (e > best_el) best_el = e, best = j;
  }
  // Golden-section search on the samples either side of the highest one.
  double lo = a + std::max(0, best - 1) * h, hi = a + std::min(n, best + 1) * h;
  const double g = 0.5 * (std::sqrt(5.0) - 1.0);
  double x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
  double f1 = elevation(x1), f2 = elevation(x2);
  while (hi - lo > peak_resolution_s) {
    if (f1 < f2) lo = x1, x1 = x2, f1 = f2, x2 = lo + g * (hi - lo), f2 = elevation(x2);
    else hi = x2, x2 = x1, f2 = f1, x1 = hi - g * (hi - lo), f1 = elevation(x1);
  }
  const double t = 0.5 * (lo + hi), e = elevation(t);
  if (e >= best_el) return {e * deg_per_rad, t};
  return {best_el * deg_per_rad, a + best * h};  // the peak at a sampled end (a pass cut by the span)
}

}  // namespace

std::vector<SitePass> find_site_passes(const Design& design, const CoverageResult& coverage) {
  if (coverage.grid != GridKind::sites || coverage.points.empty()) return {};
  std::vector<ViewPoint> points;
  const double sin_mask = std::sin(coverage.min_elevation_deg * rad_per_deg);
  for (const PointCoverage& p : coverage.points) points.push_back({p.point.r_km, p.point.up, sin_mask});
  PassSearchSpan span{coverage.span_s, std::min(coverage.step_s, max_sample_step_s), std::nullopt};
  if (coverage.nadir_half_angle_deg) span.cos_cone = std::cos(*coverage.nadir_half_angle_deg * rad_per_deg);
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));
  const auto sats = expand_constellation(design);
  std::vector<std::vector<SitePass>> by_satellite(sats.size());
  parallel_items(sats.size(), [&](size_t s) {
    const SecularOrbit orbit = make_secular_orbit(design.earth, sats[s].elements);
    const auto lists = find_view_intervals(design.earth, orbit, theta0, points, span);
    for (size_t k = 0; k < lists.size(); ++k)
      for (const ContactInterval& c : lists[k]) {
        const auto [el, at] = peak_elevation(design.earth, orbit, theta0, coverage.points[k].point, c.rise_s, c.set_s);
        by_satellite[s].push_back({k, sats[s].id, c.rise_s, c.set_s, el, at});
      }
  });
  std::vector<SitePass> out;
  for (auto& list : by_satellite) out.insert(out.end(), list.begin(), list.end());
  std::stable_sort(out.begin(), out.end(), [](const SitePass& x, const SitePass& y) {
    return x.site != y.site ? x.site < y.site : x.rise_s < y.rise_s;
  });
  return out;
}

}  // namespace skein
