#include "skein/budget/plausibility.hpp"

#include <cmath>

#include <fmt/format.h>

namespace skein {

double single_stage_dv_limit_m_s() {
  return single_stage_isp_s * standard_gravity_m_s2 * std::log(single_stage_mass_ratio);
}

Plausibility judge_plausibility(const PlausibilityInput& in) {
  Plausibility out;
  auto cannot = [&](std::string w) {
    out.cannot_fly.push_back(w);
    out.warnings.push_back("cannot be flown: " + w);
  };
  const double life_days = in.mission_life_years * days_per_julian_year;
  if (!in.lifetime_lower_bound && in.lifetime_natural_days < min_flyable_lifetime_days)
    cannot(fmt::format("the orbit decays naturally within {:.3g} days (less than {:.0f} days)", in.lifetime_natural_days,
                       min_flyable_lifetime_days));
  if (in.drag_makeup_raises > 0) {
    const double interval = life_days / static_cast<double>(in.drag_makeup_raises);
    if (interval < min_raise_interval_days)
      cannot(fmt::format("{} altitude raises over the life, one every {:.3g} days (more than one a day)",
                         in.drag_makeup_raises, interval));
  }
  const double dv_limit = single_stage_dv_limit_m_s();
  if (in.total_dv_m_s > dv_limit)
    cannot(fmt::format("total delta-v {:.6g} m/s per satellite exceeds {:.0f} m/s, the most a single chemical stage "
                       "delivers (Isp {:.0f} s, mass ratio {:.0f})",
                       in.total_dv_m_s, dv_limit, single_stage_isp_s, single_stage_mass_ratio));
  if (!in.lifetime_lower_bound && in.lifetime_natural_days < life_days)
    out.warnings.push_back(
        in.has_propulsion
            ? fmt::format("natural lifetime {:.3g} yr is shorter than the {:.2f}-year mission life: the shell lasts "
                          "only with the drag make-up budgeted",
                          in.lifetime_natural_days / days_per_julian_year, in.mission_life_years)
            : fmt::format("natural lifetime {:.3g} yr is shorter than the {:.2f}-year mission life and the spacecraft "
                          "has no propulsion (spacecraft.isp_s absent): the shell cannot last its life",
                          in.lifetime_natural_days / days_per_julian_year, in.mission_life_years));
  const double m_cda = 1.0 / in.ballistic_coefficient_m2_kg;
  if (m_cda < min_mass_to_drag_kg_m2 || m_cda > max_mass_to_drag_kg_m2)
    out.warnings.push_back(fmt::format("mass-to-drag-area ratio m/(Cd A) = {:.3g} kg/m^2 is outside {:.0f} to {:.0f} "
                                       "(most spacecraft lie between 50 and 200); check spacecraft.drag_area_m2 "
                                       "(in m^2, not cm^2) and dry_mass_kg",
                                       m_cda, min_mass_to_drag_kg_m2, max_mass_to_drag_kg_m2));
  if (in.propellant_kg && *in.propellant_kg > in.dry_mass_kg)
    out.warnings.push_back(fmt::format("propellant {:.4g} kg per satellite is heavier than the dry mass {:.4g} kg",
                                       *in.propellant_kg, in.dry_mass_kg));
  return out;
}

}  // namespace skein
