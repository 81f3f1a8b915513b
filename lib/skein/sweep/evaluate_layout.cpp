#include "skein/sweep/evaluate_layout.hpp"

#include <algorithm>

#include <fmt/format.h>

#include "skein/budget/budget.hpp"
#include "skein/budget/monte_carlo.hpp"
#include "skein/coverage/cap_bound.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/requirement_check.hpp"
#include "skein/error.hpp"

namespace skein {
namespace {

double percentile_of(const SpreadFigure& f, double percent) {
  std::vector<double> sorted = f.values;
  std::sort(sorted.begin(), sorted.end());
  return percentile_of_sorted(sorted, percent / 100.0);
}

// The delta-v and propellant figures (and the tank check) at the sweep's percentile of the layout's Monte Carlo
// budget; the lifetime stays the deterministic one.
void apply_budget_percentile(const Design& design, const BudgetResult& bud, const BudgetOptions& bopt,
                             const SweepBudgetPercentile& bp, size_t shell_index, LayoutMetrics& m) {
  MonteCarloOptions mc;
  mc.samples = bp.samples;
  mc.seed = bp.seed;
  mc.budget = bopt;
  const BudgetSpreadResult r = compute_budget_spread(design, bud, mc);
  const ShellSpread& varied = r.shells.at(shell_index);
  m.dv_per_satellite_m_s = percentile_of(*varied.find("total_dv"), bp.percent);
  m.fleet_dv_m_s = percentile_of(r.fleet.at(0), bp.percent);
  if (m.propellant_per_satellite_kg) m.propellant_per_satellite_kg = percentile_of(*varied.find("propellant"), bp.percent);
  if (m.fleet_propellant_kg) m.fleet_propellant_kg = percentile_of(r.fleet.at(1), bp.percent);
  m.exceeds_tank = false;
  for (size_t s = 0; s < r.shells.size(); ++s) {
    const auto& cap = design.spacecraft.propellant_capacity_kg;
    const SpreadFigure* p = r.shells[s].find("propellant");
    if (cap && p && percentile_of(*p, bp.percent) > *cap) m.exceeds_tank = true;
  }
}

}  // namespace

CoverageOptions sweep_coverage_options(const Sweep& sweep, const LayoutEvaluationOptions& options) {
  CoverageOptions c;
  c.max_fold = sweep.requirement.fold;
  c.mode = options.mode;
  c.force = options.force;
  // The age of the data costs 1.1 to 1.6 times the coverage on a cell grid: only when the requirement judges it.
  c.data_age = uses_data_age(sweep.requirement);
  return c;
}

void fill_count_metrics(const Design& design, LayoutMetrics& m) {
  m.design_satellites = 0;
  m.design_planes = 0;
  for (const Shell& s : design.shells) {
    m.design_satellites += s.satellites;
    m.design_planes += s.pattern == PatternKind::explicit_planes ? static_cast<int>(s.explicit_planes.size()) : s.planes;
  }
}

void fill_budget_metrics(const Design& design, size_t shell_index,
                         const std::optional<SweepBudgetPercentile>& percentile, LayoutMetrics& m) {
  BudgetOptions bopt;
  bopt.level_curves = false;  // only the selected activity's lifetime is reported
  const BudgetResult bud = compute_budget(design, bopt);
  const ShellBudget& sb = bud.shells.at(shell_index);
  m.lifetime_days = sb.lifetime_natural_days;
  m.lifetime_lower_bound = sb.lifetime_lower_bound;
  m.dv_per_satellite_m_s = sb.total_dv_m_s;
  m.fleet_dv_m_s = bud.fleet_dv_m_s;
  m.propellant_per_satellite_kg = sb.propellant_kg;
  m.fleet_propellant_kg = bud.fleet_propellant_kg;
  m.exceeds_tank = std::any_of(bud.shells.begin(), bud.shells.end(), [](const ShellBudget& s) { return s.exceeds_tank; });
  m.cannot_fly.clear();
  for (const ShellBudget& s : bud.shells)
    for (const auto& why : s.cannot_fly) m.cannot_fly.push_back("shell " + s.name + ": " + why);
  if (percentile) apply_budget_percentile(design, bud, bopt, *percentile, shell_index, m);
}

std::vector<std::string> budget_failures(const Requirement& requirement, const LayoutMetrics& m) {
  std::vector<std::string> out;
  if (requirement.within_tank && m.exceeds_tank) out.push_back("propellant exceeds the tank");
  if (!m.cannot_fly.empty()) out.push_back("the budget cannot be flown");  // never the answer of a sweep
  return out;
}

LayoutMetrics evaluate_layout(const Sweep& sweep, const Layout& layout, const LayoutEvaluationOptions& options) {
  LayoutMetrics m;
  const Design design = layout_design(sweep, layout);
  fill_count_metrics(design, m);
  try {
    const CoverageResult cov = evaluate_coverage(design, sweep_coverage_options(sweep, options));
    const int fold = sweep.requirement.fold;
    const size_t k = static_cast<size_t>(fold - 1);
    // The requirement figures as the judge reads them (grid_figure), so a row and its verdict cannot disagree.
    m.percent_covered = grid_figure(cov, RequirementFigure::percent_covered, fold);
    m.cap_bound_satellites = cap_bound_satellites(design, sweep.shell_index, fold);
    m.worst_instant_percent = grid_figure(cov, RequirementFigure::worst_instant_percent, fold);
    m.worst_point_percent = grid_figure(cov, RequirementFigure::worst_point_percent, fold);
    m.max_gap_s = grid_figure(cov, RequirementFigure::max_gap_s, fold);
    m.mean_gap_s = cov.total.gaps_by_fold.at(k).mean_gap_s;
    m.p95_gap_s = grid_figure(cov, RequirementFigure::p95_gap_s, fold);
    m.mean_response_time_s = grid_figure(cov, RequirementFigure::mean_response_time_s, fold);
    m.p95_data_age_s = grid_figure(cov, RequirementFigure::p95_data_age_s, fold);
    m.failed = failed_check_texts(judge_requirement(sweep.requirement, cov));
    m.mean_in_view = cov.total.mean_in_view;
    fill_budget_metrics(design, sweep.shell_index, sweep.budget_percentile, m);
    m.evaluated = true;
  } catch (const InputError& e) {
    m.evaluated = false;
    m.error = e.what();
    return m;
  }
  for (auto& f : budget_failures(sweep.requirement, m)) m.failed.push_back(std::move(f));
  m.meets = m.failed.empty();
  return m;
}

}  // namespace skein
