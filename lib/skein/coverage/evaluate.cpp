#include "skein/coverage/evaluate.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numeric>

#include <Eigen/Geometry>
#include <fmt/format.h>
#include <tbb/blocked_range.h>
#include <tbb/parallel_for.h>
#include <tbb/parallel_reduce.h>

#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

// Bins of the satellites-in-view distribution: 0 .. in_view_bins-2, and "in_view_bins-1 or more".
constexpr int in_view_bins = 33;
// The geodetic vertical departs from the geocentric radial by at most 0.1924 deg on WGS-84 (the largest
// difference of geodetic and geocentric latitude, at 45 deg; follows from tan psi = (1 - e^2) tan phi,
// Snyder 1987 eq. 3-28). The footprint cull widens the mask by this much, plus a safety margin.
constexpr double vertical_deflection_rad = 0.2 * rad_per_deg;
constexpr double cull_margin_rad = 0.25 * rad_per_deg;
// Candidate entries held per chunk of time steps (bounds the culling buffers to about 80 MB).
constexpr double chunk_entry_budget = 2e7;

// Sample instants t_j = j * step for j < n - 1 and t_{n-1} = span.
struct Sampling {
  long n = 0;
  double step = 0.0, span = 0.0;
  double time(long j) const { return j == n - 1 ? span : static_cast<double>(j) * step; }
};

Sampling make_sampling(double span_s, double step_s) {
  Sampling s;
  s.step = step_s;
  s.span = span_s;
  s.n = static_cast<long>(std::ceil(span_s / step_s - 1e-9)) + 1;
  return s;
}

// Ground point data laid out for the inner loops.
struct PointGeo {
  double rx, ry, rz;  // Earth-fixed position, km
  double nx, ny, nz;  // geodetic vertical
  double ux, uy, uz;  // geocentric unit vector
};

// Earth-fixed position (km) and geocentric unit vector of one satellite at one instant, packed together so a
// pair test touches one cache line.
struct SatPos {
  double x, y, z, ux, uy, uz;
};
// Earth-fixed velocity, km/s (for the pass-boundary interpolation only, so kept apart from the positions).
struct SatVel {
  double vx, vy, vz;
};

// Satellite positions (Earth-fixed) for a window of sample instants.
struct PositionBuffer {
  long first = 0, count = 0;
  int sats = 0;
  std::vector<SatPos> pos;                   // [local * sats + s]
  std::vector<SatVel> vel;                   // [local * sats + s]
  std::vector<double> cull_rad;              // per-satellite cull radius at each instant
  std::vector<double> guaranteed_cos;        // per instant: every satellite within this cosine is a candidate
  // Per instant, the satellites sorted by geocentric latitude (for the exact k-th-nearest search): index,
  // sin and cos of the latitude.
  std::vector<int> by_lat;
  std::vector<double> by_lat_sin, by_lat_cos;
  size_t at(long step, int s) const { return static_cast<size_t>((step - first) * sats + s); }
};

// Candidate satellites of each point at one instant (CSR, satellites in increasing order).
struct StepCandidates {
  std::vector<std::uint32_t> offset;
  std::vector<int> sats;
};

// Grid rows for footprint culling: points of one geocentric latitude, sorted by longitude.
struct Row {
  double psi = 0.0, sin_psi = 0.0, cos_psi = 0.0;
  std::vector<double> lon;  // rad, ascending, -pi..pi
  std::vector<int> point;
};

struct Geometry {
  double sin_min = 0.0;
  double sin_min2 = 0.0;  // sin_min squared
  bool cone = false;
  double cos_cone = 0.0;
};

// Visibility margin of satellite s from point p at a buffered instant: sin(elevation) - sin(mask), and, with a
// payload cone, the smaller of that and cos(off-nadir) - cos(half-angle). Visible when >= 0.
inline double margin(const PointGeo& p, const PositionBuffer& b, size_t i, const Geometry& g) {
  const SatPos& q = b.pos[i];
  const double dx = q.x - p.rx, dy = q.y - p.ry, dz = q.z - p.rz;
  const double len = std::sqrt(dx * dx + dy * dy + dz * dz);
  double m = (dx * p.nx + dy * p.ny + dz * p.nz) / len - g.sin_min;
  if (g.cone) m = std::min(m, (dx * q.ux + dy * q.uy + dz * q.uz) / len - g.cos_cone);
  return m;
}

