// Evidence for lib/skein/time/sun.hpp: the Almanac low-precision Sun against ERFA's Earth ephemeris.
#include <doctest/doctest.h>
#include <erfa.h>

#include <cmath>

#include "skein/constants.hpp"
#include "skein/angles.hpp"
#include "skein/time/sun.hpp"

using namespace skein;

namespace {
// Reference Sun direction, true equator and equinox of date, from ERFA: eraEpv00 gives the Earth's
// heliocentric position (BCRS); the geometric Sun direction is its negative, light time (8.3 min, 0.0057 deg
// of aberration) neglected; eraPnm06a rotates GCRS to the true equator and equinox of date.
Eigen::Vector3d erfa_sun_of_date(const JulianDate& jd) {
  const double tt_fraction = jd.fraction + 69.184 / seconds_per_day;
  double pvh[2][3], pvb[2][3];
  eraEpv00(jd.day, tt_fraction, pvh, pvb);
  double s[3] = {-pvh[0][0], -pvh[0][1], -pvh[0][2]};
  double rnpb[3][3], out[3];
  eraPnm06a(jd.day, tt_fraction, rnpb);
  eraRxp(rnpb, s, out);
  return Eigen::Vector3d(out[0], out[1], out[2]);
}
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
