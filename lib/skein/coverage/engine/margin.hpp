#pragma once
// The visibility margin of a (point, satellite) pair and its time rate, in the forms the evaluator uses.
#include <algorithm>
#include <cmath>

#include "skein/coverage/engine/crossings.hpp"
#include "skein/coverage/engine/geometry.hpp"
#include "skein/coverage/engine/position_buffer.hpp"
#include "skein/coverage/engine/hidden_pass.hpp"

namespace skein::coverage_engine {

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


// The bracket of (p, s) over (t_{j-1}, t_j]: the margin and its rate evaluated exactly at the two instants
// (from the buffered Earth-fixed positions and velocities, no new orbit evaluation).
inline Bracket crossing_bracket(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g) {
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


}  // namespace skein::coverage_engine
