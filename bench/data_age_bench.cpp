// Cost of ground contacts, daylight at the target and the age of the data, next to grid coverage, on one
// invented case: Walker 24/6/1 at 550 km, 53 deg, one day at 60 s.
//  - BM_contacts_next_to_grid: in one iteration, grid coverage of a 2 deg global grid (culled), then
//    `compute_contacts` for three stations, then coverage of four sites with data age (two searches per site:
//    the passes over it, plus the downlinks once), and the same grid with the daylight mask at 10 deg. Counters:
//    each wall time and its ratio to the grid's, and the process's peak resident memory. Then the same grid
//    with the three stations: coverage plus the data age of its 16,200 cells; cells_data_age_over_grid is the
//    data age's own time (the difference) over the grid's.
// One iteration (a shared machine: run it a few times and compare the ratios, not the seconds).
#include <benchmark/benchmark.h>

#include <sys/resource.h>

#include <chrono>

#include "skein/coverage/contacts.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/input/design_file.hpp"

namespace {

const char* const head = R"(name: bench contacts
epoch: 2027-03-01T00:00:00Z
spacecraft:
  dry_mass_kg: 100
  drag_area_m2: 1
  drag_coefficient: 2.2
shells:
  - name: shell
    pattern: walker-delta
    satellites: 24
    planes: 6
    phasing: 1
    altitude_km: 550
    inclination_deg: 53
)";

const char* const stations = R"(ground_stations:
  - {name: Heron Point, lat_deg: 64.1, lon_deg: -21.9, min_elevation_deg: 5}
  - {name: Dune Array, lat_deg: -25.9, lon_deg: 28.2, min_elevation_deg: 5}
  - {name: Basalt Hill, lat_deg: 19.8, lon_deg: -155.5, height_km: 1.0, min_elevation_deg: 5}
)";

// With the stations (contacts, data age) or without them (grid coverage alone: no data age).
skein::Design design(const std::string& coverage, bool with_stations = true) {
  return skein::read_design_text(std::string(head) + (with_stations ? stations : "") + coverage, "bench.yaml");
}

template <class F>
double wall_s(F&& f) {
  const auto t0 = std::chrono::steady_clock::now();
  f();
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

void BM_contacts_next_to_grid(benchmark::State& state) {
  const std::string global = "coverage:\n  grid:\n    spacing_deg: 2\n  span_h: 24\n  step_s: 60\n  max_fold: 1\n";
  const skein::Design grid = design(global, false);
  const skein::Design grid_age = design(global);
  const skein::Design lit = design(
      "coverage:\n  grid:\n    spacing_deg: 2\n  min_sun_elevation_deg: 10\n  span_h: 24\n  step_s: 60\n  max_fold: 1\n",
      false);
  const skein::Design sites = design(
      "coverage:\n  grid:\n    kind: sites\n    sites:\n      - {name: a, lat_deg: 48, lon_deg: 2}\n"
      "      - {name: b, lat_deg: 23, lon_deg: 90}\n      - {name: c, lat_deg: -34, lon_deg: -61}\n"
      "      - {name: d, lat_deg: 1, lon_deg: 104}\n  min_sun_elevation_deg: 10\n  span_h: 24\n  step_s: 60\n"
      "  max_fold: 1\n");
  double t_grid = 0, t_contacts = 0, t_age = 0, t_lit = 0, t_cells_age = 0;
  for (auto _ : state) {
    t_grid = wall_s([&] { benchmark::DoNotOptimize(skein::evaluate_coverage(grid)); });
    t_contacts = wall_s([&] { benchmark::DoNotOptimize(skein::compute_contacts(grid_age)); });
    t_age = wall_s([&] {
      const skein::CoverageResult r = skein::evaluate_coverage(sites);
      if (!r.data_age) state.SkipWithError("no data age");
      benchmark::DoNotOptimize(r);
    });
    t_lit = wall_s([&] { benchmark::DoNotOptimize(skein::evaluate_coverage(lit)); });
    t_cells_age = wall_s([&] {
      const skein::CoverageResult r = skein::evaluate_coverage(grid_age);
      if (!r.data_age) state.SkipWithError("no data age on the cells");
      benchmark::DoNotOptimize(r);
    });
  }
  state.counters["grid_wall_s"] = t_grid;
  state.counters["contacts_wall_s"] = t_contacts;
  state.counters["sites_with_data_age_wall_s"] = t_age;
  state.counters["grid_lit_wall_s"] = t_lit;
  state.counters["contacts_over_grid"] = t_contacts / t_grid;
  state.counters["data_age_over_grid"] = t_age / t_grid;
  state.counters["lit_over_grid"] = t_lit / t_grid;
  // The 2 deg grid's coverage with the data age of its 16,200 cells, against the same coverage without.
  state.counters["grid_with_data_age_wall_s"] = t_cells_age;
  state.counters["cells_data_age_over_grid"] = (t_cells_age - t_grid) / t_grid;
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  state.counters["peak_rss_mib"] = static_cast<double>(u.ru_maxrss) / 1024.0;
}
BENCHMARK(BM_contacts_next_to_grid)->Iterations(1)->Unit(benchmark::kSecond)->UseRealTime();

}  // namespace


