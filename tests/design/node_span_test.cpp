// Evidence for the node span of Walker shells (node_span_deg, ltan_span) and the per-plane listing of nodes and
// local times. Expected nodes and local times are worked out by hand from the stated rules: node_span_deg X puts
// plane j at raan + j X / P; ltan_span [first, last] puts plane j at first + j (last - first) / (P - 1) hours,
// and a local mean time turns with the node at exactly 15 deg per hour (its definition). Tolerances: 1e-9 deg
// and 1e-9 h absorb the rounding of a few additions and one wrap in double precision (about 1e-13 relative).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "skein/constants.hpp"
#include "skein/design/constellation.hpp"
#include "skein/design/plane_nodes.hpp"
#include "skein/error.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/layout_tables.hpp"
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
  - name: a
)";

std::string error_of(const std::string& text) {
  try {
    read_design_text(text, "t.yaml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

std::string sso(int t, int p, int f, const std::string& extra) {
  return head + "    pattern: walker-delta\n    satellites: " + std::to_string(t) + "\n    planes: " + std::to_string(p) +
         "\n    phasing: " + std::to_string(f) + "\n    altitude_km: 540\n    inclination_deg: sun-synchronous\n" + extra;
}

constexpr double tol = 1e-9;
}  // namespace

TEST_CASE("node span: three sun-synchronous planes over 09:30..11:30 sit at 9.5, 10.5 and 11.5 h") {
  const Design d = read_design_text(sso(9, 3, 1, "    ltan_span: [\"09:30\", \"11:30\"]\n"), "t.yaml");
  REQUIRE(d.shells[0].ltan_span_h.has_value());
  CHECK(*d.shells[0].ltan_span_h == doctest::Approx(2.0).epsilon(tol));
  CHECK(*d.shells[0].ltan_h == doctest::Approx(9.5).epsilon(tol));
  const auto planes = plane_nodes(d);
  REQUIRE(planes.size() == 3);
  const double expected_h[3] = {9.5, 10.5, 11.5};
  for (int j = 0; j < 3; ++j) {
    CHECK(planes[j].plane == j);
    CHECK(std::abs(planes[j].ltan_h - expected_h[j]) < tol);
  }
  // Nodes one hour = 15 deg apart; the first at the node of 09:30 at the epoch (the library's inverse of LTAN).
  const double raan0_deg = node_for_local_time_rad(9.5, julian_date(d.epoch)) * deg_per_rad;
  for (int j = 0; j < 3; ++j)
    CHECK(std::abs(std::remainder(planes[j].raan_deg - raan0_deg - 15.0 * j, 360.0)) < tol);
  // Phasing keeps Walker's unit F * 360 / T = 40 deg per plane, whatever the span; slots 120 deg apart.
  const auto sats = expand_constellation(d);
  REQUIRE(sats.size() == 9);
  CHECK(sats[3].arg_latitude_rad * deg_per_rad == doctest::Approx(40.0).epsilon(tol));
  CHECK(sats[7].arg_latitude_rad * deg_per_rad == doctest::Approx(200.0).epsilon(tol));  // plane 3, slot 2: 80 + 120
  CHECK(std::abs(std::remainder(sats[4].elements.raan_rad * deg_per_rad - planes[1].raan_deg, 360.0)) < tol);
}

TEST_CASE("node span: an ltan_span whose last time is earlier runs forward through midnight") {
  const Design d = read_design_text(sso(3, 3, 0, "    ltan_span: [\"22:00\", \"02:00\"]\n"), "t.yaml");
  const auto planes = plane_nodes(d);
  REQUIRE(planes.size() == 3);
  CHECK(std::abs(planes[0].ltan_h - 22.0) < tol);
  CHECK(std::abs(std::remainder(planes[1].ltan_h, 24.0)) < tol);  // midnight: 0 h (or a hair below 24)
  CHECK(std::abs(planes[2].ltan_h - 2.0) < tol);
}

TEST_CASE("node span: node_span_deg divides the span like Walker's 360 deg, and phasing unchanged") {
  const Design d = read_design_text(head + R"(    pattern: walker-delta
    satellites: 6
    planes: 3
    phasing: 1
    altitude_km: 700
    inclination_deg: 60
    raan_deg: 10
    node_span_deg: 60
)", "t.yaml");
  const auto planes = plane_nodes(d);
  REQUIRE(planes.size() == 3);
  CHECK(planes[0].raan_deg == doctest::Approx(10.0).epsilon(tol));
  CHECK(planes[1].raan_deg == doctest::Approx(30.0).epsilon(tol));
  CHECK(planes[2].raan_deg == doctest::Approx(50.0).epsilon(tol));
  const auto sats = expand_constellation(d);
  CHECK(sats[2].arg_latitude_rad * deg_per_rad == doctest::Approx(60.0).epsilon(tol));  // F * 360 / T = 60 deg
  CHECK(sats[4].arg_latitude_rad * deg_per_rad == doctest::Approx(120.0).epsilon(tol));
}

TEST_CASE("node span: a full span expands bit for bit like the plain pattern") {
  // node_span_deg 360 on a delta shell and 180 on a star shell name the patterns' own spreads, so the layout
  // must equal the one without the key exactly (same arithmetic), satellite by satellite.
  for (const std::string pattern : {"walker-delta", "walker-star"}) {
    const std::string base = head + "    pattern: " + pattern +
                             "\n    satellites: 24\n    planes: 6\n    phasing: 5\n    altitude_km: 800\n"
                             "    inclination_deg: 86\n    raan_deg: 33\n";
    const std::string span = pattern == "walker-delta" ? "360" : "180";
    const auto plain = expand_constellation(read_design_text(base, "t.yaml"));
    const auto spanned = expand_constellation(read_design_text(base + "    node_span_deg: " + span + "\n", "t.yaml"));
    REQUIRE(plain.size() == spanned.size());
    for (size_t k = 0; k < plain.size(); ++k) {
      CHECK(plain[k].elements.raan_rad == spanned[k].elements.raan_rad);
      CHECK(plain[k].arg_latitude_rad == spanned[k].arg_latitude_rad);
    }
  }
}

TEST_CASE("node span: the demo's 12/3/1 sun-synchronous shell lists planes at 10:30, 18:30 and 02:30") {
  // 360 / 3 = 120 deg between planes is 8 h of local time: 10:30, 18:30, 02:30.
  const Design d = read_design_file(std::string(SKEIN_SOURCE_DIR) + "/designs/demo.yaml");
  const Table t = plane_table(d);
  REQUIRE(t.rows.size() == 5);  // imaging: 3 planes, relay: 2
  const double expected_h[3] = {10.5, 18.5, 2.5};
  for (int j = 0; j < 3; ++j) {
    CHECK(std::get<std::string>(t.rows[j][0]) == "imaging");
    CHECK(std::get<long>(t.rows[j][1]) == j + 1);
    CHECK(std::abs(std::get<double>(t.rows[j][3]) - expected_h[j]) < tol);
  }
  // The relay shell (53 deg, raan 15 + 180 j) is listed with its nodes too.
  CHECK(std::get<double>(t.rows[3][2]) == doctest::Approx(15.0).epsilon(tol));
  CHECK(std::get<double>(t.rows[4][2]) == doctest::Approx(195.0).epsilon(tol));
}

TEST_CASE("node span: bad spans are refused with the line, the key and what was expected") {
  const std::string walker = head + "    pattern: walker-delta\n    satellites: 6\n    planes: 3\n    phasing: 0\n"
                                    "    altitude_km: 700\n    inclination_deg: 60\n";
  CHECK(error_of(walker + "    node_span_deg: 0\n") ==
        "t.yaml:15:20: shells[0].node_span_deg: node span 0 deg is outside (0, 360]; expected the span of node the "
        "planes divide evenly, above 0 and at most 360 deg");
  CHECK(error_of(walker + "    node_span_deg: 360.5\n").starts_with("t.yaml:15:20: shells[0].node_span_deg: node span 360.5 deg is outside (0, 360]"));
  CHECK(error_of(walker + "    node_span_deg: -30\n").starts_with("t.yaml:15:20: shells[0].node_span_deg: node span -30 deg"));
  CHECK(error_of(walker + "    ltan_span: [\"09:30\", \"11:30\"]\n") ==
        "t.yaml:15:16: shells[0].ltan_span: ltan_span applies only to sun-synchronous shells; use node_span_deg (and "
        "raan_deg for the first node)");
  CHECK(error_of(sso(6, 3, 0, "    ltan_span: [\"09:30\", \"11:70\"]\n")) ==
        "t.yaml:15:26: shells[0].ltan_span[1]: \"11:70\" is not a local time; expected \"HH:MM\" from 00:00 to 23:59");
  CHECK(error_of(sso(6, 3, 0, "    ltan_span: [\"09:30\"]\n")) ==
        "t.yaml:15:16: shells[0].ltan_span: ltan_span is not a list of two items; expected two local times "
        "[\"HH:MM\", \"HH:MM\"], the first and the last plane's");
  CHECK(error_of(sso(6, 3, 0, "    ltan_span: \"09:30\"\n")).starts_with("t.yaml:15:16: shells[0].ltan_span: ltan_span is not a list"));
  CHECK(error_of(sso(6, 3, 0, "    ltan_span: [\"09:30\", \"09:30\"]\n"))
            .starts_with("t.yaml:15:16: shells[0].ltan_span: the first and last local times are the same"));
  CHECK(error_of(sso(2, 1, 0, "    ltan_span: [\"09:30\", \"11:30\"]\n")) ==
        "t.yaml:15:16: shells[0].ltan_span: a one-plane shell has no span of local times; give ltan instead");
  CHECK(error_of(sso(6, 3, 0, "    node_span_deg: 30\n    ltan_span: [\"09:30\", \"11:30\"]\n")) ==
        "t.yaml:16:16: shells[0].ltan_span: give node_span_deg or ltan_span, not both");
  CHECK(error_of(sso(6, 3, 0, "    ltan: \"09:30\"\n    ltan_span: [\"09:30\", \"11:30\"]\n")) ==
        "t.yaml:16:16: shells[0].ltan_span: give ltan or ltan_span, not both: ltan_span's first time is the first "
        "plane's ltan");
  // A node span on a sun-synchronous shell is fine with ltan for the first plane.
  CHECK(error_of(sso(6, 3, 0, "    ltan: \"09:30\"\n    node_span_deg: 30\n")).empty());
}
