#include "skein/lifetime/decay.hpp"

#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>

namespace skein {
namespace {

constexpr double circular_e = 1e-6;     // below this the orbit is treated as circular
constexpr int max_quadrature_intervals = 24;  // trapezoid over E in [0, pi]; the integrands are even in E
constexpr long max_steps = 2000000;
constexpr double min_step_days = 1e-12;  // 86 ns: below this the state is not moving in double precision

// cos(pi k / m) for k = 0..m, for every interval count m = 1..24, computed once (the same expression as before).
const double* quadrature_cosines(int m) {
  struct Tables {
    std::array<std::array<double, max_quadrature_intervals + 1>, max_quadrature_intervals + 1> c{};
    Tables() {
      for (int n = 1; n <= max_quadrature_intervals; ++n)
        for (int k = 0; k <= n; ++k) c[static_cast<size_t>(n)][static_cast<size_t>(k)] = std::cos(pi * k / n);
    }
  };
  static const Tables tables;
  assert(m >= 1 && m <= max_quadrature_intervals);
  return tables.c[static_cast<size_t>(m)].data();
}

double perigee_altitude_km(const EarthModel& earth, const DecayPoint& s) {
  return s.a_km * (1.0 - s.e) - earth.radius_km;
}

// Density scale height (km) near altitude h at time t, from the model itself.
double scale_height_km(const DensityFn& density, double h, double t) {
  const double r0 = density(h, t), r1 = density(h + 1.0, t);
  if (!(r0 > 0.0) || !(r1 > 0.0) || r1 >= r0) return 50.0;  // flat or odd model: a moderate default
  return 1.0 / std::log(r0 / r1);
}

}  // namespace

int quadrature_half_intervals(double x) {
  x = std::abs(x);
  for (int m = 4; m < max_quadrature_intervals; ++m) {
    const int n = 2 * m;
    double term = 2.0;  // 2 (x/2)^n / n!
    for (int k = 1; k <= n; ++k) term *= 0.5 * x / k;
    if (term < 1e-10) return m;
  }
  return max_quadrature_intervals;
}

DragRates drag_rates(const EarthModel& earth, const DensityFn& density, double b, double a_km, double e,
                     double t_days, int quadrature_intervals) {
  assert(quadrature_intervals >= 1);
  const double a_m = a_km * 1000.0;
  const double period_s = two_pi * std::sqrt(a_km * a_km * a_km / earth.mu_km3_s2);
  const double per_rev_to_per_day = seconds_per_day / period_s;
  if (e < circular_e) {
    const double rho = density(a_km - earth.radius_km, t_days);
    return {-two_pi * b * rho * a_m * a_m / 1000.0 * per_rev_to_per_day, 0.0};
  }
  double ia = 0.0, ie = 0.0;
  const double* cosines = quadrature_cosines(quadrature_intervals);
  for (int k = 0; k <= quadrature_intervals; ++k) {
    const double w = (k == 0 || k == quadrature_intervals) ? 0.5 : 1.0;
    const double c = cosines[k];
    const double rho = density(a_km * (1.0 - e * c) - earth.radius_km, t_days);
    const double ratio = std::sqrt((1.0 + e * c) / (1.0 - e * c));
    ia += w * rho * (1.0 + e * c) * ratio;  // (1+ec)^(3/2) / (1-ec)^(1/2)
    ie += w * rho * ratio * c;
  }
  const double step = pi / quadrature_intervals;
  ia *= 2.0 * step;  // the [pi, 2 pi] half mirrors [0, pi]
  ie *= 2.0 * step;
  return {-b * a_m * a_m * ia / 1000.0 * per_rev_to_per_day, -b * a_m * (1.0 - e * e) * ie * per_rev_to_per_day};
}

DecayResult integrate_decay(const EarthModel& earth, const DensityFn& density, double b, const DecayPoint& start,
                            const DecayOptions& opt) {
  assert(b > 0.0 && std::isfinite(b));
  assert(std::isfinite(start.a_km) && start.a_km > earth.radius_km && start.e >= 0.0 && start.e < 1.0);
  DecayResult out;
  DecayPoint s = start;
  if (opt.record) out.curve.push_back(s);
  int intervals = max_quadrature_intervals;  // set per step, the same for its four stages
  auto rates = [&](double t, double a, double e) {
    return drag_rates(earth, density, b, a, std::max(e, 0.0), t, intervals);
  };
  auto crossed = [&](const DecayPoint& p) {
    if (perigee_altitude_km(earth, p) <= opt.reentry_altitude_km) return DecayStop::reentry;
    if (opt.stop_below_a_km > 0.0 && p.a_km <= opt.stop_below_a_km) return DecayStop::target;
    return DecayStop::horizon;  // meaning: not crossed
  };
  if (DecayStop c = crossed(s); c != DecayStop::horizon) {
    out.stop = c;
    out.end = s;
    return out;
  }
  while (true) {
    if (s.t_days >= start.t_days + opt.horizon_days) {
      out.stop = DecayStop::horizon;
      break;
    }
    if (out.steps >= max_steps) {
      out.stop = DecayStop::failed;
      break;
    }
    const double hp = perigee_altitude_km(earth, s);
    const double h_scale_km = scale_height_km(density, hp, s.t_days);
    intervals = opt.adaptive_quadrature ? quadrature_half_intervals(s.a_km * s.e / h_scale_km) : max_quadrature_intervals;
    const DragRates k1 = rates(s.t_days, s.a_km, s.e);
    const double length_km = std::max(h_scale_km, 0.5 * s.a_km * s.e);
    const double speed = std::abs(k1.da_km_per_day);
    if (!std::isfinite(speed)) {
      out.stop = DecayStop::failed;
      break;
    }
    double dt = speed > 0.0 ? opt.step_fraction * length_km / speed : opt.max_step_days;
    // With a target, take at least five steps to reach it so the crossing is interpolated inside a short step.
    if (opt.stop_below_a_km > 0.0 && speed > 0.0)
      dt = std::min(dt, 0.2 * std::max(start.a_km - opt.stop_below_a_km, 1e-3) / speed);
    dt = std::min(dt, opt.max_step_days);
    dt = std::min(dt, start.t_days + opt.horizon_days - s.t_days);
    // One RK4 step; halved while it leaves a non-finite state or a mean orbit below the Earth's surface
    // (where the rates are meaningless): the step rule above keeps that rare, the halving keeps it safe.
    DecayPoint next;
    bool sound = false;
    while (true) {
      const DragRates k2 = rates(s.t_days + dt / 2, s.a_km + dt / 2 * k1.da_km_per_day, s.e + dt / 2 * k1.de_per_day);
      const DragRates k3 = rates(s.t_days + dt / 2, s.a_km + dt / 2 * k2.da_km_per_day, s.e + dt / 2 * k2.de_per_day);
      const DragRates k4 = rates(s.t_days + dt, s.a_km + dt * k3.da_km_per_day, s.e + dt * k3.de_per_day);
      next.t_days = s.t_days + dt;
      next.a_km = s.a_km + dt / 6 * (k1.da_km_per_day + 2 * k2.da_km_per_day + 2 * k3.da_km_per_day + k4.da_km_per_day);
      next.e = s.e + dt / 6 * (k1.de_per_day + 2 * k2.de_per_day + 2 * k3.de_per_day + k4.de_per_day);
      sound = std::isfinite(next.a_km) && std::isfinite(next.e) && next.a_km > earth.radius_km && next.e < 1.0 &&
              next.t_days > s.t_days;
      if (sound) break;
      dt *= 0.5;
      if (!(dt > min_step_days)) break;
    }
    if (!sound) {
      out.stop = DecayStop::failed;
      break;
    }
    if (next.e < circular_e) next.e = 0.0;
    ++out.steps;
    const DecayStop c = crossed(next);
    if (c != DecayStop::horizon) {
      // Interpolate linearly to the crossing of the stop quantity within the step.
      double f = 1.0;
      if (c == DecayStop::reentry) {
        const double h0 = perigee_altitude_km(earth, s), h1 = perigee_altitude_km(earth, next);
        f = h0 > h1 ? (h0 - opt.reentry_altitude_km) / (h0 - h1) : 1.0;
      } else {
        f = s.a_km > next.a_km ? (s.a_km - opt.stop_below_a_km) / (s.a_km - next.a_km) : 1.0;
      }
      f = std::clamp(f, 0.0, 1.0);
      DecayPoint hit{s.t_days + f * dt, s.a_km + f * (next.a_km - s.a_km), s.e + f * (next.e - s.e)};
      s = hit;
      if (opt.record) out.curve.push_back(s);
      out.stop = c;
      break;
    }
    s = next;
    if (opt.record) out.curve.push_back(s);
  }
  out.end = s;
  return out;
}

std::vector<DecayPoint> thin_curve(const std::vector<DecayPoint>& curve, double max_gap_days, double max_drop_km) {
  std::vector<DecayPoint> kept;
  if (curve.empty()) return kept;
  kept.push_back(curve.front());
  for (size_t k = 1; k + 1 < curve.size(); ++k) {
    const DecayPoint& last = kept.back();
    if (curve[k].t_days - last.t_days >= max_gap_days || std::abs(last.a_km - curve[k].a_km) >= max_drop_km)
      kept.push_back(curve[k]);
  }
  if (curve.size() > 1) kept.push_back(curve.back());
  return kept;
}

}  // namespace skein
