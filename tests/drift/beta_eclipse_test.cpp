// Evidence for lib/skein/drift/beta_eclipse.hpp: the beta angle and the cylindrical-shadow eclipse of every plane
// over a year, against a direct geometric computation (the project's propagator, ERFA's Sun, the cylinder test
// sampled every 0.5 s) and against the seasons a dawn-dusk and a noon sun-synchronous plane must show.
#include <doctest/doctest.h>
#include <erfa.h>

#include <Eigen/Geometry>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "skein/angles.hpp"
#include "skein/constants.hpp"
#include "skein/design/constellation.hpp"
#include "skein/drift/beta_eclipse.hpp"
#include "../time/erfa_sun.hpp"
#include "skein/error.hpp"
#include "skein/input/design_file.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/orbit/secular.hpp"

using namespace skein;

namespace {

// Invented test constellation of "Marrow Bay Orbital": a mid-inclination shell, a dawn-dusk and a noon
// sun-synchronous plane at 700 km, epoch 2026-01-01.
Design test_design() {
  return read_design_text(
      "name: Kestrel eclipse test\nepoch: 2026-01-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1.0\n"
      "  drag_coefficient: 2.2\nshells:\n"
      "  - name: mid\n    pattern: walker-delta\n    satellites: 3\n    planes: 3\n    phasing: 0\n"
      "    altitude_km: 550\n    inclination_deg: 53\n    raan_deg: 40\n"
      "  - name: dawn\n    pattern: walker-delta\n    satellites: 1\n    planes: 1\n    phasing: 0\n"
      "    altitude_km: 700\n    inclination_deg: sun-synchronous\n    ltan: \"06:00\"\n"
      "  - name: noon\n    pattern: walker-delta\n    satellites: 1\n    planes: 1\n    phasing: 0\n"
      "    altitude_km: 700\n    inclination_deg: sun-synchronous\n    ltan: \"12:00\"\n",
      "eclipse.yaml");
}

// Reference Sun direction from ERFA, true equator and equinox of date (tests/time/erfa_sun.hpp), as a unit vector.
Eigen::Vector3d erfa_sun(const JulianDate& jd) { return test::erfa_sun_of_date(jd).normalized(); }

double erfa_declination_deg(const JulianDate& jd) { return std::asin(erfa_sun(jd).z()) * deg_per_rad; }

JulianDate at_day(const Design& d, double day) {
  const JulianDate jd0 = julian_date(d.epoch);
  return {jd0.day, jd0.fraction + day};
}

// The cylindrical shadow test written out on its own (not the library's): behind the Earth and closer to the
// Sun line than the Earth's radius.
bool in_cylinder_shadow(const Eigen::Vector3d& r, const Eigen::Vector3d& s, double radius_km) {
  const double along = r.dot(s);
  return along < 0.0 && (r - along * s).norm() < radius_km;
}

const ShellBetaEclipse& shell_named(const BetaEclipseResult& r, const std::string& name) {
  for (const auto& s : r.shells)
    if (s.name == name) return s;
  FAIL("no shell " << name);
  return r.shells.front();
}

}  // namespace