inline bool visible(const PointGeo& p, const PositionBuffer& b, size_t i, const Geometry& g) {
  const SatPos& q = b.pos[i];
  const double dx = q.x - p.rx, dy = q.y - p.ry, dz = q.z - p.rz;
  const double up = dx * p.nx + dy * p.ny + dz * p.nz;
  if (up < 0.0) return false;  // below the horizontal plane (mask >= 0)
  if (g.cone) return margin(p, b, i, g) >= 0.0;
  // sin(elevation) >= sin(mask) with both sides non-negative, squared so that no root or division is needed.
  return up * up >= g.sin_min2 * (dx * dx + dy * dy + dz * dz);
}

// Insert the cosine c into the descending top-K list (K >= 1); the list's values do not depend on the order
// in which the cosines arrive.
inline void insert_top(double* top, int K, double c) {
  if (!(c > top[K - 1])) return;
  int k = K - 1;
  while (k > 0 && top[k - 1] < c) {
    top[k] = top[k - 1];
    --k;
  }
  top[k] = c;
}

inline double cos_to(const PointGeo& p, const SatPos& q) { return p.ux * q.ux + p.uy * q.uy + p.uz * q.uz; }

// The two terms of the visibility margin of satellite s from point p at a buffered instant and their time
// derivatives (1/s), from the satellite's Earth-fixed velocity v: with d = r_sat - r_ground and L = |d|,
// the mask term d.n / L - sin(mask) has the rate v.n / L - (d.n)(d.v) / L^3; the payload-cone term
// d.u / L - cos(half-angle), with u = r_sat/|r_sat| and du/dt = (v - u (u.v)) / |r_sat|, has the rate
// (v.u + d.du/dt) / L - (d.u)(d.v) / L^3. Without a cone the second term is +infinity.
struct MarginTerms {
  double mask, mask_rate, cone, cone_rate;
};
inline MarginTerms margin_terms(const PointGeo& p, const SatPos& q, const SatVel& w, const Geometry& g) {
  MarginTerms r;
  const double dx = q.x - p.rx, dy = q.y - p.ry, dz = q.z - p.rz;
  const double len2 = dx * dx + dy * dy + dz * dz;
  const double inv = 1.0 / std::sqrt(len2);
  const double dn = dx * p.nx + dy * p.ny + dz * p.nz;
  const double vn = w.vx * p.nx + w.vy * p.ny + w.vz * p.nz;
  const double dv = dx * w.vx + dy * w.vy + dz * w.vz;
  r.mask = dn * inv - g.sin_min;
  r.mask_rate = (vn - dn * dv * inv * inv) * inv;
  r.cone = 1e300;
  r.cone_rate = 0.0;
  if (g.cone) {
    const double du = dx * q.ux + dy * q.uy + dz * q.uz;
    const double r_inv = 1.0 / std::sqrt(q.x * q.x + q.y * q.y + q.z * q.z);
    const double uv = q.ux * w.vx + q.uy * w.vy + q.uz * w.vz;  // v.u
    const double d_du = (dx * (w.vx - q.ux * uv) + dy * (w.vy - q.uy * uv) + dz * (w.vz - q.uz * uv)) * r_inv;
    r.cone = du * inv - g.cos_cone;
    r.cone_rate = (uv + d_du - du * dv * inv * inv) * inv;
  }
  return r;
}

