#pragma once
// Sun-synchronous conditions under J2.
#include <optional>

#include "skein/constants.hpp"

namespace skein {

// Inclination (rad) whose J2 node rate equals the mean Sun's motion (360 deg per tropical year), for mean
// a (km) and e. nullopt when no inclination reaches that rate (a above about 12352 km for e = 0).
// Source: Vallado (2013) eq. 9-41 solved for cos i = -(dOmega/dt)_sun / (3/2 n J2 (Re/p)^2);
// Vallado sec. 11.4.1 "Sun-synchronous orbits".
std::optional<double> sun_synchronous_inclination_rad(const EarthModel& earth, double a_km, double e);

// Semi-major axis (km) of the sun-synchronous orbit with inclination i (rad, must be retrograde, > pi/2)
// and eccentricity e. nullopt for prograde i. The same relation solved for a:
//   a = [ -3/2 sqrt(mu) J2 Re^2 cos i / ((dOmega/dt)_sun (1 - e^2)^2) ]^(2/7).
std::optional<double> sun_synchronous_semi_major_axis_km(const EarthModel& earth, double i_rad, double e);

// Drift of the local time of the ascending node, minutes of local time per Julian year, for an orbit
// whose node rate is raan_rate_rad_s: (dOmega/dt - n_sun) converted at 4 min of time per degree.
// Zero for an exactly sun-synchronous orbit. Source: follows from the definition of local mean time
// (Vallado 2013 sec. 3.5: the hour angle of the mean Sun).
double ltan_drift_min_per_year(double raan_rate_rad_s);

}  // namespace skein