TEST_CASE("beta and eclipse: the closed form agrees with a direct shadow count (propagator, ERFA Sun)") {
  // For each plane and every 25th day of the year: propagate the plane's satellite with the project's J2 secular
  // propagator over 1.5 nodal periods centred on the sample instant, in steps of at most 0.5 s, with ERFA's Sun
  // (interpolated linearly between 60 s nodes: the Sun moves 0.0007 deg in 60 s), apply the cylinder test, and
  // time the whole eclipse whose middle is nearest the sample instant (none when the orbit is lit throughout).
  // Tolerance, derived: each sample stands for [t, t + dt), so the entry and the exit are each timed to dt
  // (1 s in all). The closed form takes beta as constant; the true orbit sees beta change (the node moves up to
  // 5 deg/day against the Sun), so the band of beta is the direct values at the eclipse's entry, exit and the
  // sample instant, widened by 0.03 deg (the Almanac Sun is within 0.02 deg of ERFA's, tests/time/sun_test.cpp,
  // plus up to 0.005 deg of nutation between the mean and true equator). The closed form also holds the Sun
  // fixed in the orbit plane during the eclipse; the Sun's projection on the plane turns at most
  // (n_sun + |dOmega/dt|) / cos(beta) against the satellite's rate 2 pi / period, which stretches or shrinks the
  // eclipse by that ratio (0.1 % for the 53 deg planes, about 2 s). So: direct and library minutes both lie in
  // [T(max |beta|) (1 - ratio) - 1 s, T(min |beta|) (1 + ratio) + 1 s].
  const Design d = test_design();
  const BetaEclipseResult r = compute_beta_eclipse(d);
  const auto sats = expand_constellation(d);
  const double radius = d.earth.radius_km;
  int eclipsed_checks = 0, checks = 0;
  double worst_beta_deg = 0.0, worst_minutes_excess = 0.0, worst_away_from_limit = 0.0;
  for (const auto& sat : sats) {
    const ShellBetaEclipse& shell = r.shells[static_cast<size_t>(sat.shell)];
    const PlaneBetaEclipse& plane = shell.planes[static_cast<size_t>(sat.plane)];
    REQUIRE(shell.circular);
    const SecularOrbit orbit = make_secular_orbit(d.earth, sat.elements);
    const double period = shell.period_s;
    CHECK(period == doctest::Approx(nodal_period_s(d.earth, sat.elements.a_km, 0.0, sat.elements.i_rad)));
    for (size_t k = 0; k < plane.samples.size(); k += 25) {
      const BetaEclipseSample& x = plane.samples[k];
      const double t_mid = x.day * seconds_per_day;
      const double span = 1.5 * period, t0 = t_mid - 0.5 * span;
      std::vector<Eigen::Vector3d> sun_nodes;
      for (double t = t0; t <= t0 + span + 60.0; t += 60.0) sun_nodes.push_back(erfa_sun(at_day(d, t / seconds_per_day)));
      auto sun_at = [&](double t) {
        const double u = (t - t0) / 60.0;
        const size_t j = std::min(sun_nodes.size() - 2, static_cast<size_t>(u));
        const double w = u - static_cast<double>(j);
        return Eigen::Vector3d((1.0 - w) * sun_nodes[j] + w * sun_nodes[j + 1]).normalized();
      };
      auto beta_direct_deg = [&](double t) {
        const StateVector st = state_at(d.earth, orbit, t);
        return std::asin(st.r_km.cross(st.v_km_s).normalized().dot(sun_at(t))) * deg_per_rad;
      };
      // Beta at the sample instant against ERFA: 0.02 deg (Almanac Sun) + 0.005 deg (nutation) + rounding.
      const double beta_mid = beta_direct_deg(t_mid);
      CHECK(std::abs(x.beta_deg - beta_mid) < 0.03);
      worst_beta_deg = std::max(worst_beta_deg, std::abs(x.beta_deg - beta_mid));
      // Shadow runs inside the window (runs touching its edges are incomplete and skipped).
      const long steps = static_cast<long>(std::ceil(span / 0.5));
      const double dt = span / static_cast<double>(steps);
      std::vector<bool> dark(static_cast<size_t>(steps));
      for (long j = 0; j < steps; ++j) {
        const double t = t0 + static_cast<double>(j) * dt;
        dark[static_cast<size_t>(j)] = in_cylinder_shadow(state_at(d.earth, orbit, t).r_km, sun_at(t), radius);
      }
      double direct_min = 0.0, best = INFINITY, entry = t_mid, exit = t_mid;
      for (long j = 1; j < steps; ++j) {
        if (!dark[static_cast<size_t>(j)] || dark[static_cast<size_t>(j - 1)]) continue;
        long e = j;
        while (e < steps && dark[static_cast<size_t>(e)]) ++e;
        if (e == steps) break;
        const double t_in = t0 + static_cast<double>(j) * dt, t_out = t0 + static_cast<double>(e) * dt;
        if (std::abs(0.5 * (t_in + t_out) - t_mid) < best) {
          best = std::abs(0.5 * (t_in + t_out) - t_mid);
          direct_min = (t_out - t_in) / 60.0;
          entry = t_in;
          exit = t_out;
        }
      }
      const double b0 = std::abs(beta_direct_deg(entry)), b1 = std::abs(beta_mid), b2 = std::abs(beta_direct_deg(exit));
      const double lo = std::max(0.0, std::min({b0, b1, b2}) - 0.03), hi = std::max({b0, b1, b2}) + 0.03;
      const double ratio = (sun_mean_motion_rad_s + std::abs(orbit.rates.raan_rad_s)) /
                           (two_pi / period * std::cos(hi * rad_per_deg));
      const double least =
          circular_eclipse_fraction(sat.elements.a_km, radius, hi * rad_per_deg) * period / 60.0 * (1.0 - ratio) - 1.0 / 60.0;
      const double most =
          circular_eclipse_fraction(sat.elements.a_km, radius, lo * rad_per_deg) * period / 60.0 * (1.0 + ratio) + 1.0 / 60.0;
      CHECK(direct_min >= least);
      CHECK(direct_min <= most);
      CHECK(x.eclipse_min_per_orbit >= least);
      CHECK(x.eclipse_min_per_orbit <= most);
      worst_minutes_excess = std::max(worst_minutes_excess, std::abs(direct_min - x.eclipse_min_per_orbit));
      if (hi < shell.beta_limit_deg - 10.0)
        worst_away_from_limit = std::max(worst_away_from_limit, std::abs(direct_min - x.eclipse_min_per_orbit));
      ++checks;
      if (direct_min > 0.0) ++eclipsed_checks;
    }
  }
  MESSAGE("direct checks: " << checks << " orbits, " << eclipsed_checks << " with an eclipse; worst beta difference "
                            << worst_beta_deg << " deg, worst eclipse difference " << worst_minutes_excess * 60.0
                            << " s (" << worst_away_from_limit * 60.0 << " s with |beta| 10 deg or more below beta*)");
  CHECK(checks == 5 * 15);
  CHECK(eclipsed_checks >= 45);  // the test must see eclipses to mean anything (the dawn plane sees few)
}

