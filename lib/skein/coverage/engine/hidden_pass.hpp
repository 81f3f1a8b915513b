#pragma once
// Passes that begin and end between two sample instants ("hidden passes"). The coverage evaluator tests
// visibility at the sample instants and refines each change of state to its time; a pass shorter than the
// step can fall wholly between two instants, with the satellite out of view at both. A narrow payload cone
// at the default step loses most of its passes that way. This file holds what finds them:
//  - the bound on how far a satellite's Earth-fixed ground direction can stray from the great-circle arc
//    between its directions at the two instants (so a footprint swept over the step lies inside a window
//    that can be computed from the two instants alone);
//  - the satellite's path between the instants as the cubic Hermite interpolant of its buffered Earth-fixed
//    positions and velocities;
//  - the search: for a pair out of view at both instants whose margin rises at the first and falls at the
//    second, the margin's maximum between them, and when it is in view there, the rise and the set.
// Pure functions; angles in radians, times in seconds, lengths in km.
#include <algorithm>
#include <cmath>
#include <optional>

namespace skein::coverage_engine {

// Bound on the geodesic deviation of a satellite's Earth-fixed ground direction u(t) from the great-circle
// arc joining u(t0) and u(t1), for a step of h seconds.
//
// Derivation (in the Earth-fixed frame, rotating at w_z about the polar axis relative to the frame in which
// the orbit plane is fixed: the Earth's rate plus the largest node drift rate): u' = w - W x u, with w the
// in-plane rate of the inertial direction (|w| = dnu/dt, the true-anomaly rate plus the perigee drift). The
// component of u'' across the track is bounded by w_z |u'| (the rotation of u') plus |d2nu/dt2| w_z / |u'|
// (the in-plane acceleration projected across the track), so the geodesic curvature obeys
// kappa <= w_z / |u'|min + |nu''|max w_z / |u'|min^3 (Do Carmo, "Differential Geometry of Curves and
// Surfaces", 1976, sec. 4-4, geodesic curvature as the tangential part of the acceleration over speed^2).
// A curve of length L with curvature at most kappa stays within kappa L^2 / 8 of the chord joining its ends
// (to first order in kappa L; the planar sagitta). The bound below takes twice that, for the higher orders
// and the sphere, with L = |u'|max h.
struct TrackRates {
  double rate_min_rad_s = 0.0;   // lower bound of |u'| over the run (Earth-fixed angular speed of u)
  double rate_max_rad_s = 0.0;   // upper bound of |u'|
  double accel_max_rad_s2 = 0.0; // upper bound of |d2nu/dt2| (in-plane angular acceleration, eccentric orbits)
  double frame_rate_rad_s = 0.0; // w_z: Earth rotation plus the largest |dOmega/dt|
};

// Upper bound (rad) of the deviation from the chord over one step of h_s seconds; pi when the bound does
// not hold (the ground track could stall: |u'| min not above zero).
inline double track_deviation_bound_rad(const TrackRates& t, double h_s) {
  if (!(t.rate_min_rad_s > 0.0)) return 3.141592653589793;
  const double w = t.rate_min_rad_s;
  const double kappa = t.frame_rate_rad_s / w + t.accel_max_rad_s2 * t.frame_rate_rad_s / (w * w * w);
  const double len = t.rate_max_rad_s * h_s;
  return std::min(3.141592653589793, 2.0 * kappa * len * len / 8.0 + 1e-9);
}

// Cosine of the widened footprint angle: a point within angle lambda of the satellite's ground direction at
// some instant of the step is within this angle of u(t0) or of u(t1). With u(t) within eps of the arc from
// u(t0) to u(t1), whose length is D (cos_d = cos D = u(t0).u(t1)), the farthest such point sits across the
// arc's midpoint at lambda + eps, at angle acos(cos(lambda + eps) cos(D / 2)) from either end (spherical
// Pythagoras). cos_lambda is cos(lambda); the result is clamped to [-1, 1].
// The two factors, apart: cos(lambda + eps) depends only on the orbit radius and the step, so the row sweep
// keeps it per radius; only cos(D / 2) changes from satellite to satellite and step to step.
inline double widened_footprint_cos(double cos_lambda, double eps_rad) {
  if (eps_rad >= 3.14159) return -1.0;
  const double c = std::clamp(cos_lambda, -1.0, 1.0);
  const double s = std::sqrt(std::max(0.0, 1.0 - c * c));
  return c * std::cos(eps_rad) - s * std::sin(eps_rad);  // cos(lambda + eps)
}
// cos(D / 2) from cos D: it depends on the satellite and the step only (PositionBuffer::step_pole keeps it).
inline double swept_half_cos(double cos_d) {
  return std::sqrt(std::max(0.0, (1.0 + std::clamp(cos_d, -1.0, 1.0)) / 2.0));
}
inline double swept_footprint_cos_from_half(double c_le, double half) {
  if (c_le <= -1.0) return -1.0;
  const double out = c_le >= 0.0 ? c_le * half : c_le;  // past 90 deg the cap is a hemisphere or more: keep it
  return std::clamp(out - 1e-12, -1.0, 1.0);
}
inline double swept_footprint_cos(double cos_lambda, double eps_rad, double cos_d) {
  return swept_footprint_cos_from_half(widened_footprint_cos(cos_lambda, eps_rad), swept_half_cos(cos_d));
}

// The cubic Hermite interpolant of a satellite's Earth-fixed position between two instants, from the
// positions p0, p1 (km) and velocities v0, v1 (km/s) there; tau = (t - t0) / h in [0, 1]. Its error is at
// most h^4 max|r''''| / 384 (C. de Boor, "A Practical Guide to Splines", 1978, ch. II); for a circular orbit
// at rate n (plus the Earth's rate) |r''''| <= r (n + w_E)^4, about 0.4 m at a 60 s step in low orbit.
struct CubicPath {
  double c0[3], c1[3], c2[3], c3[3];
  double h = 0.0;
  CubicPath(const double p0[3], const double v0[3], const double p1[3], const double v1[3], double h_s) : h(h_s) {
    for (int k = 0; k < 3; ++k) {
      c0[k] = p0[k];
      c1[k] = h_s * v0[k];
      c2[k] = 3.0 * (p1[k] - p0[k]) - h_s * (2.0 * v0[k] + v1[k]);
      c3[k] = 2.0 * (p0[k] - p1[k]) + h_s * (v0[k] + v1[k]);
    }
  }
  void at(double tau, double pos[3], double vel[3]) const {
    for (int k = 0; k < 3; ++k) {
      pos[k] = c0[k] + tau * (c1[k] + tau * (c2[k] + tau * c3[k]));
      vel[k] = (c1[k] + tau * (2.0 * c2[k] + tau * 3.0 * c3[k])) / h;
    }
  }
};

// The point in [x0, x1] where f changes between "in view" (f >= 0) and not, given f0 = f(x0) and f1 = f(x1)
// on the two sides, by regula falsi with the Illinois modification (Dowell and Jarratt, BIT 11, 1971) until
// the bracket is below tol; the bracket's midpoint.
template <class F>
double illinois_root(double x0, double f0, double x1, double f1, F&& f, double tol) {
  int s = 0;
  for (int it = 0; it < 100 && x1 - x0 > tol; ++it) {
    double x = x0 + (x1 - x0) * f0 / (f0 - f1);
    if (!(x > x0 && x < x1)) x = 0.5 * (x0 + x1);
    const double v = f(x);
    if ((v >= 0.0) == (f1 >= 0.0)) {
      x1 = x;
      f1 = v;
      if (s == -1) f0 *= 0.5;
      s = -1;
    } else {
      x0 = x;
      f0 = v;
      if (s == 1) f1 *= 0.5;
      s = 1;
    }
  }
  return 0.5 * (x0 + x1);
}

// A pass found between two instants: its rise and set times (s).
struct HiddenPass {
  double rise_s = 0.0, set_s = 0.0;
};

struct MarginSample {
  double value = 0.0, rate = 0.0;  // the visibility margin (visible when >= 0) and its time derivative (1/s)
};

// The pass of one pair between t0 and t1 (t1 > t0), given the margin and its rate at both instants (both
// values below zero, out of view) and `margin_at(tau)`, the margin and rate at tau = (t - t0) / h in [0, 1].
//
// Over a step much shorter than an orbit the margin of one pair has at most one interior extremum (the
// central angle from a ground point to a direction moving along a near-great circle at a near-uniform rate
// is unimodal over less than half a revolution; the margin is a decreasing function of that angle for a
// given orbit radius, and the smaller of the mask and cone terms of a unimodal pair is unimodal too). So a
// pass wholly inside the step needs the margin rising at t0 and falling at t1, and then it lies around the
// margin's single maximum. The maximum is bracketed by the sign change of the rate and found by regula falsi
// with the Illinois modification (Dowell and Jarratt, BIT 11, 1971) until the margin there is non-negative
// or the bracket is below tolerance; the rise and set are then the roots on each side, by the same method,
// to 1e-9 of the step. Returns nothing when the maximum stays below zero.
template <class MarginAt>
std::optional<HiddenPass> find_hidden_pass(double t0, double t1, MarginSample a, MarginSample b, MarginAt&& margin_at) {
  if (!(a.value < 0.0 && b.value < 0.0)) return std::nullopt;
  if (!(a.rate > 0.0 && b.rate < 0.0)) return std::nullopt;
  const double h = t1 - t0;
  // Maximum: root of the rate on [0, 1].
  double lo = 0.0, hi = 1.0, rlo = a.rate * h, rhi = b.rate * h;  // rates per unit tau
  int side = 0;
  double peak = -1.0;
  double peak_value = -1.0;
  for (int it = 0; it < 80 && hi - lo > 1e-10; ++it) {
    double x = lo + (hi - lo) * rlo / (rlo - rhi);
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    const MarginSample m = margin_at(x);
    if (m.value >= 0.0) {
      peak = x;
      peak_value = m.value;
      break;
    }
    const double r = m.rate * h;
    if (r > 0.0) {
      lo = x;
      rlo = r;
      if (side == -1) rhi *= 0.5;
      side = -1;
    } else {
      hi = x;
      rhi = r;
      if (side == 1) rlo *= 0.5;
      side = 1;
    }
  }
  if (peak < 0.0) return std::nullopt;
  // Roots of the margin on [0, peak] (rising) and [peak, 1] (falling), to 1e-9 of the step.
  const auto value = [&](double x) { return margin_at(x).value; };
  // The same routine brackets both: it keeps the end whose sign ("in view" or not) differs from the new point's.
  const double rise = illinois_root(0.0, a.value, peak, peak_value, value, 1e-9);
  const double set = illinois_root(peak, peak_value, 1.0, b.value, value, 1e-9);
  return HiddenPass{t0 + rise * h, t0 + std::max(set, rise) * h};
}

}  // namespace skein::coverage_engine
