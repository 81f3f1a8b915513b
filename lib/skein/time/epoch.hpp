#pragma once
// UTC epochs, Julian dates and the Greenwich sidereal angle.
#include <optional>
#include <string>
#include <string_view>

namespace skein {

// The years an epoch may fall in (common practice for this model set: the GMST and almanac Sun formulas are
// fitted to the present era; 1900 to 2200 bounds their use generously).
inline constexpr int min_epoch_year = 1900;
inline constexpr int max_epoch_year = 2200;

// A UTC calendar instant. seconds may reach 60.x only on a leap second.
struct UtcEpoch {
  int year = 2000, month = 1, day = 1, hour = 0, minute = 0;
  double second = 0.0;
};

// Parse an ISO 8601 UTC instant: "YYYY-MM-DDThh:mm:ss[.fff]Z" (the T may be a space; the Z, or "+00:00", is
// required so the time scale is never guessed). nullopt when the text is not of that form or the date is
// not a real calendar date.
std::optional<UtcEpoch> parse_utc_iso8601(std::string_view text);

// ISO 8601 text "YYYY-MM-DDThh:mm:ss.sssZ" with `decimals` digits of seconds (0..6).
std::string format_utc_iso8601(const UtcEpoch& epoch, int decimals = 3);

// Julian date of a UTC instant, split as a two-part date (day part + fraction) to keep precision.
// Source: Fliegel & Van Flandern (1968), Comm. ACM 11(10) 657, the integer algorithm for the Julian day
// number; valid for Gregorian dates from 1901 to 2099 and beyond.
struct JulianDate {
  double day = 2451545.0;   // integral Julian day at noon-based count, ends in .5 for midnight
  double fraction = 0.0;    // fraction of day
  double value() const { return day + fraction; }
};
JulianDate julian_date(const UtcEpoch& epoch);

// The UTC instant dt_s seconds after epoch (leap seconds inside the span are ignored, common practice
// for design spans; the error is at most one second per leap second).
UtcEpoch add_seconds(const UtcEpoch& epoch, double dt_s);

// Greenwich mean sidereal angle (rad, [0, 2 pi)) at UT1 Julian date jd_ut1 (two parts).
// Source: Aoki et al. (1982), A&A 105, 359, the IAU 1982 GMST expression, as given in the Explanatory
// Supplement to the Astronomical Almanac (1992) eq. 2.24-1. skein passes UTC for UT1 (|UT1-UTC| < 0.9 s,
// i.e. < 0.004 deg of Earth rotation).
double greenwich_mean_sidereal_angle_rad(const JulianDate& jd_ut1);

}  // namespace skein
