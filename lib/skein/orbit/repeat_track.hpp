#pragma once
// Repeat ground tracks under J2.
#include <optional>

#include "skein/constants.hpp"

namespace skein {

// Mean semi-major axis (km) at which the ground track repeats after `revolutions` nodal periods in
// `days` nodal days, for eccentricity e and inclination i (rad), or for the sun-synchronous inclination
// at each trial a when sun_synchronous is true. The condition is
//   revolutions * T_nodal = days * 2 pi / (omega_earth - dOmega/dt)
// (Vallado 2013 sec. 11.4.2, repeat-groundtrack orbits), solved by fixed-point iteration on a starting
// from the Kepler value. nullopt when the iteration does not settle or lands below the Earth's surface.
std::optional<double> repeat_track_semi_major_axis_km(const EarthModel& earth, int revolutions, int days, double e,
                                                      double i_rad, bool sun_synchronous);

}  // namespace skein
