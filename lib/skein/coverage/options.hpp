#pragma once
// The coverage evaluator's run controls, resolved settings and resource estimate (types only; the functions
// are in evaluate.hpp). Below the engine and the driver, so both read them downward.
#include <atomic>
#include <cstdint>
#include <optional>

#include "skein/coverage/result.hpp"

namespace skein {

// Overrides of the design's coverage block, and run controls. Every field has a stated default.
struct CoverageOptions {
  std::optional<double> spacing_deg;        // default: the design's grid.spacing_deg (2 deg)
  std::optional<double> span_s;             // default: the design's span_h (24 h)
  std::optional<double> step_s;             // default: the design's step_s (60 s)
  std::optional<double> min_elevation_deg;  // default: the design's min_elevation_deg (10 deg)
  std::optional<int> max_fold;              // default: the design's max_fold, else min(3, satellites)
  CoverageMode mode = CoverageMode::culled; // exhaustive tests every pair
  bool force = false;                       // run even when the estimate exceeds the limits below
  bool data_age = true;                     // the age of the data, when the design has ground stations (a
                                            // sweep asks for it only when its requirement judges it)
  double memory_limit_bytes = 4.0 * 1024 * 1024 * 1024;  // refuse above 4 GiB of estimated memory
  double pair_test_limit = 2e12;            // refuse above 2e12 estimated pair tests (about an hour on 2 cores)
  std::atomic<std::int64_t>* progress = nullptr;  // when set, incremented by finished point-instants
};

// The settings of a run: the design's coverage block with the overrides applied and checked.
struct CoverageSettings {
  CoverageSpec spec;
  int max_fold = 1;
  int satellites = 0;
};

// An estimate of the work and memory of a run, made before any work starts.
struct CoverageWorkEstimate {
  long points = 0;
  long steps = 0;
  int satellites = 0;
  double point_steps = 0.0;
  double pair_tests = 0.0;        // expected visibility tests
  double memory_bytes = 0.0;      // expected peak memory
  double seconds_2_cores = 0.0;   // rough: 3 ns per pair test and 60 ns per point-instant, over 2 cores
};
}  // namespace skein
