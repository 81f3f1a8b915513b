#pragma once
// Plausibility of a shell's budget: the limits past which a figure describes a spacecraft or an orbit that
// cannot be flown as designed, and the warnings that flag figures which are legal but suspicious (a drag
// area typed in cm^2, a shell too low for its mission life). The budget still computes every figure; these
// only judge it.
#include <optional>
#include <string>
#include <vector>

#include "skein/constants.hpp"

namespace skein {

// Total delta-v per satellite above which no single chemical stage delivers it: the rocket equation with
// the best chemical vacuum specific impulse, about 450 s (liquid oxygen / liquid hydrogen; MEMORY, common
// practice), and a propellant fraction of 0.9 (mass ratio 10, the lightest launch-vehicle stages; MEMORY,
// common practice): 450 s x 9.80665 m/s^2 x ln 10 = 10.16 km/s. A satellite's own tank, with storable
// propellant near 220-320 s, delivers far less, so this bound is generous.
inline constexpr double single_stage_isp_s = 450.0;
inline constexpr double single_stage_mass_ratio = 10.0;
double single_stage_dv_limit_m_s();

// More than one altitude raise a day is not a plan an operations team flies with impulsive burns (common
// practice: station-keeping burns are days to weeks apart).
inline constexpr double min_raise_interval_days = 1.0;
// A natural lifetime under a week: the orbit decays before a satellite could be commissioned (common
// practice: commissioning takes weeks).
inline constexpr double min_flyable_lifetime_days = 7.0;
// Mass-to-drag-area ratio m / (Cd A) outside 10 to 1000 kg/m^2 is suspicious (common practice: most
// spacecraft lie between 50 and 200 kg/m^2; a drag area entered in cm^2 gives about 0.01).
inline constexpr double min_mass_to_drag_kg_m2 = 10.0;
inline constexpr double max_mass_to_drag_kg_m2 = 1000.0;

// The figures a judgement needs, for one shell.
struct PlausibilityInput {
  double mission_life_years = 0.0;
  double ballistic_coefficient_m2_kg = 0.0;  // Cd A / m
  bool has_propulsion = false;               // spacecraft.isp_s given
  double dry_mass_kg = 0.0;
  double lifetime_natural_days = 0.0;
  bool lifetime_lower_bound = false;
  long drag_makeup_raises = 0;
  double total_dv_m_s = 0.0;
  std::optional<double> propellant_kg;
};

struct Plausibility {
  std::vector<std::string> cannot_fly;  // budgets that cannot be flown (each also a warning)
  std::vector<std::string> warnings;    // every warning, cannot_fly included, in a fixed order
};

Plausibility judge_plausibility(const PlausibilityInput& in);

}  // namespace skein
