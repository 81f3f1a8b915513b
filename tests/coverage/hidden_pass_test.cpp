// Evidence for lib/skein/coverage/engine/hidden_pass.hpp and its use by the evaluator: passes that begin and end
// between two sample instants are found, with their durations, at any step.
#include <doctest/doctest.h>

#include <cmath>

#include "coverage_test_designs.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/engine/hidden_pass.hpp"
#include "skein/orbit/secular.hpp"

using namespace skein;
using namespace skein::coverage_engine;

namespace {
// Inertial rate of the true longitude Omega + omega + M of an equatorial circular orbit under J2 (rad/s).
double longitude_rate(const EarthModel& earth, double a_km) {
  const SecularRates r = secular_rates(earth, a_km, 0.0, 0.0);
  return r.raan_rad_s + r.argp_rad_s + r.mean_anomaly_rad_s;
}

// Earth-central angle of the edge of a nadir cone of half-angle eta (rad) seen from radius r on a sphere of
// radius R: lambda = asin(r sin eta / R) - eta (law of sines in the Earth centre, point, satellite triangle;
// Wertz & Larson, SMAD 3rd ed. sec. 5.2).
double cone_central_angle_rad(double r_km, double R_km, double eta_rad) {
  return std::asin(r_km * std::sin(eta_rad) / R_km) - eta_rad;
}
}  // namespace

TEST_CASE("hidden pass search: a bump narrower than the interval is found with its roots") {
  // A margin with a single narrow peak: m(t) = 0.01 - (t - 37)^2 / 100 on [0, 60]: in view on
  // 37 +- 1 s, out of view at both ends, rising at 0 and falling at 60. Exact roots 36 and 38.
  const auto m = [](double t) { return MarginSample{0.01 - (t - 37.0) * (t - 37.0) / 100.0, -(t - 37.0) / 50.0}; };
  const auto p = find_hidden_pass(0.0, 60.0, m(0.0), m(60.0), [&](double tau) { return m(60.0 * tau); });
  REQUIRE(p.has_value());
  CHECK(p->rise_s == doctest::Approx(36.0).epsilon(1e-7));  // 1e-9 of the step is the stated tolerance
  CHECK(p->set_s == doctest::Approx(38.0).epsilon(1e-7));
  // The same bump lowered below zero: no pass.
  const auto low = [](double t) { return MarginSample{-0.001 - (t - 37.0) * (t - 37.0) / 100.0, -(t - 37.0) / 50.0}; };
  CHECK_FALSE(find_hidden_pass(0.0, 60.0, low(0.0), low(60.0), [&](double tau) { return low(60.0 * tau); }).has_value());
  // Rising at both ends (the maximum is at the end, not inside): not searched.
  CHECK_FALSE(find_hidden_pass(0.0, 30.0, m(0.0), m(30.0), [&](double tau) { return m(30.0 * tau); }).has_value());
}

TEST_CASE("hidden pass bounds: the swept footprint holds every point within lambda + eps of the chord") {
  // Spherical geometry check: with the two ends D apart, a point across the midpoint at lambda + eps is at
  // acos(cos(lambda + eps) cos(D/2)) from either end (spherical Pythagoras, Todhunter, "Spherical
  // Trigonometry", 1886, art. 62: cos c = cos a cos b for a right triangle).
  const double lambda = 0.3, eps = 0.01, d = 0.2;
  const double c = swept_footprint_cos(std::cos(lambda), eps, std::cos(d));
  CHECK(c == doctest::Approx(std::cos(lambda + eps) * std::cos(d / 2)).epsilon(1e-11));
  // Track deviation: zero frame rate means no curvature (a great circle), only the 1e-9 floor remains.
  TrackRates t{0.001, 0.0012, 0.0, 0.0};
  CHECK(track_deviation_bound_rad(t, 60.0) == doctest::Approx(1e-9));
  // Earth rotation gives a positive bound that grows with the square of the step (kappa L^2 / 4).
  t.frame_rate_rad_s = 7.292115e-5;
  const double e60 = track_deviation_bound_rad(t, 60.0), e120 = track_deviation_bound_rad(t, 120.0);
  CHECK(e60 > 1e-6);
  CHECK(e120 / e60 == doctest::Approx(4.0).epsilon(1e-3));
}