// Time of the sign change of the margin of (p, s) inside (t_{j-1}, t_j). The margin and its rate are evaluated
// exactly at the two bracketing instants (from the buffered Earth-fixed positions and velocities, no new
// orbit evaluation); between them the margin is replaced by the cubic Hermite interpolant of those four values
// (error h^4 max|f''''| / 384 for a step h; C. de Boor, "A Practical Guide to Splines", 1978, ch. II). Its root
// is found by a safeguarded Newton iteration started at the secant root.
double crossing_time(const PointGeo& p, const PositionBuffer& b, const Sampling& smp, long j, int s, const Geometry& g) {
  const double t0 = smp.time(j - 1), t1 = smp.time(j), h = t1 - t0;
  const MarginTerms e0 = margin_terms(p, b.pos[b.at(j - 1, s)], b.vel[b.at(j - 1, s)], g);
  const MarginTerms e1 = margin_terms(p, b.pos[b.at(j, s)], b.vel[b.at(j, s)], g);
  // The margin is the smaller term. Follow the term that is the smaller one at the end out of view: it is the
  // one that crosses zero, and it is smooth, whereas the minimum has a kink where the terms swap.
  const MarginTerms& out = std::min(e0.mask, e0.cone) < std::min(e1.mask, e1.cone) ? e0 : e1;
  const bool use_cone = out.cone < out.mask;
  double f0 = use_cone ? e0.cone : e0.mask, d0 = use_cone ? e0.cone_rate : e0.mask_rate;
  double f1 = use_cone ? e1.cone : e1.mask, d1 = use_cone ? e1.cone_rate : e1.mask_rate;
  if (f0 == 0.0) return t0;
  if ((f0 < 0.0) == (f1 < 0.0)) return 0.5 * (t0 + t1);  // not bracketed by rounding: take the midpoint
  // Power form in x = (t - t0) / h: c0 + c1 x + c2 x^2 + c3 x^3.
  const double c0 = f0, c1 = h * d0, c2 = 3.0 * (f1 - f0) - h * (2.0 * d0 + d1), c3 = 2.0 * (f0 - f1) + h * (d0 + d1);
  double a = 0.0, bb = 1.0;
  const bool fb_negative = f1 < 0.0;
  double x = f0 / (f0 - f1);
  // Newton steps; the bracket [a, bb] is kept, and a step leaving it is replaced by bisection. Stops after a
  // Newton step below 1e-4 of the interval, which leaves an error far under the interpolation residual.
  for (int it = 0; it < 12; ++it) {
    const double v = c0 + x * (c1 + x * (c2 + x * c3));
    const double dv = c1 + x * (2.0 * c2 + x * 3.0 * c3);
    if (v == 0.0) break;
    if ((v < 0.0) == fb_negative) {
      bb = x;
    } else {
      a = x;
    }
    double xn = dv != 0.0 ? x - v / dv : 0.5 * (a + bb);
    const bool newton = xn > a && xn < bb;
    if (!newton) xn = 0.5 * (a + bb);
    // After a Newton step of size delta the error is O(delta^2), so 1e-4 of the interval leaves about 1e-8 of it.
    const bool done = newton && std::abs(xn - x) < 1e-4;
    x = xn;
    if (done) break;
  }
  return t0 + x * h;
}

std::vector<Row> build_rows(const std::vector<PointGeo>& geo) {
  std::vector<int> order(geo.size());
  std::iota(order.begin(), order.end(), 0);
  std::vector<double> psi(geo.size()), lon(geo.size());
  for (size_t i = 0; i < geo.size(); ++i) {
    psi[i] = std::asin(std::clamp(geo[i].uz, -1.0, 1.0));
    lon[i] = std::atan2(geo[i].uy, geo[i].ux);
  }
  std::sort(order.begin(), order.end(), [&](int a, int b) { return psi[a] != psi[b] ? psi[a] < psi[b] : lon[a] < lon[b]; });
  std::vector<Row> rows;
  for (int i : order) {
    if (rows.empty() || rows.back().psi != psi[i]) {
      Row r;
      r.psi = psi[i];
      r.sin_psi = std::sin(r.psi);
      r.cos_psi = std::cos(r.psi);
      rows.push_back(std::move(r));
    }
    rows.back().lon.push_back(lon[i]);
    rows.back().point.push_back(i);
  }
  return rows;
}

// std::lower_bound / std::upper_bound on a row's ascending longitudes, started from the linear guess (exact
// for the evenly spaced rows of global, band and region grids) and corrected by stepping, so the result is the
// same as the binary search for any row.
inline long row_guess(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  if (n < 2) return 0;
  const double f = (x - row.lon.front()) / (row.lon.back() - row.lon.front()) * static_cast<double>(n - 1);
  if (!(f > 0.0)) return 0;
  if (f >= static_cast<double>(n)) return n;
  return static_cast<long>(f);
}
inline long row_lower_bound(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  long k = row_guess(row, x);
  while (k > 0 && row.lon[static_cast<size_t>(k - 1)] >= x) --k;
  while (k < n && row.lon[static_cast<size_t>(k)] < x) ++k;
  return k;
}
inline long row_upper_bound(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  long k = row_guess(row, x);
  while (k > 0 && row.lon[static_cast<size_t>(k - 1)] > x) --k;
  while (k < n && row.lon[static_cast<size_t>(k)] <= x) ++k;
  return k;
}

struct Window {
  int row;
  std::uint32_t begin, end;
};

