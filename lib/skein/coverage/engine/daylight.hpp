#pragma once
// Daylight at the target: the Sun's elevation at a ground point, and the times it crosses a threshold
// (sunrise and sunset at that elevation), the events the daylight mask adds to a point's timeline.
#include <limits>

#include "skein/coverage/engine/geometry.hpp"
#include "skein/time/epoch.hpp"

namespace skein::coverage_engine {

// The Sun in the evaluator's Earth-fixed frame: the almanac's Sun of date (time/sun.hpp), turned by the same
// sidereal angle theta(t) = theta0 + rate t the satellites are turned by (position_buffer.cpp).
struct DaylightMask {
  JulianDate epoch;               // t = 0
  double theta0_rad = 0.0;        // Greenwich sidereal angle at t = 0
  double rotation_rad_s = 0.0;    // Earth rotation rate of the design's Earth model
  double sin_min = 0.0;           // sine of the least Sun elevation

  // sin(Sun elevation) - sin(threshold) at point p, t seconds after the epoch: >= 0 while lit. The elevation is
  // that of the Sun's centre above the geodetic horizontal (geometric; the Sun's parallax, 0.0024 deg, neglected).
  double margin(const PointGeo& p, double t) const;
  // The first time in (t, t_end] at which the lit state differs from `lit` (the state at t), or +infinity
  // when it does not change before t_end. See daylight.cpp for the search and what it may miss.
  double next_change(const PointGeo& p, double t, bool lit, double t_end) const;
};

constexpr double no_daylight_change = std::numeric_limits<double>::infinity();

// The shortest step of the search for a change of daylight (s): a lit or dark spell shorter than this, which
// needs the Sun's daily highest or lowest elevation within a few hundredths of a degree of the threshold,
// may be missed.
constexpr double daylight_min_step_s = 30.0;
// The root of a change is refined until it is bracketed within this time (s).
constexpr double daylight_time_tolerance_s = 1e-4;

}  // namespace skein::coverage_engine
