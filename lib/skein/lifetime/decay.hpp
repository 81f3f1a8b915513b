#pragma once
// Natural orbit decay under drag: orbit-averaged mean semi-major axis and eccentricity.
#include <functional>
#include <vector>

#include "skein/constants.hpp"

namespace skein {

// Density (kg/m^3) at an altitude (km) and a time (days after the epoch).
using DensityFn = std::function<double(double altitude_km, double t_days)>;

// Orbit-averaged drag rates of a and e for ballistic coefficient B = Cd A / m (m^2/kg), in a
// non-rotating atmosphere. Per revolution (E = eccentric anomaly, r = a (1 - e cos E)):
//   delta a = -B a^2 Int_0^2pi rho(r) (1 + e cos E)^(3/2) / (1 - e cos E)^(1/2) dE
//   delta e = -B a (1 - e^2) Int_0^2pi rho(r) [(1 + e cos E)/(1 - e cos E)]^(1/2) cos E dE
// divided by the Kepler period. For e = 0: delta a = -2 pi B rho a^2, so da/dt = -rho B sqrt(mu a).
// Source: D.G. King-Hele, "Theory of Satellite Orbits in an Atmosphere" (Butterworths 1964): the
// per-revolution changes of a and e, here with atmospheric rotation factor F = 1 (no rotating atmosphere).
struct DragRates {
  double da_km_per_day = 0.0;
  double de_per_day = 0.0;
};
// The E integrals use the trapezoid rule with half_intervals (1 to 24) steps over [0, pi] (the integrands are even
// in E).
DragRates drag_rates(const EarthModel& earth, const DensityFn& density, double b_m2_kg, double a_km, double e,
                     double t_days, int half_intervals = 24);

// Trapezoid intervals over [0, pi] enough for an orbit whose density varies as exp(x cos E), x = a e / H (H the
// density scale height at perigee): the trapezoid rule on the period with N = 2 M points integrates exp(x cos E)
// with a relative error of about 2 I_N(x) / I_0(x), about 2 (x/2)^N / N! for x well below N (the aliased N-th
// Fourier coefficient;
// P.J. Davis, P. Rabinowitz, "Methods of Numerical Integration", 2nd ed. 1984, sec. 2.9, periodic functions;
// recalled from memory). The least M from 4 to 24 that brings this below 1e-10; 24 (skein's former fixed count)
// above that.
int quadrature_half_intervals(double x);

struct DecayPoint {
  double t_days = 0.0;
  double a_km = 0.0;
  double e = 0.0;
};

struct DecayOptions {
  double reentry_altitude_km = 120.0;   // decay ends when the perigee altitude reaches this
  double horizon_days = 200.0 * days_per_julian_year;  // integration stops here (lifetime then a lower bound)
  double stop_below_a_km = 0.0;         // also stop when a falls to this (deadband cycles); 0: not used
  double step_fraction = 0.03;          // step so |da| <= fraction x the perigee density scale height
  double max_step_days = 30.0;          // resolves the solar cycle; also bounds long-lived runs
  bool record = true;                   // keep the curve
  bool adaptive_quadrature = true;      // quadrature_half_intervals per step; false: always 24 (the former rule)
};

// failed: the integration could not follow the decay (a non-finite state, or max_steps without reaching a
// stop); the result is then neither a lifetime nor a lower bound, and callers refuse it.
enum class DecayStop { reentry, horizon, target, failed };

struct DecayResult {
  DecayStop stop = DecayStop::horizon;
  DecayPoint end;                   // state at the stop (interpolated to the crossing)
  std::vector<DecayPoint> curve;    // every step (when recorded), from the start to `end`
  long steps = 0;
};

// Integrate from `start` (t, a, e) with classical RK4 on (a, e), steps set by the perigee density scale
// height (step_fraction), at least five per descent to stop_below_a_km, and capped by max_step_days. There
// is no lower bound on the step: an orbit that falls through the atmosphere in minutes (a ballistic
// coefficient of 1e6 m^2/kg) takes steps of a fraction of a second and re-enters, never "outlives" the
// horizon. A step that would leave a non-finite state, e >= 1 or a mean orbit below the Earth's surface is
// halved; when halving goes below 1e-12 day, the rates are not finite, or 2,000,000 steps pass without a
// stop, the result is `failed` (never a lifetime, never a lower bound).
// Asserts b_m2_kg > 0 and finite state.
DecayResult integrate_decay(const EarthModel& earth, const DensityFn& density, double b_m2_kg,
                            const DecayPoint& start, const DecayOptions& options);

// A few hundred points of a curve for tables and plots: keeps the first and last points and any point at
// least `max_gap_days` or `max_drop_km` (mean altitude) after the last kept one.
std::vector<DecayPoint> thin_curve(const std::vector<DecayPoint>& curve, double max_gap_days, double max_drop_km);

}  // namespace skein
