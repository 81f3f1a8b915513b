#pragma once
// Crossing times: rises and sets inside a step, from the margin's cubic Hermite interpolant in time.
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <vector>

namespace skein::coverage_engine {

// Margin values and rates (1/s) of one pair at the two instants t_{j-1}, t_j that bracket its rise or set.
struct Bracket {
  double f0, d0, f1, d1;
};

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

double hermite_root(double f0, double d0, double f1, double d1, double t0, double t1);

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

inline bool event_before(const Event& x, const Event& y) {
  // Rises before sets at equal times, so no zero-length gap is made.
  return x.t != y.t ? x.t < y.t : x.delta > y.delta;
}


}  // namespace skein::coverage_engine
