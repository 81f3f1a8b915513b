#include "skein/atmosphere/atmosphere.hpp"

#include <cmath>

#include "skein/atmosphere/exponential_table.hpp"
#include "skein/atmosphere/harris_priester.hpp"

namespace skein {

std::string_view to_string(AtmosphereKind kind) {
  switch (kind) {
    case AtmosphereKind::harris_priester: return "harris-priester";
    case AtmosphereKind::exponential: return "exponential";
  }
  return "harris-priester";
}

std::optional<AtmosphereKind> atmosphere_kind_from_string(std::string_view text) {
  for (AtmosphereKind k : {AtmosphereKind::harris_priester, AtmosphereKind::exponential})
    if (to_string(k) == text) return k;
  return std::nullopt;
}

double atmosphere_table_top_km(AtmosphereKind kind) {
  return kind == AtmosphereKind::exponential ? exponential_table_top_km : harris_priester_top_km;
}

OrbitDensity::OrbitDensity(const OrbitAtmosphere& atm)
    : atm_(atm), solar_(!(atm.solar.level == SolarLevel::mean && atm.solar.amplitude == 1.0)) {}

double OrbitDensity::operator()(double altitude_km, double t_days) {
  double rho = 0.0;
  if (atm_.kind == AtmosphereKind::exponential) {
    rho = exponential_density_kg_m3(altitude_km);
  } else {
    const HarrisPriesterBounds b = harris_priester_bounds(altitude_km);
    rho = b.min_kg_m3 + atm_.bulge_weight * (b.max_kg_m3 - b.min_kg_m3);
  }
  if (!solar_) return rho;
  if (!known_ || (atm_.solar.level == SolarLevel::cycle && t_days != t_days_)) {
    inverse_difference_ = solar_inverse_numerator_difference(solar_indices_at(atm_.solar, t_days));
    t_days_ = t_days;
    known_ = true;
  }
  return rho * std::exp(solar_density_log_factor(altitude_km, inverse_difference_));
}

double orbit_density_kg_m3(const OrbitAtmosphere& atm, double altitude_km, double t_days) {
  return OrbitDensity(atm)(altitude_km, t_days);
}

}  // namespace skein
