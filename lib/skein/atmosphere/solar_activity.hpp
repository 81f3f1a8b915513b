#pragma once
// Solar activity: fixed levels, the 11-year cycle profile, and the density scaling they imply.
#include <optional>
#include <string_view>

namespace skein {

enum class SolarLevel { low, mean, high, cycle };
std::string_view to_string(SolarLevel level);
std::optional<SolarLevel> solar_level_from_string(std::string_view text);

// Daily 10.7 cm solar radio flux (solar flux units) and geomagnetic Ap index.
struct SolarIndices {
  double f107_sfu = 140.0;
  double ap = 15.0;
};

// skein's three fixed levels (common practice; close to the low / moderate / high long-term values of
// ISO 14222 "Earth upper atmosphere", which are recalled from memory: F10.7 65 / 140 / 250):
//   low  F10.7 = 65,  Ap = 0;   mean F10.7 = 140, Ap = 15;   high F10.7 = 250, Ap = 25.
SolarIndices solar_indices(SolarLevel fixed_level);  // asserts fixed_level != cycle

// Mean length of the sunspot cycle, 11 years (D.H. Hathaway, "The Solar Cycle", Living Rev. Solar Phys. 12,
// 4 (2015): cycles average about 11 years).
inline constexpr double solar_cycle_years = 11.0;
// Start of solar cycle 25: the minimum of December 2019 (NOAA/NASA Solar Cycle 25 Prediction Panel,
// announcement of 15 September 2020). Julian date of 2019-12-15 00:00 UTC.
inline constexpr double solar_minimum_reference_jd = 2458832.5;

// Phase of the cycle (0 = minimum, 0.5 = maximum, in [0, 1)) at Julian date jd, counting whole cycles of
// solar_cycle_years from the reference minimum.
double solar_cycle_phase_at(double jd);

// Indices on the cycle profile at `phase` (any real; taken modulo 1): a raised cosine between the low
// and high levels, x = (1 - cos 2 pi phase)/2, F10.7 = F_low + x (F_high - F_low), the same for Ap.
// (A smooth stand-in for the observed cycle, which rises faster than it falls: common practice for budgets.)
SolarIndices solar_cycle_indices(double phase);

// Solar activity of a run: a fixed level, or the cycle starting from phase_at_epoch.
struct SolarActivity {
  SolarLevel level = SolarLevel::mean;
  double phase_at_epoch = 0.0;  // used when level == cycle
  double amplitude = 1.0;       // scale of the swing above the low level (a Monte Carlo draw; 1: as stated)
};
// Indices t_days after the epoch. With amplitude s != 1 each index I becomes I_low + s (I - I_low), where I is the
// level's (or the cycle profile's) value and I_low the low level's: a weaker or stronger cycle (or level) than
// skein's profile, never below the low level for s >= 0.
SolarIndices solar_indices_at(const SolarActivity& activity, double t_days);

// Density of the simple solar-activity model (kg/m^3) at altitude_km, valid 180-500 km:
//   H = (900 + 2.5 (F10.7 - 70) + 1.5 Ap) / (27 - 0.012 (h - 200)) km,  rho = 6e-10 exp(-(h - 175)/H).
// Source: IPS Radio and Space Services (Australian Space Weather Agency), "Satellite Orbital Decay
// Calculations" (1999, updated by R. Panwar), sec. 3.
double ips_density_kg_m3(double altitude_km, const SolarIndices& indices);

// Multiplier applied to the mean-activity tables (Harris-Priester, Vallado) for other activity:
// rho_IPS(h', indices) / rho_IPS(h', mean indices) with h' = h clamped to the IPS range 180-500 km.
// Above 500 km the 500 km ratio is held (which understates the swing higher up); below 180 km the ratio
// tapers geometrically to 1 at 100 km (activity matters little there). A skein construction, not a
// published table: stated in the README.
double solar_density_factor(double altitude_km, const SolarIndices& indices);

// The same factor in two parts, for many altitudes at one set of indices: both IPS densities share the divisor
// D = 27 - 0.012 (h - 200) of their scale heights H = N / D, N = 900 + 2.5 (F10.7 - 70) + 1.5 Ap, so
//   ln factor = -(h' - 175) D (1/N - 1/N_mean)   (h' clamped to 180..500 km; times the taper below 180 km).
// solar_inverse_numerator_difference gives 1/N - 1/N_mean (km^-1); solar_density_log_factor the logarithm.
double solar_inverse_numerator_difference(const SolarIndices& indices);
double solar_density_log_factor(double altitude_km, double inverse_numerator_difference);

}  // namespace skein
