// Impulsive delta-v formulas against exact two-impulse computations and published examples.
#include <doctest/doctest.h>

#include <cmath>

#include <Eigen/Geometry>

#include "skein/budget/impulses.hpp"
#include "skein/constants.hpp"

using namespace skein;

namespace {
constexpr double mu = 398600.4418;  // WGS-84 GM, km^3/s^2
constexpr double re = 6378.137;     // WGS-84 equatorial radius, km
}  // namespace

TEST_SUITE("budget") {

TEST_CASE("Hohmann transfer: Vallado (2013) Example 6-1, LEO to GEO") {
  // Source: Vallado, "Fundamentals of Astrodynamics and Applications", Example 6-1: from 191.34411 km to
  // 35781.34857 km altitude, dv = 2.457038 + 1.478187 = 3.935224 km/s (recalled: MEMORY). Tolerance 1 m/s.
  CHECK(hohmann_dv_m_s(mu, re + 191.34411, re + 35781.34857) == doctest::Approx(3935.224).epsilon(1.0 / 3935.0));
  // Symmetric: going down costs the same.
  CHECK(hohmann_dv_m_s(mu, re + 35781.34857, re + 191.34411) ==
        doctest::Approx(hohmann_dv_m_s(mu, re + 191.34411, re + 35781.34857)).epsilon(1e-12));
}

TEST_CASE("perigee lowering equals the first burn of the exact two-impulse transfer") {
  // The disposal burn from a circular orbit r to perigee rp is the first impulse of a Hohmann-type transfer
  // r -> rp, from vis-viva: dv1 = sqrt(mu/r) - sqrt(mu (2/r - 2/(r + rp))). The full two-impulse transfer then
  // adds the circularisation at rp, dv2 = sqrt(mu (2/rp - 2/(r+rp))) - sqrt(mu/rp). Exact: tolerance 1e-9.
  for (double h : {500.0, 700.0, 800.0, 1200.0}) {
    for (double hp : {50.0, 300.0, 400.0}) {
      if (hp >= h) continue;
      const double r = re + h, rp = re + hp;
      const double dv1 = (std::sqrt(mu / r) - std::sqrt(mu * (2.0 / r - 2.0 / (r + rp)))) * 1000.0;
      const double dv2 = (std::sqrt(mu * (2.0 / rp - 2.0 / (r + rp))) - std::sqrt(mu / rp)) * 1000.0;
      CAPTURE(h);
      CAPTURE(hp);
      CHECK(perigee_lowering_dv_m_s(mu, r, r, rp) == doctest::Approx(dv1).epsilon(1e-9));
      CHECK(perigee_lowering_dv_m_s(mu, r, r, rp) + dv2 == doctest::Approx(hohmann_dv_m_s(mu, r, rp)).epsilon(1e-9));
    }
  }
  // Worked values from the vis-viva equation (hand-evaluated with WGS-84 GM): 500 -> 50 km 129.83 m/s,
  // 800 -> 50 km 208.29 m/s, 550 -> 300 km 70.01 m/s. Tolerance 0.02 m/s (rounding).
  CHECK(perigee_lowering_dv_m_s(mu, re + 500, re + 500, re + 50) == doctest::Approx(129.83).epsilon(0.02 / 129.8));
  CHECK(perigee_lowering_dv_m_s(mu, re + 800, re + 800, re + 50) == doctest::Approx(208.29).epsilon(0.02 / 208.3));
  CHECK(perigee_lowering_dv_m_s(mu, re + 550, re + 550, re + 300) == doctest::Approx(70.01).epsilon(0.02 / 70.0));
  // From an elliptical orbit, burning at apogee: vis-viva at r_apo before and after.
  const double a = re + 600.0, e = 0.01, ra = a * (1 + e), rp = re + 200.0;
  const double expect = (std::sqrt(mu * (2 / ra - 1 / a)) - std::sqrt(mu * (2 / ra - 2 / (ra + rp)))) * 1000.0;
  CHECK(perigee_lowering_dv_m_s(mu, ra, a, rp) == doctest::Approx(expect).epsilon(1e-12));
}

TEST_CASE("plane change equals the velocity vector difference") {
  // Independent check: rotate the velocity vector by di about the radius (Eigen) and take the difference.
  const double v = 7500.0, di = 0.2 * rad_per_deg;
  const Eigen::Vector3d v0(0.0, v, 0.0);
  const Eigen::Vector3d v1 = Eigen::AngleAxisd(di, Eigen::Vector3d::UnitX()) * v0;
  CHECK(plane_change_dv_m_s(v, di) == doctest::Approx((v1 - v0).norm()).epsilon(1e-12));
  // Small-angle form v di: 0.1 deg at 7504 m/s is 13.10 m/s (hand evaluation).
  CHECK(plane_change_dv_m_s(7504.0, 0.1 * rad_per_deg) == doctest::Approx(13.097).epsilon(1e-3));
}

TEST_CASE("phasing allowance against the exact two-impulse phasing manoeuvre") {
  // Exact: to gain shift s in time T, the mean motion must change by s/T; the orbit with n' = n + s/T has
  // a' = (mu/n'^2)^(1/3) (Kepler's third law); going there and back is two exact Hohmann transfers.
  // The first-order formula 2 a s / (3 T) must agree to O(da/a): tolerance 0.1 %.
  const double a = re + 550.0, s = 1.0 * rad_per_deg, t = 10.0 * seconds_per_day;
  const double n = std::sqrt(mu / (a * a * a));
  const double a2 = std::cbrt(mu / ((n + s / t) * (n + s / t)));
  const double exact = 2.0 * hohmann_dv_m_s(mu, a, a2);
  CHECK(phasing_dv_m_s(a, s, t) == doctest::Approx(exact).epsilon(1e-3));
}

TEST_CASE("rocket equation") {
  // Tsiolkovsky: dv = g0 Isp ln(m0/mf). With dv = g0 Isp, m0/mf = e: m_p = m_dry (e - 1). Exact.
  CHECK(propellant_mass_kg(100.0, 9.80665 * 300.0, 300.0) == doctest::Approx(100.0 * (std::exp(1.0) - 1.0)).epsilon(1e-12));
  // Small dv: m_p ~ m_dry dv / (g0 Isp) (first order); 1 m/s on 145 kg at 220 s: 0.06721 kg.
  CHECK(propellant_mass_kg(145.0, 1.0, 220.0) == doctest::Approx(145.0 / (9.80665 * 220.0)).epsilon(1e-3));
  CHECK(propellant_mass_kg(145.0, 0.0, 220.0) == 0.0);
}

}  // TEST_SUITE