// Footprint culling for one instant: each satellite's cull cap is cut into latitude rows, and in each row into
// the longitude window of half-width acos((cos lambda - sin psi sin psi_s) / (cos psi cos psi_s)) (the spherical
// law of cosines), so the cost follows the pairs inside the caps, not satellites x points.
void build_candidates(const PositionBuffer& b, long step, const std::vector<Row>& rows, const std::vector<double>& row_psi,
                      size_t npoints, StepCandidates& out, std::vector<Window>& windows, std::vector<int>& window_sat,
                      std::vector<std::uint32_t>& fill) {
  windows.clear();
  window_sat.clear();
  const auto add = [&](int r, const Row& row, double lo, double hi, int s) {
    const long b0 = row_lower_bound(row, lo), b1 = row_upper_bound(row, hi);
    if (b1 > b0) {
      windows.push_back({r, static_cast<std::uint32_t>(b0), static_cast<std::uint32_t>(b1)});
      window_sat.push_back(s);
    }
  };
  for (int s = 0; s < b.sats; ++s) {
    const size_t i = b.at(step, s);
    const double psi_s = std::asin(std::clamp(b.pos[i].uz, -1.0, 1.0));
    const double lon_s = std::atan2(b.pos[i].uy, b.pos[i].ux);
    const double lam = b.cull_rad[i];
    const double cos_lam = std::cos(lam), sin_s = std::sin(psi_s), cos_s = std::cos(psi_s);
    const auto r0 = std::lower_bound(row_psi.begin(), row_psi.end(), psi_s - lam) - row_psi.begin();
    const auto r1 = std::upper_bound(row_psi.begin(), row_psi.end(), psi_s + lam) - row_psi.begin();
    for (auto r = r0; r < r1; ++r) {
      const Row& row = rows[static_cast<size_t>(r)];
      const double den = row.cos_psi * cos_s;
      double half;
      if (den < 1e-12) {
        if (row.sin_psi * sin_s < cos_lam) continue;
        half = pi;
      } else {
        const double q = (cos_lam - row.sin_psi * sin_s) / den;
        if (q > 1.0) continue;
        half = q <= -1.0 ? pi : std::acos(q);
      }
      const int ri = static_cast<int>(r);
      if (half >= pi) {
        add(ri, row, -4.0, 4.0, s);
        continue;
      }
      const double lo = lon_s - half, hi = lon_s + half;
      if (lo < -pi) {
        add(ri, row, lo + two_pi, 4.0, s);
        add(ri, row, -4.0, hi, s);
      } else if (hi >= pi) {
        add(ri, row, lo, 4.0, s);
        add(ri, row, -4.0, hi - two_pi, s);
      } else {
        add(ri, row, lo, hi, s);
      }
    }
  }
  out.offset.assign(npoints + 1, 0);
  for (const Window& w : windows) {
    const Row& row = rows[static_cast<size_t>(w.row)];
    for (std::uint32_t k = w.begin; k < w.end; ++k) ++out.offset[static_cast<size_t>(row.point[k]) + 1];
  }
  for (size_t k = 0; k < npoints; ++k) out.offset[k + 1] += out.offset[k];
  out.sats.resize(out.offset[npoints]);
  fill.assign(out.offset.begin(), out.offset.end() - 1);
  for (size_t wi = 0; wi < windows.size(); ++wi) {
    const Window& w = windows[wi];
    const Row& row = rows[static_cast<size_t>(w.row)];
    for (std::uint32_t k = w.begin; k < w.end; ++k) out.sats[fill[static_cast<size_t>(row.point[k])]++] = window_sat[wi];
  }
}

// The central angle inside which the k-th nearest satellite is expected: 1.5 times the radius of a cap holding
// K/T of the sphere (common practice for sizing a search; only speed depends on it, not the result).
double radius_search_rad(int k, int satellites) {
  const double x = 1.0 - 2.0 * k / static_cast<double>(satellites);
  if (x <= -1.0) return pi;
  return std::min(pi, 1.5 * std::acos(x));
}

// Central angle of the widest footprint of a satellite at orbit radius r, made conservative for the ellipsoid.
double visibility_cull_rad(double r_km, double min_ground_radius_km, const CoverageSettings& st) {
  const double eps = std::max(0.0, st.spec.min_elevation_deg * rad_per_deg - vertical_deflection_rad);
  const double c = min_ground_radius_km * std::cos(eps) / r_km;
  if (c >= 1.0) return 0.0;
  return std::acos(c) - eps + cull_margin_rad;
}

struct PointState {
  std::vector<int> vis;
  std::vector<float> gaps;
  double gap_start = 0.0;
  bool in_gap = false;
  int count = 0;
  int max_in_view = 0;
  double count_time = 0.0;
};

struct Partial {
  std::vector<double> covered;  // [local step * K + k-1]: area weight with at least k in view
  std::int64_t pair_tests = 0;
  std::int64_t fallbacks = 0;
};

double weighted_quantile(std::vector<std::pair<float, double>>& sample, double q) {
  // sample sorted by value; smallest value whose cumulative weight reaches q of the total.
  double total = 0.0;
  for (const auto& v : sample) total += v.second;
  double cum = 0.0;
  for (const auto& v : sample) {
    cum += v.second;
    if (cum >= q * total * (1.0 - 1e-12)) return v.first;
  }
  return sample.back().first;
}

