// Evidence for lib/skein/time/epoch.hpp: calendar to Julian date and the Greenwich sidereal angle,
// checked against ERFA (the IAU SOFA algorithms as shipped by Debian's liberfa-dev).
#include <doctest/doctest.h>
#include <erfa.h>

#include <cmath>

#include "skein/constants.hpp"
#include "skein/time/epoch.hpp"

using namespace skein;

TEST_CASE("epoch: ISO 8601 UTC parsing accepts the documented form and nothing looser") {
  const auto e = parse_utc_iso8601("2027-03-01T06:30:15.250Z");
  REQUIRE(e);
  CHECK(e->year == 2027);
  CHECK(e->month == 3);
  CHECK(e->day == 1);
  CHECK(e->hour == 6);
  CHECK(e->minute == 30);
  CHECK(e->second == doctest::Approx(15.25).epsilon(1e-12));
  CHECK(parse_utc_iso8601("2027-03-01 06:30:15+00:00"));
  CHECK_FALSE(parse_utc_iso8601("2027-03-01T06:30:15"));     // no time scale: never guessed
  CHECK_FALSE(parse_utc_iso8601("2027-02-29T00:00:00Z"));    // 2027 is not a leap year
  CHECK_FALSE(parse_utc_iso8601("2027-13-01T00:00:00Z"));
  CHECK_FALSE(parse_utc_iso8601("2027-03-01T24:00:00Z"));
  CHECK_FALSE(parse_utc_iso8601("2027-3-1T00:00:00Z"));
  CHECK(parse_utc_iso8601("2028-02-29T00:00:00Z"));
}

TEST_CASE("epoch: Julian date agrees with ERFA eraDtf2d to 1 microsecond") {
  // Source: ERFA eraDtf2d (SOFA iauDtf2d), scale "UTC". The days chosen have no leap second, where the
  // UTC quasi-JD of ERFA and a plain calendar JD agree exactly.
  const char* dates[] = {"2000-01-01T12:00:00Z", "2027-03-01T00:00:00Z", "2031-07-19T17:45:30.5Z",
                         "1999-12-31T23:59:59Z"};
  for (const char* text : dates) {
    const UtcEpoch e = *parse_utc_iso8601(text);
    const JulianDate jd = julian_date(e);
    double d1 = 0, d2 = 0;
    REQUIRE(eraDtf2d("UTC", e.year, e.month, e.day, e.hour, e.minute, e.second, &d1, &d2) >= 0);
    CHECK(std::abs((jd.day - d1) + (jd.fraction - d2)) * seconds_per_day < 1e-6);
  }
  CHECK(julian_date(*parse_utc_iso8601("2000-01-01T12:00:00Z")).value() == doctest::Approx(2451545.0));
}

TEST_CASE("epoch: add_seconds crosses month, year and leap-day boundaries") {
  const UtcEpoch e = *parse_utc_iso8601("2028-02-28T23:00:00Z");
  const UtcEpoch f = add_seconds(e, 2 * 3600.0 + 0.5);
  CHECK(f.year == 2028);
  CHECK(f.month == 2);
  CHECK(f.day == 29);
  CHECK(f.hour == 1);
  CHECK(f.second == doctest::Approx(0.5));
  const UtcEpoch g = add_seconds(*parse_utc_iso8601("2027-12-31T23:59:59Z"), 1.0);
  CHECK(format_utc_iso8601(g, 0) == "2028-01-01T00:00:00Z");
  // Round trip through the Julian date: the elapsed time is what was added (to 1 microsecond).
  const double dt = 123456.789;
  const UtcEpoch h = add_seconds(e, dt);
  const double back = ((julian_date(h).day - julian_date(e).day) + (julian_date(h).fraction - julian_date(e).fraction)) *
                      seconds_per_day;
  CHECK(back == doctest::Approx(dt).epsilon(1e-11));
}

TEST_CASE("epoch: Greenwich mean sidereal angle matches ERFA eraGmst82 to 1e-9 rad") {
  // Source: ERFA eraGmst82, the IAU 1982 expression of Aoki et al. (1982). Same formula, so the only
  // difference is rounding: 1e-9 rad (0.2 mas) is far below anything coverage can see.
  for (const char* text : {"2000-01-01T12:00:00Z", "2027-03-01T00:00:00Z", "2027-03-01T13:17:42Z", "2040-11-05T04:00:00Z"}) {
    const JulianDate jd = julian_date(*parse_utc_iso8601(text));
    const double ours = greenwich_mean_sidereal_angle_rad(jd);
    const double ref = eraGmst82(jd.day, jd.fraction);
    CHECK(std::abs(std::remainder(ours - ref, two_pi)) < 1e-9);
  }
}

TEST_CASE("epoch: IAU 1982 GMST stays within 0.001 deg of the IAU 2006 GMST (ERFA eraGmst06)") {
  // Source: ERFA eraGmst06 (Capitaine et al. 2003, IERS Conventions 2010), given UT1 = UTC and TT = UTC + 69.184 s
  // (32.184 s + 37 leap seconds, in force since 2017). The models differ by milliarcseconds; 0.001 deg
  // (3.6 arcsec) bounds that with margin and is 0.11 km of ground motion at the equator.
  for (const char* text : {"2027-03-01T00:00:00Z", "2035-06-21T12:00:00Z"}) {
    const JulianDate jd = julian_date(*parse_utc_iso8601(text));
    const double tt_fraction = jd.fraction + 69.184 / seconds_per_day;
    const double ref = eraGmst06(jd.day, jd.fraction, jd.day, tt_fraction);
    CHECK(std::abs(std::remainder(greenwich_mean_sidereal_angle_rad(jd) - ref, two_pi)) * deg_per_rad < 1e-3);
  }
}
