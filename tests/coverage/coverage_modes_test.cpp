// Evidence for the culled evaluation: it gives the same metrics as the exhaustive oracle, whatever the
// thread count.
#include <doctest/doctest.h>

#include <tbb/global_control.h>

#include "coverage_test_designs.hpp"
#include "skein/coverage/evaluate.hpp"

using namespace skein;

namespace {

Design mixed_design() {
  // Two shells (a Walker delta and an eccentric single plane) with a payload cone and a 3-fold metric.
  return read_design_text(test::coverage_design_head() + test::walker_shell(60, 6, 1, 700.0, 55.0) +
                              "  - name: ecc\n    pattern: walker-delta\n    satellites: 4\n    planes: 1\n    phasing: 0\n"
                              "    semi_major_axis_km: 8000\n    eccentricity: 0.05\n    inclination_deg: 98\n"
                              "coverage:\n  grid:\n    spacing_deg: 5\n  min_elevation_deg: 10\n"
                              "  nadir_half_angle_deg: 60\n  span_h: 3\n  step_s: 60\n  max_fold: 3\n",
                          "modes.yaml");
}

void check_same(const CoverageResult& a, const CoverageResult& b) {
  REQUIRE(a.points.size() == b.points.size());
  for (size_t i = 0; i < a.points.size(); ++i) {
    const PointCoverage& p = a.points[i];
    const PointCoverage& q = b.points[i];
    CAPTURE(i);
    // Identical, not approximately equal: the candidate sets hold every visible satellite, in the same order.
    CHECK(p.percent_by_fold == q.percent_by_fold);
    CHECK(p.max_gap_s == q.max_gap_s);
    CHECK(p.mean_gap_s == q.mean_gap_s);
    CHECK(p.p95_gap_s == q.p95_gap_s);
    CHECK(p.gap_count == q.gap_count);
    CHECK(p.mean_response_time_s == q.mean_response_time_s);
    CHECK(p.mean_in_view == q.mean_in_view);
    CHECK(p.max_in_view == q.max_in_view);
    CHECK(p.radius_deg_by_fold == q.radius_deg_by_fold);
  }
  CHECK(a.total.percent_by_fold == b.total.percent_by_fold);
  CHECK(a.required_radius_deg == b.required_radius_deg);
  CHECK(a.worst_instant_covered_percent == b.worst_instant_covered_percent);
  CHECK(a.in_view_fraction == b.in_view_fraction);
  CHECK(a.gap_quantiles_s == b.gap_quantiles_s);
}

}  // namespace

TEST_CASE("coverage modes: culled and exhaustive give identical metrics") {
  // Reference: the exhaustive mode, which tests every (satellite, point) pair (common practice as an oracle).
  const Design d = mixed_design();
  CoverageOptions culled, exhaustive;
  exhaustive.mode = CoverageMode::exhaustive;
  const CoverageResult a = evaluate_coverage(d, culled), b = evaluate_coverage(d, exhaustive);
  check_same(a, b);
  CHECK(a.pair_tests * 5 < b.pair_tests);  // culling tests far fewer pairs
  CHECK(a.total.percent_by_fold[0] > 1.0);  // the case is not trivially empty
  CHECK(a.total.gap_count > 100);
}

TEST_CASE("coverage modes: results do not depend on the TBB thread count") {
  const Design d = mixed_design();
  CoverageResult one, two;
  {
    tbb::global_control c(tbb::global_control::max_allowed_parallelism, 1);
    one = evaluate_coverage(d);
  }
  {
    tbb::global_control c(tbb::global_control::max_allowed_parallelism, 2);
    two = evaluate_coverage(d);
  }
  check_same(one, two);
  CHECK(one.total.mean_in_view == two.total.mean_in_view);
  CHECK(one.total.p95_gap_s == two.total.p95_gap_s);
}
