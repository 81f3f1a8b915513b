// Evidence for the per-site pass figures of the coverage evaluator (passes per day, mean pass length): they
// equal those of the ground-contact search (contacts.cpp), an independent implementation (sampling with a
// margin-rate bound and bisection, per satellite and station, against the evaluator's event timeline), when
// the stations stand where the sites are with the same elevation mask.
#include <doctest/doctest.h>

#include <cmath>

#include "coverage_test_designs.hpp"
#include "skein/coverage/contacts.hpp"
#include "skein/coverage/evaluate.hpp"

using namespace skein;

TEST_CASE("site passes: the evaluator's pass count and mean pass length equal the contact search's") {
  // 18 satellites in 3 planes at 800 km plus an eccentric pair; three sites that are also stations, 15 deg mask.
  const std::string places =
      "      - {name: fjord, lat_deg: 62.5, lon_deg: 6.1, height_km: 0.2}\n"
      "      - {name: atoll, lat_deg: -8.5, lon_deg: 179.2}\n"
      "      - {name: mesa, lat_deg: 36.1, lon_deg: -112.1, height_km: 2.1}\n";
  std::string stations = places;
  for (size_t at = 0; (at = stations.find("}", at)) != std::string::npos; at += 24)
    stations.replace(at, 1, ", min_elevation_deg: 15}");
  const Design d = read_design_text(
      test::coverage_design_head() + test::walker_shell(18, 3, 1, 800.0, 65.0) +
          "  - name: ecc\n    pattern: walker-delta\n    satellites: 2\n    planes: 1\n    phasing: 0\n"
          "    semi_major_axis_km: 7600\n    eccentricity: 0.06\n    inclination_deg: 80\n"
          "coverage:\n  grid:\n    kind: sites\n    sites:\n" + places +
          "  min_elevation_deg: 15\n  span_h: 12\n  step_s: 20\n  max_fold: 1\n"
          "ground_stations:\n" + stations,
      "site-passes.yaml");
  REQUIRE(d.ground_stations.size() == 3);
  const CoverageResult cov = evaluate_coverage(d, CoverageOptions{});
  const ContactResult con = compute_contacts(d);
  REQUIRE(cov.points.size() == 3);
  for (size_t s = 0; s < 3; ++s) {
    CAPTURE(cov.points[s].point.name);
    long passes = 0;
    double in_view_s = 0.0;
    for (const SatelliteContacts& sat : con.satellites)
      for (const ContactInterval& c : sat.stations[s].intervals) {
        ++passes;
        in_view_s += c.set_s - c.rise_s;
      }
    REQUIRE(passes > 20);
    // Same passes: both find every pass of the same secular orbits over the same ground point (the contact
    // search drops passes under 1 ms; none are that short here, or the counts would differ).
    CHECK(cov.points[s].passes == passes);
    // Same in-view time to the contact search's event resolution (each end within 0.5 ms, so 1 ms per pass)
    // plus the evaluator's crossing error: the margin's cubic in time errs by O(h^4) (README, "Pass boundaries":
    // about 1 ms per boundary at 60 s for 550 km; at 60 s this case differed by 3 ms per pass), so the step
    // here is 20 s, where (20/60)^4 leaves about 0.04 ms per boundary.
    const double tol_s = 1e-3 * static_cast<double>(passes) + 1e-6;
    CHECK(std::abs(cov.points[s].mean_pass_s * static_cast<double>(passes) - in_view_s) <= tol_s);
  }
}
