#include "skein/coverage/engine/settings.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/coverage/grid.hpp"
#include "skein/design/coverage_spec.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"

namespace skein {
namespace coverage_engine {

// The central angle inside which the k-th nearest satellite is searched first: twice the radius of a cap
// holding K/T of the sphere, so about 4K satellites lie there when they are spread evenly (common practice
// for sizing a search; only speed depends on it, not the result: fewer than K there means an exact scan).
double radius_search_rad(int k, int satellites) {
  const double x = 1.0 - 2.0 * k / static_cast<double>(satellites);
  if (x <= -1.0) return pi;
  return std::min(pi, 2.0 * std::acos(x));
}

// Central angle of the widest footprint of a satellite at orbit radius r, made conservative for the ellipsoid.
double visibility_cull_rad(double r_km, double min_ground_radius_km, const CoverageSettings& st) {
  const double eps = std::max(0.0, st.spec.min_elevation_deg * rad_per_deg - vertical_deflection_rad);
  const double c = min_ground_radius_km * std::cos(eps) / r_km;
  if (c >= 1.0) return 0.0;
  return std::acos(c) - eps + cull_margin_rad;
}





// Estimate shared by the guard and the CLI's progress line.
CoverageWorkEstimate estimate(const Design& design, const CoverageSettings& st, long points, CoverageMode mode) {
  CoverageWorkEstimate e;
  e.points = points;
  e.steps = make_sampling(st.spec.span_s, st.spec.step_s).n;
  e.satellites = st.satellites;
  e.point_steps = static_cast<double>(points) * static_cast<double>(e.steps);
  double cand = 0.0, passes = 0.0;
  for (const Shell& sh : design.shells) {
    const double r = sh.a_km * (1.0 + sh.e);
    const double lam = std::max(visibility_cull_rad(r, design.earth.radius_km * (1.0 - design.earth.flattening), st),
                                radius_search_rad(st.max_fold, st.satellites));
    cand += sh.satellites * (1.0 - std::cos(lam)) / 2.0;
    const double revs = st.spec.span_s / (two_pi * std::sqrt(sh.a_km * sh.a_km * sh.a_km / design.earth.mu_km3_s2));
    passes += sh.satellites * revs * 4.0 * std::min(lam, pi / 2) / pi;
  }
  const double tests_per_point_step = mode == CoverageMode::exhaustive ? st.satellites : std::max(1.0, cand);
  e.pair_tests = e.point_steps * tests_per_point_step;
  const double gaps = std::min(passes, static_cast<double>(e.steps) / 2.0 + 1.0);
  // Fold-1 gaps take 4 bytes each. Gaps at folds 2..K take 8 bytes each, with a gap start per fold; every set
  // opens the gap of exactly one fold, so all folds together hold at most one gap per pass, plus K open at the
  // start.
  const double fold_gaps = st.max_fold > 1 ? 8.0 * (passes + st.max_fold) + 8.0 * (st.max_fold - 1) : 0.0;
  // The age of the data (designs with ground stations, coverage/data_age.hpp): per point its histogram (sites
  // 16 KiB, cells 1 KiB), sums and figures.
  const bool age = !design.ground_stations.empty() && !st.spec.nadir_half_angle_deg;
  const double age_bytes = !age ? 0.0 : (st.spec.grid == GridKind::sites ? 16384.0 : 1024.0) + 80.0;
  const double per_point = 160.0 + 16.0 * st.max_fold + 8.0 * in_view_bins + 4.0 * gaps + fold_gaps +
                           8.0 * std::max(1.0, cand) + age_bytes;
  const double chunk = mode == CoverageMode::exhaustive ? 0.0 : culled_scratch_bytes + 64.0 * 4.0 * (static_cast<double>(points) + 1.0);
  e.memory_bytes = static_cast<double>(points) * per_point * 2.0 + chunk + 70.0 * st.satellites * 112.0;  // satellite buffers, roughly
  e.seconds_2_cores = (3e-9 * e.pair_tests + 60e-9 * e.point_steps) / 2.0;
  return e;
}


bool over_limits(const CoverageWorkEstimate& est, const CoverageOptions& options) {
  return est.memory_bytes > options.memory_limit_bytes || est.pair_tests > options.pair_test_limit;
}

void check_limits(const CoverageWorkEstimate& est, const CoverageOptions& options) {
  if (options.force) return;
  if (est.memory_bytes > options.memory_limit_bytes)
    throw InputError(fmt::format("this run would need about {:.1f} GiB of memory ({} points, {} instants, {} satellites), "
                                 "above the {:.1f} GiB limit; use a coarser grid, a shorter span or a longer step, "
                                 "or --force", est.memory_bytes / (1024.0 * 1024 * 1024), est.points, est.steps,
                                 est.satellites, options.memory_limit_bytes / (1024.0 * 1024 * 1024)));
  if (est.pair_tests > options.pair_test_limit)
    throw InputError(fmt::format("this run would make about {:.2g} visibility tests (roughly {:.0f} min on 2 cores), above "
                                 "the limit of {:.2g}; use a coarser grid, a shorter span, a longer step or culled mode, "
                                 "or --force", est.pair_tests, est.seconds_2_cores / 60.0, options.pair_test_limit));
}

// The estimate from the grid's point count computed from spacing and extent, before any grid is built
// (exact except for regions, where it is an upper bound).
CoverageWorkEstimate estimate_before_grid(const Design& design, const CoverageSettings& st, CoverageMode mode) {
  const double bound = std::min(grid_point_count_bound(st.spec), 1e15);
  return estimate(design, st, static_cast<long>(bound), mode);
}

}  // namespace coverage_engine

using namespace coverage_engine;

std::string_view to_string(CoverageMode mode) { return mode == CoverageMode::culled ? "culled" : "exhaustive"; }

std::optional<CoverageMode> coverage_mode_from_string(std::string_view text) {
  if (text == "culled") return CoverageMode::culled;
  if (text == "exhaustive") return CoverageMode::exhaustive;
  return std::nullopt;
}

CoverageSettings resolve_coverage_settings(const Design& design, const CoverageOptions& o) {
  CoverageSettings st;
  st.spec = design.coverage;
  CoverageSpec& s = st.spec;
  if (o.spacing_deg) {
    if (s.grid == GridKind::sites) throw InputError("coverage.grid.spacing_deg: an override does not apply to a grid of sites");
    const double v = *o.spacing_deg;
    const double n = 180.0 / v;
    if (!(v >= 0.01 && v <= 30.0) || std::abs(n - std::round(n)) > 1e-9)
      throw InputError(fmt::format("coverage.grid.spacing_deg = {} deg: expected a cell size from 0.01 to 30 deg that divides 180 deg", v));
    if (s.grid == GridKind::band) {
      const double nb = (s.band_lat_max_deg - s.band_lat_min_deg) / v;
      if (std::abs(nb - std::round(nb)) > 1e-9)
        throw InputError(fmt::format("coverage.grid.spacing_deg = {} deg: the band {} to {} deg is not a whole number of cells", v,
                                     s.band_lat_min_deg, s.band_lat_max_deg));
    }
    s.spacing_deg = v;
  }
  if (o.span_s) {
    if (!(*o.span_s > 0.0))
      throw InputError(fmt::format("coverage.span_h = {} h: expected a span above zero", *o.span_s / 3600.0));
    if (*o.span_s > 366.0 * 86400.0)
      throw InputError(fmt::format("coverage.span_h = {} h: expected at most a year (8784 h)", *o.span_s / 3600.0));
    s.span_s = *o.span_s;
  }
  if (o.step_s) {
    if (!(*o.step_s > 0.0))
      throw InputError(fmt::format("coverage.step_s = {} s: expected a step above zero, e.g. 30", *o.step_s));
    s.step_s = *o.step_s;
  }
  if (!(s.step_s > 0.0)) throw InputError("coverage.step_s: the step must be above zero");
  if (s.step_s > s.span_s)
    throw InputError(fmt::format("coverage.step_s = {} s is longer than the span ({} h); expected step <= span", s.step_s, s.span_s / 3600.0));
  if (o.min_elevation_deg) {
    if (!(*o.min_elevation_deg >= 0.0 && *o.min_elevation_deg <= 89.0))
      throw InputError(fmt::format("coverage.min_elevation_deg = {} deg: expected an elevation mask from 0 to 89 deg", *o.min_elevation_deg));
    s.min_elevation_deg = *o.min_elevation_deg;
  }
  st.satellites = static_cast<int>(expand_constellation(design).size());
  if (o.max_fold) {
    if (*o.max_fold < 1 || *o.max_fold > max_fold_limit) throw InputError(fmt::format("coverage.max_fold = {}: expected 1 to {}", *o.max_fold, max_fold_limit));
    if (*o.max_fold > st.satellites)
      throw InputError(fmt::format("coverage.max_fold = {}: the design has only {} satellites; expected a fold of at most {}",
                                   *o.max_fold, st.satellites, st.satellites));
    st.max_fold = *o.max_fold;
  } else if (s.max_fold) {
    if (*s.max_fold > st.satellites)
      throw InputError(fmt::format("coverage.max_fold: fold {} is larger than the design's {} satellites; expected "
                                   "at most {} (the design reader checks this at its position; here a layout changed T)",
                                   *s.max_fold, st.satellites, st.satellites));
    st.max_fold = *s.max_fold;
  } else {
    st.max_fold = std::min(3, st.satellites);
  }
  // The coverage block's requirement is judged at its fold: the evaluation reaches it.
  if (s.requirement) {
    if (s.requirement->fold > st.satellites)
      throw InputError(fmt::format("coverage.requirement.fold: fold {} is larger than the design's {} satellites",
                                   s.requirement->fold, st.satellites));
    st.max_fold = std::max(st.max_fold, s.requirement->fold);
  }
  return st;
}


CoverageWorkEstimate estimate_coverage_work(const Design& design, const CoverageOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options);
  const CoverageWorkEstimate before = estimate_before_grid(design, st, options.mode);
  if (st.spec.grid != GridKind::region || over_limits(before, options)) return before;
  const Grid grid = build_grid(st.spec, design.earth);
  return estimate(design, st, static_cast<long>(grid.points.size()), options.mode);
}


}  // namespace skein