TEST_CASE("beta and eclipse: the sampled shadow equals the closed form on a circle and a brute force on an ellipse") {
  const EarthModel earth = wgs84;
  const double i = 53.0 * rad_per_deg, raan = 1.1;
  const Eigen::Vector3d h(std::sin(i) * std::sin(raan), -std::sin(i) * std::cos(raan), std::cos(i));
  const Eigen::Vector3d node(std::cos(raan), std::sin(raan), 0.0);
  const Eigen::Vector3d in_plane = h.cross(node);
  for (double beta_deg : {0.0, 15.0, -40.0, 60.0, 66.0, 75.0}) {
    const double b = beta_deg * rad_per_deg;
    const Eigen::Vector3d s = std::cos(b) * (std::cos(0.7) * node + std::sin(0.7) * in_plane) + std::sin(b) * h;
    CHECK(beta_angle_rad(i, raan, s) == doctest::Approx(b).epsilon(1e-12).scale(1.0));
    // Circle, a = 6928 km (550 km): bisection to 1e-10 rad of mean anomaly, so 1e-9 on the share.
    const MeanElements circle{6928.137, 0.0, i, raan, 0.3, 0.0};
    const ShadowShares c = sampled_shadow_shares(earth, circle, s, 720);
    CHECK(std::abs(c.total - circular_eclipse_fraction(circle.a_km, earth.radius_km, b)) < 1e-9);
    CHECK(c.longest_arc == doctest::Approx(c.total).epsilon(1e-12));
    // Ellipse (the small design's probe: a = 7300 km, e = 0.02, perigee at 90 deg): brute force over 40000 steps
    // of mean anomaly with the cylinder test above, so within 2 steps (5e-5) of the share.
    for (double argp : {0.0, 1.5708, 3.0}) {
      const MeanElements ellipse{7300.0, 0.02, i, raan, argp, 0.0};
      long shadowed = 0;
      const int n = 40000;
      for (int k = 0; k < n; ++k) {
        MeanElements x = ellipse;
        x.mean_anomaly_rad = two_pi * k / n;
        if (in_cylinder_shadow(state_from_elements(earth, x).r_km, s, earth.radius_km)) ++shadowed;
      }
      const ShadowShares e = sampled_shadow_shares(earth, ellipse, s, 720);
      CHECK(std::abs(e.total - static_cast<double>(shadowed) / n) < 5e-5);
      CHECK(e.longest_arc == doctest::Approx(e.total).epsilon(1e-12));  // one arc: the ellipse is outside the Earth
    }
  }
}

