#pragma once
// Low-precision Sun position, for the local time of the ascending node and lighting.
#include <Eigen/Core>

#include "skein/time/epoch.hpp"

namespace skein {

struct SunPosition {
  double right_ascension_rad = 0.0;  // of date, [0, 2 pi)
  double declination_rad = 0.0;
  double distance_au = 1.0;
  Eigen::Vector3d unit_eci = Eigen::Vector3d::UnitX();  // direction, mean equator and equinox of date
};

// Geocentric apparent Sun, low precision. Source: The Astronomical Almanac, section C, "Low precision
// formulas for the Sun" (mean longitude 280.460 + 0.9856474 n deg, mean anomaly 357.528 + 0.9856003 n deg,
// ecliptic longitude L + 1.915 sin g + 0.020 sin 2g, obliquity 23.439 - 0.0000004 n deg), stated accuracy
// 0.01 deg between 1950 and 2050. n = days from J2000.0 (UTC is used for TT: 69 s is 0.0008 deg of motion).
SunPosition sun_position(const JulianDate& jd);

// Local mean time of the ascending node (hours, [0, 24)) for a node of right ascension raan_rad at jd:
// 12 h + (raan - RA of the mean Sun) / 15 deg per hour. Uses the mean Sun (mean longitude, no equation of
// time), matching the usual mission-design definition of LTAN (common practice).
double local_time_of_node_h(double raan_rad, const JulianDate& jd);

// The node right ascension (rad) that gives local mean time ltan_h at jd; the inverse of the above.
double node_for_local_time_rad(double ltan_h, const JulianDate& jd);

// Right ascension of the mean Sun (rad) at jd, the mean longitude of the Almanac formula.
double mean_sun_right_ascension_rad(const JulianDate& jd);

}  // namespace skein
