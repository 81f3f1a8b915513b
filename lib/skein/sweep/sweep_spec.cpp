#include "skein/sweep/sweep_spec.hpp"

namespace skein {

std::string_view to_string(CostFigure c) {
  switch (c) {
    case CostFigure::satellites: return "satellites";
    case CostFigure::fleet_dv_m_s: return "fleet_dv_m_s";
    case CostFigure::fleet_propellant_kg: return "fleet_propellant_kg";
    case CostFigure::dv_per_satellite_m_s: return "dv_per_satellite_m_s";
    case CostFigure::propellant_per_satellite_kg: return "propellant_per_satellite_kg";
    case CostFigure::planes: return "planes";
  }
  return "?";
}

std::optional<CostFigure> cost_figure_from_string(std::string_view text) {
  for (CostFigure c : {CostFigure::satellites, CostFigure::fleet_dv_m_s, CostFigure::fleet_propellant_kg,
                       CostFigure::dv_per_satellite_m_s, CostFigure::propellant_per_satellite_kg, CostFigure::planes})
    if (to_string(c) == text) return c;
  return std::nullopt;
}

}  // namespace skein