TEST_CASE("beta and eclipse: a dawn-dusk plane (LTAN 06:00, 700 km) is eclipse-free around the June solstice") {
  // Derivation: the sun-synchronous node keeps Omega = RA(mean Sun) - 90 deg, so Omega - RA(Sun) = -90 deg + Delta,
  // Delta the equation of time as an angle. With Delta = 0: sin beta = -cos(dec) sin i + sin(dec) cos i =
  // sin(dec - i). At i = 98.19 deg (shared/references.md 2.3) beta runs from dec - i = -74.75 deg at the June
  // solstice (dec = +23.44 deg) to 180 - i - 23.44 = 58.37 deg in size at the December solstice. There is an
  // eclipse when |beta| < beta* = asin(Re / r) = 64.3 deg, i.e. when dec - i < -(180 deg - beta*):
  // dec < dec* = i - 180 deg + beta* = -17.5 deg. Delta (at most 4.2 deg, the 16.5 min equation of time) moves
  // sin beta by at most sin i (1 - cos Delta) = 0.0027, i.e. beta by 0.35 deg near beta*, which moves dec* by
  // as much: a 0.6 deg margin in declination is kept on both sides.
  const Design d = test_design();
  const BetaEclipseResult r = compute_beta_eclipse(d);
  const ShellBetaEclipse& dawn = shell_named(r, "dawn");
  const double i_deg = d.shells[1].inclination_deg;
  CHECK(i_deg == doctest::Approx(98.188).epsilon(2e-5));  // shared/references.md 2.3, COMPUTED
  CHECK(dawn.beta_limit_deg == doctest::Approx(std::asin(d.earth.radius_km / (d.earth.radius_km + 700.0)) * deg_per_rad));
  const double dec_star = i_deg - 180.0 + dawn.beta_limit_deg;
  CHECK(dec_star == doctest::Approx(-17.5).epsilon(0.01));
  const auto& samples = dawn.planes.at(0).samples;
  REQUIRE(samples.size() == 366);
  int june = 0, december = 0, free_days = 0, judged = 0;
  double dec_max = -90, dec_min = 90;
  for (size_t k = 0; k < samples.size(); ++k) {
    const double dec = erfa_declination_deg(at_day(d, samples[k].day));
    if (dec > dec_max) { dec_max = dec; june = static_cast<int>(k); }
    if (dec < dec_min) { dec_min = dec; december = static_cast<int>(k); }
    if (dec > dec_star + 0.6) { CHECK(samples[k].eclipse_fraction == 0.0); ++judged; }
    if (dec < dec_star - 0.6) { CHECK(samples[k].eclipse_fraction > 0.0); ++judged; }
    if (samples[k].eclipse_fraction == 0.0) ++free_days;
  }
  CHECK(judged >= 350);
  // The solstices of 2026 from ERFA's Sun: about 21 June (day 171) and 21 December (day 354).
  CHECK(std::abs(june - 171) <= 1);
  CHECK(std::abs(december - 354) <= 1);
  // The eclipse-free season is one run of days (the year is one season of eclipses around December).
  int runs = 0;
  for (size_t k = 0; k < samples.size(); ++k)
    if (samples[k].eclipse_fraction == 0.0 && (k == 0 || samples[k - 1].eclipse_fraction > 0.0)) ++runs;
  CHECK(runs == 1);
  for (int k = june - 60; k <= june + 60; ++k) CHECK(samples[static_cast<size_t>(k)].eclipse_fraction == 0.0);
  // beta at the June solstice: dec - i (Delta is 0.4 deg then, a 0.01 deg effect), within 0.05 deg.
  CHECK(std::abs(samples[static_cast<size_t>(june)].beta_deg - (dec_max - i_deg)) < 0.05);
  // The longest eclipse: at the December solstice, |beta| = 180 - i + dec_min (dec_min < 0), the closed form
  // there within a 0.1 deg band of beta.
  const double beta_dec = 180.0 - i_deg + dec_min;
  CHECK(beta_dec == doctest::Approx(58.37).epsilon(1e-3));
  const double a_km = d.shells[1].a_km, radius = d.earth.radius_km, period = dawn.period_s;
  const double lo = circular_eclipse_fraction(a_km, radius, (beta_dec + 0.1) * rad_per_deg) * period / 60.0;
  const double hi = circular_eclipse_fraction(a_km, radius, (beta_dec - 0.1) * rad_per_deg) * period / 60.0;
  const PlaneBetaEclipse& plane = dawn.planes.at(0);
  CHECK(plane.longest_eclipse_min >= lo);
  CHECK(plane.longest_eclipse_min <= hi);
  CHECK(std::abs(plane.longest_eclipse_day - december) <= 3.0);
  CHECK(plane.eclipse_free_days == doctest::Approx(free_days));
  MESSAGE("dawn-dusk 700 km: beta " << plane.beta_min_deg << " to " << plane.beta_max_deg << " deg, eclipse-free "
                                    << free_days << " of 366 days, longest eclipse " << plane.longest_eclipse_min
                                    << " min on day " << plane.longest_eclipse_day);
}

