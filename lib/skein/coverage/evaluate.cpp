#include "skein/coverage/evaluate.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numeric>

#include <Eigen/Geometry>
#include <fmt/format.h>
#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/parallel_for.h>
#include <tbb/parallel_reduce.h>

#include "skein/coverage/engine/context.hpp"
#include "skein/coverage/engine/exhaustive_scan.hpp"
#include "skein/coverage/engine/metrics.hpp"
#include "skein/coverage/engine/path_events.hpp"
#include "skein/coverage/engine/row_sweep.hpp"
#include "skein/coverage/engine/settings.hpp"
#include "skein/coverage/data_age.hpp"
#include "skein/coverage/footprint.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/requirement_check.hpp"
#include "skein/design/coverage_spec.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/epoch.hpp"

// The coverage evaluator's driver: resolve the settings, build the grid and the satellite orbits, loop over
// chunks of sample instants (fill the position buffer, sweep rows or scan points in parallel), collect the
// metrics. The pieces live in lib/skein/coverage/engine/, one concept per file.
//
// How the evaluation runs (both modes give the same numbers, to the bit):
//  - Satellite positions and velocities are computed for a chunk of sample instants at a time.
//  - Each ground point keeps a timeline: the number of satellites in view changes only at a rise or a set,
//    whose time inside the step is refined (CrossingBatch, hermite_root); the time integrals of the metrics
//    are taken between those events. A rise or set of (point, satellite) inside (t_{j-1}, t_j] is a pair
//    whose exact visibility test differs at t_{j-1} and t_j.
//  - Exhaustive mode tests every pair at every instant and finds the events by comparing the lists of
//    satellites in view.
//  - Culled mode sweeps the grid row by row (points of one geocentric latitude). For each satellite near the
//    row it cuts two footprint bounds into longitude windows (footprint.hpp): outside the outer window the
//    satellite is not visible, inside the inner window it surely is. Only the points inside the outer window
//    at t_{j-1} or t_j and not inside the inner window at both instants are tested, so the work follows the
//    pass boundaries. The k-th nearest satellite (required radius) is searched inside a cap sized to hold
//    about 4K satellites, with an exact fallback when fewer lie there.
//  - The area share covered at each instant is summed in integer units of the area weight, so the sum does
//    not depend on the order in which points are visited.

