// A sweep with budget_percentile trades the P-th percentile of each layout's Monte Carlo budget: the row's delta-v
// and propellant figures equal a brute-force percentile of the layout design's own samples.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "skein/budget/monte_carlo.hpp"
#include "skein/input/sweep_file.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"

using namespace skein;

namespace {
// numpy.percentile's "linear" rule, written out: rank (n - 1) p of the sorted values.
double brute(std::vector<double> v, double p) {
  std::sort(v.begin(), v.end());
  const double rank = static_cast<double>(v.size() - 1) * p;
  const size_t lo = static_cast<size_t>(std::floor(rank));
  const size_t hi = std::min(lo + 1, v.size() - 1);
  return v[lo] + (rank - static_cast<double>(lo)) * (v[hi] - v[lo]);
}
}  // namespace

TEST_CASE("sweep: budget_percentile 90 trades the P90 of the layout's Monte Carlo budget") {
  // designs/spread.yaml holds budget.samples 200 and seed 11, which the sweep takes.
  const std::string axes =
      "name: spread trade\nbase: spread.yaml\nshell: relay\ncoverage:\n  grid:\n    kind: global\n    spacing_deg: 30\n"
      "  span_h: 1\n  step_s: 300\naxes:\n  satellites: [6]\n  planes: [2]\n  phasing: [1]\n  altitude_km: [550]\n"
      "requirement:\n  fold: 1\n  min_percent_covered: 0\ncost: [satellites]\n";
  const std::string folder = std::string(SKEIN_SOURCE_DIR) + "/designs";
  const Sweep plain = read_sweep_text(axes, "plain.yaml", folder);
  const Sweep traded = read_sweep_text(axes + "budget_percentile: 90\n", "p90.yaml", folder);
  REQUIRE(traded.budget_percentile);
  CHECK(traded.budget_percentile->samples == 200);
  CHECK(traded.budget_percentile->seed == 11);
  const LayoutSet set = expand_layouts(traded);
  const Layout& layout = set.layouts.at(0);
  const LayoutMetrics m0 = evaluate_layout(plain, layout), m = evaluate_layout(traded, layout);
  REQUIRE(m0.evaluated);
  REQUIRE(m.evaluated);

  // Brute force on the layout's own design: its deterministic budget, then its samples.
  const Design d = layout_design(traded, layout);
  MonteCarloOptions o;
  o.samples = 200;
  o.seed = 11;
  o.budget.level_curves = false;
  const BudgetResult det = compute_budget(d, o.budget);
  const BudgetSpreadResult r = compute_budget_spread(d, det, o);
  CHECK(m0.dv_per_satellite_m_s == det.shells[0].total_dv_m_s);
  CHECK(m.dv_per_satellite_m_s == brute(r.shells[0].find("total_dv")->values, 0.90));
  CHECK(m.fleet_dv_m_s == brute(r.fleet[0].values, 0.90));
  REQUIRE(m.propellant_per_satellite_kg);
  CHECK(*m.propellant_per_satellite_kg == brute(r.shells[0].find("propellant")->values, 0.90));
  CHECK(m.lifetime_days == m0.lifetime_days);  // the lifetime stays deterministic
  CHECK(m.dv_per_satellite_m_s != m0.dv_per_satellite_m_s);
}
