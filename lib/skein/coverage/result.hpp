#pragma once
// What the coverage evaluator returns: per-point metrics, area-weighted aggregates, latitude bands and
// the distributions the report plots. Times in seconds, angles in degrees, percentages 0..100.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "skein/coverage/data_age.hpp"
#include "skein/coverage/grid.hpp"
#include "skein/coverage/requirement_verdict.hpp"
#include "skein/design/coverage_spec.hpp"

namespace skein {

// How candidate (satellite, point) pairs are chosen.
enum class CoverageMode {
  culled,     // footprint culling by latitude rows and longitude windows
  exhaustive  // every pair tested (the oracle)
};
std::string_view to_string(CoverageMode mode);
std::optional<CoverageMode> coverage_mode_from_string(std::string_view text);

// Revisit figures at one fold k. A gap at fold k is an interval with fewer than k satellites in view (at
// k = 1, with none); gaps at the start and end of the span count. Times in seconds.
struct GapFigures {
  double max_gap_s = 0.0;             // longest gap (for an aggregate: the worst point's)
  double mean_gap_s = 0.0;            // 0 when there is no gap
  double p95_gap_s = 0.0;             // 95th percentile of the gaps (an aggregate pools them, area-weighted)
  long gap_count = 0;
  double mean_response_time_s = 0.0;  // time average of the wait until at least k are in view
};

struct PointCoverage {
  GridPoint point;                          // position, weight, cell bounds
  std::vector<double> percent_by_fold;      // k = 1..K: percent of the span with at least k satellites in view
  double max_gap_s = 0.0;                   // longest interval with no satellite in view (edge gaps included)
  double mean_gap_s = 0.0;                  // 0 when there is no gap
  double p95_gap_s = 0.0;                   // nearest-rank 95th percentile of this point's gaps
  long gap_count = 0;
  double mean_response_time_s = 0.0;        // time average of the wait until the next coverage
  double mean_in_view = 0.0;                // time average of the number of satellites in view
  int max_in_view = 0;
  long passes = 0;                          // satellite passes over the point (in view at the start, or rising)
  double mean_pass_s = 0.0;                 // in-view time summed over satellites / passes (cut at the span's ends)
  std::vector<double> radius_deg_by_fold;   // k = 1..K: largest central angle to the k-th nearest satellite
  std::vector<GapFigures> gaps_by_fold;     // k = 1..K; entry 0 holds the fold-1 figures above
};

// Aggregates over a set of points (the whole grid or one latitude band), area-weighted.
struct CoverageAggregate {
  double area_weight = 0.0;                 // share of the grid's weight in this set
  long points = 0;
  std::vector<double> percent_by_fold;      // area-weighted percent of time covered, k = 1..K
  double max_gap_s = 0.0;                   // worst point's longest gap
  double mean_gap_s = 0.0;                  // mean over all gaps, each weighted by its point's area
  double p95_gap_s = 0.0;                   // 95th percentile of the pooled, area-weighted gap distribution
  long gap_count = 0;
  double mean_response_time_s = 0.0;        // area-weighted
  double mean_in_view = 0.0;                // area- and time-weighted
  int max_in_view = 0;
  std::vector<GapFigures> gaps_by_fold;     // k = 1..K; entry 0 holds the fold-1 figures above
};

// The least-covered point at fold k: the lowest percent of time with at least k in view (ties: the longer
// gap at fold k, then the first in grid order), and its longest gap at fold k.
struct WorstPoint {
  size_t point = 0;                         // index into CoverageResult::points
  double percent_covered = 0.0;
  double max_gap_s = 0.0;
};

struct LatitudeBand {
  double lat_min_deg = 0.0, lat_max_deg = 0.0;
  CoverageAggregate metrics;
};

struct CoverageResult {
  std::string design;
  GridKind grid = GridKind::global;
  double spacing_deg = 0.0;
  double span_s = 0.0, step_s = 0.0;
  long steps = 0;                           // sample instants, including both ends
  double min_elevation_deg = 0.0;
  std::optional<double> nadir_half_angle_deg;
  std::optional<double> min_sun_elevation_deg;  // set: every coverage figure counts lit coverage only
  int max_fold = 1;
  int satellites = 0;
  CoverageMode mode = CoverageMode::culled;

  std::vector<PointCoverage> points;        // in grid order
  CoverageAggregate total;
  std::vector<LatitudeBand> bands;          // south to north, only bands holding points
  std::vector<double> required_radius_deg;  // k = 1..K: max over time and grid of the central angle to the k-th nearest
  std::vector<double> worst_instant_covered_percent;  // k = 1..K: min over the sample instants of the area share covered
  std::vector<WorstPoint> worst_point_by_fold;        // k = 1..K
  std::vector<double> in_view_fraction;     // [n]: time- and area-weighted share with n satellites in view; last bin is "n or more"
  std::vector<double> gap_quantiles_s;      // [q], q = 0..100 %: pooled area-weighted gap distribution (empty: no gaps)
  std::optional<DataAgeResult> data_age;    // designs with ground stations (data_age.hpp); none otherwise
  std::optional<RequirementVerdict> requirement;  // the design's coverage.requirement, judged (none without one)

  // Work done, for benchmarks and the progress line.
  std::int64_t point_steps = 0;             // grid points x sample instants
  std::int64_t pair_tests = 0;              // (satellite, point, instant) visibility tests
  std::int64_t distance_tests = 0;          // (satellite, point, instant) central angles for the k-th nearest
  std::int64_t radius_fallbacks = 0;        // point-instants whose k-th nearest lay beyond the search cap (exact scan)
  std::int64_t events = 0;                  // rises and sets applied to the points' timelines (same in both modes)
  // Passes that begin and end between two sample instants, found by the search between instants; the bounds
  // that search rests on: how far a ground track can stray from its chord over a step, and the position error
  // of the cubic path between two instants.
  std::int64_t hidden_passes = 0;
  double track_deviation_bound_deg = 0.0;
  double path_error_bound_m = 0.0;
};

}  // namespace skein
