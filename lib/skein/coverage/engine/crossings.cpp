#include "skein/coverage/engine/crossings.hpp"

#include <algorithm>
#include <cmath>

namespace skein::coverage_engine {

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

}  // namespace skein::coverage_engine
