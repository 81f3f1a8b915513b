#pragma once
// Tables and JSON for Monte Carlo budgets (budget/monte_carlo.hpp), shared by `skein budget --samples` and the
// report folder.
#include <nlohmann/json.hpp>

#include "skein/budget/monte_carlo.hpp"
#include "skein/report/table.hpp"

namespace skein {

// One row per shell and figure (lifetime, each line, totals, propellant; then the fleet over all shells): the
// deterministic value beside the mean, P5, P50, P95 and the P95's standard error.
Table budget_spread_table(const BudgetSpreadResult& result);
// The input spreads drawn, with their values and basis.
Table budget_spread_inputs_table(const BudgetSpreadResult& result);
// {samples, seed, caution, notes, warnings, spread, shells: [{name, figures: [...]}], fleet: [...]}.
nlohmann::ordered_json budget_spread_to_json(const BudgetSpreadResult& result);

}  // namespace skein