TEST_CASE("coverage: an equatorial pass shorter than the step is found with its exact duration") {
  // An equatorial circular orbit at 540 km with a 5 deg nadir cone: the footprint's central angle is
  // lambda = asin(r sin eta / R) - eta = 0.43 deg, and a site on the equator sees the satellite for
  // 2 lambda / w_rel = 14.6 s per synodic period (w_rel = dL/dt - w_E; Vallado 2013 eq. 9-41 for the J2
  // rates), far less than the 60 s step. At the equator the WGS-84 normal is radial and the site's radius is
  // the equatorial radius, so the relation is exact there. Sites at several longitudes put the pass at
  // different phases of the step.
  Design d = read_design_text(
      test::coverage_design_head() + test::equatorial_satellite(540.0, 0.0) +
          "coverage:\n  grid:\n    kind: sites\n    sites:\n"
          "      - name: a\n        lat_deg: 0\n        lon_deg: 10\n"
          "      - name: b\n        lat_deg: 0\n        lon_deg: 33.3\n"
          "      - name: c\n        lat_deg: 0\n        lon_deg: -71.7\n"
          "      - name: d\n        lat_deg: 0\n        lon_deg: 145.25\n"
          "  min_elevation_deg: 10\n  nadir_half_angle_deg: 5\n  step_s: 60\n  max_fold: 1\n",
      "eq_cone.yaml");
  const double a = d.shells[0].a_km;
  const double w_rel = longitude_rate(d.earth, a) - d.earth.rotation_rad_s;
  const double lambda = cone_central_angle_rad(a, d.earth.radius_km, 5.0 * rad_per_deg);
  const double pass_s = 2.0 * lambda / w_rel;
  REQUIRE(pass_s < 20.0);
  CoverageOptions o;
  o.span_s = 3.0 * two_pi / w_rel;  // three synodic periods: each site has exactly three passes
  for (CoverageMode mode : {CoverageMode::culled, CoverageMode::exhaustive}) {
    CAPTURE(to_string(mode));
    o.mode = mode;
    const CoverageResult r = evaluate_coverage(d, o);
    // 4 sites x 3 passes; a 14.6 s pass holds a sample instant about a quarter of the time (those are found as
    // ordinary rises and sets, on the satellite's path since the step is long against the pass).
    CHECK(r.hidden_passes >= 6);
    CHECK(r.hidden_passes <= 12);
    for (const PointCoverage& p : r.points) {
      CAPTURE(p.point.lon_deg);
      // Covered time = three passes. Tolerance 1 ms per boundary: the cubic path's position error at 60 s is
      // under 1 m (r.path_error_bound_m), under 0.2 ms of ground-track motion; the roots are to 6e-8 s.
      CHECK(p.percent_by_fold[0] / 100.0 * o.span_s.value() == doctest::Approx(3.0 * pass_s).epsilon(6e-3 / (3.0 * pass_s)));
      CHECK(p.gap_count == 4);  // before the first pass, two between, after the last
    }
    CHECK(r.path_error_bound_m < 1.0);
  }
}

TEST_CASE("coverage: narrow payload cones at the default 60 s step agree with a 1 s step within 1 %") {
  // The case that lost most of its coverage before passes between instants were searched: the 12-satellite
  // sun-synchronous imaging shell of designs/demo.yaml (540 km, three planes) with a 15 deg and a 5 deg
  // payload cone. The reference is the same evaluation at a 1 s step, where a pass of the 5 deg cone (up to
  // 14 s long) spans many instants. A 2 deg band grid over +-60 deg and 3 h keep the reference to seconds.
  for (double cone : {15.0, 5.0}) {
    CAPTURE(cone);
    const std::string text =
        test::coverage_design_head() +
        "shells:\n  - name: imaging\n    pattern: walker-delta\n    satellites: 12\n    planes: 3\n    phasing: 1\n"
        "    altitude_km: 540\n    inclination_deg: sun-synchronous\n    ltan: \"10:30\"\n" +
        fmt::format("coverage:\n  grid:\n    kind: band\n    spacing_deg: 2\n    lat_min_deg: -60\n    lat_max_deg: 60\n"
                    "  min_elevation_deg: 10\n  nadir_half_angle_deg: {}\n  span_h: 3\n  max_fold: 1\n",
                    cone);
    const Design d = read_design_text(text, "cone.yaml");
    CoverageOptions o;  // default step (60 s)
    const CoverageResult coarse = evaluate_coverage(d, o);
    o.step_s = 1.0;
    const CoverageResult fine = evaluate_coverage(d, o);
    MESSAGE("cone ", cone, " deg: 60 s ", coarse.total.percent_by_fold[0], " %, 1 s ", fine.total.percent_by_fold[0],
            " %, passes found between instants: ", coarse.hidden_passes);
    CHECK(coarse.hidden_passes > 0);
    CHECK(coarse.total.percent_by_fold[0] == doctest::Approx(fine.total.percent_by_fold[0]).epsilon(0.01));
    CHECK(coarse.total.mean_in_view == doctest::Approx(fine.total.mean_in_view).epsilon(0.01));
  }
}