TEST_CASE("beta and eclipse: a noon plane (LTAN 12:00, 700 km) keeps beta small and the eclipse near its maximum") {
  // Derivation: the node follows the mean Sun, Omega - RA(Sun) = Delta (the equation of time as an angle,
  // |Delta| <= 4.2 deg: at most 16.5 min, Astronomical Almanac, common practice figure as in
  // tests/time/sun_test.cpp). sin beta = cos(dec) sin i sin Delta + sin(dec) cos i, so
  // |sin beta| <= sin 4.2 deg + sin 23.44 deg |cos i| = 0.0732 + 0.0567 (i = 98.19 deg): |beta| <= 7.46 deg.
  // The eclipse share is the closed form's, between its value at that bound and at beta = 0,
  // asin(Re / r) / pi = 0.357 of the orbit (35.3 min of 98.8, shared/references.md 9.1, COMPUTED).
  const Design d = test_design();
  const BetaEclipseResult r = compute_beta_eclipse(d);
  const ShellBetaEclipse& noon = shell_named(r, "noon");
  const double i_deg = d.shells[2].inclination_deg;
  const double bound_deg =
      std::asin(std::sin(4.2 * rad_per_deg) + std::sin(23.44 * rad_per_deg) * std::abs(std::cos(i_deg * rad_per_deg))) * deg_per_rad;
  CHECK(bound_deg == doctest::Approx(7.46).epsilon(2e-3));
  const double a_km = d.shells[2].a_km, radius = d.earth.radius_km, period = noon.period_s;
  const double max_min = std::asin(radius / a_km) / pi * period / 60.0;
  CHECK(max_min == doctest::Approx(35.3).epsilon(2e-3));
  CHECK(noon.max_eclipse_min == doctest::Approx(max_min).epsilon(1e-12));
  const double least = circular_eclipse_fraction(a_km, radius, bound_deg * rad_per_deg) * period / 60.0;
  const PlaneBetaEclipse& plane = noon.planes.at(0);
  for (const auto& x : plane.samples) {
    CHECK(std::abs(x.beta_deg) <= bound_deg);
    CHECK(x.eclipse_min_per_orbit >= least);
    CHECK(x.eclipse_min_per_orbit <= max_min);
  }
  CHECK(least > 0.99 * max_min);
  // beta changes sign during the year (dec cos i and the equation of time both change sign), so the daily
  // samples pass within a day's motion of beta = 0 and the longest eclipse is the maximum to 0.1 %.
  CHECK(plane.beta_min_deg < 0.0);
  CHECK(plane.beta_max_deg > 0.0);
  CHECK(plane.longest_eclipse_min == doctest::Approx(max_min).epsilon(1e-3));
  CHECK(plane.eclipse_free_days == 0.0);
  MESSAGE("noon 700 km: beta " << plane.beta_min_deg << " to " << plane.beta_max_deg << " deg (bound " << bound_deg
                               << "), eclipse " << least << " to " << plane.longest_eclipse_min << " min");
}

TEST_CASE("beta and eclipse: span, step and orbit samples are checked before any work") {
  const Design d = test_design();
  auto message = [&](BetaEclipseOptions o) {
    try {
      compute_beta_eclipse(d, o);
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(message({0.0, 1.0, 720}) == "beta and eclipse span = 0 days: expected a positive number of days");
  CHECK(message({365.0, std::nan(""), 720}) == "beta and eclipse step = nan days: expected a positive number of days");
  CHECK(message({365.0, 0.001, 720}).find("365001 samples per plane, above the limit of 100000") != std::string::npos);
  CHECK(message({365.0, 1.0, 4}) == "beta and eclipse orbit samples = 4: expected 8 to 100000");
  // The eccentric work is bounded before it starts: 16000 eccentric planes x 366 days x 720 samples = 4.2e9 > 4e9.
  const Design many = read_design_text(
      "name: Kestrel many planes\nepoch: 2026-01-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1.0\n"
      "  drag_coefficient: 2.2\nshells:\n"
      "  - name: wide\n    pattern: walker-delta\n    satellites: 16000\n    planes: 16000\n    phasing: 0\n"
      "    semi_major_axis_km: 7300\n    eccentricity: 0.02\n    inclination_deg: 63.4\n",
      "many.yaml");
  std::string refused;
  try {
    compute_beta_eclipse(many);
  } catch (const InputError& e) {
    refused = e.what();
  }
  CHECK(refused == "beta and eclipse: 5856000 eccentric plane-days sampled 720 times per orbit, above the limit of "
                   "4000000000 shadow samples (eclipses of eccentric orbits are found along each orbit); expected "
                   "fewer eccentric planes");
  const BetaEclipseResult r = compute_beta_eclipse(d, {10.0, 2.5, 720});
  REQUIRE(r.shells.size() == 3);
  CHECK(r.shells[0].planes.size() == 3);
  CHECK(r.shells[0].planes[0].samples.size() == 5);  // days 0, 2.5, 5, 7.5, 10
  CHECK(r.shells[0].planes[0].samples.back().day == 10.0);
}
