// Evidence for lib/skein/orbit/repeat_track.hpp against flown repeat-ground-track missions.
#include <doctest/doctest.h>

#include "skein/constants.hpp"
#include "skein/orbit/repeat_track.hpp"
#include "skein/orbit/secular.hpp"

using namespace skein;

TEST_CASE("repeat track: Landsat's 233 revolutions in 16 days is the 7077.7 km sun-synchronous orbit") {
  // Source: USGS Landsat 7 Science Data Users Handbook, orbit table: sun-synchronous, 16-day repeat of 233
  // orbits, semi-major axis 7077.7 km, nominal altitude 705 km (MEMORY of the handbook). 1 km tolerance:
  // the handbook's osculating-vs-mean convention is not stated, and J3/J4 shift a mean a by well under 1 km.
  const auto a = repeat_track_semi_major_axis_km(wgs84, 233, 16, 0.0, 0.0, true);
  REQUIRE(a);
  CHECK(*a == doctest::Approx(7077.7).epsilon(1.0 / 7077.7));
}

TEST_CASE("repeat track: TOPEX/Jason 127 revolutions in 10 nodal days at 66 deg is ~1336 km") {
  // Source: AVISO/CNES Jason-3 products handbook: 1336 km, 66.04 deg, 127 revolutions per ~10-day cycle
  // (9.9156 solar days = 10 nodal days). MEMORY of the handbook; 5 km tolerance for the nominal altitude.
  const auto a = repeat_track_semi_major_axis_km(wgs84, 127, 10, 0.0, 66.04 * rad_per_deg, false);
  REQUIRE(a);
  CHECK(*a - wgs84.radius_km == doctest::Approx(1336.0).epsilon(5.0 / 1336.0));
}

TEST_CASE("repeat track: the solution satisfies the repeat condition exactly") {
  const double i = 53.0 * rad_per_deg;
  const auto a = repeat_track_semi_major_axis_km(wgs84, 31, 2, 0.0, i, false);
  REQUIRE(a);
  const SecularRates r = secular_rates(wgs84, *a, 0.0, i);
  const double lhs = 31 * nodal_period_s(wgs84, *a, 0.0, i);
  const double rhs = 2 * two_pi / (wgs84.rotation_rad_s - r.raan_rad_s);
  CHECK(lhs == doctest::Approx(rhs).epsilon(1e-12));
  CHECK_FALSE(repeat_track_semi_major_axis_km(wgs84, 0, 1, 0.0, i, false));
  CHECK_FALSE(repeat_track_semi_major_axis_km(wgs84, 40, 1, 0.0, i, false));  // below the surface
}
