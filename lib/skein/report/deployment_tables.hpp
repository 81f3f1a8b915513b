#pragma once
// Tables and JSON of a shell's deployment plan (budget.deployment): every drift plan traded and the
// non-dominated curve of days against delta-v, with the point chosen for the deadline.
#include <nlohmann/json.hpp>

#include "skein/budget/budget.hpp"
#include "skein/report/table.hpp"

namespace skein {

// One row per drift plan (planes, then phasing): offset, relative rates, groups low and high, days, delta-v.
Table deployment_plans_table(const ShellBudget& shell);
// One row per point of the trade curve (fewest days first), with the chosen point marked.
Table deployment_curve_table(const ShellBudget& shell);
// {deadline_days, fastest_days, chosen {...}, plans [...], curve [...], skipped [...]}; null without a plan.
nlohmann::ordered_json deployment_to_json(const ShellBudget& shell);

}  // namespace skein
