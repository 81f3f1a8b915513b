// The decay integrator's adaptive quadrature (the Monte Carlo speed-up) against the former fixed 24-interval rule,
// and the cached density object against the plain density function.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "skein/atmosphere/atmosphere.hpp"
#include "skein/budget/budget.hpp"
#include "skein/lifetime/decay.hpp"

using namespace skein;

namespace {

double lifetime_days(const OrbitAtmosphere& atm, double b, double hp_km, double ha_km, bool adaptive) {
  const double rp = wgs84.radius_km + hp_km, ra = wgs84.radius_km + ha_km;
  DecayOptions opt;
  opt.record = false;
  opt.adaptive_quadrature = adaptive;
  opt.horizon_days = 50.0 * days_per_julian_year;
  const DensityFn rho = OrbitDensity(atm);
  return integrate_decay(wgs84, rho, b, {0.0, 0.5 * (rp + ra), (ra - rp) / (ra + rp)}, opt).end.t_days;
}

}  // namespace

TEST_SUITE("budget") {

TEST_CASE("adaptive quadrature: eccentric lifetimes within 5e-4 of the fixed 24-interval rule") {
  // The disposal orbits of a budget (apogee 550 km, perigee lowered to 150..500 km) under the cycle, at three
  // ballistic coefficients. The adaptive rule picks the intervals for a 1e-10 aliasing error of exp(x cos E), but
  // the Harris-Priester profile is piecewise exponential: its slope jumps at the table nodes, so the trapezoid error
  // is algebraic in the interval count, not exponential, and the lifetime integrates it. Measured (this test, when
  // written): at most 3.2e-4 relative, for a re-entry in 2.2 days from a 150 km perigee; 1e-5 to 4e-5 for the rest.
  // Tolerance 5e-4 relative: a tenth of the 0.5 % the lifetime tests of this suite allow against the IPS
  // reference, and far inside the factor-of-2 density uncertainty of any lifetime.
  OrbitAtmosphere atm;
  atm.bulge_weight = 0.45;
  atm.solar = {SolarLevel::cycle, 0.3, 1.0};
  double worst = 0.0;
  for (double b : {0.005, 0.0129, 0.03})
    for (double hp : {150.0, 200.0, 300.0, 400.0, 500.0}) {
      CAPTURE(b);
      CAPTURE(hp);
      const double fixed = lifetime_days(atm, b, hp, 550.0, false);
      const double adaptive = lifetime_days(atm, b, hp, 550.0, true);
      worst = std::max(worst, std::abs(adaptive / fixed - 1.0));
      CHECK(adaptive == doctest::Approx(fixed).epsilon(5e-4));
    }
  MESSAGE("largest relative lifetime difference, adaptive against fixed quadrature: " << worst);
}

TEST_CASE("the interval count follows the aliasing bound") {
  // x = 0 (circular): the least count, 4. x = 2: 2 (x/2)^N / N! < 1e-10 first at N = 14 (2/14! = 2.3e-12; N = 12
  // gives 4.2e-9), so M = 7. Large x: capped at the former 24.
  CHECK(quadrature_half_intervals(0.0) == 4);
  CHECK(quadrature_half_intervals(2.0) == 7);
  CHECK(quadrature_half_intervals(1000.0) == 24);
}

TEST_CASE("the cached density object equals orbit_density_kg_m3 at every altitude and time") {
  // OrbitDensity keeps the solar term of the last time; asked in any order it must give the same values as the
  // one-shot function (which builds a fresh object), to the bit.
  OrbitAtmosphere atm;
  atm.bulge_weight = 0.6;
  atm.solar = {SolarLevel::cycle, 0.1, 1.2};
  OrbitDensity cached(atm);
  for (double t : {0.0, 0.0, 400.0, 17.5, 400.0})
    for (double h : {90.0, 150.0, 179.9, 180.0, 350.0, 500.0, 812.0, 1200.0})
      CHECK(cached(h, t) == orbit_density_kg_m3(atm, h, t));
}

}  // TEST_SUITE
