#pragma once
// Footprint bounds for culling the (satellite, ground point) pairs of the coverage evaluator. For a row of
// ground points that share one geocentric latitude, and a satellite at geocentric radius r, two central angles
// bound the exact visibility test: a point beyond the outer angle cannot see the satellite, and a point inside
// the inner angle surely does. On the row, each angle becomes a window of longitudes. Only the pairs between
// the two bounds need the exact test, so the work follows the pass boundaries, not satellites x points.
// Pure functions; angles in radians, lengths in km.
#include <algorithm>
#include <cmath>
#include <optional>

#include "skein/constants.hpp"

namespace skein {

// acos(x) for x in [-1, 1] with an absolute error below fast_acos_error_rad: Abramowitz and Stegun, "Handbook
// of Mathematical Functions", 1964, eq. 4.4.45 (acos x = sqrt(1 - x) (a0 + a1 x + a2 x^2 + a3 x^3), error at
// most 6.7e-5 rad on [0, 1]), with acos(-x) = pi - acos(x). Used only to size windows, which are widened or
// narrowed by the error bound, so no result depends on it. Arguments outside [-1, 1] are clamped.
// (Inline, with row_half_width: both sit in the innermost loop of the coverage row sweep.)
inline double fast_acos(double x) {
  x = std::clamp(x, -1.0, 1.0);
  const double ax = std::abs(x);
  // Abramowitz and Stegun 4.4.45 coefficients.
  const double r = std::sqrt(1.0 - ax) * (1.5707288 + ax * (-0.2121144 + ax * (0.0742610 + ax * -0.0187293)));
  return x >= 0.0 ? r : pi - r;
}
inline constexpr double fast_acos_error_rad = 1e-4;  // above the published 6.7e-5 (tests check the bound)

// What a footprint bound needs to know of a row of ground points.
struct FootprintRow {
  double min_radius_km = 0.0;      // smallest geocentric radius of the row's points
  double max_radius_km = 0.0;      // largest geocentric radius of the row's points
  double max_deflection_rad = 0.0; // largest angle between a point's geodetic vertical and its geocentric radial
  // Derived, set by make_footprint_row: cos and sin of the mask less and plus the deflection, and the cone.
  double cos_e_out = 1.0, sin_e_out = 0.0, cos_e_in = 1.0, sin_e_in = 0.0;
  bool cone = false;
  double sin_cone = 0.0, cos_cone = 1.0;
};
FootprintRow make_footprint_row(double min_radius_km, double max_radius_km, double max_deflection_rad,
                                double min_elevation_rad, std::optional<double> nadir_half_angle_rad);

// Cosines of the two bounding central angles for a satellite at geocentric radius r_km (r above the row):
//  - outer: a point of the row that sees the satellite has cos(central angle) >= outer;
//  - inner: a point with cos(central angle) >= inner sees it (2 when no point can be sure to).
// Derivation: for a point at radius R the geocentric elevation e and the central angle theta obey
// theta = acos(R cos e / r) - e (the Earth-central-angle relation, e.g. Wertz, "Spacecraft Attitude
// Determination and Control", 1978, sec. 5.1), decreasing in e and in R; the elevation from the geodetic
// vertical differs from the geocentric one by at most the deflection. With a payload cone of half-angle eta
// (off-nadir), the nadir angle at the inner bound is largest for the largest R, where the cone edge lies at
// theta = 90 deg - eta - acos(r sin eta / R) (law of sines in the Earth-centre, point, satellite triangle).
// Both cosines carry a 1e-9 margin against rounding, outward.
struct FootprintCosines {
  double outer = 1.0;
  double inner = 2.0;
};
FootprintCosines footprint_cosines(const FootprintRow& row, double r_km);

// Half-width in longitude of the set of row points (geocentric latitude with sine sin_r and cosine cos_r)
// whose central angle to a direction at latitude (sin_s, cos_s) has cosine >= c, from the spherical law of
// cosines cos theta = sin_r sin_s + cos_r cos_s cos(dlon). Returns a negative value when the set is empty and
// a value >= pi when it is the whole row. `widen` pads the window by the fast_acos error (for outer bounds,
// which must not miss a point); otherwise it is narrowed by it (for inner bounds, which must not claim one).
inline double row_half_width(double sin_r, double cos_r, double sin_s, double cos_s, double c, bool widen) {
  const double den = cos_r * cos_s;
  const double base = sin_r * sin_s;
  if (!(den > 0.0)) return base >= c ? pi : -1.0;  // a pole: the central angle does not depend on longitude
  if (base + den < c) return -1.0;  // q > 1 without the division: even dlon = 0 is outside
  const double q = (c - base) / den;
  if (q > 1.0) return -1.0;
  if (q <= -1.0) return pi;
  const double h = fast_acos(q);
  if (widen) return h + fast_acos_error_rad;
  const double narrowed = h - fast_acos_error_rad;
  return narrowed < 0.0 ? -1.0 : narrowed;
}


}  // namespace skein
