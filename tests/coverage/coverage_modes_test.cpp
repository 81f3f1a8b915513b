// Evidence for the culled evaluation: it gives the same metrics as the exhaustive oracle, whatever the
// thread count.
#include <doctest/doctest.h>

#include <tbb/global_control.h>
#include <tbb/task_group.h>

#include <utility>

#include "coverage_test_designs.hpp"
#include "skein/coverage/evaluate.hpp"

using namespace skein;

namespace {

Design mixed_design(const std::string& extra = "") {
  // Two shells (a Walker delta and an eccentric single plane) with a payload cone and a 3-fold metric.
  return read_design_text(test::coverage_design_head() + test::walker_shell(60, 6, 1, 700.0, 55.0) +
                              "  - name: ecc\n    pattern: walker-delta\n    satellites: 4\n    planes: 1\n    phasing: 0\n"
                              "    semi_major_axis_km: 8000\n    eccentricity: 0.05\n    inclination_deg: 98\n"
                              "coverage:\n  grid:\n    spacing_deg: 5\n  min_elevation_deg: 10\n"
                              "  nadir_half_angle_deg: 60\n  span_h: 3\n  step_s: 60\n  max_fold: 3\n" + extra,
                          "modes.yaml");
}

Design awkward_sites_design(const std::string& extra = "") {
  // Sites where the culling windows are hardest: both poles, the antimeridian from both sides, a high site
  // and two sites on one latitude far apart; a polar and a low-inclination shell, 2-fold.
  return read_design_text(test::coverage_design_head() + test::walker_shell(24, 4, 1, 800.0, 87.0) +
                              "  - name: low\n    pattern: walker-delta\n    satellites: 6\n    planes: 2\n    phasing: 1\n"
                              "    altitude_km: 500\n    inclination_deg: 30\n"
                              "coverage:\n  grid:\n    kind: sites\n    sites:\n"
                              "      - {name: north, lat_deg: 90, lon_deg: 0}\n"
                              "      - {name: south, lat_deg: -90, lon_deg: 45}\n"
                              "      - {name: east, lat_deg: 12, lon_deg: 180}\n"
                              "      - {name: west, lat_deg: 12, lon_deg: -179.999}\n"
                              "      - {name: high, lat_deg: -16.5, lon_deg: -68.1, height_km: 4.1}\n"
                              "      - {name: far, lat_deg: 12, lon_deg: 3}\n"
                              "  min_elevation_deg: 5\n  span_h: 12\n  step_s: 45\n  max_fold: 2\n" + extra,
                          "awkward.yaml");
}

Design region_design(const std::string& extra = "") {
  // A region across the antimeridian (vertices east of 180 written as lon > 180), 1 deg cells.
  return read_design_text(test::coverage_design_head() + test::walker_shell(40, 5, 2, 1000.0, 60.0) +
                              "coverage:\n  grid:\n    kind: region\n    spacing_deg: 1\n"
                              "    vertices: [[170, -20], [200, -20], [200, 15], [170, 15]]\n"
                              "  min_elevation_deg: 15\n  span_h: 6\n  step_s: 30\n  max_fold: 2\n" + extra,
                          "region.yaml");
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
    CHECK(p.passes == q.passes);
    CHECK(p.mean_pass_s == q.mean_pass_s);
    CHECK(p.radius_deg_by_fold == q.radius_deg_by_fold);
    REQUIRE(p.gaps_by_fold.size() == q.gaps_by_fold.size());
    for (size_t k = 0; k < p.gaps_by_fold.size(); ++k) {
      CHECK(p.gaps_by_fold[k].max_gap_s == q.gaps_by_fold[k].max_gap_s);
      CHECK(p.gaps_by_fold[k].p95_gap_s == q.gaps_by_fold[k].p95_gap_s);
      CHECK(p.gaps_by_fold[k].gap_count == q.gaps_by_fold[k].gap_count);
      CHECK(p.gaps_by_fold[k].mean_response_time_s == q.gaps_by_fold[k].mean_response_time_s);
    }
  }
  CHECK(a.total.percent_by_fold == b.total.percent_by_fold);
  CHECK(a.required_radius_deg == b.required_radius_deg);
  CHECK(a.worst_instant_covered_percent == b.worst_instant_covered_percent);
  CHECK(a.in_view_fraction == b.in_view_fraction);
  CHECK(a.gap_quantiles_s == b.gap_quantiles_s);
  CHECK(a.events == b.events);  // the same rises and sets, found by either mode
  CHECK(a.hidden_passes == b.hidden_passes);
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

TEST_CASE("coverage modes: culled and exhaustive agree at poles, across the antimeridian and on a region") {
  // Reference: the exhaustive oracle, as above.
  for (const Design& d : {awkward_sites_design(), region_design()}) {
    CAPTURE(d.name);
    CoverageOptions exhaustive;
    exhaustive.mode = CoverageMode::exhaustive;
    const CoverageResult a = evaluate_coverage(d), b = evaluate_coverage(d, exhaustive);
    check_same(a, b);
    CHECK(a.total.gap_count > 10);  // passes happen: the comparison is not between two empty timelines
  }
}

namespace {
// The same design evaluated (culled) with TBB limited to one thread, then to two.
std::pair<CoverageResult, CoverageResult> at_one_and_two_threads(const Design& d) {
  std::pair<CoverageResult, CoverageResult> out;
  {
    tbb::global_control c(tbb::global_control::max_allowed_parallelism, 1);
    out.first = evaluate_coverage(d);
  }
  {
    tbb::global_control c(tbb::global_control::max_allowed_parallelism, 2);
    out.second = evaluate_coverage(d);
  }
  return out;
}
}  // namespace

TEST_CASE("coverage modes: results do not depend on the TBB thread count") {
  const Design d = mixed_design();
  const auto [one, two] = at_one_and_two_threads(d);
  check_same(one, two);
  CHECK(one.total.mean_in_view == two.total.mean_in_view);
  CHECK(one.total.p95_gap_s == two.total.p95_gap_s);
}

// Daylight at the target (coverage.min_sun_elevation_deg): the changes of daylight are events of each point's
// timeline, applied by the same function in both modes, so the modes must still agree to the bit. The
// thresholds put the terminator across the grid (mixed, region) and the south pole's Sun (about 7.7 deg high on
// 1 March, declination -7.6 deg) just above or below the threshold (sites).
TEST_CASE("coverage modes: with the daylight mask culled and exhaustive still agree, whatever the thread count") {
  const std::vector<Design> designs = {mixed_design("  min_sun_elevation_deg: 10\n"),
                                       awkward_sites_design("  min_sun_elevation_deg: 7.5\n"),
                                       region_design("  min_sun_elevation_deg: -6\n")};
  for (const Design& d : designs) {
    CAPTURE(d.name);
    CoverageOptions exhaustive;
    exhaustive.mode = CoverageMode::exhaustive;
    const CoverageResult a = evaluate_coverage(d), b = evaluate_coverage(d, exhaustive);
    check_same(a, b);
    CHECK(a.min_sun_elevation_deg.has_value());
    CHECK(a.total.percent_by_fold[0] > 0.1);
    const auto [one, two] = at_one_and_two_threads(d);
    check_same(one, two);
    check_same(one, a);
  }
  // Lit coverage is at most the coverage in view, point by point.
  const CoverageResult lit = evaluate_coverage(designs[0]), plain = evaluate_coverage(mixed_design());
  int darker = 0;
  for (size_t i = 0; i < lit.points.size(); ++i) {
    CHECK(lit.points[i].percent_by_fold[0] <= plain.points[i].percent_by_fold[0] + 1e-9);
    darker += lit.points[i].percent_by_fold[0] < plain.points[i].percent_by_fold[0] - 1e-9;
  }
  CHECK(darker > 10);  // the mask does remove coverage somewhere
}

TEST_CASE("coverage: run inside a task group being cancelled, the evaluation throws instead of reading half-made rows") {
  // A caller that lets an exception out of a plain TBB loop cancels the task group the evaluation runs in, and
  // its nested loops (rows, metrics) then skip their work and return without error. The evaluation must notice
  // (stop_if_cancelled) and throw, never build figures from the skipped rows. Made certain here by cancelling
  // the group from inside the task before the evaluation starts.
  const Design d = mixed_design();
  std::string message;
  bool returned = false;
  tbb::task_group group;
  group.run_and_wait([&] {
    group.cancel();
    try {
      (void)evaluate_coverage(d, CoverageOptions{});
      returned = true;
    } catch (const std::runtime_error& e) {
      message = e.what();
    }
  });
  CHECK(!returned);
  CHECK(message.find("stopped, the enclosing parallel work was cancelled") != std::string::npos);
  // The same evaluation outside any cancelled group runs whole.
  CHECK(evaluate_coverage(d, CoverageOptions{}).points.size() > 0);
}
