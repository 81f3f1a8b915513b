// Layouts per second of a trade sweep: the 72 layouts of designs/sweeps/kestrel-small.yaml (demo base design,
// imaging shell varied; coverage on a 10 deg global grid over 6 h at 120 s, budget for both shells), evaluated
// in parallel with TBB on all cores, rows encoded as for the journal.
#include <benchmark/benchmark.h>

#include <filesystem>
#include <string>

#include "skein/input/sweep_file.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/sweep_run.hpp"

namespace {

// The project root, from this file's path (CMake compiles it by its absolute path).
std::string source_dir() { return std::filesystem::path(__FILE__).parent_path().parent_path().string(); }

void BM_sweep_kestrel_small(benchmark::State& state) {
  const skein::Sweep sweep = skein::read_sweep_file(source_dir() + "/designs/sweeps/kestrel-small.yaml");
  const skein::LayoutSet set = skein::expand_layouts(sweep);
  const auto n = static_cast<size_t>(state.range(0));
  std::vector<size_t> todo;
  for (size_t i = 0; i < n && i < set.layouts.size(); ++i) todo.push_back(i);
  for (auto _ : state) {
    size_t bytes = 0;
    skein::evaluate_layouts(sweep, set, todo, [&](size_t, const std::string& row) { bytes += row.size(); });
    benchmark::DoNotOptimize(bytes);
  }
  state.counters["layouts_per_s"] =
      benchmark::Counter(static_cast<double>(todo.size()) * static_cast<double>(state.iterations()),
                         benchmark::Counter::kIsRate);
}
BENCHMARK(BM_sweep_kestrel_small)->Arg(72)->Unit(benchmark::kMillisecond)->UseRealTime()->MinTime(2.0);

}  // namespace
