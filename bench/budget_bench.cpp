// Speed of the budget evaluator: a later sweep evaluates hundreds of layouts, so one shell's budget
// (lifetime under three levels, make-up, disposal search) should take milliseconds.
#include <benchmark/benchmark.h>

#include <string>

#include "skein/budget/budget.hpp"
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

}  // namespace
