// Evidence for daylight at the target (coverage.min_sun_elevation_deg, engine/daylight.*): the times the Sun
// crosses the threshold against ERFA's Sun, and lit coverage against a brute-force scan of every satellite's
// elevation and the Sun's elevation at each site.
#include <doctest/doctest.h>
#include <erfa.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "../time/erfa_sun.hpp"
#include "coverage_test_designs.hpp"
#include "skein/constants.hpp"
#include "skein/coverage/engine/daylight.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"
#include "skein/time/sun.hpp"

using namespace skein;
using coverage_engine::DaylightMask;
using coverage_engine::PointGeo;

namespace {

PointGeo vertical_point(double lat_deg, double lon_deg) {
  const double la = lat_deg * rad_per_deg, lo = lon_deg * rad_per_deg;
  PointGeo p{};
  p.nx = std::cos(la) * std::cos(lo);
  p.ny = std::cos(la) * std::sin(lo);
  p.nz = std::sin(la);
  return p;
}

// sin(Sun elevation) - sin(threshold) from ERFA: the Sun of date (eraEpv00 + eraPnm06a, tests/time/erfa_sun.hpp)
// turned to the Earth-fixed frame by the Greenwich apparent sidereal time eraGst06a (UT1 taken as UTC, as skein
// does).
double erfa_margin(const JulianDate& epoch, const PointGeo& p, double t, double sin_min) {
  JulianDate jd = epoch;
  jd.fraction += t / seconds_per_day;
  const Eigen::Vector3d s = test::erfa_sun_of_date(jd).normalized();
  const double tt = jd.fraction + 69.184 / seconds_per_day;
  const double g = eraGst06a(jd.day, jd.fraction, jd.day, tt);
  const double c = std::cos(g), sn = std::sin(g);
  return p.nx * (c * s.x() + sn * s.y()) + p.ny * (-sn * s.x() + c * s.y()) + p.nz * s.z() - sin_min;
}

}  // namespace

TEST_CASE("daylight: sunrise and sunset at a threshold agree with ERFA's Sun") {
  // Reference: ERFA's Sun (VSOP-based eraEpv00, precession-nutation eraPnm06a, sidereal time eraGst06a), its
  // threshold crossings found by a 60 s scan and bisection to 1e-6 s. skein uses the Almanac's low-precision Sun,
  // within 0.02 deg of ERFA (tests/time/sun_test.cpp), and mean sidereal time (the equation of the equinoxes,
  // at most 1.2 s of time, 0.005 deg, is neglected). Tolerance: 0.03 deg of elevation divided by the Sun's
  // elevation rate at the crossing (measured on the ERFA margin), plus 1 ms: a few seconds at these sites.
  const UtcEpoch e = *parse_utc_iso8601("2027-06-10T00:00:00Z");
  const JulianDate epoch = julian_date(e);
  DaylightMask mask;
  mask.epoch = epoch;
  mask.theta0_rad = greenwich_mean_sidereal_angle_rad(epoch);
  mask.rotation_rad_s = 7.292115e-5;  // WGS-84 (the design's Earth model in the coverage tests)
  struct Case {
    double lat_deg, lon_deg, sun_deg;
  };
  // An invented harbour at mid-latitude, a high-latitude one near the midsummer limit of night, an equatorial
  // and a southern one in winter (noon Sun about 22 deg); thresholds from civil twilight to 12 deg.
  for (const Case c : {Case{40.0, 15.0, 10.0}, Case{62.0, 6.0, 0.0}, Case{1.3, 103.8, -6.0}, Case{-45.0, 170.0, 12.0}}) {
    CAPTURE(c.lat_deg);
    CAPTURE(c.sun_deg);
    mask.sin_min = std::sin(c.sun_deg * rad_per_deg);
    const PointGeo p = vertical_point(c.lat_deg, c.lon_deg);
    const double span = 3.0 * seconds_per_day;
    // Reference crossings.
    std::vector<double> ref;
    double t = 0.0, f = erfa_margin(epoch, p, t, mask.sin_min);
    const bool lit0 = f >= 0.0;
    while (t < span) {
      const double t2 = std::min(span, t + 60.0), f2 = erfa_margin(epoch, p, t2, mask.sin_min);
      if ((f >= 0.0) != (f2 >= 0.0)) {
        double lo = t, hi = t2;
        while (hi - lo > 1e-6) {
          const double mid = 0.5 * (lo + hi);
          ((erfa_margin(epoch, p, mid, mask.sin_min) >= 0.0) == (f >= 0.0) ? lo : hi) = mid;
        }
        ref.push_back(hi);
      }
      t = t2;
      f = f2;
    }
    // skein's crossings.
    std::vector<double> ours;
    bool lit = mask.margin(p, 0.0) >= 0.0;
    CHECK(lit == lit0);
    for (double x = mask.next_change(p, 0.0, lit, span); x <= span; x = mask.next_change(p, x, lit, span)) {
      ours.push_back(x);
      lit = !lit;
    }
    REQUIRE(ours.size() == ref.size());
    CHECK(ref.size() >= 5);  // days and nights happen at each case
    for (size_t k = 0; k < ref.size(); ++k) {
      const double rate = std::abs(erfa_margin(epoch, p, ref[k] + 1.0, mask.sin_min) -
                                   erfa_margin(epoch, p, ref[k] - 1.0, mask.sin_min)) / 2.0;  // d sin(h)/dt
      const double dh_dt_deg_s = rate / std::cos(c.sun_deg * rad_per_deg) * deg_per_rad;
      const double tol = 0.03 / dh_dt_deg_s + 1e-3;
      CAPTURE(k);
      CAPTURE(tol);
      CHECK(std::abs(ours[k] - ref[k]) < tol);
      CHECK(tol < 30.0);  // the tolerance stays meaningful (well under a minute)
    }
  }
}

