// Speed of the coverage evaluator: a 1000-satellite Walker shell on a 1 deg global grid at a 30 s step.
// Counters: visibility pair tests per second and grid-point-instants per second.
//  - BM_coverage_1000_culled_24h: the whole day in culled mode (the speed target: seconds on 2 cores).
//  - BM_coverage_1000_ratio_1h: culled and exhaustive over the first hour, both in the same iteration, so the
//    speed-up (exhaustive time / culled time, wall and CPU) is measured under the same machine load.
// One iteration each (the exhaustive hour takes tens of seconds on 2 cores).
#include <benchmark/benchmark.h>

#include <chrono>
#include <ctime>

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

struct Timed {
  skein::CoverageResult result;
  double wall_s = 0.0, cpu_s = 0.0;  // cpu: process CPU time over all threads (std::clock)
};

Timed timed_run(const skein::Design& d, skein::CoverageMode mode, double span_s) {
  skein::CoverageOptions o;
  o.mode = mode;
  o.force = true;
  o.span_s = span_s;
  const auto w0 = std::chrono::steady_clock::now();
  const std::clock_t c0 = std::clock();
  Timed t;
  t.result = skein::evaluate_coverage(d, o);
  t.cpu_s = static_cast<double>(std::clock() - c0) / CLOCKS_PER_SEC;
  t.wall_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - w0).count();
  return t;
}

void BM_coverage_1000_culled_24h(benchmark::State& state) {
  const skein::Design d = benchmark_design();
  std::int64_t pairs = 0, point_steps = 0;
  double cpu = 0.0;
  for (auto _ : state) {
    const Timed t = timed_run(d, skein::CoverageMode::culled, 86400.0);
    pairs += t.result.pair_tests;
    point_steps += t.result.point_steps;
    cpu += t.cpu_s;
    benchmark::DoNotOptimize(t.result.total.percent_by_fold[0]);
  }
  const double n = static_cast<double>(state.iterations());
  state.counters["pair_tests_per_s"] = benchmark::Counter(static_cast<double>(pairs), benchmark::Counter::kIsRate);
  state.counters["point_steps_per_s"] = benchmark::Counter(static_cast<double>(point_steps), benchmark::Counter::kIsRate);
  state.counters["pair_tests"] = static_cast<double>(pairs) / n;
  state.counters["cpu_s"] = cpu / n;
}

void BM_coverage_1000_ratio_1h(benchmark::State& state) {
  const skein::Design d = benchmark_design();
  Timed c, e;
  for (auto _ : state) {
    c = timed_run(d, skein::CoverageMode::culled, 3600.0);
    e = timed_run(d, skein::CoverageMode::exhaustive, 3600.0);
    // Same metrics from both modes (the tests check this to the bit); a difference here voids the ratio.
    if (c.result.total.percent_by_fold != e.result.total.percent_by_fold) state.SkipWithError("modes disagree");
  }
  const auto rate = [](double v, double s) { return s > 0.0 ? v / s : 0.0; };
  state.counters["culled_wall_s"] = c.wall_s;
  state.counters["exhaustive_wall_s"] = e.wall_s;
  state.counters["culled_cpu_s"] = c.cpu_s;
  state.counters["exhaustive_cpu_s"] = e.cpu_s;
  state.counters["speedup_wall"] = rate(e.wall_s, c.wall_s);
  state.counters["speedup_cpu"] = rate(e.cpu_s, c.cpu_s);
  state.counters["culled_pair_tests_per_s"] = rate(static_cast<double>(c.result.pair_tests), c.wall_s);
  state.counters["exhaustive_pair_tests_per_s"] = rate(static_cast<double>(e.result.pair_tests), e.wall_s);
  state.counters["culled_point_steps_per_s"] = rate(static_cast<double>(c.result.point_steps), c.wall_s);
  state.counters["exhaustive_point_steps_per_s"] = rate(static_cast<double>(e.result.point_steps), e.wall_s);
  state.counters["pair_test_ratio"] = rate(static_cast<double>(e.result.pair_tests), static_cast<double>(c.result.pair_tests));
}

}  // namespace

BENCHMARK(BM_coverage_1000_ratio_1h)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();
BENCHMARK(BM_coverage_1000_culled_24h)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();
