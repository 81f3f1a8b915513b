#pragma once
// Tables and JSON for budget results, shared by `skein budget` and the report folder.
#include <nlohmann/json.hpp>

#include "skein/budget/budget.hpp"
#include "skein/report/table.hpp"

namespace skein {

// One row per shell: lifetime, drag make-up, totals, propellant, tank flag, disposal perigee.
Table budget_shell_table(const BudgetResult& result);
// One row per shell and budget line: the delta-v per satellite over the life and how it was found.
Table budget_lines_table(const BudgetResult& result);
// Natural lifetime of every shell under each solar level computed.
Table lifetime_by_level_table(const BudgetResult& result);
// The decay curve of one shell under one level: time, mean altitude, perigee and apogee altitudes.
// earth_radius_km converts semi-major axes to altitudes.
Table decay_curve_table(const ShellBudget& shell, const LevelDecay& decay, double earth_radius_km);

// The whole result as JSON: design, settings, caution, warnings, fleet totals and a `shells` array whose
// entries carry name, lifetime_natural_days, drag_makeup_dv_m_s_per_year, dv_lines [{name, dv_m_s, basis}],
// total_dv_m_s, propellant_kg (null without isp), disposal_perigee_km, decay_curves per level, and more.
nlohmann::ordered_json budget_to_json(const BudgetResult& result, double earth_radius_km);

}  // namespace skein