TEST_CASE("daylight: sunset near the equinox matches the standard hour-angle formula") {
  // Closed form: the Sun's hour angle at elevation h0 is cos H = (sin h0 - sin phi sin dec) / (cos phi cos dec)
  // (Meeus, Astronomical Algorithms, 2nd ed., ch. 15, eq. 15.1; MEMORY, but it is the spherical triangle pole -
  // zenith - Sun). At 30 deg N with h0 = 0 and the declination near zero, H is about 90 deg. The declination and
  // right ascension are taken from skein's own almanac at the computed sunset, so the check isolates the root
  // search and the frame rotation; the formula treats the point's vertical as geocentric, as the test point
  // does. Tolerance 1 s of hour angle (the search brackets the root within 1e-4 s; 1 s leaves room for rounding
  // in the sidereal angle over a day).
  const JulianDate epoch = julian_date(*parse_utc_iso8601("2027-03-20T00:00:00Z"));
  DaylightMask mask;
  mask.epoch = epoch;
  mask.theta0_rad = greenwich_mean_sidereal_angle_rad(epoch);
  mask.rotation_rad_s = 7.292115e-5;
  mask.sin_min = 0.0;
  const double lat = 30.0 * rad_per_deg;
  const PointGeo p = vertical_point(30.0, 0.0);
  const bool lit = mask.margin(p, 0.0) >= 0.0;  // midnight at lon 0: dark
  REQUIRE(!lit);
  const double rise = mask.next_change(p, 0.0, false, 2.0 * seconds_per_day);
  const double set = mask.next_change(p, rise, true, 2.0 * seconds_per_day);
  JulianDate at = epoch;
  at.fraction += set / seconds_per_day;
  const SunPosition s = sun_position(at);
  const double cos_h = (0.0 - std::sin(lat) * std::sin(s.declination_rad)) / (std::cos(lat) * std::cos(s.declination_rad));
  const double hour_angle = std::acos(cos_h);
  // The point's local sidereal angle minus the Sun's right ascension at the computed sunset is the hour angle.
  const double local = mask.theta0_rad + mask.rotation_rad_s * set;
  const double h_ours = std::remainder(local - s.right_ascension_rad, 2.0 * pi);
  CHECK(std::abs(h_ours - hour_angle) * (1.0 / mask.rotation_rad_s) < 1.0);
  CHECK(set - rise > 11.9 * 3600.0);  // equinox: about 12 h of day
  CHECK(set - rise < 12.3 * 3600.0);
}

