// Evidence for lib/skein/design: the design reader, Walker expansion and the messages for bad input.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "skein/constants.hpp"
#include "skein/design/constellation.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/time/sun.hpp"

using namespace skein;

namespace {
const std::string head = R"(name: test
epoch: 2027-03-01T00:00:00Z
spacecraft:
  dry_mass_kg: 100
  drag_area_m2: 1
  drag_coefficient: 2.2
shells:
)";

std::string error_of(const std::string& text) {
  try {
    read_design_text(text, "t.yaml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
}  // namespace

TEST_CASE("design: Walker delta 24/3/1 expands per Walker's definition") {
  // Source: J.G. Walker, "Satellite constellations", JBIS 37 (1984): T/P/F puts P planes 360/P apart in node,
  // T/P satellites per plane 360/(T/P) apart, and each plane's satellites F*360/T ahead of the previous plane's.
  const Design d = read_design_text(head + R"(  - name: a
    pattern: walker-delta
    satellites: 24
    planes: 3
    phasing: 1
    altitude_km: 1000
    inclination_deg: 55
    raan_deg: 10
)", "t.yaml");
  const auto sats = expand_constellation(d);
  REQUIRE(sats.size() == 24);
  CHECK(sats[0].elements.raan_rad * deg_per_rad == doctest::Approx(10.0));
  CHECK(sats[8].elements.raan_rad * deg_per_rad == doctest::Approx(130.0));
  CHECK(sats[16].elements.raan_rad * deg_per_rad == doctest::Approx(250.0));
  CHECK(sats[1].arg_latitude_rad * deg_per_rad == doctest::Approx(45.0));
  CHECK(sats[8].arg_latitude_rad * deg_per_rad == doctest::Approx(15.0));   // F*360/T = 15 deg
  CHECK(sats[16].arg_latitude_rad * deg_per_rad == doctest::Approx(30.0));
  CHECK(sats[9].id == "a-p02-s02");
  CHECK(sats[5].elements.a_km == doctest::Approx(wgs84.radius_km + 1000.0));
}

TEST_CASE("design: Walker star spreads planes over 180 deg, and explicit planes keep their slots") {
  const Design d = read_design_text(head + R"(  - name: polar
    pattern: walker-star
    satellites: 6
    planes: 3
    phasing: 0
    altitude_km: 780
    inclination_deg: 86.4
  - name: odd
    pattern: explicit
    semi_major_axis_km: 7000
    eccentricity: 0.01
    arg_perigee_deg: 90
    inclination_deg: 40
    planes:
      - raan_deg: 0
        slots_deg: [0, 100]
      - raan_deg: 200
        slots_deg: [45]
)", "t.yaml");
  const auto sats = expand_constellation(d);
  REQUIRE(sats.size() == 9);
  CHECK(sats[2].elements.raan_rad * deg_per_rad == doctest::Approx(60.0));
  CHECK(sats[4].elements.raan_rad * deg_per_rad == doctest::Approx(120.0));
  CHECK(d.shells[1].satellites == 3);
  CHECK(sats[7].arg_latitude_rad * deg_per_rad == doctest::Approx(100.0));
  CHECK(sats[7].elements.mean_anomaly_rad * deg_per_rad == doctest::Approx(10.0));  // u - omega
  CHECK(sats[8].elements.raan_rad * deg_per_rad == doctest::Approx(200.0));
}

TEST_CASE("design: a sun-synchronous shell takes its inclination from J2 and its node from ltan") {
  const Design d = read_design_text(head + R"(  - name: sso
    pattern: walker-delta
    satellites: 2
    planes: 2
    phasing: 0
    altitude_km: 700
    inclination_deg: sun-synchronous
    ltan: "10:30"
)", "t.yaml");
  CHECK(d.shells[0].inclination_deg == doctest::Approx(98.19).epsilon(2e-4));
  const auto sats = expand_constellation(d);
  CHECK(local_time_of_node_h(sats[0].elements.raan_rad, julian_date(d.epoch)) == doctest::Approx(10.5));
  CHECK(local_time_of_node_h(sats[1].elements.raan_rad, julian_date(d.epoch)) == doctest::Approx(22.5));
}

TEST_CASE("design: errors name the line, the key and what was expected") {
  const std::string walker = head + "  - name: a\n    pattern: walker-delta\n";
  CHECK(error_of(walker + "    satellites: 10\n    planes: 3\n    phasing: 0\n    altitude_km: 700\n    inclination_deg: 50\n") ==
        "t.yaml:11:13: shells[0].planes: T = 10 satellites do not divide into P = 3 equal planes; expected P to divide T");
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 3\n    altitude_km: 700\n    inclination_deg: 50\n") ==
        "t.yaml:12:14: shells[0].phasing: F = 3 is outside 0..P-1 = 0..2");
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: 700\n    inclinaton_deg: 50\n") ==
        "t.yaml:14:5: shells[0]: unknown key \"inclinaton_deg\"; did you mean \"inclination_deg\"?");
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    planes: 3\n    phasing: 1\n    altitude_km: 700\n    inclination_deg: 50\n") ==
        "t.yaml:12:5: shells[0]: key \"planes\" appears twice (first at line 11); keep one");
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: 50\n    inclination_deg: 50\n")
            .starts_with("t.yaml:13:18: shells[0].altitude_km: perigee altitude 50.0 km is below 100 km"));
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: 700\n    eccentricity: 1.2\n    inclination_deg: 50\n")
            .starts_with("t.yaml:14:19: shells[0].eccentricity: eccentricity 1.2 is not a closed orbit"));
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: 700\n    inclination_deg: 190\n")
            .starts_with("t.yaml:14:22: shells[0].inclination_deg: 190 is out of range; expected an inclination in degrees or sun-synchronous from 0 to 180"));
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: 9000\n    inclination_deg: sun-synchronous\n    ltan: \"06:00\"\n")
            .starts_with("t.yaml:14:22: shells[0].inclination_deg: no sun-synchronous inclination exists"));
  CHECK(error_of(walker + "    satellites: nine\n    planes: 3\n    phasing: 1\n    altitude_km: 700\n    inclination_deg: 50\n") ==
        "t.yaml:10:17: shells[0].satellites: expected the total number of satellites T (a whole number), got \"nine\"");
  CHECK(error_of(walker + "    satellites: 9\n    planes: 3\n    phasing: 1\n    altitude_km: .nan\n    inclination_deg: 50\n")
            .starts_with("t.yaml:13:18: shells[0].altitude_km: expected an altitude"));
  CHECK(error_of("name: [unclosed\n").starts_with("t.yaml:"));
}

TEST_CASE("design: Walker phasing of very large patterns does not overflow (fuzz regression)") {
  // fuzz/regressions/walker_phasing_overflow.yaml: T = P = 100000, F = 99999 once overflowed int in P*F.
  Shell s;
  s.pattern = PatternKind::walker_delta;
  s.satellites = 100000;
  s.planes = 100000;
  s.phasing = 99999;
  const double u = walker_slot_arg_latitude_rad(s, 21476, 0) * deg_per_rad;
  const double expected = std::fmod(21476.0 * 99999.0 * 360.0 / 100000.0, 360.0);
  CHECK(u == doctest::Approx(expected).epsilon(1e-9));
}
