#include "skein/coverage/engine/daylight.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"
#include "skein/time/sun.hpp"

namespace skein::coverage_engine {

double DaylightMask::margin(const PointGeo& p, double t) const {
  JulianDate jd = epoch;
  jd.fraction += t / seconds_per_day;
  const Eigen::Vector3d s = sun_position(jd).unit_eci;
  const double theta = theta0_rad + rotation_rad_s * t;
  const double c = std::cos(theta), sn = std::sin(theta);
  // Earth-fixed Sun direction: R3(theta) applied to the direction of date.
  const double sx = c * s.x() + sn * s.y(), sy = -sn * s.x() + c * s.y(), sz = s.z();
  return p.nx * sx + p.ny * sy + p.nz * sz - sin_min;
}

// The margin m(t) = n . s(t) - sin(threshold), with n the point's vertical (fixed in the Earth-fixed frame) and
// s(t) the Sun's direction there. In the frame of date n turns at the Earth's rate w about the pole and s moves
// along the ecliptic at the Sun's rate, so |dm/dt| <= w |n_xy| + w_sun, with |n_xy| the vertical's distance
// from the polar axis. w_sun bounds the almanac's longitude rate 0.9856 + 1.915 * 0.0172 + 0.04 * 0.0172
// = 1.0193 deg/day from above (1.03 deg/day); w is taken 1 % above the design's rotation rate.
// The search steps forward by |m| / bound (the margin cannot reach zero sooner), but at least
// daylight_min_step_s, and refines a change of sign by the Illinois variant of regula falsi (Dowell & Jarratt,
// BIT 11 (1971) 168) until the bracket is within daylight_time_tolerance_s. The time returned is the bracket's
// end on the new side, so the state there is the new state.
double DaylightMask::next_change(const PointGeo& p, double t, bool lit, double t_end) const {
  const double w_sun = 1.03 * rad_per_deg / seconds_per_day;
  const double bound = 1.01 * rotation_rad_s * std::hypot(p.nx, p.ny) + w_sun;
  const auto side = [&](double m) { return m >= 0.0; };
  double a = t;
  double fa = margin(p, a);
  if (side(fa) != lit) return t;  // should not happen: the state at t is given
  while (a < t_end) {
    const double h = std::max(std::abs(fa) / bound, daylight_min_step_s);
    const double b = std::min(t_end, a + h);
    const double fb = margin(p, b);
    if (side(fb) == lit) {
      a = b;
      fa = fb;
      continue;
    }
    // A change in (a, b]: fa on the old side, fb on the new.
    double lo = a, flo = fa, hi = b, fhi = fb;
    int kept = 0;  // which end was kept last (Illinois: halve its value when kept twice)
    for (int it = 0; it < 200 && hi - lo > daylight_time_tolerance_s; ++it) {
      double x = (flo != fhi) ? hi - fhi * (hi - lo) / (fhi - flo) : 0.5 * (lo + hi);
      if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
      const double fx = margin(p, x);
      if (side(fx) == lit) {
        lo = x;
        flo = fx;
        if (kept == +1) fhi *= 0.5;
        kept = +1;
      } else {
        hi = x;
        fhi = fx;
        if (kept == -1) flo *= 0.5;
        kept = -1;
      }
    }
    return hi;
  }
  return no_daylight_change;
}

}  // namespace skein::coverage_engine
