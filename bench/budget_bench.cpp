// Speed of the budget evaluator: a later sweep evaluates hundreds of layouts, so one shell's budget
// (lifetime under three levels, make-up, disposal search) should take milliseconds.
#include <benchmark/benchmark.h>

#include <string>

#include <tbb/global_control.h>

#include "skein/budget/budget.hpp"
#include "skein/budget/monte_carlo.hpp"
#include "skein/input/design_file.hpp"

namespace {

const std::string design_yaml = R"(name: Kestrel bench
epoch: 2027-03-01T00:00:00Z
spacecraft:
  dry_mass_kg: 145
  drag_area_m2: 0.85
  drag_coefficient: 2.2
  isp_s: 220
shells:
  - name: imaging
    pattern: walker-delta
    satellites: 12
    planes: 3
    phasing: 1
    altitude_km: 540
    inclination_deg: sun-synchronous
    ltan: "10:30"
budget:
  mission_life_years: 5
)";

void BM_BudgetOneShell(benchmark::State& state) {
  const skein::Design d = skein::read_design_text(design_yaml, "bench.yaml");
  skein::BudgetOptions o;
  o.level_curves = state.range(0) != 0;
  for (auto _ : state) benchmark::DoNotOptimize(skein::compute_budget(d, o));
}
BENCHMARK(BM_BudgetOneShell)->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond);

void BM_NaturalLifetime540(benchmark::State& state) {
  skein::OrbitAtmosphere atm;
  for (auto _ : state)
    benchmark::DoNotOptimize(skein::natural_lifetime(skein::wgs84, atm, 0.0129, skein::wgs84.radius_km + 540.0, 0.0,
                                                     0.0, 120.0, 73050.0).days);
}
BENCHMARK(BM_NaturalLifetime540)->Unit(benchmark::kMicrosecond);

// Issue target: at least 10,000 Monte Carlo samples of a one-shell budget at 550 km in under 10 s on 2 cores.
// One shell of 12 satellites at 550 km, solar cycle, natural-decay disposal (the costliest line: a bisection of
// decay runs per sample). Arg: samples; threads fixed at 2 with tbb::global_control.
const std::string mc_yaml = R"(name: Plover spread bench
epoch: 2027-03-01T00:00:00Z
spacecraft:
  dry_mass_kg: 145
  drag_area_m2: 0.85
  drag_coefficient: 2.2
  isp_s: 220
shells:
  - name: mid
    pattern: walker-delta
    satellites: 12
    planes: 3
    phasing: 1
    altitude_km: 550
    inclination_deg: 53
budget:
  mission_life_years: 5
  solar_activity: cycle
)";

void BM_MonteCarlo550(benchmark::State& state) {
  const skein::Design d = skein::read_design_text(mc_yaml, "bench.yaml");
  tbb::global_control two(tbb::global_control::max_allowed_parallelism, 2);
  skein::MonteCarloOptions o;
  o.samples = state.range(0);
  const skein::BudgetResult det = skein::compute_budget(d, o.budget);
  for (auto _ : state) benchmark::DoNotOptimize(skein::compute_budget_spread(d, det, o));
  state.counters["samples_per_s"] = benchmark::Counter(static_cast<double>(state.range(0)) * state.iterations(),
                                                       benchmark::Counter::kIsRate);
}
BENCHMARK(BM_MonteCarlo550)->Arg(10000)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();

}  // namespace