namespace skein {

using namespace coverage_engine;

CoveragePlan plan_coverage(const Design& design, const CoverageOptions& options) {
  CoveragePlan plan;
  plan.settings = resolve_coverage_settings(design, options);
  check_limits(estimate_before_grid(design, plan.settings, options.mode), options);  // before the grid is built
  plan.grid = build_grid(plan.settings.spec, design.earth);
  plan.estimate = estimate(design, plan.settings, static_cast<long>(plan.grid.points.size()), options.mode);
  check_limits(plan.estimate, options);
  return plan;
}

CoverageResult evaluate_coverage(const Design& design, const CoverageOptions& options) {
  return evaluate_coverage(design, plan_coverage(design, options), options);
}

CoverageResult evaluate_coverage(const Design& design, const CoveragePlan& plan, const CoverageOptions& options) {
  const CoverageSettings& st = plan.settings;
  const Grid& grid = plan.grid;

  const std::vector<Satellite> sats = expand_constellation(design);
  const int T = static_cast<int>(sats.size());
  const int K = st.max_fold;
  const size_t P = grid.points.size();
  const Sampling smp = make_sampling(st.spec.span_s, st.spec.step_s);
  const EarthModel& earth = design.earth;
  const bool exhaustive = options.mode == CoverageMode::exhaustive;

  std::vector<SecularOrbit> orbits;
  orbits.reserve(sats.size());
  for (const Satellite& s : sats) orbits.push_back(make_secular_orbit(earth, s.elements));
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));

  std::vector<PointGeo> geo(P);
  double total_weight = 0.0;
  for (size_t i = 0; i < P; ++i) {
    const GridPoint& g = grid.points[i];
    const Eigen::Vector3d u = g.r_km.normalized();
    geo[i] = {g.r_km.x(), g.r_km.y(), g.r_km.z(), g.up.x(), g.up.y(), g.up.z(), u.x(), u.y(), u.z()};
    total_weight += g.area_weight;
  }
  std::vector<std::int64_t> weight_q(P);
  std::int64_t total_q = 0;
  for (size_t i = 0; i < P; ++i) {
    weight_q[i] = total_weight > 0.0 ? std::llround(grid.points[i].area_weight / total_weight * weight_units) : 0;
    total_q += weight_q[i];
  }

  const double mask_rad = st.spec.min_elevation_deg * rad_per_deg;
  const std::optional<double> cone_rad =
      st.spec.nadir_half_angle_deg ? std::optional<double>(*st.spec.nadir_half_angle_deg * rad_per_deg) : std::nullopt;
  const std::vector<Row> rows = exhaustive ? std::vector<Row>{} : build_rows(geo, mask_rad, cone_rad);
  // The widest outer footprint over all rows, for a satellite at radius r: the smallest ground radius and the
  // largest deflection of any row.
  double min_ground_radius = 1e300, max_deflection = 0.0;
  for (const Row& r : rows) {
    min_ground_radius = std::min(min_ground_radius, r.bounds.min_radius_km);
    max_deflection = std::max(max_deflection, r.bounds.max_deflection_rad);
  }
  const auto reach_of = [&](double r_km) {
    const double e = mask_rad - max_deflection;
    const double x = min_ground_radius * std::cos(e) / r_km;
    return x >= 1.0 ? 1e-6 : std::acos(x) - e + 1e-6;
  };

  Geometry gm;
  gm.sin_min = std::sin(mask_rad);
  gm.sin_min2 = gm.sin_min * gm.sin_min;
  if (cone_rad) {
    gm.cone = true;
    gm.cos_cone = std::cos(*cone_rad);
  }
  gm.polynomial = !gm.cone && st.spec.min_elevation_deg >= 5.0;

  const PathBounds pb = path_bounds(earth, orbits, smp.step);
  const TrackRates& tr = pb.rates;
  const std::vector<double>& r_apo = pb.r_apo_km;
  const double r_apo_max = pb.r_apo_max_km, track_eps = pb.track_eps_rad, path_error_m = pb.path_error_m;
  // Exhaustive mode: one cross-track limit per satellite, from an outer footprint bound good for every point
  // (the grid's smallest radius and largest vertical deflection).
  std::vector<double> sat_sin_limit(static_cast<size_t>(T), 2.0);
  double rmin = 1e300, rmax = 0.0, defl = 0.0;
  for (const PointGeo& p : geo) {
    const double len = std::sqrt(p.rx * p.rx + p.ry * p.ry + p.rz * p.rz);
    rmin = std::min(rmin, len);
    rmax = std::max(rmax, len);
    defl = std::max(defl, std::acos(std::clamp(p.nx * p.ux + p.ny * p.uy + p.nz * p.uz, -1.0, 1.0)));
  }
  const FootprintRow any = make_footprint_row(rmin - 1e-3, rmax + 1e-3, defl + 1e-9, mask_rad, cone_rad);
  // Crossing times: the margin's cubic in time has an error of order (h / tau)^4 for a step h and a pass of
  // tau (de Boor's h^4 bound). Measured on the README's case (550 km, 10 deg mask, tau = 435 s for the shortest
  // full pass): 0.05, 0.33 and 0.93 ms at 30, 47 and 60 s, which follows h^4; at h = tau / 4 the same law
  // gives about 10 ms. Where the step is longer than a quarter of the shortest full pass (a pass over the
  // footprint's centre at the smallest radius, through the inner footprint angle at the highest track rate),
  // the roots are found on the satellite's path instead (narrow payload cones, long steps).
  {
    double r_peri_min = 1e300;
    for (const SecularOrbit& o : orbits) r_peri_min = std::min(r_peri_min, o.epoch_elements.a_km * (1.0 - o.epoch_elements.e));
    const double c_in = footprint_cosines(any, r_peri_min).inner;
    const double full_pass_s = c_in <= 1.0 ? 2.0 * std::acos(c_in) / tr.rate_max_rad_s : 0.0;
    gm.roots_on_path = smp.step > full_pass_s / 4.0;
  }
  std::vector<double> sat_widened_cos(static_cast<size_t>(T), -1.0);
  if (exhaustive) {
    for (int s = 0; s < T; ++s) {
      const double outer = footprint_cosines(any, r_apo[static_cast<size_t>(s)] + 1e-6).outer;
      sat_sin_limit[static_cast<size_t>(s)] = cross_track_sin_limit(outer, track_eps);
      sat_widened_cos[static_cast<size_t>(s)] = widened_footprint_cos(outer, track_eps);
    }
  }

  // Instants per chunk: 64 (exhaustive) or about culled_cache_bytes of buffer (culled), fewer when the satellite
  // buffers would pass the budget.
  const double bytes_per_instant = static_cast<double>(T) * (sizeof(SatPos) + sizeof(SatVel) + 3.0 * sizeof(SatAux) + 20.0);
  const long culled_chunk =
      std::clamp(static_cast<long>(culled_cache_bytes / bytes_per_instant), culled_chunk_min, culled_chunk_max);
  const long chunk = std::clamp(static_cast<long>(buffer_budget_bytes / bytes_per_instant) - 1, 1L, exhaustive ? 64L : culled_chunk);

  std::vector<PointState> state(P);
  std::vector<double> worst_cos(P * static_cast<size_t>(K), 2.0);
  std::vector<double> hist(P * in_view_bins, 0.0);
  std::vector<double> fold_gap_start(P * static_cast<size_t>(K - 1), 0.0);
  std::vector<std::int64_t> running(static_cast<size_t>(K), 0);
  std::vector<std::int64_t> worst_q(static_cast<size_t>(K), std::numeric_limits<std::int64_t>::max());
  std::int64_t pair_tests = 0, distance_tests = 0, fallbacks = 0, hidden_passes = 0, events = 0;

  PositionBuffer buf;
  buf.sats = T;
  const double search_rad = radius_search_rad(K, T);
  std::vector<int> nearest(exhaustive ? 0 : P * static_cast<size_t>(K), -1);
  // Daylight at the target: the Sun turned into the Earth-fixed frame by the satellites' sidereal angle.
  DaylightMask daylight;
  if (st.spec.min_sun_elevation_deg) {
    daylight.epoch = julian_date(design.epoch);
    daylight.theta0_rad = theta0;
    daylight.rotation_rad_s = earth.rotation_rad_s;
    daylight.sin_min = std::sin(*st.spec.min_sun_elevation_deg * rad_per_deg);
  }
  const EvaluationContext sw{buf, smp, gm, geo, weight_q, K, T, search_rad, std::cos(search_rad), state, worst_cos, hist, fold_gap_start, nearest,
                 track_eps, r_apo, sat_sin_limit, sat_widened_cos, st.spec.min_sun_elevation_deg ? &daylight : nullptr};
  if (!exhaustive) buf.swept_reach_rad = reach_of(r_apo_max) + track_eps + tr.rate_max_rad_s * smp.step / 2.0 + 1e-9;

  tbb::enumerable_thread_specific<RowScratch> scratches;
  for (long c0 = 0; c0 < smp.n; c0 += chunk) {
    const long c1 = std::min(smp.n, c0 + chunk);
    buf.first = std::max<long>(0, c0 - 1);
    const long last = c1 - 1;  // a crossing in (t_{j-1}, t_j] needs instants j-1 and j only
    buf.count = last - buf.first + 1;
    fill_positions(buf, orbits, earth, theta0, smp, !exhaustive, reach_of);

    const size_t nsteps = static_cast<size_t>(c1 - c0);
    Partial identity;
    identity.covered.assign(nsteps * static_cast<size_t>(K), 0);
    const auto join = [](Partial x, const Partial& y) {
      for (size_t i = 0; i < x.covered.size(); ++i) x.covered[i] += y.covered[i];
      x.pair_tests += y.pair_tests;
      x.distance_tests += y.distance_tests;
      x.fallbacks += y.fallbacks;
      x.hidden_passes += y.hidden_passes;
      x.events += y.events;
      return x;
    };
    Partial part;
    if (exhaustive) {
      part = tbb::parallel_reduce(
          tbb::blocked_range<size_t>(0, P, 64), identity,
          [&](const tbb::blocked_range<size_t>& range, Partial acc) {
            std::vector<int> fresh;
            CrossingBatch crossings;
            std::vector<double> top(static_cast<size_t>(K));
            std::vector<Event> hidden;
            for (size_t p = range.begin(); p < range.end(); ++p)
              scan_point(sw, p, c0, c1, acc, fresh, crossings, top, hidden);
            if (options.progress) options.progress->fetch_add(static_cast<std::int64_t>(range.size()) * (c1 - c0));
            return acc;
          },
          join);
    } else {
      part = tbb::parallel_reduce(
          tbb::blocked_range<size_t>(0, rows.size(), 1), identity,
          [&](const tbb::blocked_range<size_t>& range, Partial acc) {
            RowScratch& scratch = scratches.local();
            for (size_t r = range.begin(); r < range.end(); ++r) {
              sweep_row(sw, rows[r], static_cast<long>(r), static_cast<long>(rows.size()), c0, c1, acc, scratch);
              if (options.progress) options.progress->fetch_add(static_cast<std::int64_t>(rows[r].point.size()) * (c1 - c0));
            }
            return acc;
          },
          join);
    }
    stop_if_cancelled("coverage evaluation");  // before reading what the rows made
    pair_tests += part.pair_tests;
    distance_tests += part.distance_tests;
    fallbacks += part.fallbacks;
    hidden_passes += part.hidden_passes;
    events += part.events;
    for (size_t l = 0; l < nsteps; ++l)
      for (int k = 0; k < K; ++k) {
        const std::int64_t v = part.covered[l * static_cast<size_t>(K) + static_cast<size_t>(k)];
        std::int64_t& run = running[static_cast<size_t>(k)];
        run = exhaustive ? v : run + v;
        worst_q[static_cast<size_t>(k)] = std::min(worst_q[static_cast<size_t>(k)], run);
      }
  }
  for (size_t p = 0; p < P; ++p) {
    integrate(state[p], sw.sums(p), smp.span);
    close_gaps(state[p], sw.sums(p), smp.span);
  }

  // Per-point metrics.
  CoverageResult res;
  res.design = design.name;
  res.grid = grid.kind;
  res.spacing_deg = grid.spacing_deg;
  res.span_s = smp.span;
  res.step_s = smp.step;
  res.steps = smp.n;
  res.min_elevation_deg = st.spec.min_elevation_deg;
  res.nadir_half_angle_deg = st.spec.nadir_half_angle_deg;
  res.min_sun_elevation_deg = st.spec.min_sun_elevation_deg;
  res.max_fold = K;
  res.satellites = T;
  res.mode = options.mode;
  res.point_steps = static_cast<std::int64_t>(P) * smp.n;
  res.pair_tests = pair_tests;
  res.distance_tests = distance_tests;
  res.radius_fallbacks = fallbacks;
  res.hidden_passes = hidden_passes;
  res.events = events;
  res.track_deviation_bound_deg = track_eps * deg_per_rad;
  res.path_error_bound_m = path_error_m;
  collect_metrics(res, grid, state, hist, worst_cos, worst_q, total_q, smp, st.spec.band_width_deg);
  // Age of the data (any grid, with ground stations), over the resolved coverage settings.
  {
    Design resolved = design;
    resolved.coverage = st.spec;
    if (options.data_age && data_age_applies(resolved)) res.data_age = compute_data_age(resolved, grid);
  }
  if (st.spec.requirement) res.requirement = judge_requirement(*st.spec.requirement, res);
  return res;
}

}  // namespace skein