TEST_CASE("daylight: lit coverage of sites against a brute-force scan of satellite and Sun elevations") {
  // Reference: a 1 s scan over 24 h of every satellite's elevation (the same secular J2 orbits, Earth-fixed
  // through the same sidereal angle) and the Sun's elevation (the same Almanac Sun) at each site; a sample at t
  // stands for [t, t + 1 s). Covered time then errs by at most 1 s per boundary of a lit pass, and each gap by
  // at most 2 s (its two ends); the engine's crossing error is a few ms at a 60 s step (README). Tolerances:
  // percent covered within (boundaries x 1 s) / span; max gap within 2 s; gap count and lit passes exact.
  const Design d = read_design_text(
      test::coverage_design_head() + test::walker_shell(8, 2, 1, 600.0, 97.8) +
          "coverage:\n  grid:\n    kind: sites\n    sites:\n"
          "      - {name: saltmarsh, lat_deg: 40, lon_deg: 15}\n"
          "      - {name: northcape, lat_deg: 68, lon_deg: 20}\n"
          "      - {name: reefline, lat_deg: -10, lon_deg: 160}\n"
          "  min_elevation_deg: 10\n  min_sun_elevation_deg: 10\n  span_h: 24\n  step_s: 60\n  max_fold: 1\n",
      "daylight.yaml");
  const CoverageResult r = evaluate_coverage(d);
  const std::vector<Satellite> sats = expand_constellation(d);
  std::vector<SecularOrbit> orbits;
  for (const Satellite& s : sats) orbits.push_back(make_secular_orbit(d.earth, s.elements));
  const JulianDate epoch = julian_date(d.epoch);
  const double theta0 = greenwich_mean_sidereal_angle_rad(epoch);
  const double sin_mask = std::sin(10.0 * rad_per_deg), sin_sun = std::sin(10.0 * rad_per_deg);
  const size_t S = r.points.size(), T = sats.size();
  const long n = 86400;
  std::vector<long> covered(S, 0), gaps(S, 0), passes(S, 0), boundaries(S, 0);
  std::vector<double> max_gap(S, 0.0), gap_start(S, 0.0);
  std::vector<char> prev(S, 0);
  std::vector<std::vector<char>> prev_sat(S, std::vector<char>(T, 0));
  for (long j = 0; j < n; ++j) {
    const double t = static_cast<double>(j);
    const double theta = theta0 + d.earth.rotation_rad_s * t;
    const Eigen::Vector3d sun = test::scan_sun_earth_fixed(epoch, t, theta);
    std::vector<Eigen::Vector3d> pos(T);
    for (size_t s = 0; s < T; ++s) pos[s] = earth_fixed_state_at(d.earth, orbits[s], theta, t).r_km;
    for (size_t i = 0; i < S; ++i) {
      const GridPoint& g = r.points[i].point;
      const bool lit = g.up.dot(sun) >= sin_sun;
      bool any = false;
      for (size_t s = 0; s < T; ++s) {
        const Eigen::Vector3d dv = pos[s] - g.r_km;
        const bool seen = lit && g.up.dot(dv) >= sin_mask * dv.norm();
        if (seen && (j == 0 || !prev_sat[i][s])) ++passes[i];
        if (j > 0 && seen != static_cast<bool>(prev_sat[i][s])) ++boundaries[i];
        prev_sat[i][s] = seen;
        any = any || seen;
      }
      if (any) ++covered[i];
      if (j == 0 && !any) gap_start[i] = 0.0;
      if (j > 0 && any && !prev[i]) {
        ++gaps[i];
        max_gap[i] = std::max(max_gap[i], t - gap_start[i]);
      }
      if (j > 0 && !any && prev[i]) gap_start[i] = t;
      prev[i] = any;
    }
  }
  for (size_t i = 0; i < S; ++i) {
    if (!prev[i]) {  // the gap open at the end
      ++gaps[i];
      max_gap[i] = std::max(max_gap[i], static_cast<double>(n) - gap_start[i]);
    }
    const PointCoverage& p = r.points[i];
    CAPTURE(p.point.name);
    const double pct = 100.0 * static_cast<double>(covered[i]) / static_cast<double>(n);
    const double tol = 100.0 * static_cast<double>(boundaries[i] + 2) / static_cast<double>(n);
    CHECK(std::abs(p.percent_by_fold[0] - pct) <= tol);
    CHECK(std::abs(p.max_gap_s - max_gap[i]) <= 2.0);
    CHECK(p.gap_count == gaps[i]);
    CHECK(p.passes == passes[i]);
    CHECK(covered[i] > 0);  // lit passes happen at every site
  }
  // The mask matters: the far-north site in March sees passes in the dark that do not count.
  const Design plain = read_design_text(
      test::coverage_design_head() + test::walker_shell(8, 2, 1, 600.0, 97.8) +
          "coverage:\n  grid:\n    kind: sites\n    sites:\n      - {name: northcape, lat_deg: 68, lon_deg: 20}\n"
          "  min_elevation_deg: 10\n  span_h: 24\n  step_s: 60\n  max_fold: 1\n",
      "plain.yaml");
  CHECK(evaluate_coverage(plain).points[0].passes > r.points[1].passes);
}
