// Evidence for lib/skein/coverage/spec and the checks made before any work: bad input gets a clear error
// naming its position.
#include <doctest/doctest.h>

#include <string>

#include "coverage_test_designs.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/polygon.hpp"
#include "skein/error.hpp"

using namespace skein;

namespace {
std::string base() { return test::coverage_design_head() + test::walker_shell(6, 3, 1, 700.0, 55.0); }

std::string error_of(const std::string& coverage_block, const CoverageOptions& o = {}) {
  try {
    const Design d = read_design_text(base() + coverage_block, "c.yaml");
    evaluate_coverage(d, o);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
}  // namespace

TEST_CASE("coverage spec: the block is read with its defaults") {
  const Design none = read_design_text(base(), "c.yaml");
  CHECK_FALSE(none.coverage.present);
  CHECK(none.coverage.grid == GridKind::global);
  CHECK(none.coverage.spacing_deg == 2.0);
  CHECK(none.coverage.step_s == 60.0);
  CHECK(none.coverage.span_s == 86400.0);
  CHECK(none.coverage.min_elevation_deg == 10.0);
  const Design d = read_design_text(base() + R"(coverage:
  grid:
    kind: region
    spacing_deg: 1
    vertices: [[-10, 35], [30, 35], [30, 60], [-10, 60]]
  min_elevation_deg: 15
  nadir_half_angle_deg: 55
  span_h: 2
  step_s: 30
  max_fold: 2
  latitude_band_deg: 5
)", "c.yaml");
  CHECK(d.coverage.grid == GridKind::region);
  CHECK(d.coverage.region.size() == 4);
  CHECK(d.coverage.span_s == 7200.0);
  CHECK(*d.coverage.nadir_half_angle_deg == 55.0);
  CHECK(grid_kind_from_string(to_string(GridKind::sites)) == GridKind::sites);
  CHECK(coverage_mode_from_string(to_string(CoverageMode::exhaustive)) == CoverageMode::exhaustive);
  const CoverageResult r = evaluate_coverage(d);
  // 40 x 25 one-degree cells lie inside the rectangle (its edges fall on cell boundaries).
  CHECK(r.points.size() == 1000);
  CHECK(r.bands.size() == 5);
}

TEST_CASE("coverage spec: bad input is refused before any work, with its position") {
  CHECK(error_of("coverage:\n  step_s: 0\n").find("c.yaml:17:11: coverage.step_s: a step of 0 s is not positive") !=
        std::string::npos);
  CHECK(error_of("coverage:\n  step_s: -5\n").find("not positive") != std::string::npos);
  // A bow-tie ring crosses itself.
  const std::string bowtie = error_of("coverage:\n  grid:\n    kind: region\n    vertices: [[0, 0], [10, 10], [10, 0], [0, 10]]\n");
  CHECK(bowtie.find("c.yaml:19:15: coverage.grid.vertices") != std::string::npos);
  CHECK(bowtie.find("cross") != std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    kind: region\n    vertices: [[0, 0], [10, 10]]\n").find("at least 3 vertices") !=
        std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    kind: region\n    vertices: [[0, 0], [5, 5], [10, 10]]\n").find("zero area") !=
        std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    kind: region\n    spacing_deg: 10\n    vertices: [[1, 1], [2, 1], [2, 2]]\n")
            .find("holds no cell centre") != std::string::npos);
  CHECK(error_of("coverage:\n  max_fold: 7\n").find("c.yaml:17:13: coverage.max_fold: fold 7 is larger than the design's 6 satellites") !=
        std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    spacing_deg: 7\n").find("does not divide 180") != std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    kind: band\n    lat_min_deg: 20\n    lat_max_deg: 10\n").find("not north of") !=
        std::string::npos);
  CHECK(error_of("coverage:\n  grid:\n    kind: sites\n    spacing_deg: 2\n    sites: []\n").find("does not apply") !=
        std::string::npos);
  CoverageOptions o;
  o.step_s = 0.0;
  CHECK(error_of("", o).find("coverage.step_s = 0 s: expected a step above zero") != std::string::npos);
  CoverageOptions fold;
  fold.max_fold = 9;
  CHECK(error_of("", fold).find("only 6 satellites") != std::string::npos);
  // The resource guard: a run estimated above the memory limit is refused unless forced.
  CoverageOptions tight;
  tight.memory_limit_bytes = 1e6;
  CHECK(error_of("", tight).find("GiB of memory") != std::string::npos);
  CoverageOptions slow;
  slow.pair_test_limit = 1e3;
  CHECK(error_of("", slow).find("visibility tests") != std::string::npos);
}

TEST_CASE("coverage polygon: simple-polygon checks and point inclusion") {
  // Source: even-odd rule (O'Rourke, Computational Geometry in C, 2nd ed., sec. 7.4), checked on a square.
  const std::vector<GeoVertex> square{{0, 0}, {10, 0}, {10, 10}, {0, 10}};
  CHECK_FALSE(polygon_problem(square));
  CHECK(point_in_polygon(5, 5, square));
  CHECK_FALSE(point_in_polygon(15, 5, square));
  const std::vector<GeoVertex> east{{170, -5}, {190, -5}, {190, 5}, {170, 5}};  // across the antimeridian
  CHECK(point_in_polygon(-175, 0, east));
  CHECK(point_in_polygon(175, 0, east));
  CHECK_FALSE(point_in_polygon(0, 0, east));
}
