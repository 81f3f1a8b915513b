#pragma once
// Piecewise-exponential atmosphere density, 0 to 1000 km.
namespace skein {

// Top of the exponential table (km). Above it the last band's scale height is extended (an extrapolation
// the budget reports as a warning).
inline constexpr double exponential_table_top_km = 1000.0;

// Density (kg/m^3) at geometric altitude altitude_km >= 0: rho = rho0 exp(-(h - h0)/H) with the band whose
// base h0 is the highest not above h. Source: D.A. Vallado, "Fundamentals of Astrodynamics and
// Applications", 4th ed. (2013), Table 8-4 "Exponential atmospheric model" (28 bands, h0 = 0 ... 1000 km).
// Negative altitudes are treated as 0 km.
double exponential_density_kg_m3(double altitude_km);

}  // namespace skein
