#include "skein/design/design.hpp"

namespace skein {

std::string_view to_string(PatternKind kind) {
  switch (kind) {
    case PatternKind::walker_delta: return "walker-delta";
    case PatternKind::walker_star: return "walker-star";
    case PatternKind::explicit_planes: return "explicit";
  }
  return "walker-delta";
}

std::optional<PatternKind> pattern_kind_from_string(std::string_view text) {
  for (PatternKind k : {PatternKind::walker_delta, PatternKind::walker_star, PatternKind::explicit_planes})
    if (to_string(k) == text) return k;
  return std::nullopt;
}

double Spacecraft::ballistic_coefficient_m2_kg() const {
  const double mass = dry_mass_kg + propellant_capacity_kg.value_or(0.0);
  return drag_coefficient * drag_area_m2 / mass;
}

}  // namespace skein
