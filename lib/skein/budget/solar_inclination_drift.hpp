#pragma once
// Secular inclination drift of a sun-synchronous orbit caused by the Sun's gravity.
#include "skein/constants.hpp"

namespace skein {

// di/dt (rad/s) of a circular orbit of radius a_km and inclination i_rad whose node stays at the local
// mean time ltan_h (hours) of the ascending node, from the Sun's quadrupole tide averaged over the orbit
// and then over a year (Sun on a circular ecliptic; the node follows the mean Sun):
//   <R> = mu_s a^2 / (4 r_s^3) (1 - 3 (h . s)^2),   di/dt = -1/(n a^2 sin i) dR/dOmega
//       = 3 n_s^2 / (2 n) (h . s) [cos Omega cos lambda + sin Omega sin lambda cos eps],
// with h the orbit normal, s the Sun direction at ecliptic longitude lambda, Omega = lambda + (ltan_h - 12) 15 deg.
// Derived here from Lagrange's planetary equation for di/dt (Vallado 2013 ch. 9) and the third-body
// disturbing function (Vallado 2013 ch. 8). The year average has the closed form
// di/dt = 3 n_s^2 / (4 n) sin i sin(2 (ltan - 12 h) 15 deg/h) cos^4(eps/2), checked in the tests. The Moon's term is periodic for a
// sun-synchronous node and is left out.
double solar_inclination_rate_rad_s(const EarthModel& earth, double a_km, double i_rad, double ltan_h);

}  // namespace skein
