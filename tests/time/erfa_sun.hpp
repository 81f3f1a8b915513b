#pragma once
// The reference Sun direction for the tests, from ERFA (Debian's liberfa, the SOFA-derived library): eraEpv00
// gives the Earth's heliocentric position (BCRS); the geometric Sun direction is its negative, light time
// (8.3 min, 0.0057 deg of aberration) neglected; eraPnm06a rotates GCRS to the true equator and equinox of date.
// TT = UTC + 69.184 s (the leap seconds of 2017 onwards). Not normalised (AU).
#include <Eigen/Core>
#include <erfa.h>

#include "skein/constants.hpp"
#include "skein/time/epoch.hpp"

namespace skein::test {

inline Eigen::Vector3d erfa_sun_of_date(const JulianDate& jd) {
  const double tt_fraction = jd.fraction + 69.184 / seconds_per_day;
  double pvh[2][3], pvb[2][3];
  eraEpv00(jd.day, tt_fraction, pvh, pvb);
  double s[3] = {-pvh[0][0], -pvh[0][1], -pvh[0][2]};
  double rnpb[3][3], out[3];
  eraPnm06a(jd.day, tt_fraction, rnpb);
  eraRxp(rnpb, s, out);
  return Eigen::Vector3d(out[0], out[1], out[2]);
}

}  // namespace skein::test
