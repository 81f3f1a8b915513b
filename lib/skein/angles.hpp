#pragma once
// Angle wrapping, below every module that handles angles (time, orbit, coverage, report). Radians.
#include <cmath>

#include "skein/constants.hpp"

namespace skein {

// Wrap an angle to [0, 2 pi).
inline double wrap_two_pi(double angle_rad) {
  double w = std::fmod(angle_rad, two_pi);
  if (w < 0.0) w += two_pi;
  if (w >= two_pi) w = 0.0;
  return w;
}

// Wrap an angle to [-pi, pi).
inline double wrap_pi(double angle_rad) { return wrap_two_pi(angle_rad + pi) - pi; }

}  // namespace skein
