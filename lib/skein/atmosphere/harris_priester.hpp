#pragma once
// Harris-Priester atmosphere (modified form) with its diurnal bulge, 100 to 1000 km, mean solar activity.
#include <Eigen/Core>

namespace skein {

inline constexpr double harris_priester_bottom_km = 100.0;
inline constexpr double harris_priester_top_km = 1000.0;
// The bulge apex lags the Sun by 30 deg in right ascension (Montenbruck & Gill 2000, sec. 3.5.2).
inline constexpr double harris_priester_lag_rad = 0.523599;

// The antapex (night minimum) and apex (day maximum) densities at altitude_km, kg/m^3, interpolated
// exponentially between the table's 50 nodes. Source: O. Montenbruck, E. Gill, "Satellite Orbits" (Springer
// 2000), Table 3.8 (values for mean solar activity, given there in g/km^3). Below 100 km the 100 km value;
// above 1000 km the 960-1000 km scale heights are extended (an extrapolation the budget warns about).
struct HarrisPriesterBounds {
  double min_kg_m3 = 0.0;  // antapex
  double max_kg_m3 = 0.0;  // apex
};
HarrisPriesterBounds harris_priester_bounds(double altitude_km);

// Density at altitude_km where psi is the angle between the position and the bulge apex:
// rho = rho_min + (rho_max - rho_min) cos^n(psi/2), cos^n(psi/2) = ((1 + cos psi)/2)^(n/2).
// Source: Montenbruck & Gill (2000) sec. 3.5.2; n = 2 (low inclination) to 6 (polar).
double harris_priester_density_kg_m3(double altitude_km, double cos_psi, double exponent);

// Unit vector of the bulge apex in the equatorial frame, from the Sun's right ascension and declination
// (rad): right ascension + 30 deg, same declination (Montenbruck & Gill 2000 sec. 3.5.2).
Eigen::Vector3d harris_priester_apex(double sun_ra_rad, double sun_dec_rad);

// The cos^n(psi/2) weight averaged over a circular orbit (argument of latitude) and over a year of Sun
// positions, for inclination i_rad. When sun_locked (sun-synchronous), the node keeps the fixed offset
// node_minus_mean_sun_rad from the mean Sun; otherwise the node is taken uniformly over all offsets (it
// drifts through every Sun angle within months). The orbit-averaged density is then
// rho_min + w (rho_max - rho_min) at every altitude. Sun on a circular ecliptic of obliquity 23.439 deg (obliquity_j2000_rad)
// (Astronomical Almanac low-precision Sun, common practice for averages).
double harris_priester_mean_weight(double i_rad, bool sun_locked, double node_minus_mean_sun_rad, double exponent);

// skein's default exponent for an inclination: linear in the smaller of i and 180 deg - i, from n = 2 at
// the equator to n = 6 at 90 deg (Montenbruck & Gill give only the two end values).
double harris_priester_default_exponent(double i_rad);

}  // namespace skein
