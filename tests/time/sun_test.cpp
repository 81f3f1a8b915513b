// Evidence for lib/skein/time/sun.hpp: the Almanac low-precision Sun against ERFA's Earth ephemeris.
#include <doctest/doctest.h>
#include <erfa.h>

#include <cmath>

#include "skein/constants.hpp"
#include "skein/angles.hpp"
#include "skein/time/sun.hpp"
#include "erfa_sun.hpp"

using namespace skein;

namespace {
using test::erfa_sun_of_date;  // tests/time/erfa_sun.hpp
}  // namespace

TEST_CASE("sun: Almanac low-precision direction within 0.02 deg of ERFA over 2025-2045") {
  // The Almanac states 0.01 deg accuracy for 1950-2050; aberration (20.5 arcsec = 0.0057 deg) is in the
  // Almanac's apparent position but not in the geometric ERFA reference, hence 0.02 deg.
  for (int k = 0; k < 40; ++k) {
    UtcEpoch e = *parse_utc_iso8601("2025-01-01T00:00:00Z");
    e = add_seconds(e, k * 187.3 * seconds_per_day);
    const JulianDate jd = julian_date(e);
    const Eigen::Vector3d ref = erfa_sun_of_date(jd);
    const SunPosition ours = sun_position(jd);
    const double angle_deg = std::acos(std::clamp(ours.unit_eci.dot(ref.normalized()), -1.0, 1.0)) * deg_per_rad;
    CHECK(angle_deg < 0.02);
    CHECK(ours.distance_au == doctest::Approx(ref.norm()).epsilon(2e-4));  // Almanac: R to 0.0003 au, common practice
  }
}

TEST_CASE("sun: local time of node and its inverse are consistent, noon means node under the mean Sun") {
  const JulianDate jd = julian_date(*parse_utc_iso8601("2027-03-01T00:00:00Z"));
  for (double h : {0.0, 6.0, 10.5, 13.75, 22.0}) {
    const double raan = node_for_local_time_rad(h, jd);
    CHECK(local_time_of_node_h(raan, jd) == doctest::Approx(h).epsilon(1e-12));
  }
  CHECK(node_for_local_time_rad(12.0, jd) == doctest::Approx(mean_sun_right_ascension_rad(jd)));
  // The mean Sun and the true Sun differ by the equation of time, which never exceeds 16.5 min (4.2 deg)
  // (Astronomical Almanac; common practice figure).
  const double diff_deg = std::abs(wrap_pi(mean_sun_right_ascension_rad(jd) - sun_position(jd).right_ascension_rad)) * deg_per_rad;
  CHECK(diff_deg < 4.2);
}
