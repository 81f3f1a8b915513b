#pragma once
// The density model a budget uses: which table, the orbit-averaged bulge weight, and solar activity.
#include <optional>
#include <string_view>

#include "skein/atmosphere/solar_activity.hpp"

namespace skein {

enum class AtmosphereKind {
  harris_priester,  // Montenbruck & Gill Table 3.8 with the diurnal bulge (orbit-averaged)
  exponential       // Vallado Table 8-4
};
std::string_view to_string(AtmosphereKind kind);
std::optional<AtmosphereKind> atmosphere_kind_from_string(std::string_view text);

// Highest altitude (km) the model's table covers; above it densities are extrapolated.
double atmosphere_table_top_km(AtmosphereKind kind);

// An orbit-averaged density model for one shell.
struct OrbitAtmosphere {
  AtmosphereKind kind = AtmosphereKind::harris_priester;
  double bulge_weight = 0.5;  // Harris-Priester: orbit- and year-averaged cos^n(psi/2); unused otherwise
  SolarActivity solar;
};

// Orbit-averaged density (kg/m^3) at altitude_km, t_days after the epoch:
//   harris-priester: rho_min + w (rho_max - rho_min), times the solar factor;
//   exponential: the table value times the solar factor.
// (solar_density_factor in solar_activity.hpp; 1 for mean activity.)
double orbit_density_kg_m3(const OrbitAtmosphere& atmosphere, double altitude_km, double t_days);

// orbit_density_kg_m3 as a function object that keeps the solar term of the last time it was asked (a decay step
// asks many altitudes at one time; a fixed level never changes it): the same formula, fewer transcendental calls.
// Holds state: one object per thread (a DensityFn copy each).
class OrbitDensity {
 public:
  explicit OrbitDensity(const OrbitAtmosphere& atmosphere);
  double operator()(double altitude_km, double t_days);

 private:
  OrbitAtmosphere atm_;
  bool solar_ = false;        // a solar factor applies (not mean activity at amplitude 1)
  double t_days_ = 0.0;       // time of inverse_difference_ (cycle only)
  bool known_ = false;
  double inverse_difference_ = 0.0;  // solar_inverse_numerator_difference at t_days_
};

}  // namespace skein
