#pragma once
// Monte Carlo budgets: the budget of every shell rerun under draws of the solar cycle's timing and strength, the
// drag coefficient, the drag area and the injection errors, summarised by percentiles beside the deterministic
// values. The percentiles reflect the stated input spreads only (budget.spread and budget.injection_sigma).
#include <string>
#include <string_view>
#include <vector>

#include "skein/budget/budget.hpp"
#include "skein/budget/sample_stats.hpp"
#include "skein/design/design.hpp"

namespace skein {

struct MonteCarloOptions {
  long samples = 1000;               // monte_carlo_min_samples .. monte_carlo_max_samples
  unsigned long long seed = 1;       // 0 .. 2^53
  BudgetOptions budget;              // as given to compute_budget (solar override, horizon)
};

// The draw of sample `index` for shell `shell_index` (the solar and drag draws are shared by every shell of a
// sample: one Sun, one spacecraft type; the injection errors are the shell's own). Each sample consumes a fixed
// sequence of numbers from SampleRandom(seed, index): the phase (uniform), the amplitude, Cd and area factors
// (normal, clipped at +-3), then per shell the altitude and inclination errors (normal, clipped at +-6), so a
// spread set to zero leaves every other draw unchanged.
BudgetDraw draw_budget_sample(const BudgetSpec& spec, unsigned long long seed, unsigned long long index,
                              size_t shell_index);

// One reported figure over the samples.
struct SpreadFigure {
  std::string name;            // natural_lifetime, a budget line's name, total_dv, propellant, fleet_dv, fleet_propellant
  std::string unit;            // days, m/s or kg
  double deterministic = 0.0;  // the value compute_budget reports (the stated case; the node line at k sigma)
  SampleSummary summary;
  std::vector<double> values;  // by sample index
};

struct ShellSpread {
  std::string name;
  std::vector<SpreadFigure> figures;
  long lifetime_lower_bounds = 0;  // samples still in orbit at the horizon (their lifetime is the horizon)
  long cannot_fly = 0;             // samples whose budget cannot be flown (ShellBudget::cannot_fly)
  const SpreadFigure* find(std::string_view figure) const;
};

struct BudgetSpreadResult {
  long samples = 0;
  unsigned long long seed = 0;
  BudgetSpread spread;
  double injection_sigma_altitude_km = 0.0;
  double injection_sigma_inclination_deg = 0.0;
  SolarLevel solar = SolarLevel::mean;
  std::vector<ShellSpread> shells;
  std::vector<SpreadFigure> fleet;   // fleet_dv and (when every shell has one) fleet_propellant over all shells
  std::vector<std::string> notes;    // what was drawn and what was held, and the standard-error method
  std::vector<std::string> warnings; // lower-bound lifetimes, samples that cannot be flown
};

// Refuse a sample count or seed out of range (InputError naming budget.samples or budget.seed, the value and the
// valid range). Run it before the work it guards.
void check_monte_carlo_options(const MonteCarloOptions& options);

// Run the samples in parallel (TBB); the numbers are the same for any thread count. `deterministic` is
// compute_budget(design, options.budget). Throws InputError for a sample count or seed out of range (naming the
// value and the valid range) and for a sample whose budget is refused (naming the lowest such sample and its draw).
BudgetSpreadResult compute_budget_spread(const Design& design, const BudgetResult& deterministic,
                                         const MonteCarloOptions& options);

// The caution printed with every Monte Carlo budget.
inline constexpr std::string_view budget_spread_caution =
    "percentiles reflect the stated input spreads only (solar-cycle timing and strength, drag coefficient, drag "
    "area, injection errors); model error and unstated inputs are not in them";

}  // namespace skein
