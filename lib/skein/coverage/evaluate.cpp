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
#include "skein/coverage/footprint.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/spec.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
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

CoverageResult evaluate_coverage(const Design& design, const CoverageOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options);
  check_limits(estimate_before_grid(design, st, options.mode), options);  // the guard runs before the grid is built
  const Grid grid = build_grid(st.spec, design.earth);
  const CoverageWorkEstimate est = estimate(design, st, static_cast<long>(grid.points.size()), options.mode);
  check_limits(est, options);

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

  // Hidden passes (hidden_pass.hpp): bounds of each satellite's Earth-fixed ground-direction rate over the
  // run, from Kepler's second law (h = r^2 dnu/dt) on its mean elements with the J2 secular rates: the
  // true-anomaly rate lies between n (1 - e)^2 / (1 - e^2)^(3/2) at apogee and n (1 + e)^2 / (1 - e^2)^(3/2)
  // at perigee (Vallado 2013, sec. 2.2), the perigee drift and the mean-anomaly correction add at most their
  // size, and the frame turns at the Earth's rate plus the node drift. |d2nu/dt2| = 2 (dnu/dt) |dr/dt| / r is
  // at most 2 nu'_max n a e / (sqrt(1 - e^2) r_min).
  TrackRates tr;
  tr.rate_min_rad_s = 1e300;
  double frame_rate = earth.rotation_rad_s, path_r4 = 0.0, r_apo_max = 0.0;
  std::vector<double> r_apo(static_cast<size_t>(T));
  for (const SecularOrbit& o : orbits) frame_rate = std::max(frame_rate, earth.rotation_rad_s + std::abs(o.rates.raan_rad_s));
  for (int s = 0; s < T; ++s) {
    const SecularOrbit& o = orbits[static_cast<size_t>(s)];
    const double e = o.epoch_elements.e, a = o.epoch_elements.a_km, n = o.rates.mean_motion_rad_s;
    const double q = std::pow(1.0 - e * e, 1.5);
    const double extra = std::abs(o.rates.argp_rad_s) + std::abs(o.rates.mean_anomaly_rad_s - n);
    const double nu_max = n * (1.0 + e) * (1.0 + e) / q + extra, nu_min = n * (1.0 - e) * (1.0 - e) / q - extra;
    tr.rate_max_rad_s = std::max(tr.rate_max_rad_s, nu_max + frame_rate);
    tr.rate_min_rad_s = std::min(tr.rate_min_rad_s, nu_min - frame_rate);
    tr.accel_max_rad_s2 = std::max(tr.accel_max_rad_s2, 2.0 * nu_max * n * a * e / (std::sqrt(1.0 - e * e) * a * (1.0 - e)));
    r_apo[static_cast<size_t>(s)] = a * (1.0 + e);
    r_apo_max = std::max(r_apo_max, a * (1.0 + e));
    path_r4 = std::max(path_r4, a * (1.0 + e) * std::pow(nu_max + frame_rate, 4));
  }
  tr.frame_rate_rad_s = frame_rate;
  const double track_eps = track_deviation_bound_rad(tr, smp.step);
  // Position error of the cubic path between two instants, h^4 max|d4r/dt4| / 384 (hidden_pass.hpp), in m.
  const double path_error_m = 1000.0 * std::pow(smp.step, 4) * path_r4 / 384.0;
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
  if (exhaustive) {
    for (int s = 0; s < T; ++s)
      sat_sin_limit[static_cast<size_t>(s)] =
          cross_track_sin_limit(footprint_cosines(any, r_apo[static_cast<size_t>(s)] + 1e-6).outer, track_eps);
  }

  // Instants per chunk: 64 (exhaustive) or culled_chunk, fewer when the satellite buffers would pass the budget.
  const double bytes_per_instant = static_cast<double>(T) * (sizeof(SatPos) + sizeof(SatVel) + 3.0 * sizeof(SatAux) + 20.0);
  const long chunk = std::clamp(static_cast<long>(buffer_budget_bytes / bytes_per_instant) - 1, 1L, exhaustive ? 64L : culled_chunk);

  std::vector<PointState> state(P);
  std::vector<double> worst_cos(P * static_cast<size_t>(K), 2.0);
  std::vector<double> hist(P * in_view_bins, 0.0);
  std::vector<std::int64_t> running(static_cast<size_t>(K), 0);
  std::vector<std::int64_t> worst_q(static_cast<size_t>(K), std::numeric_limits<std::int64_t>::max());
  std::int64_t pair_tests = 0, distance_tests = 0, fallbacks = 0, hidden_passes = 0;

  PositionBuffer buf;
  buf.sats = T;
  const double search_rad = radius_search_rad(K, T);
  std::vector<int> nearest(exhaustive ? 0 : P * static_cast<size_t>(K), -1);
  const EvaluationContext sw{buf, smp, gm, geo, weight_q, K, T, search_rad, std::cos(search_rad), state, worst_cos, hist, nearest,
                 track_eps, r_apo, sat_sin_limit};
  if (!exhaustive) buf.swept_reach_rad = reach_of(r_apo_max) + track_eps + tr.rate_max_rad_s * smp.step / 2.0 + 1e-9;

  tbb::enumerable_thread_specific<RowScratch> scratches;
  for (long c0 = 0; c0 < smp.n; c0 += chunk) {
    const long c1 = std::min(smp.n, c0 + chunk);
    buf.first = std::max<long>(0, c0 - 1);
    const long last = c1 - 1;  // a crossing in (t_{j-1}, t_j] needs instants j-1 and j only
    buf.count = last - buf.first + 1;
    const size_t cells = static_cast<size_t>(buf.count) * static_cast<size_t>(T);
    buf.pos.resize(cells);
    buf.vel.resize(cells);
    buf.aux.resize(cells);
    if (!exhaustive) {
      buf.by_lat.resize(cells);
      buf.by_lat_sin.resize(cells);
      buf.by_lat_aux.resize(cells);
      buf.by_lat_prev.resize(cells);
    }
    buf.reach_rad.assign(static_cast<size_t>(buf.count), 0.0);
    buf.moved_rad.assign(static_cast<size_t>(buf.count), 0.0);
    tbb::parallel_for(tbb::blocked_range<long>(0, buf.count), [&](const tbb::blocked_range<long>& r) {
      for (long l = r.begin(); l < r.end(); ++l) {
        const long step = buf.first + l;
        const double t = smp.time(step);
        const double theta = theta0 + earth.rotation_rad_s * t;
        double r_max = 0.0;
        for (int s = 0; s < T; ++s) {
          const StateVector sv = state_at(earth, orbits[static_cast<size_t>(s)], t);
          const Eigen::Vector3d r_ef = inertial_to_earth_fixed(sv.r_km, theta);
          const size_t i = buf.at(step, s);
          const double len = r_ef.norm();
          // Time derivative of the secular-model position (not the osculating Kepler velocity): with the rates of
          // M, omega and Omega, dr/dt = v_kep (dM/dt)/n + (domega/dt) h x r + (dOmega/dt) z x r, h the orbit normal
          // (chain rule on r(Omega(t), omega(t), M(t)); v_kep = n dr/dM, Vallado 2013 sec. 2.3).
          const SecularRates& rt = orbits[static_cast<size_t>(s)].rates;
          const Eigen::Vector3d h_unit = sv.r_km.cross(sv.v_km_s).normalized();
          const Eigen::Vector3d v_in = sv.v_km_s * (rt.mean_anomaly_rad_s / rt.mean_motion_rad_s) +
                                       rt.argp_rad_s * h_unit.cross(sv.r_km) +
                                       rt.raan_rad_s * Eigen::Vector3d(-sv.r_km.y(), sv.r_km.x(), 0.0);
          // Earth-fixed velocity: v_ef = R3(theta) v_in - w x r_ef, with w = (0, 0, w_E) (rotating-frame kinematics).
          const Eigen::Vector3d v_ef = inertial_to_earth_fixed(v_in, theta) +
                                       Eigen::Vector3d(earth.rotation_rad_s * r_ef.y(), -earth.rotation_rad_s * r_ef.x(), 0.0);
          const double uz = std::clamp(r_ef.z() / len, -1.0, 1.0);
          buf.pos[i] = {r_ef.x(), r_ef.y(), r_ef.z(), r_ef.x() / len, r_ef.y() / len, r_ef.z() / len};
          buf.vel[i] = {v_ef.x(), v_ef.y(), v_ef.z()};
          buf.aux[i] = {uz, std::sqrt(1.0 - uz * uz), std::atan2(r_ef.y(), r_ef.x()), len};
          r_max = std::max(r_max, len);
        }
        if (exhaustive) continue;  // the latitude order below serves the row sweep only
        buf.reach_rad[static_cast<size_t>(l)] = reach_of(r_max);
        const size_t base = buf.at(step, 0);
        int* ord = &buf.by_lat[base];
        std::iota(ord, ord + T, 0);
        std::sort(ord, ord + T, [&](int a, int b) {
          const double za = buf.pos[base + static_cast<size_t>(a)].uz, zb = buf.pos[base + static_cast<size_t>(b)].uz;
          return za != zb ? za < zb : a < b;
        });
        for (int k = 0; k < T; ++k) {
          const SatAux& x = buf.aux[base + static_cast<size_t>(ord[k])];
          buf.by_lat_sin[base + static_cast<size_t>(k)] = x.sin_psi;
          buf.by_lat_aux[base + static_cast<size_t>(k)] = x;
        }
      }
    });
    // Largest change of latitude of any satellite since the previous instant, and the previous instant's data
    // in this instant's latitude order (the first instant of the buffer has none before it in the buffer; it
    // is only ever used as t_{j-1}).
    if (!exhaustive)
      tbb::parallel_for(tbb::blocked_range<long>(1, std::max(1L, buf.count)), [&](const tbb::blocked_range<long>& r) {
      for (long l = r.begin(); l < r.end(); ++l) {
        const long step = buf.first + l;
        const size_t base = buf.at(step, 0);
        double moved = 0.0;
        for (int k = 0; k < T; ++k) {
          const int s = buf.by_lat[base + static_cast<size_t>(k)];
          const SatAux& x1 = buf.by_lat_aux[base + static_cast<size_t>(k)];
          const SatAux& x0 = buf.aux[buf.at(step - 1, s)];
          buf.by_lat_prev[base + static_cast<size_t>(k)] = x0;
          moved = std::max(moved, std::abs(std::asin(x1.sin_psi) - std::asin(x0.sin_psi)));
        }
        buf.moved_rad[static_cast<size_t>(l)] = moved + 1e-9;
      }
    });

    const size_t nsteps = static_cast<size_t>(c1 - c0);
    Partial identity;
    identity.covered.assign(nsteps * static_cast<size_t>(K), 0);
    const auto join = [](Partial x, const Partial& y) {
      for (size_t i = 0; i < x.covered.size(); ++i) x.covered[i] += y.covered[i];
      x.pair_tests += y.pair_tests;
      x.distance_tests += y.distance_tests;
      x.fallbacks += y.fallbacks;
      x.hidden_passes += y.hidden_passes;
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
    pair_tests += part.pair_tests;
    distance_tests += part.distance_tests;
    fallbacks += part.fallbacks;
    hidden_passes += part.hidden_passes;
    for (size_t l = 0; l < nsteps; ++l)
      for (int k = 0; k < K; ++k) {
        const std::int64_t v = part.covered[l * static_cast<size_t>(K) + static_cast<size_t>(k)];
        std::int64_t& run = running[static_cast<size_t>(k)];
        run = exhaustive ? v : run + v;
        worst_q[static_cast<size_t>(k)] = std::min(worst_q[static_cast<size_t>(k)], run);
      }
  }
  for (size_t p = 0; p < P; ++p) integrate(state[p], sw.sums(p), smp.span);

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
  res.max_fold = K;
  res.satellites = T;
  res.mode = options.mode;
  res.point_steps = static_cast<std::int64_t>(P) * smp.n;
  res.pair_tests = pair_tests;
  res.distance_tests = distance_tests;
  res.radius_fallbacks = fallbacks;
  res.hidden_passes = hidden_passes;
  res.track_deviation_bound_deg = track_eps * deg_per_rad;
  res.path_error_bound_m = path_error_m;
  res.points.resize(P);
  res.required_radius_deg.assign(static_cast<size_t>(K), 0.0);
  res.in_view_fraction.assign(in_view_bins, 0.0);
  for (size_t p = 0; p < P; ++p) {
    PointState& ps = state[p];
    if (ps.in_gap && smp.span - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(smp.span - ps.gap_start));
    PointCoverage& pc = res.points[p];
    pc.point = grid.points[p];
    // Time with at least k in view: the bins above k - 1, summed from the top.
    double at_least[max_fold_limit];
    {
      const double* h = &hist[p * in_view_bins];
      double above = 0.0;
      for (int n = in_view_bins - 1; n >= 1; --n) {
        above += h[n];
        if (n <= K) at_least[n - 1] = above;
      }
    }
    for (int k = 0; k < K; ++k) {
      pc.percent_by_fold.push_back(100.0 * at_least[k] / smp.span);
      const double rd = std::acos(std::clamp(worst_cos[p * static_cast<size_t>(K) + static_cast<size_t>(k)], -1.0, 1.0)) * deg_per_rad;
      pc.radius_deg_by_fold.push_back(rd);
      res.required_radius_deg[static_cast<size_t>(k)] = std::max(res.required_radius_deg[static_cast<size_t>(k)], rd);
    }
    pc.gap_count = static_cast<long>(ps.gaps.size());
    if (!ps.gaps.empty()) {
      std::vector<float> sorted = ps.gaps;
      std::sort(sorted.begin(), sorted.end());
      double sum = 0.0, sq = 0.0;
      for (float g : sorted) {
        sum += g;
        sq += static_cast<double>(g) * g;
      }
      pc.max_gap_s = sorted.back();
      pc.mean_gap_s = sum / static_cast<double>(sorted.size());
      // Nearest-rank percentile: the ceil(0.95 n)-th smallest (common practice).
      const size_t rank = static_cast<size_t>(std::ceil(0.95 * static_cast<double>(sorted.size())));
      pc.p95_gap_s = sorted[std::max<size_t>(rank, 1) - 1];
      // Mean response time: a request at a time inside a gap of length g waits on average g/2, so the time
      // average over the span is sum(g^2) / (2 span) (SMAD 3rd ed. sec. 7.2, "mean response time").
      pc.mean_response_time_s = sq / (2.0 * smp.span);
    }
    pc.mean_in_view = ps.count_time / smp.span;
    pc.max_in_view = ps.max_in_view;
    for (int n = 0; n < in_view_bins; ++n)
      res.in_view_fraction[static_cast<size_t>(n)] += pc.point.area_weight * hist[p * in_view_bins + static_cast<size_t>(n)] / smp.span;
  }
  for (int k = 0; k < K; ++k)
    res.worst_instant_covered_percent.push_back(
        total_q > 0 ? 100.0 * static_cast<double>(worst_q[static_cast<size_t>(k)]) / static_cast<double>(total_q) : 0.0);

  std::vector<size_t> all(P);
  std::iota(all.begin(), all.end(), 0);
  res.total = aggregate(res.points, all, state, K, 1.0);
  const int nbands = static_cast<int>(std::lround(180.0 / st.spec.band_width_deg));
  std::vector<std::vector<size_t>> members(static_cast<size_t>(nbands));
  for (size_t p = 0; p < P; ++p) {
    const int b = std::clamp(static_cast<int>(std::floor((grid.points[p].lat_deg + 90.0) / st.spec.band_width_deg)), 0, nbands - 1);
    members[static_cast<size_t>(b)].push_back(p);
  }
  for (int b = 0; b < nbands; ++b) {
    if (members[static_cast<size_t>(b)].empty()) continue;
    LatitudeBand band;
    band.lat_min_deg = -90.0 + b * st.spec.band_width_deg;
    band.lat_max_deg = band.lat_min_deg + st.spec.band_width_deg;
    band.metrics = aggregate(res.points, members[static_cast<size_t>(b)], state, K, 1.0);
    res.bands.push_back(std::move(band));
  }
  std::vector<std::pair<float, double>> pooled;
  for (size_t p = 0; p < P; ++p)
    for (float g : state[p].gaps) pooled.emplace_back(g, grid.points[p].area_weight);
  if (!pooled.empty()) {
    std::stable_sort(pooled.begin(), pooled.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
    double total = 0.0;
    for (const auto& v : pooled) total += v.second;
    res.gap_quantiles_s.push_back(pooled.front().first);
    double cum = 0.0;
    size_t i = 0;
    for (int q = 1; q <= 100; ++q) {
      const double target = q / 100.0 * total * (1.0 - 1e-12);
      while (i + 1 < pooled.size() && cum + pooled[i].second < target) cum += pooled[i++].second;
      res.gap_quantiles_s.push_back(pooled[i].first);
    }
  }
  return res;
}

}  // namespace skein

