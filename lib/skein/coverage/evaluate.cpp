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

#include "skein/coverage/footprint.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/coverage/hidden_pass.hpp"
#include "skein/coverage/spec.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

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
namespace {

// Bins of the satellites-in-view distribution: 0 .. in_view_bins-2, and "in_view_bins-1 or more".
constexpr int in_view_bins = 33;
// The geodetic vertical departs from the geocentric radial by at most 0.1924 deg on WGS-84 (the largest
// difference of geodetic and geocentric latitude, at 45 deg; follows from tan psi = (1 - e^2) tan phi,
// Snyder 1987 eq. 3-28). The work estimate widens the mask by this much, plus a safety margin.
constexpr double vertical_deflection_rad = 0.2 * rad_per_deg;
constexpr double cull_margin_rad = 0.25 * rad_per_deg;
// Scratch memory of culled mode, a bound used by the work estimate.
constexpr double culled_scratch_bytes = 8e7;
// Sample instants held at once: at most 64 (exhaustive) or 16 (culled, whose row sweep reads the buffer once
// per row, so it should stay in cache), fewer for very large constellations (about 256 MB of buffers).
constexpr double buffer_budget_bytes = 2.56e8;
constexpr long culled_chunk = 16;
// Area weights in integer units: the weight share times 2^53 (exact sums in any order).
constexpr double weight_units = 9007199254740992.0;

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

// Satellite state for the culling windows, per instant.
struct SatAux {
  double sin_psi, cos_psi, lon, r_km;  // geocentric latitude (sine, cosine), longitude (rad), radius (km)
};

// Satellite positions (Earth-fixed) for a window of sample instants.
struct PositionBuffer {
  long first = 0, count = 0;
  int sats = 0;
  std::vector<SatPos> pos;   // [local * sats + s]
  std::vector<SatVel> vel;   // [local * sats + s]
  std::vector<SatAux> aux;   // [local * sats + s]
  // Per instant: the largest outer footprint angle of any satellite over any row, and the largest change of a
  // satellite's geocentric latitude since the previous instant (both rad).
  std::vector<double> reach_rad, moved_rad;
  // The largest angle from a satellite's ground direction at t_{j-1} or t_j to a point that can see it
  // during the step (the outer angle at the largest orbit radius, plus the chord's half and the track's
  // deviation bound; hidden_pass.hpp). Constant over the run.
  double swept_reach_rad = 0.0;
  // Culled mode only: per instant, the satellites sorted by geocentric latitude.
  std::vector<int> by_lat;
  std::vector<double> by_lat_sin;   // sin of the latitude, same order (contiguous for the binary searches)
  std::vector<SatAux> by_lat_aux;   // aux in the same order
  std::vector<SatAux> by_lat_prev;  // aux of the previous instant, same order (unset for the buffer's first)
  size_t at(long step, int s) const { return static_cast<size_t>((step - first) * sats + s); }
  size_t local(long step) const { return static_cast<size_t>(step - first); }
};

struct Geometry {
  double sin_min = 0.0;
  double sin_min2 = 0.0;  // sin_min squared
  bool cone = false;
  double cos_cone = 0.0;
  bool polynomial = false;  // crossing times on the polynomial form of the margin (no cone, mask >= 5 deg)
  // Rises and sets found on the satellite's cubic path instead of the margin's cubic in time: set when the
  // step is long against the shortest full pass, where the margin is far from a cubic over a step.
  bool roots_on_path = false;
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

// The same, keeping the satellite of each value alongside.
inline void insert_top_sat(double* top, int* sat, int K, double c, int s) {
  if (!(c > top[K - 1])) return;
  int k = K - 1;
  while (k > 0 && top[k - 1] < c) {
    top[k] = top[k - 1];
    sat[k] = sat[k - 1];
    --k;
  }
  top[k] = c;
  sat[k] = s;
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

// Without a payload cone and with a mask of at least 5 deg, the margin is taken in the form of the visibility
// test, G = (d.n)|d.n| - sin^2(mask) |d|^2, which has the same sign as sin(elevation) - sin(mask) and the same
// zero, needs no root or division, and is smooth near the mask (its kink, at d.n = 0, is on the horizon, at
// least 5 deg of elevation away). Rate: G' = 2 |d.n| (v.n) - 2 sin^2(mask) (d.v).
struct PolynomialMargin {
  double value, rate;
};
// The value alone, with what the rate needs: the line of sight d and d.n. Its sign is the visibility test's.
struct PolynomialValue {
  double value, dx, dy, dz, dn;
};
inline PolynomialValue polynomial_value(const PointGeo& p, const SatPos& q, const Geometry& g) {
  const double dx = q.x - p.rx, dy = q.y - p.ry, dz = q.z - p.rz;
  const double dn = dx * p.nx + dy * p.ny + dz * p.nz;
  const double len2 = dx * dx + dy * dy + dz * dz;
  return {dn * std::abs(dn) - g.sin_min2 * len2, dx, dy, dz, dn};
}
inline double polynomial_rate(const PointGeo& p, const PolynomialValue& e, const SatVel& w, const Geometry& g) {
  const double vn = w.vx * p.nx + w.vy * p.ny + w.vz * p.nz;
  const double dv = e.dx * w.vx + e.dy * w.vy + e.dz * w.vz;
  return 2.0 * std::abs(e.dn) * vn - 2.0 * g.sin_min2 * dv;
}
inline PolynomialMargin polynomial_margin(const PointGeo& p, const SatPos& q, const SatVel& w, const Geometry& g) {
  const PolynomialValue e = polynomial_value(p, q, g);
  return {e.value, polynomial_rate(p, e, w, g)};
}

// Margin values and rates (1/s) of one pair at the two instants t_{j-1}, t_j that bracket its rise or set.
struct Bracket {
  double f0, d0, f1, d1;
};

// The bracket of (p, s) over (t_{j-1}, t_j]: the margin and its rate evaluated exactly at the two instants
// (from the buffered Earth-fixed positions and velocities, no new orbit evaluation).
Bracket crossing_bracket(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g) {
  if (g.polynomial) {
    const PolynomialMargin e0 = polynomial_margin(p, b.pos[b.at(j - 1, s)], b.vel[b.at(j - 1, s)], g);
    const PolynomialMargin e1 = polynomial_margin(p, b.pos[b.at(j, s)], b.vel[b.at(j, s)], g);
    return {e0.value, e0.rate, e1.value, e1.rate};
  }
  const MarginTerms e0 = margin_terms(p, b.pos[b.at(j - 1, s)], b.vel[b.at(j - 1, s)], g);
  const MarginTerms e1 = margin_terms(p, b.pos[b.at(j, s)], b.vel[b.at(j, s)], g);
  // The margin is the smaller term. Follow the term that is the smaller one at the end out of view: it is the
  // one that crosses zero, and it is smooth, whereas the minimum has a kink where the terms swap.
  const MarginTerms& out = std::min(e0.mask, e0.cone) < std::min(e1.mask, e1.cone) ? e0 : e1;
  const bool use_cone = out.cone < out.mask;
  return {use_cone ? e0.cone : e0.mask, use_cone ? e0.cone_rate : e0.mask_rate, use_cone ? e1.cone : e1.mask,
          use_cone ? e1.cone_rate : e1.mask_rate};
}

// The true margin (the smaller term) and its rate, for the hidden-pass search (the polynomial form has the
// visibility test's sign but not the margin's rate sign, so the search always uses the terms).
inline MarginSample true_margin(const PointGeo& p, const SatPos& q, const SatVel& w, const Geometry& g) {
  const MarginTerms e = margin_terms(p, q, w, g);
  return e.cone < e.mask ? MarginSample{e.cone, e.cone_rate} : MarginSample{e.mask, e.mask_rate};
}

// A pass of (p, s) wholly inside (t_{j-1}, t_j] for a pair out of view at both instants (hidden_pass.hpp).
// sin_limit is the sine of an outer footprint angle of s valid for p over the step, widened by the track's
// deviation bound: the satellite's ground direction stays within that deviation of the great circle through
// its directions at the two instants, so a point farther than the outer angle plus the deviation from that
// circle cannot see it during the step (first test, no orbit evaluation). The path between the instants is
// the cubic Hermite interpolant of the buffered positions and velocities. Both modes call this with the same
// arguments for every pair that can hold a pass, so they find the same passes to the bit.
std::optional<HiddenPass> hidden_pass(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g,
                                      double sin_limit, double t0, double t1) {
  const SatPos& q0 = b.pos[b.at(j - 1, s)];
  const SatPos& q1 = b.pos[b.at(j, s)];
  if (sin_limit < 1.0) {
    const double nx = q0.uy * q1.uz - q0.uz * q1.uy, ny = q0.uz * q1.ux - q0.ux * q1.uz, nz = q0.ux * q1.uy - q0.uy * q1.ux;
    const double nn = std::sqrt(nx * nx + ny * ny + nz * nz);
    if (nn > 1e-12 && std::abs(p.ux * nx + p.uy * ny + p.uz * nz) > sin_limit * nn) return std::nullopt;
  }
  const SatVel& w0 = b.vel[b.at(j - 1, s)];
  const SatVel& w1 = b.vel[b.at(j, s)];
  const MarginSample a = true_margin(p, q0, w0, g), c = true_margin(p, q1, w1, g);
  if (!(a.rate > 0.0 && c.rate < 0.0)) return std::nullopt;
  const double p0[3] = {q0.x, q0.y, q0.z}, v0[3] = {w0.vx, w0.vy, w0.vz};
  const double p1[3] = {q1.x, q1.y, q1.z}, v1[3] = {w1.vx, w1.vy, w1.vz};
  const CubicPath path(p0, v0, p1, v1, t1 - t0);
  return find_hidden_pass(t0, t1, a, c, [&](double tau) {
    double r[3], v[3];
    path.at(tau, r, v);
    const double len = std::sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    const SatPos q{r[0], r[1], r[2], r[0] / len, r[1] / len, r[2] / len};
    return true_margin(p, q, SatVel{v[0], v[1], v[2]}, g);
  });
}

// The time of the one rise or set of (p, s) inside (t_{j-1}, t_j) (visible at one instant, not the other),
// as the root of the true margin along the satellite's cubic path (regula falsi, Illinois, to 1e-9 of the
// step). Used instead of the margin's cubic in time when Geometry::roots_on_path is set.
double path_root(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g, double t0, double t1) {
  const SatPos& q0 = b.pos[b.at(j - 1, s)];
  const SatPos& q1 = b.pos[b.at(j, s)];
  const SatVel& w0 = b.vel[b.at(j - 1, s)];
  const SatVel& w1 = b.vel[b.at(j, s)];
  const double p0[3] = {q0.x, q0.y, q0.z}, v0[3] = {w0.vx, w0.vy, w0.vz};
  const double p1[3] = {q1.x, q1.y, q1.z}, v1[3] = {w1.vx, w1.vy, w1.vz};
  const CubicPath path(p0, v0, p1, v1, t1 - t0);
  const auto f = [&](double tau) {
    double r[3], v[3];
    path.at(tau, r, v);
    const double len = std::sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    return true_margin(p, SatPos{r[0], r[1], r[2], r[0] / len, r[1] / len, r[2] / len}, SatVel{v[0], v[1], v[2]}, g).value;
  };
  return t0 + (t1 - t0) * illinois_root(0.0, true_margin(p, q0, w0, g).value, 1.0, true_margin(p, q1, w1, g).value, f, 1e-9);
}

// Sine of the cross-track limit for hidden_pass from the cosine of an outer footprint angle and the track's
// deviation bound eps: sin(lambda + eps), or 2 (no limit) when lambda + eps reaches 90 deg.
inline double cross_track_sin_limit(double cos_lambda, double eps_rad) {
  const double lam = std::acos(std::clamp(cos_lambda, -1.0, 1.0)) + eps_rad + 1e-9;
  return lam >= pi / 2 ? 2.0 : std::sin(lam);
}

// Time of the sign change of a bracket inside (t0, t1). Between the two instants the margin is replaced by the
// cubic Hermite interpolant of its four values (error h^4 max|f''''| / 384 for a step h; C. de Boor, "A
// Practical Guide to Splines", 1978, ch. II). Its root is found by two Newton steps from the secant root
// (newton_from_secant), or, where those do not settle, by a safeguarded Newton iteration.
double hermite_root(double f0, double d0, double f1, double d1, double t0, double t1);

// The interpolant in power form in x = (t - t0) / h: c0 + c1 x + c2 x^2 + c3 x^3, with its value and slope.
struct HermiteCubic {
  double c0, c1, c2, c3;
  HermiteCubic(double f0, double d0, double f1, double d1, double h)
      : c0(f0), c1(h * d0), c2(3.0 * (f1 - f0) - h * (2.0 * d0 + d1)), c3(2.0 * (f0 - f1) + h * (d0 + d1)) {}
  double value(double x) const { return c0 + x * (c1 + x * (c2 + x * c3)); }
  double slope(double x) const { return c1 + x * (2.0 * c2 + x * 3.0 * c3); }
};

// The fast path of hermite_root: two plain Newton steps on the interpolant from the secant root. Returns x
// and sets the second step. It has no branches, so a batch of these runs as independent chains
// (CrossingBatch::solve).
inline double newton_from_secant(double f0, double d0, double f1, double d1, double h, double& step) {
  const HermiteCubic c(f0, d0, f1, d1, h);
  const double xa = f0 / (f0 - f1);
  const double xb = xa - c.value(xa) / c.slope(xa);
  step = c.value(xb) / c.slope(xb);
  return xb - step;
}

// The fast path's result is kept when the bracket is proper (f0 non-zero, signs differ), the result stays
// inside the step and the second step moved it by less than 1e-3 of the interval, so the error left is of the
// order of the square of that, about 1e-6 of the interval (quadratic convergence), under the interpolation
// residual.
inline bool fast_root_accepted(double f0, double f1, double x, double step) {
  return f0 != 0.0 && (f0 < 0.0) != (f1 < 0.0) && x > 0.0 && x < 1.0 && std::abs(step) < 1e-3;
}

double hermite_root(double f0, double d0, double f1, double d1, double t0, double t1) {
  const double h = t1 - t0;
  if (f0 == 0.0) return t0;
  if ((f0 < 0.0) == (f1 < 0.0)) return 0.5 * (t0 + t1);  // not bracketed by rounding: take the midpoint
  {
    double step = 0.0;
    const double x = newton_from_secant(f0, d0, f1, d1, h, step);
    if (fast_root_accepted(f0, f1, x, step)) return t0 + x * h;
  }
  const HermiteCubic c(f0, d0, f1, d1, h);
  double a = 0.0, bb = 1.0;
  const bool fb_negative = f1 < 0.0;
  double x = f0 / (f0 - f1);
  // Newton steps from the secant root; the bracket [a, bb] is kept, and a step leaving it is replaced by
  // bisection. Stops after a Newton step below 1e-4 of the interval, which leaves an error far under the
  // interpolation residual.
  for (int it = 0; it < 12; ++it) {
    const double v = c.value(x);
    const double dv = c.slope(x);
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

// A rise (+1) or set (-1) of one satellite seen from one point, at time t (s).
struct Event {
  double t;
  int delta;
  std::uint32_t point;  // index within the row (culled mode)
};

// The rises and sets found in one step (t0, t1], with their brackets in columns. solve() finds their times
// together: first the fast root of every bracket in one loop without branches, so that the division chains
// of different brackets overlap, then one by one the few brackets the fast root does not settle. Each time is
// the one hermite_root gives for its bracket, to the bit.
struct CrossingBatch {
  size_t n = 0;
  std::vector<double> f0, d0, f1, d1, x, step;
  std::vector<Event> event;  // event[k] belongs to bracket k; its time is set by solve()

  void clear() { n = 0; }
  void add(const Bracket& b, int delta, std::uint32_t point) {
    if (n == event.size()) grow();
    f0[n] = b.f0;
    d0[n] = b.d0;
    f1[n] = b.f1;
    d1[n] = b.d1;
    event[n] = {0.0, delta, point};
    ++n;
  }
  void solve(double t0, double t1) {
    const double h = t1 - t0;
    const double* __restrict a0 = f0.data();
    const double* __restrict r0 = d0.data();
    const double* __restrict a1 = f1.data();
    const double* __restrict r1 = d1.data();
    double* __restrict xs = x.data();
    double* __restrict st = step.data();
    for (size_t k = 0; k < n; ++k) xs[k] = newton_from_secant(a0[k], r0[k], a1[k], r1[k], h, st[k]);
    for (size_t k = 0; k < n; ++k)
      event[k].t = fast_root_accepted(a0[k], a1[k], xs[k], st[k]) ? t0 + xs[k] * h
                                                                  : hermite_root(a0[k], r0[k], a1[k], r1[k], t0, t1);
  }

 private:
  void grow() {
    const size_t m = std::max<size_t>(256, 2 * event.size());
    for (std::vector<double>* v : {&f0, &d0, &f1, &d1, &x, &step}) v->resize(m);
    event.resize(m);
  }
};

// Grid rows for footprint culling: points of one geocentric latitude, sorted by longitude.
struct Row {
  double psi = 0.0, sin_psi = 0.0, cos_psi = 0.0;
  std::vector<double> lon;  // rad, ascending, in [-pi, pi)
  std::vector<int> point;
  FootprintRow bounds;
  double guess_scale = 0.0;  // (n - 1) / (last - first longitude): index per radian of the linear guess
  // Evenly spaced round the whole circle (global and band grids): longitude k is lon0 + k / per_rad within
  // 1e-9 rad, and n / per_rad is 2 pi within 1e-9 rad.
  bool periodic = false;
  double lon0 = 0.0, per_rad = 0.0;
};

std::vector<Row> build_rows(const std::vector<PointGeo>& geo, double min_elevation_rad,
                            std::optional<double> nadir_half_angle_rad) {
  std::vector<int> order(geo.size());
  std::iota(order.begin(), order.end(), 0);
  std::vector<double> psi(geo.size()), lon(geo.size());
  for (size_t i = 0; i < geo.size(); ++i) {
    psi[i] = std::asin(std::clamp(geo[i].uz, -1.0, 1.0));
    lon[i] = std::atan2(geo[i].uy, geo[i].ux);
    if (lon[i] >= pi) lon[i] -= two_pi;
  }
  std::sort(order.begin(), order.end(), [&](int a, int b) { return psi[a] != psi[b] ? psi[a] < psi[b] : a < b; });
  // Points of one grid latitude differ in computed geocentric latitude by rounding only; a row takes them all
  // (within 1e-10 rad, far inside the footprint margins) and uses its first latitude.
  std::vector<Row> rows;
  for (size_t k = 0; k < order.size();) {
    size_t e = k + 1;
    while (e < order.size() && psi[static_cast<size_t>(order[e])] - psi[static_cast<size_t>(order[k])] <= 1e-10) ++e;
    std::sort(order.begin() + static_cast<long>(k), order.begin() + static_cast<long>(e),
              [&](int a, int b) { return lon[a] != lon[b] ? lon[a] < lon[b] : a < b; });
    Row r;
    r.psi = psi[static_cast<size_t>(order[k])];
    r.sin_psi = std::sin(r.psi);
    r.cos_psi = std::cos(r.psi);
    for (size_t m = k; m < e; ++m) {
      r.lon.push_back(lon[static_cast<size_t>(order[m])]);
      r.point.push_back(order[m]);
    }
    rows.push_back(std::move(r));
    k = e;
  }
  for (Row& r : rows) {
    double rmin = 1e300, rmax = 0.0, defl = 0.0;
    for (int i : r.point) {
      const PointGeo& g = geo[static_cast<size_t>(i)];
      const double len = std::sqrt(g.rx * g.rx + g.ry * g.ry + g.rz * g.rz);
      rmin = std::min(rmin, len);
      rmax = std::max(rmax, len);
      const Eigen::Vector3d n(g.nx, g.ny, g.nz), u(g.ux, g.uy, g.uz);
      defl = std::max(defl, std::atan2(n.cross(u).norm(), n.dot(u)));
    }
    // Pads: 1 m in radius, 1e-9 rad in deflection, against rounding.
    if (r.lon.size() > 1 && r.lon.back() > r.lon.front())
      r.guess_scale = static_cast<double>(r.lon.size() - 1) / (r.lon.back() - r.lon.front());
    if (r.lon.size() > 1) {
      const double spacing = (r.lon.back() - r.lon.front()) / static_cast<double>(r.lon.size() - 1);
      bool even = std::abs(spacing * static_cast<double>(r.lon.size()) - two_pi) < 1e-9;
      for (size_t m = 0; m < r.lon.size() && even; ++m)
        even = std::abs(r.lon[m] - (r.lon.front() + static_cast<double>(m) * spacing)) < 1e-9;
      if (even) {
        r.periodic = true;
        r.lon0 = r.lon.front();
        r.per_rad = 1.0 / spacing;
      }
    }
    r.bounds = make_footprint_row(rmin - 1e-3, rmax + 1e-3, defl + 1e-9, min_elevation_rad, nadir_half_angle_rad);
  }
  return rows;
}

// std::lower_bound / std::upper_bound on a row's ascending longitudes, started from the linear guess (exact
// for the evenly spaced rows of global, band and region grids) and corrected by stepping, so the result is the
// same as the binary search for any row.
inline long row_guess(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  if (n < 2) return 0;
  const double f = (x - row.lon.front()) * row.guess_scale;
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

template <class F>
void for_row(const Row& row, F&& f) {
  for (long k = 0, n = static_cast<long>(row.lon.size()); k < n; ++k) f(k);
}

// On a periodic row, points are counted round the circle without end: index k stands for point k mod n.
// The indices [first, last) of the points on the arc from a to b (any reals, a <= b), widened by 1e-6 of a
// spacing at each end, which covers the 1e-9 rad the points may be off the even spacing. The callers need
// only a superset of the points (a point visited needlessly costs one exact test and changes no result), but
// never a point twice.
struct IndexSpan {
  long first, last;
};
// Floor and ceiling of x for |x| < 2^62 (truncation toward zero, then one step), without a library call.
inline long floor_long(double x) {
  const long t = static_cast<long>(x);
  return t - (static_cast<double>(t) > x);
}
inline long ceil_long(double x) {
  const long t = static_cast<long>(x);
  return t + (static_cast<double>(t) < x);
}
inline IndexSpan periodic_span(const Row& row, double a, double b) {
  return {ceil_long((a - row.lon0) * row.per_rad - 1e-6), floor_long((b - row.lon0) * row.per_rad + 1e-6) + 1};
}
// Call f(i) once for each point of the span (the whole row once when the span is n or longer).
template <class F>
void for_span(const Row& row, long first, long last, F&& f) {
  const long n = static_cast<long>(row.lon.size());
  if (last - first >= n) return for_row(row, f);
  if (last <= first) return;
  long k0 = first % n;
  if (k0 < 0) k0 += n;
  const long end = k0 + (last - first);
  for (long k = k0, e = std::min(n, end); k < e; ++k) f(k);
  for (long k = 0; k < end - n; ++k) f(k);
}

// Call f(i) for the row points whose longitude lies on the arc from a to b (rad, b - a < 2 pi, any real a),
// with each end open or closed (on a periodic row, a superset: the span of both ends closed and widened).
// Each point is visited at most once.
template <class F>
void for_arc(const Row& row, double a, double b, bool open_a, bool open_b, F&& f) {
  if (row.periodic) {
    const IndexSpan sp = periodic_span(row, a, b);
    return for_span(row, sp.first, sp.last, f);
  }
  const double shift = two_pi * std::floor((a + pi) * (1.0 / two_pi));
  a -= shift;  // now in [-pi, pi)
  b -= shift;
  const auto lo = [&](double x) { return open_a ? row_upper_bound(row, x) : row_lower_bound(row, x); };
  const auto hi = [&](double x) { return open_b ? row_lower_bound(row, x) : row_upper_bound(row, x); };
  const long n = static_cast<long>(row.lon.size());
  if (b < pi) {
    for (long k = lo(a), e = hi(b); k < e; ++k) f(k);
  } else {
    for (long k = lo(a); k < n; ++k) f(k);
    for (long k = 0, e = hi(b - two_pi); k < e; ++k) f(k);
  }
}

// Call f(i) for the points on the arcs [a1, b1) and (a2, b2], with a1 <= b1 <= a2 <= b2 and b2 - a1 < 2 pi
// (on a periodic row, a superset), each point at most once.
template <class F>
void for_two_arcs(const Row& row, double a1, double b1, double a2, double b2, F&& f) {
  if (!row.periodic) {
    for_arc(row, a1, b1, false, true, f);
    for_arc(row, a2, b2, true, false, f);
    return;
  }
  const long n = static_cast<long>(row.lon.size());
  const IndexSpan s1 = periodic_span(row, a1, b1);
  IndexSpan s2 = periodic_span(row, a2, b2);
  if (s1.last - s1.first >= n) return for_row(row, f);
  if (s1.last >= s2.first) return for_span(row, s1.first, std::max(s1.last, s2.last), f);  // the widened spans meet
  s2.last = std::min(s2.last, s1.first + n);  // nor may the second come round onto the first
  for_span(row, s1.first, s1.last, f);
  for_span(row, s2.first, s2.last, f);
}

// Call f(i) for the row points within half-width h (rad, >= 0; >= pi: the whole row) of longitude lon.
template <class F>
void for_window(const Row& row, double lon, double h, F&& f) {
  if (h >= pi) {
    for_row(row, f);
  } else {
    for_arc(row, lon - h, lon + h, false, false, f);
  }
}

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

inline bool event_before(const Event& x, const Event& y) {
  // Rises before sets at equal times, so no zero-length gap is made.
  return x.t != y.t ? x.t < y.t : x.delta > y.delta;
}

// The timeline of one ground point: satellites in view now, and the integrals and gaps so far.
struct PointState {
  std::vector<int> vis;  // exhaustive mode: the satellites in view at the last instant, ascending
  std::vector<float> gaps;
  double last_t = 0.0;   // the integrals below are taken up to this time
  double gap_start = 0.0;
  bool in_gap = false;
  int count = 0;
  int max_in_view = 0;
  double count_time = 0.0;
};

// Per-point integrals: time with n in view (the time with at least k in view, k = 1..K, is summed from it at
// the end; K is at most 16, under the last bin).
struct PointSums {
  double* hist;
};

inline void integrate(PointState& ps, const PointSums& sums, double t) {
  const double dt = t - ps.last_t;
  if (dt <= 0.0) return;
  ps.count_time += ps.count * dt;
  sums.hist[std::min(ps.count, in_view_bins - 1)] += dt;
  ps.last_t = t;
}

inline void start_timeline(PointState& ps, int count) {
  ps.count = count;
  ps.max_in_view = count;
  ps.last_t = 0.0;
  if (count == 0) {
    ps.in_gap = true;
    ps.gap_start = 0.0;
  }
}

// Apply the events of one step (t0, t1], sorted by event_before. Event times are clamped into the step and
// kept in order.
inline void apply_events(PointState& ps, const PointSums& sums, const Event* begin, const Event* end, double t0,
                         double t1) {
  double cur = t0;
  for (const Event* e = begin; e != end; ++e) {
    const double te = std::clamp(e->t, cur, t1);
    integrate(ps, sums, te);
    cur = te;
    const int before = ps.count;
    ps.count += e->delta;
    ps.max_in_view = std::max(ps.max_in_view, ps.count);
    if (before == 0 && ps.count == 1 && ps.in_gap) {
      if (te - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(te - ps.gap_start));
      ps.in_gap = false;
    } else if (before == 1 && ps.count == 0) {
      ps.in_gap = true;
      ps.gap_start = te;
    }
  }
}

// Sort a short run of events (a point's events in one step; usually one to three) by insertion.
inline void sort_short(Event* begin, Event* end) {
  for (Event* i = begin + 1; i < end; ++i) {
    const Event v = *i;
    Event* j = i;
    while (j > begin && event_before(v, *(j - 1))) {
      *j = *(j - 1);
      --j;
    }
    *j = v;
  }
}

// The K nearest satellites of a point, exactly, among all satellites at one instant. The central angle to a
// satellite is at least the difference of the geocentric latitudes, so its cosine is at most
// cos psi_s cos psi_p + sin psi_s sin psi_p (spherical law of cosines). The satellites are sorted by latitude,
// so the scan runs outward from the point's latitude and stops on each side once that bound is below the
// k-th best cosine found (less 1e-12 for rounding). The top-K values do not depend on the scan order, so
// this equals the full scan. `mid` is where the point's latitude falls in the sorted list (the scan stays exact
// if it is off by satellites within rounding of that latitude). Returns the number of satellites looked at.
long nearest_by_latitude(const PointGeo& pg, const PositionBuffer& buf, long step, int K, double* tp, int* ts, int mid) {
  std::fill(tp, tp + K, -2.0);
  std::fill(ts, ts + K, -1);
  const int T = buf.sats;
  const size_t base = buf.at(step, 0);
  const SatPos* sp = &buf.pos[base];
  const int* ord = &buf.by_lat[base];
  const double* zs = &buf.by_lat_sin[base];
  const SatAux* xs = &buf.by_lat_aux[base];
  const double zp = std::clamp(pg.uz, -1.0, 1.0), cp = std::sqrt(1.0 - zp * zp);
  long looked = 0;
  for (int k = mid; k < T; ++k) {
    if (xs[k].cos_psi * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
    insert_top_sat(tp, ts, K, cos_to(pg, sp[ord[k]]), ord[k]);
    ++looked;
  }
  for (int k = mid - 1; k >= 0; --k) {
    if (xs[k].cos_psi * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
    insert_top_sat(tp, ts, K, cos_to(pg, sp[ord[k]]), ord[k]);
    ++looked;
  }
  return looked;
}

// Range [lo, hi) of the latitude-sorted satellites at one instant with geocentric latitude within `half`
// (rad) of psi.
std::pair<int, int> latitude_range(const PositionBuffer& buf, long step, double psi, double half) {
  const size_t base = buf.at(step, 0);
  const double* zs = &buf.by_lat_sin[base];
  const double lo = psi - half <= -pi / 2 ? -2.0 : std::sin(psi - half);
  const double hi = psi + half >= pi / 2 ? 2.0 : std::sin(psi + half);
  const int a = static_cast<int>(std::lower_bound(zs, zs + buf.sats, lo) - zs);
  const int b = static_cast<int>(std::upper_bound(zs, zs + buf.sats, hi) - zs);
  return {a, b};
}

// Work counters and the area share covered at each instant of a chunk (integer weight units: in culled mode
// the change since the previous instant, in exhaustive mode the value).
struct Partial {
  std::vector<std::int64_t> covered;  // [local step * K + k-1]
  std::int64_t pair_tests = 0;      // visibility tests
  std::int64_t distance_tests = 0;  // central-angle evaluations for the k-th nearest satellite
  std::int64_t fallbacks = 0;
  std::int64_t hidden_passes = 0;   // passes found wholly between two instants
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

// Everything a row sweep or a point scan reads, and the per-point results it writes.
struct Sweep {
  const PositionBuffer& buf;
  const Sampling& smp;
  const Geometry& gm;
  const std::vector<PointGeo>& geo;
  const std::vector<std::int64_t>& weight_q;
  int K = 1;
  int T = 0;
  double search_rad = 0.0;     // k-th nearest search radius
  double search_cos = 0.0;     // its cosine: when the k-th best found is at least this, it is exact
  std::vector<PointState>& state;
  std::vector<double>& worst_cos;
  std::vector<double>& hist;
  std::vector<int>& nearest;  // culled mode: the K nearest satellites when the point was last searched (-1: never)
  double track_eps_rad = 0.0;               // deviation bound of a ground direction from its chord over a step
  const std::vector<double>& sat_r_apo_km;  // largest orbit radius of each satellite
  const std::vector<double>& sat_sin_limit; // exhaustive mode: cross-track limit of each satellite, any point
  PointSums sums(size_t p) const {
    return {&hist[p * in_view_bins]};
  }
};

inline void add_covered(Partial& acc, size_t local_step, int K, int before, int after, std::int64_t wq) {
  for (int k = 0; k < K; ++k) {
    const bool a = after > k, b = before > k;
    if (a != b) acc.covered[local_step * static_cast<size_t>(K) + static_cast<size_t>(k)] += a ? wq : -wq;
  }
}

// The inner half-width of each satellite's window on one row at one instant, keyed by instant * rows + row
// (no_window when it was not needed there).
constexpr double no_window = -1e300;
struct WindowCache {
  std::vector<long> key;
  std::vector<double> in;
};

// Scratch of one worker thread in culled mode, kept across rows and chunks.
struct RowScratch {
  CrossingBatch crossings;
  std::vector<Event> sorted;
  std::vector<std::uint32_t> start;
  std::vector<int> count;
  std::vector<double> top;
  std::vector<int> top_sat;
  std::vector<char> open;
  WindowCache cache;
  std::vector<Event> hidden;  // rises and sets of passes found between two instants, this step
};

// Culled mode: row number r of `rows_total` over the instants [c0, c1) of the buffer.
void sweep_row(const Sweep& sw, const Row& row, long r, long rows_total, long c0, long c1, Partial& acc,
               RowScratch& scratch) {
  const PositionBuffer& buf = sw.buf;
  CrossingBatch& crossings = scratch.crossings;
  std::vector<Event>& sorted = scratch.sorted;
  std::vector<std::uint32_t>& start = scratch.start;
  std::vector<int>& count = scratch.count;
  std::vector<double>& top = scratch.top;
  std::vector<int>& top_sat = scratch.top_sat;
  std::vector<char>& open = scratch.open;
  WindowCache& cache = scratch.cache;
  // Footprint cosines of the last orbit radius seen on this row, made good for radii within 1 mm of it (the
  // outer cosine of the largest radius, the inner of the smallest: both bounds shrink the safe side only,
  // since both angles grow with the radius). Circular shells then compute them once per row.
  constexpr double radius_tolerance_km = 1e-6;
  double r_seen = -1.0;
  FootprintCosines f_seen;
  const auto cosines = [&](double r_km) {
    if (std::abs(r_km - r_seen) > radius_tolerance_km) {
      r_seen = r_km;
      f_seen = {footprint_cosines(row.bounds, r_km + radius_tolerance_km).outer,
                footprint_cosines(row.bounds, r_km - radius_tolerance_km).inner};
    }
    return f_seen;
  };
  // The same at a satellite's largest orbit radius (its outer cosine holds over a whole step), with the sine of
  // the hidden-pass cross-track limit.
  double r_apo_seen = -1.0, cos_apo = 1.0, sin_limit_apo = 2.0;
  const auto apogee_outer = [&](double r_km) {
    if (r_km != r_apo_seen) {
      r_apo_seen = r_km;
      cos_apo = footprint_cosines(row.bounds, r_km + radius_tolerance_km).outer;
      sin_limit_apo = cross_track_sin_limit(cos_apo, sw.track_eps_rad);
    }
  };
  if (cache.key.size() != static_cast<size_t>(sw.T)) {
    cache.key.assign(static_cast<size_t>(sw.T), -1);
    cache.in.assign(static_cast<size_t>(sw.T), 0.0);
  }
  const size_t n = row.point.size();
  const int K = sw.K;
  for (long step = c0; step < c1; ++step) {
    const SatPos* sp1 = &buf.pos[buf.at(step, 0)];
    const SatAux* sx1 = &buf.by_lat_aux[buf.at(step, 0)];
    const int* ord = &buf.by_lat[buf.at(step, 0)];
    const size_t ls = static_cast<size_t>(step - c0);
    if (step == 0) {
      // Satellites in view at the first instant, inside each satellite's outer window.
      count.assign(n, 0);
      const auto [a, b] = latitude_range(buf, step, row.psi, buf.reach_rad[buf.local(step)]);
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x = sx1[k];
        const double h = row_half_width(row.sin_psi, row.cos_psi, x.sin_psi, x.cos_psi,
                                        cosines(x.r_km).outer, true);
        if (h < 0.0) continue;
        const auto test = [&](long i) {
          ++acc.pair_tests;
          if (visible(sw.geo[static_cast<size_t>(row.point[static_cast<size_t>(i)])], buf, buf.at(step, s), sw.gm))
            ++count[static_cast<size_t>(i)];
        };
        for_window(row, x.lon, h, test);
      }
      for (size_t i = 0; i < n; ++i) {
        const size_t p = static_cast<size_t>(row.point[i]);
        start_timeline(sw.state[p], count[i]);
        add_covered(acc, ls, K, 0, count[i], sw.weight_q[p]);
      }
    } else {
      // Rises and sets inside (t_{j-1}, t_j].
      crossings.clear();
      scratch.hidden.clear();
      const double t0 = sw.smp.time(step - 1), t1 = sw.smp.time(step);
      const SatAux* sx0 = &buf.by_lat_prev[buf.at(step, 0)];
      // Satellites whose swept footprint can reach the row: the widest outer angle, widened as in
      // swept_footprint_cos for the largest chord of a step.
      const double reach = std::max(buf.swept_reach_rad, buf.reach_rad[buf.local(step - 1)]) + buf.moved_rad[buf.local(step)];
      const auto [a, b] = latitude_range(buf, step, row.psi, reach);
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x1 = sx1[k];
        const SatAux& x0 = sx0[k];
        const FootprintCosines f1 = cosines(x1.r_km);
        const FootprintCosines f0 = cosines(x0.r_km);
        // The inner window of t_{j-1}, from this row's previous instant when it was computed there.
        const size_t su = static_cast<size_t>(s);
        const bool cached = cache.key[su] == (step - 1) * rows_total + r;
        const double cache_in0 = cached ? cache.in[su] : no_window;
        cache.key[su] = step * rows_total + r;
        cache.in[su] = no_window;
        // The windows swept over the step (hidden passes): the outer angle at the satellite's largest radius,
        // widened for its motion between the instants. They hold the outer windows of both instants.
        apogee_outer(sw.sat_r_apo_km[su]);
        const SatPos& u0 = buf.pos[buf.at(step - 1, s)];
        const SatPos& u1 = sp1[s];
        const double c_w = swept_footprint_cos(cos_apo, sw.track_eps_rad, u0.ux * u1.ux + u0.uy * u1.uy + u0.uz * u1.uz);
        const double sin_limit = sin_limit_apo;
        const double h1w = row_half_width(row.sin_psi, row.cos_psi, x1.sin_psi, x1.cos_psi, c_w, true);
        const double h0w = row_half_width(row.sin_psi, row.cos_psi, x0.sin_psi, x0.cos_psi, c_w, true);
        if (h1w < 0.0 && h0w < 0.0) continue;
        // Longitudes as offsets from the satellite's at t_j; d0 is its offset at t_{j-1}.
        double d0 = x0.lon - x1.lon;
        if (d0 > pi) d0 -= two_pi;
        if (d0 < -pi) d0 += two_pi;
        constexpr double whole = 4.0 * pi;  // a window that holds the whole row
        double ulo = 1e300, uhi = -1e300;
        if (h1w >= 0.0) {
          ulo = h1w >= pi ? -whole : -h1w;
          uhi = h1w >= pi ? whole : h1w;
        }
        if (h0w >= 0.0) {
          ulo = std::min(ulo, h0w >= pi ? -whole : d0 - h0w);
          uhi = std::max(uhi, h0w >= pi ? whole : d0 + h0w);
        }
        bool inner = false;
        double ilo = 0.0, ihi = 0.0;
        if (h1w >= 0.0 && h0w >= 0.0 && f1.inner <= 1.0 && f0.inner <= 1.0) {
          const double h1i = row_half_width(row.sin_psi, row.cos_psi, x1.sin_psi, x1.cos_psi, f1.inner, false);
          cache.in[su] = h1i;
          const double h0i = h1i < 0.0 ? -1.0
                             : cache_in0 != no_window
                                 ? cache_in0
                                 : row_half_width(row.sin_psi, row.cos_psi, x0.sin_psi, x0.cos_psi, f0.inner, false);
          if (h1i >= 0.0 && h0i >= 0.0) {
            ilo = std::max(h1i >= pi ? -whole : -h1i, h0i >= pi ? -whole : d0 - h0i);
            ihi = std::min(h1i >= pi ? whole : h1i, h0i >= pi ? whole : d0 + h0i);
            inner = ilo <= ihi;
          }
        }
        if (inner && ihi - ilo >= two_pi) continue;  // the whole row sees the satellite at both instants
        const size_t i1 = buf.at(step, s), i0 = buf.at(step - 1, s);
        const auto add_hidden = [&](const PointGeo& pg, long i) {
          if (const auto pass = hidden_pass(pg, buf, step, s, sw.gm, sin_limit, t0, t1)) {
            scratch.hidden.push_back({pass->rise_s, +1, static_cast<std::uint32_t>(i)});
            scratch.hidden.push_back({pass->set_s, -1, static_cast<std::uint32_t>(i)});
            ++acc.hidden_passes;
          }
        };
        const auto add_on_path = [&](const PointGeo& pg, int delta, long i) {
          scratch.hidden.push_back({path_root(pg, buf, step, s, sw.gm, t0, t1), delta, static_cast<std::uint32_t>(i)});
        };
        const auto test = [&](long i) {
          const size_t p = static_cast<size_t>(row.point[static_cast<size_t>(i)]);
          const PointGeo& pg = sw.geo[p];
          acc.pair_tests += 2;
          if (sw.gm.polynomial) {
            // The visibility test and the crossing share the margin's value: its sign is visible()'s, and its
            // numbers are those crossing_bracket computes, so exhaustive mode finds the same times.
            const PolynomialValue e1 = polynomial_value(pg, buf.pos[i1], sw.gm);
            const PolynomialValue e0 = polynomial_value(pg, buf.pos[i0], sw.gm);
            const bool v1 = e1.value >= 0.0, v0 = e0.value >= 0.0;
            if (v1 != v0 && sw.gm.roots_on_path)
              add_on_path(pg, v1 ? 1 : -1, i);
            else if (v1 != v0)
              crossings.add({e0.value, polynomial_rate(pg, e0, buf.vel[i0], sw.gm), e1.value,
                             polynomial_rate(pg, e1, buf.vel[i1], sw.gm)},
                            v1 ? 1 : -1, static_cast<std::uint32_t>(i));
            else if (!v1)
              add_hidden(pg, i);
            return;
          }
          const bool v1 = visible(pg, buf, i1, sw.gm), v0 = visible(pg, buf, i0, sw.gm);
          if (v1 != v0 && sw.gm.roots_on_path)
            add_on_path(pg, v1 ? 1 : -1, i);
          else if (v1 != v0)
            crossings.add(crossing_bracket(pg, buf, step, s, sw.gm), v1 ? 1 : -1, static_cast<std::uint32_t>(i));
          else if (!v1)
            add_hidden(pg, i);
        };
        if (uhi - ulo >= two_pi) {
          if (inner) {
            for_arc(row, x1.lon + ihi, x1.lon + ilo + two_pi, true, true, test);
          } else {
            for_row(row, test);
          }
        } else if (inner) {
          for_two_arcs(row, x1.lon + ulo, x1.lon + ilo, x1.lon + ihi, x1.lon + uhi, test);
        } else {
          for_arc(row, x1.lon + ulo, x1.lon + uhi, false, false, test);
        }
      }
      if (crossings.n > 0 || !scratch.hidden.empty()) {
        crossings.solve(t0, t1);
        // Group the events by point (a counting sort, stable), then order each point's few events in time.
        const Event* events = crossings.event.data();
        const Event* events_end = events + crossings.n;
        const Event* extra = scratch.hidden.data();
        const Event* extra_end = extra + scratch.hidden.size();
        start.assign(n + 1, 0);
        for (const Event* e = events; e != events_end; ++e) ++start[e->point + 1];
        for (const Event* e = extra; e != extra_end; ++e) ++start[e->point + 1];
        for (size_t i = 0; i < n; ++i) start[i + 1] += start[i];
        sorted.resize(crossings.n + scratch.hidden.size());
        for (const Event* e = events; e != events_end; ++e) sorted[start[e->point]++] = *e;
        for (const Event* e = extra; e != extra_end; ++e) sorted[start[e->point]++] = *e;
        // start[i] is now the end of point i's run.
        std::uint32_t begin = 0;
        for (size_t i = 0; i < n; ++i) {
          const std::uint32_t end = start[i];
          if (end == begin) continue;
          Event* eb = sorted.data() + begin;
          Event* ee = sorted.data() + end;
          sort_short(eb, ee);
          const size_t p = static_cast<size_t>(row.point[i]);
          PointState& ps = sw.state[p];
          const int before = ps.count;
          apply_events(ps, sw.sums(p), eb, ee, t0, t1);
          add_covered(acc, ls, K, before, ps.count, sw.weight_q[p]);
          begin = end;
        }
      }
    }
    // The K nearest satellites of each point, for the required radius. Only the worst (smallest) k-th cosine
    // over time is kept, so an instant matters only if it could lower it. First the satellites that were the
    // K nearest when the point was last searched: the k-th largest of their cosines now is a lower bound of
    // the k-th nearest's, so when it is at least the worst so far for every k, the instant cannot lower it
    // and the point is settled. The other points look inside the search cap, then scan exactly where fewer
    // than K lie there, and remember the K found.
    top.assign(n * static_cast<size_t>(K), -2.0);
    top_sat.assign(n * static_cast<size_t>(K), -1);
    open.assign(n, 1);
    size_t open_points = n;
    for (size_t i = 0; i < n; ++i) {
      const size_t p = static_cast<size_t>(row.point[i]);
      const int* nb = &sw.nearest[p * static_cast<size_t>(K)];
      if (nb[0] < 0) continue;
      double lower[max_fold_limit];
      std::fill(lower, lower + K, -2.0);
      for (int k = 0; k < K; ++k) insert_top(lower, K, cos_to(sw.geo[p], sp1[nb[k]]));
      acc.distance_tests += K;
      const double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
      bool settled = true;
      for (int k = 0; k < K; ++k) settled = settled && lower[k] >= wc[k];
      if (settled) {
        open[i] = 0;
        --open_points;
      }
    }
    if (open_points == 0) continue;
    {
      const auto [a, b] = latitude_range(buf, step, row.psi, sw.search_rad + 1e-9);
      const double c = std::cos(std::min(pi, sw.search_rad + 1e-9));
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x = sx1[k];
        const double h = row_half_width(row.sin_psi, row.cos_psi, x.sin_psi, x.cos_psi, c, true);
        if (h < 0.0) continue;
        const SatPos& q = sp1[s];
        const auto near = [&](long i) {
          if (!open[static_cast<size_t>(i)]) return;
          ++acc.distance_tests;
          const size_t o = static_cast<size_t>(i) * static_cast<size_t>(K);
          insert_top_sat(&top[o], &top_sat[o], K, cos_to(sw.geo[static_cast<size_t>(row.point[static_cast<size_t>(i)])], q), s);
        };
        for_window(row, x.lon, h, near);
      }
    }
    int mid = -1;
    for (size_t i = 0; i < n; ++i) {
      if (!open[i]) continue;
      const size_t p = static_cast<size_t>(row.point[i]);
      double* tp = &top[i * static_cast<size_t>(K)];
      int* ts = &top_sat[i * static_cast<size_t>(K)];
      if (tp[K - 1] < sw.search_cos) {
        ++acc.fallbacks;
        if (mid < 0) {
          const double* zs = &buf.by_lat_sin[buf.at(step, 0)];
          mid = static_cast<int>(std::lower_bound(zs, zs + sw.T, row.sin_psi) - zs);
        }
        acc.distance_tests += nearest_by_latitude(sw.geo[p], buf, step, K, tp, ts, mid);
      }
      std::copy(ts, ts + K, &sw.nearest[p * static_cast<size_t>(K)]);
      double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
      for (int k = 0; k < K; ++k) wc[k] = std::min(wc[k], tp[k]);
    }
  }
}

// Exhaustive mode: one point over the instants [c0, c1) of the buffer, every satellite at every instant.
void scan_point(const Sweep& sw, size_t p, long c0, long c1, Partial& acc, std::vector<int>& fresh,
                CrossingBatch& crossings, std::vector<double>& top, std::vector<Event>& hidden) {
  const PositionBuffer& buf = sw.buf;
  const PointGeo& pg = sw.geo[p];
  PointState& ps = sw.state[p];
  const PointSums sums = sw.sums(p);
  const int K = sw.K;
  double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
  for (long step = c0; step < c1; ++step) {
    fresh.clear();
    std::fill(top.begin(), top.end(), -2.0);
    double* tp = top.data();
    const size_t base = buf.at(step, 0);
    const SatPos* sp = &buf.pos[base];
    for (int s = 0; s < sw.T; ++s) {
      if (visible(pg, buf, base + static_cast<size_t>(s), sw.gm)) fresh.push_back(s);
      insert_top(tp, K, cos_to(pg, sp[s]));
    }
    acc.pair_tests += sw.T;
    acc.distance_tests += sw.T;
    for (int k = 0; k < K; ++k) wc[k] = std::min(wc[k], tp[k]);
    if (step == 0) {
      start_timeline(ps, static_cast<int>(fresh.size()));
    } else {
      // Rises (in fresh, not in vis) and sets (in vis, not in fresh) inside (t_{j-1}, t_j].
      crossings.clear();
      hidden.clear();
      const double t0 = sw.smp.time(step - 1), t1 = sw.smp.time(step);
      const auto add = [&](int s, int delta) {
        if (sw.gm.roots_on_path)
          hidden.push_back({path_root(pg, buf, step, s, sw.gm, t0, t1), delta, 0});
        else
          crossings.add(crossing_bracket(pg, buf, step, s, sw.gm), delta, 0);
      };
      size_t a = 0, b = 0;
      while (a < ps.vis.size() || b < fresh.size()) {
        if (b == fresh.size() || (a < ps.vis.size() && ps.vis[a] < fresh[b])) {
          add(ps.vis[a], -1);
          ++a;
        } else if (a == ps.vis.size() || fresh[b] < ps.vis[a]) {
          add(fresh[b], +1);
          ++b;
        } else {
          ++a;
          ++b;
        }
      }
      crossings.solve(t0, t1);
      // Passes wholly between the instants: every satellite out of view at both.
      hidden.insert(hidden.end(), crossings.event.begin(), crossings.event.begin() + static_cast<long>(crossings.n));
      {
        size_t a0 = 0, b0 = 0;
        for (int s = 0; s < sw.T; ++s) {
          while (a0 < ps.vis.size() && ps.vis[a0] < s) ++a0;
          while (b0 < fresh.size() && fresh[b0] < s) ++b0;
          if ((a0 < ps.vis.size() && ps.vis[a0] == s) || (b0 < fresh.size() && fresh[b0] == s)) continue;
          if (const auto pass = hidden_pass(pg, buf, step, s, sw.gm, sw.sat_sin_limit[static_cast<size_t>(s)], t0, t1)) {
            hidden.push_back({pass->rise_s, +1, 0});
            hidden.push_back({pass->set_s, -1, 0});
            ++acc.hidden_passes;
          }
        }
      }
      Event* events = hidden.data();
      std::sort(events, events + hidden.size(), event_before);
      apply_events(ps, sums, events, events + hidden.size(), t0, t1);
      assert(ps.count == static_cast<int>(fresh.size()));
    }
    add_covered(acc, static_cast<size_t>(step - c0), K, 0, ps.count, sw.weight_q[p]);
    ps.vis.swap(fresh);
  }
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
    if (*o.max_fold < 1 || *o.max_fold > max_fold_limit) throw InputError(fmt::format("--fold {}: expected 1 to {}", *o.max_fold, max_fold_limit));
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
  const double chunk = mode == CoverageMode::exhaustive ? 0.0 : culled_scratch_bytes + 64.0 * 4.0 * (static_cast<double>(points) + 1.0);
  e.memory_bytes = static_cast<double>(points) * per_point * 2.0 + chunk + 70.0 * st.satellites * 112.0;  // satellite buffers, roughly
  e.seconds_2_cores = (3e-9 * e.pair_tests + 60e-9 * e.point_steps) / 2.0;
  return e;
}

}  // namespace

namespace {

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

}  // namespace

CoverageWorkEstimate estimate_coverage_work(const Design& design, const CoverageOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options);
  const CoverageWorkEstimate before = estimate_before_grid(design, st, options.mode);
  if (st.spec.grid != GridKind::region || over_limits(before, options)) return before;
  const Grid grid = build_grid(st.spec, design.earth);
  return estimate(design, st, static_cast<long>(grid.points.size()), options.mode);
}

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
  const Sweep sw{buf, smp, gm, geo, weight_q, K, T, search_rad, std::cos(search_rad), state, worst_cos, hist, nearest,
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