CoverageAggregate aggregate(const std::vector<PointCoverage>& pts, const std::vector<size_t>& members,
                            const std::vector<PointState>& state, int K, double total_weight) {
  CoverageAggregate a;
  a.percent_by_fold.assign(static_cast<size_t>(K), 0.0);
  double w = 0.0, gap_sum = 0.0, gap_weight = 0.0;
  std::vector<std::pair<float, double>> pooled;
  for (size_t i : members) {
    const PointCoverage& p = pts[i];
    const double pw = p.point.area_weight;
    w += pw;
    for (int k = 0; k < K; ++k) a.percent_by_fold[static_cast<size_t>(k)] += pw * p.percent_by_fold[static_cast<size_t>(k)];
    a.max_gap_s = std::max(a.max_gap_s, p.max_gap_s);
    a.gap_count += p.gap_count;
    a.mean_response_time_s += pw * p.mean_response_time_s;
    a.mean_in_view += pw * p.mean_in_view;
    a.max_in_view = std::max(a.max_in_view, p.max_in_view);
    for (float g : state[i].gaps) {
      gap_sum += pw * g;
      gap_weight += pw;
      pooled.emplace_back(g, pw);
    }
  }
  a.points = static_cast<long>(members.size());
  a.area_weight = w / total_weight;
  if (w > 0.0) {
    for (double& v : a.percent_by_fold) v /= w;
    a.mean_response_time_s /= w;
    a.mean_in_view /= w;
  }
  if (gap_weight > 0.0) {
    a.mean_gap_s = gap_sum / gap_weight;
    std::stable_sort(pooled.begin(), pooled.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
    a.p95_gap_s = weighted_quantile(pooled, 0.95);
  }
  return a;
}

void check_positive(double v, const char* what) {
  if (!(v > 0.0)) throw InputError(fmt::format("{} {} is not positive; expected a value above zero", what, v));
}

}  // namespace

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
    if (s.grid == GridKind::sites) throw InputError("--spacing does not apply to a grid of sites");
    const double v = *o.spacing_deg;
    const double n = 180.0 / v;
    if (!(v >= 0.01 && v <= 30.0) || std::abs(n - std::round(n)) > 1e-9)
      throw InputError(fmt::format("--spacing {}: expected a cell size from 0.01 to 30 deg that divides 180 deg", v));
    if (s.grid == GridKind::band) {
      const double nb = (s.band_lat_max_deg - s.band_lat_min_deg) / v;
      if (std::abs(nb - std::round(nb)) > 1e-9)
        throw InputError(fmt::format("--spacing {}: the band {} to {} deg is not a whole number of cells", v,
                                     s.band_lat_min_deg, s.band_lat_max_deg));
    }
    s.spacing_deg = v;
  }
  if (o.span_s) {
    check_positive(*o.span_s, "--span (h)");
    if (*o.span_s > 366.0 * 86400.0) throw InputError("--span: expected at most a year (8784 h)");
    s.span_s = *o.span_s;
  }
  if (o.step_s) {
    check_positive(*o.step_s, "--step (s)");
    s.step_s = *o.step_s;
  }
  if (!(s.step_s > 0.0)) throw InputError("coverage.step_s: the step must be above zero");
  if (s.step_s > s.span_s)
    throw InputError(fmt::format("the step {} s is longer than the span {} s; expected step <= span", s.step_s, s.span_s));
  if (o.min_elevation_deg) {
    if (!(*o.min_elevation_deg >= 0.0 && *o.min_elevation_deg <= 89.0))
      throw InputError(fmt::format("--elevation {}: expected an elevation mask from 0 to 89 deg", *o.min_elevation_deg));
    s.min_elevation_deg = *o.min_elevation_deg;
  }
  st.satellites = static_cast<int>(expand_constellation(design).size());
  if (o.max_fold) {
    if (*o.max_fold < 1 || *o.max_fold > 16) throw InputError(fmt::format("--fold {}: expected 1 to 16", *o.max_fold));
    if (*o.max_fold > st.satellites)
      throw InputError(fmt::format("--fold {}: the design has only {} satellites; expected a fold of at most {}",
                                   *o.max_fold, st.satellites, st.satellites));
    st.max_fold = *o.max_fold;
  } else if (s.max_fold) {
    if (*s.max_fold > st.satellites)
      throw InputError(fmt::format("{}: fold {} is larger than the design's {} satellites; expected at most {}",
                                   s.max_fold_location, *s.max_fold, st.satellites, st.satellites));
    st.max_fold = *s.max_fold;
  } else {
    st.max_fold = std::min(3, st.satellites);
  }
  return st;
}

