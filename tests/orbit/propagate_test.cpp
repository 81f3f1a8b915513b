// Evidence for lib/skein/orbit/propagate.hpp: Kepler's equation and elements-to-state.
#include <doctest/doctest.h>

#include <cmath>

#include "skein/constants.hpp"
#include "skein/orbit/propagate.hpp"

using namespace skein;

TEST_CASE("propagate: Kepler's equation, Vallado Example 2-1") {
  // Source: Vallado (2013) Example 2-1: M = 235.4 deg, e = 0.4 gives E = 220.512074767522 deg
  // (MEMORY of the printed digits; 1e-9 deg is far inside them).
  const double ecc = eccentric_anomaly_rad(235.4 * rad_per_deg, 0.4);
  CHECK(wrap_two_pi(ecc) * deg_per_rad == doctest::Approx(220.512074767522).epsilon(1e-11));
  for (double e : {0.0, 0.1, 0.7, 0.95})
    for (double m : {-3.0, 0.01, 1.0, 3.1, 6.0}) {
      const double ea = eccentric_anomaly_rad(m, e);
      CHECK(ea - e * std::sin(ea) == doctest::Approx(m).epsilon(1e-13));
    }
}

TEST_CASE("propagate: elements to state, Vallado Example 2-6 (COE2RV)") {
  // Source: Vallado (2013) Example 2-6: p = 11067.790 km, e = 0.83285, i = 87.87 deg, node = 227.89 deg,
  // arg perigee = 53.38 deg, true anomaly = 92.335 deg gives r = (6525.344, 6861.535, 6449.125) km and
  // v = (4.902276, 5.533124, -1.975709) km/s (MEMORY of the printed values). Tolerance 1e-5 relative: the
  // inputs are printed to 0.001 deg and 0.001 km, and 0.0005 deg of anomaly alone moves r by about 1e-5 of
  // its length.
  const double e = 0.83285, p = 11067.790, nu = 92.335 * rad_per_deg;
  const double ea = 2.0 * std::atan(std::sqrt((1 - e) / (1 + e)) * std::tan(nu / 2));
  MeanElements el;
  el.a_km = p / (1 - e * e);
  el.e = e;
  el.i_rad = 87.87 * rad_per_deg;
  el.raan_rad = 227.89 * rad_per_deg;
  el.argp_rad = 53.38 * rad_per_deg;
  el.mean_anomaly_rad = ea - e * std::sin(ea);
  const StateVector s = state_from_elements(wgs84, el);
  CHECK(s.r_km.x() == doctest::Approx(6525.344).epsilon(1e-5));
  CHECK(s.r_km.y() == doctest::Approx(6861.535).epsilon(1e-5));
  CHECK(s.r_km.z() == doctest::Approx(6449.125).epsilon(1e-5));
  CHECK(s.v_km_s.x() == doctest::Approx(4.902276).epsilon(1e-5));
  CHECK(s.v_km_s.y() == doctest::Approx(5.533124).epsilon(1e-5));
  CHECK(s.v_km_s.z() == doctest::Approx(-1.975709).epsilon(1e-5));
}

TEST_CASE("propagate: secular advance and the Earth-fixed rotation") {
  MeanElements el;
  el.a_km = 7000.0;
  el.i_rad = 1.0;
  const SecularOrbit orbit = make_secular_orbit(wgs84, el);
  const MeanElements later = elements_at(orbit, 3600.0);
  CHECK(later.raan_rad == doctest::Approx(wrap_two_pi(orbit.rates.raan_rad_s * 3600.0)));
  CHECK(later.a_km == el.a_km);
  // Vis-viva: |v|^2 = mu (2/r - 1/a).
  const StateVector s = state_at(wgs84, orbit, 1234.5);
  CHECK(s.v_km_s.squaredNorm() == doctest::Approx(wgs84.mu_km3_s2 * (2 / s.r_km.norm() - 1 / el.a_km)).epsilon(1e-12));
  // A point on the x axis seen after a quarter turn of Greenwich sits at -90 deg longitude.
  const Eigen::Vector3d fixed = inertial_to_earth_fixed(Eigen::Vector3d(1, 0, 0), pi / 2);
  CHECK(fixed.y() == doctest::Approx(-1.0));
  CHECK(std::abs(fixed.x()) < 1e-15);
}
