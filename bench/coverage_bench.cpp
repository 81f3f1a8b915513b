// Speed of the coverage evaluator: a 1000-satellite Walker shell on a 1 deg global grid over one day at a
// 30 s step, culled against exhaustive. Counters: visibility pair tests per second and grid-point-instants
// per second. One iteration each (the exhaustive case takes minutes on 2 cores).
#include <benchmark/benchmark.h>

#include "skein/coverage/evaluate.hpp"
#include "skein/design/design_file.hpp"

namespace {

skein::Design benchmark_design() {
  // 1000 = 40 planes x 25, 550 km, 53 deg, F = 17: a broadband-style shell; 10 deg elevation mask, fold 1.
  return skein::read_design_text(R"(name: bench 1000
epoch: 2027-03-01T00:00:00Z
spacecraft:
  dry_mass_kg: 260
  drag_area_m2: 3
  drag_coefficient: 2.2
shells:
  - name: shell
    pattern: walker-delta
    satellites: 1000
    planes: 40
    phasing: 17
    altitude_km: 550
    inclination_deg: 53
coverage:
  grid:
    spacing_deg: 1
  min_elevation_deg: 10
  span_h: 24
  step_s: 30
  max_fold: 1
)", "bench.yaml");
}

void run(benchmark::State& state, skein::CoverageMode mode) {
  const skein::Design d = benchmark_design();
  skein::CoverageOptions o;
  o.mode = mode;
  o.force = true;
  std::int64_t pairs = 0, point_steps = 0;
  double covered = 0.0;
  for (auto _ : state) {
    const skein::CoverageResult r = skein::evaluate_coverage(d, o);
    pairs += r.pair_tests;
    point_steps += r.point_steps;
    covered = r.total.percent_by_fold[0];
    benchmark::DoNotOptimize(covered);
  }
  state.counters["pair_tests_per_s"] = benchmark::Counter(static_cast<double>(pairs), benchmark::Counter::kIsRate);
  state.counters["point_steps_per_s"] = benchmark::Counter(static_cast<double>(point_steps), benchmark::Counter::kIsRate);
  state.counters["pair_tests"] = static_cast<double>(pairs) / static_cast<double>(state.iterations());
}

void BM_coverage_1000_culled(benchmark::State& state) { run(state, skein::CoverageMode::culled); }
void BM_coverage_1000_exhaustive(benchmark::State& state) { run(state, skein::CoverageMode::exhaustive); }

}  // namespace

BENCHMARK(BM_coverage_1000_culled)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();
BENCHMARK(BM_coverage_1000_exhaustive)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();