namespace {

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
  const double per_point = 160.0 + 16.0 * st.max_fold + 8.0 * in_view_bins + 4.0 * gaps + 8.0 * std::max(1.0, cand);
  const double chunk = mode == CoverageMode::exhaustive ? 0.0 : 4.0 * chunk_entry_budget + 64.0 * 4.0 * (static_cast<double>(points) + 1.0);
  e.memory_bytes = static_cast<double>(points) * per_point * 2.0 + chunk + 70.0 * st.satellites * 112.0;  // per satellite-instant: position, velocity, cull radius, latitude order
  e.seconds_2_cores = (3e-9 * e.pair_tests + 60e-9 * e.point_steps) / 2.0;
  return e;
}

}  // namespace

CoverageWorkEstimate estimate_coverage_work(const Design& design, const CoverageOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options);
  const Grid grid = build_grid(st.spec, design.earth);
  return estimate(design, st, static_cast<long>(grid.points.size()), options.mode);
}

CoverageResult evaluate_coverage(const Design& design, const CoverageOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options);
  const Grid grid = build_grid(st.spec, design.earth);
  const CoverageWorkEstimate est = estimate(design, st, static_cast<long>(grid.points.size()), options.mode);
  if (!options.force) {
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
  double min_ground_radius = 1e300;
  for (size_t i = 0; i < P; ++i) {
    const GridPoint& g = grid.points[i];
    const Eigen::Vector3d u = g.r_km.normalized();
    geo[i] = {g.r_km.x(), g.r_km.y(), g.r_km.z(), g.up.x(), g.up.y(), g.up.z(), u.x(), u.y(), u.z()};
    min_ground_radius = std::min(min_ground_radius, g.r_km.norm());
  }
  min_ground_radius = std::min(min_ground_radius, earth.radius_km * (1.0 - earth.flattening)) - 0.01;
  const std::vector<Row> rows = exhaustive ? std::vector<Row>{} : build_rows(geo);
  std::vector<double> row_psi;
  for (const Row& r : rows) row_psi.push_back(r.psi);

  Geometry gm;
  gm.sin_min = std::sin(st.spec.min_elevation_deg * rad_per_deg);
  gm.sin_min2 = gm.sin_min * gm.sin_min;
  if (st.spec.nadir_half_angle_deg) {
    gm.cone = true;
    gm.cos_cone = std::cos(*st.spec.nadir_half_angle_deg * rad_per_deg);
  }
  const double radius_guess = radius_search_rad(K, T);

  const double cand_est = std::max(1.0, est.pair_tests / std::max(1.0, est.point_steps));
  const long chunk = exhaustive ? 64
                                : std::clamp(static_cast<long>(chunk_entry_budget / (static_cast<double>(P) * cand_est)), 1L, 64L);

  std::vector<PointState> state(P);
  std::vector<double> at_least(P * static_cast<size_t>(K), 0.0), worst_cos(P * static_cast<size_t>(K), 2.0);
  std::vector<double> hist(P * in_view_bins, 0.0);
  std::vector<double> worst_covered(static_cast<size_t>(K), 1e300);
  std::int64_t pair_tests = 0, fallbacks = 0;

  PositionBuffer buf;
  buf.sats = T;
  std::vector<StepCandidates> cands(static_cast<size_t>(chunk));

  for (long c0 = 0; c0 < smp.n; c0 += chunk) {
    const long c1 = std::min(smp.n, c0 + chunk);
    buf.first = std::max<long>(0, c0 - 1);
    const long last = c1 - 1;  // a crossing in (t_{j-1}, t_j] needs instants j-1 and j only
    buf.count = last - buf.first + 1;
    const size_t cells = static_cast<size_t>(buf.count) * static_cast<size_t>(T);
    buf.pos.resize(cells);
    buf.vel.resize(cells);
    buf.cull_rad.resize(cells);
    if (!exhaustive) {
      buf.by_lat.resize(cells);
      buf.by_lat_sin.resize(cells);
      buf.by_lat_cos.resize(cells);
    }
    buf.guaranteed_cos.resize(static_cast<size_t>(buf.count));
    tbb::parallel_for(tbb::blocked_range<long>(0, buf.count), [&](const tbb::blocked_range<long>& r) {
      for (long l = r.begin(); l < r.end(); ++l) {
        const long step = buf.first + l;
        const double t = smp.time(step);
        const double theta = theta0 + earth.rotation_rad_s * t;
        double guaranteed = pi;
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
          buf.pos[i] = {r_ef.x(), r_ef.y(), r_ef.z(), r_ef.x() / len, r_ef.y() / len, r_ef.z() / len};
          buf.vel[i] = {v_ef.x(), v_ef.y(), v_ef.z()};
          buf.cull_rad[i] = std::max(visibility_cull_rad(len, min_ground_radius, st), radius_guess);
          guaranteed = std::min(guaranteed, buf.cull_rad[i]);
        }
        buf.guaranteed_cos[static_cast<size_t>(l)] = std::cos(std::max(0.0, guaranteed - 1e-7));
        if (!exhaustive) {
          const size_t base = buf.at(step, 0);
          int* ord = &buf.by_lat[base];
          std::iota(ord, ord + T, 0);
          std::sort(ord, ord + T, [&](int a, int b) {
            const double za = buf.pos[base + static_cast<size_t>(a)].uz, zb = buf.pos[base + static_cast<size_t>(b)].uz;
            return za != zb ? za < zb : a < b;
          });
          for (int k = 0; k < T; ++k) {
            const double z = std::clamp(buf.pos[base + static_cast<size_t>(ord[k])].uz, -1.0, 1.0);
            buf.by_lat_sin[base + static_cast<size_t>(k)] = z;
            buf.by_lat_cos[base + static_cast<size_t>(k)] = std::sqrt(1.0 - z * z);
          }
        }
      }
    });
    if (!exhaustive) {
      tbb::parallel_for(tbb::blocked_range<long>(c0, c1, 1), [&](const tbb::blocked_range<long>& r) {
        std::vector<Window> windows;
        std::vector<int> window_sat;
        std::vector<std::uint32_t> fill;
        for (long step = r.begin(); step < r.end(); ++step)
          build_candidates(buf, step, rows, row_psi, P, cands[static_cast<size_t>(step - c0)], windows, window_sat, fill);
      });
    }

    const size_t nsteps = static_cast<size_t>(c1 - c0);
    Partial identity;
    identity.covered.assign(nsteps * static_cast<size_t>(K), 0.0);
    const Partial part = tbb::parallel_deterministic_reduce(
        tbb::blocked_range<size_t>(0, P, 64), identity,
        [&](const tbb::blocked_range<size_t>& range, Partial acc) {
          std::vector<int> fresh;
          std::vector<double> top(static_cast<size_t>(K));
          std::vector<std::pair<double, int>> events;
          for (size_t p = range.begin(); p < range.end(); ++p) {
            const PointGeo& pg = geo[p];
            PointState& ps = state[p];
            double* al = &at_least[p * static_cast<size_t>(K)];
            double* wc = &worst_cos[p * static_cast<size_t>(K)];
            double* hi = &hist[p * in_view_bins];
            const double w = grid.points[p].area_weight;
            const auto integrate = [&](int c, double dt) {
              if (dt <= 0.0) return;
              ps.count_time += c * dt;
              hi[std::min(c, in_view_bins - 1)] += dt;
              for (int k = 0; k < std::min(c, K); ++k) al[k] += dt;
            };
            for (long step = c0; step < c1; ++step) {
              fresh.clear();
              std::fill(top.begin(), top.end(), -2.0);
              double* tp = top.data();
              const SatPos* sp = &buf.pos[buf.at(step, 0)];
              const auto consider = [&](int s) {
                ++acc.pair_tests;
                if (visible(pg, buf, buf.at(step, s), gm)) fresh.push_back(s);
                insert_top(tp, K, cos_to(pg, sp[s]));
              };
              if (exhaustive) {
                for (int s = 0; s < T; ++s) consider(s);
              } else {
                const StepCandidates& sc = cands[static_cast<size_t>(step - c0)];
                for (std::uint32_t k = sc.offset[p]; k < sc.offset[p + 1]; ++k) consider(sc.sats[k]);
                if (tp[K - 1] < buf.guaranteed_cos[static_cast<size_t>(step - buf.first)]) {
                  // The k-th nearest satellite lies beyond the cull radius: find it, exactly, among all satellites.
                  // The central angle to a satellite is at least the difference of the geocentric latitudes, so its
                  // cosine is at most cos psi_s cos psi_p + sin psi_s sin psi_p (spherical law of cosines). The
                  // satellites are sorted by latitude, so the scan runs outward from the point's latitude and
                  // stops on each side once that bound is below the k-th best cosine found (less 1e-12 for
                  // rounding). The top-K values do not depend on the scan order, so this equals the full scan.
                  ++acc.fallbacks;
                  std::fill(top.begin(), top.end(), -2.0);
                  const size_t base = buf.at(step, 0);
                  const int* ord = &buf.by_lat[base];
                  const double* zs = &buf.by_lat_sin[base];
                  const double* cs = &buf.by_lat_cos[base];
                  const double zp = std::clamp(pg.uz, -1.0, 1.0), cp = std::sqrt(1.0 - zp * zp);
                  const int mid = static_cast<int>(std::lower_bound(zs, zs + T, zp) - zs);
                  for (int k = mid; k < T; ++k) {
                    if (cs[k] * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
                    insert_top(tp, K, cos_to(pg, sp[ord[k]]));
                  }
                  for (int k = mid - 1; k >= 0; --k) {
                    if (cs[k] * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
                    insert_top(tp, K, cos_to(pg, sp[ord[k]]));
                  }
                }
              }
              for (int k = 0; k < K; ++k) wc[k] = std::min(wc[k], top[static_cast<size_t>(k)]);
              if (step == 0) {
                ps.count = static_cast<int>(fresh.size());
                ps.max_in_view = ps.count;
                if (ps.count == 0) {
                  ps.in_gap = true;
                  ps.gap_start = 0.0;
                }
              } else {
                // Rises (in fresh, not in vis) and sets (in vis, not in fresh) inside (t_{j-1}, t_j].
                events.clear();
                size_t a = 0, b = 0;
                while (a < ps.vis.size() || b < fresh.size()) {
                  if (b == fresh.size() || (a < ps.vis.size() && ps.vis[a] < fresh[b])) {
                    events.emplace_back(crossing_time(pg, buf, smp, step, ps.vis[a], gm), -1);
                    ++a;
                  } else if (a == ps.vis.size() || fresh[b] < ps.vis[a]) {
                    events.emplace_back(crossing_time(pg, buf, smp, step, fresh[b], gm), +1);
                    ++b;
                  } else {
                    ++a;
                    ++b;
                  }
                }
                // Rises before sets at equal times, so no zero-length gap is made.
                if (events.size() > 1)
                  std::sort(events.begin(), events.end(), [](const auto& x, const auto& y) {
                    return x.first != y.first ? x.first < y.first : x.second > y.second;
                  });
                double cur = smp.time(step - 1);
                for (const auto& [tau, delta] : events) {
                  const double te = std::clamp(tau, cur, smp.time(step));
                  integrate(ps.count, te - cur);
                  cur = te;
                  const int before = ps.count;
                  ps.count += delta;
                  ps.max_in_view = std::max(ps.max_in_view, ps.count);
                  if (before == 0 && ps.count == 1 && ps.in_gap) {
                    if (te - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(te - ps.gap_start));
                    ps.in_gap = false;
                  } else if (before == 1 && ps.count == 0) {
                    ps.in_gap = true;
                    ps.gap_start = te;
                  }
                }
                integrate(ps.count, smp.time(step) - cur);
                assert(ps.count == static_cast<int>(fresh.size()));
              }
              for (int k = 0; k < std::min(ps.count, K); ++k)
                acc.covered[static_cast<size_t>(step - c0) * static_cast<size_t>(K) + static_cast<size_t>(k)] += w;
              ps.vis.swap(fresh);
            }
          }
          if (options.progress) options.progress->fetch_add(static_cast<std::int64_t>(range.size()) * (c1 - c0));
          return acc;
        },
        [](Partial x, const Partial& y) {
          for (size_t i = 0; i < x.covered.size(); ++i) x.covered[i] += y.covered[i];
          x.pair_tests += y.pair_tests;
          x.fallbacks += y.fallbacks;
          return x;
        });
    pair_tests += part.pair_tests;
    fallbacks += part.fallbacks;
    for (size_t l = 0; l < nsteps; ++l)
      for (int k = 0; k < K; ++k)
        worst_covered[static_cast<size_t>(k)] =
            std::min(worst_covered[static_cast<size_t>(k)], part.covered[l * static_cast<size_t>(K) + static_cast<size_t>(k)]);
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
  res.max_fold = K;
  res.satellites = T;
  res.mode = options.mode;
  res.point_steps = static_cast<std::int64_t>(P) * smp.n;
  res.pair_tests = pair_tests;
  res.radius_fallbacks = fallbacks;
  res.points.resize(P);
  res.required_radius_deg.assign(static_cast<size_t>(K), 0.0);
  res.in_view_fraction.assign(in_view_bins, 0.0);
  for (size_t p = 0; p < P; ++p) {
    PointState& ps = state[p];
    if (ps.in_gap && smp.span - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(smp.span - ps.gap_start));
    PointCoverage& pc = res.points[p];
    pc.point = grid.points[p];
    for (int k = 0; k < K; ++k) {
      pc.percent_by_fold.push_back(100.0 * at_least[p * static_cast<size_t>(K) + static_cast<size_t>(k)] / smp.span);
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
  for (int k = 0; k < K; ++k) res.worst_instant_covered_percent.push_back(100.0 * worst_covered[static_cast<size_t>(k)]);

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
