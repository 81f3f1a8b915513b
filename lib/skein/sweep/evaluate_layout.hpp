#pragma once
// Evaluation of one layout of a sweep: coverage (evaluate_coverage) and budget (compute_budget) on the layout's
// design, the requirement check and the cost figures.
#include <optional>
#include <string>
#include <vector>

#include "skein/coverage/evaluate.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

struct LayoutEvaluationOptions {
  CoverageMode mode = CoverageMode::culled;  // coverage pair selection
  bool force = false;                        // pass --force to the coverage work limits
};

struct LayoutMetrics {
  bool evaluated = false;  // false: the evaluators refused the layout (error holds why)
  std::string error;
  int design_satellites = 0;         // every shell
  int design_planes = 0;             // every shell's orbit planes (explicit shells: their listed planes)
  // coverage, over the design's (or the sweep's) grid, area-weighted; fold k = requirement.fold
  double percent_covered = 0.0;      // at fold k
  // cap-area lower bound (coverage/cap_bound.hpp): the least T of the varied shell, the other shells as they
  // are, that could cover the grid continuously at fold k; none for region and site grids
  std::optional<long> cap_bound_satellites;
  double worst_instant_percent = 0.0;  // at fold k
  double worst_point_percent = 0.0;    // at fold k: the least-covered point's percent of time covered
  double max_gap_s = 0.0, mean_gap_s = 0.0, p95_gap_s = 0.0, mean_response_time_s = 0.0;  // at fold k
  double p95_data_age_s = 0.0;  // grid p95 of the age of the data (0 without data age)
  double mean_in_view = 0.0;
  // budget of the (first) varied shell and of the whole design
  double lifetime_days = 0.0;        // first varied shell, natural, selected solar activity
  bool lifetime_lower_bound = false;
  double dv_per_satellite_m_s = 0.0; // varied shell, margin included
  double fleet_dv_m_s = 0.0;         // every satellite of the design
  std::optional<double> propellant_per_satellite_kg;  // varied shell; none without isp_s
  std::optional<double> fleet_propellant_kg;
  bool exceeds_tank = false;         // some shell's propellant exceeds the tank capacity
  std::vector<std::string> cannot_fly;  // "shell NAME: why", for every shell whose budget cannot be flown
  // the requirement
  bool meets = false;
  std::vector<std::string> failed;   // the checks that failed, e.g. "percent_covered 84.20 < 90"; with every_site
                                     // they name the failing sites
};

// The layout design's satellite and plane counts (every shell).
void fill_count_metrics(const Design& design, LayoutMetrics& metrics);
// The budget figures of a layout's design (compute_budget, without the solar-level curves): lifetime, delta-v and
// propellant of shell `shell_index` and of the fleet, the tank and cannot-fly flags. Throws InputError when the
// budget refuses the design. evaluate_layout calls it after the coverage; a search calls it alone (no coverage)
// to order layouts by cost, so both hold the same numbers. With `percentile` (a sweep's budget_percentile), the
// delta-v, propellant and tank figures are that percentile of the layout's Monte Carlo budget.
void fill_budget_metrics(const Design& design, size_t shell_index,
                         const std::optional<SweepBudgetPercentile>& percentile, LayoutMetrics& metrics);
// The failed checks that come from the budget alone (propellant over the tank when the requirement asks for it,
// a budget that cannot be flown): a layout with any never meets the requirement, whatever its coverage.
std::vector<std::string> budget_failures(const Requirement& requirement, const LayoutMetrics& metrics);

// Evaluate one layout. InputErrors from the evaluators (for this layout's values) are caught and returned as
// evaluated = false; they do not stop the sweep.
LayoutMetrics evaluate_layout(const Sweep& sweep, const Layout& layout, const LayoutEvaluationOptions& options = {});

// The coverage options a sweep uses for a layout (fold k of the requirement, the given mode and force).
CoverageOptions sweep_coverage_options(const Sweep& sweep, const LayoutEvaluationOptions& options);

}  // namespace skein
