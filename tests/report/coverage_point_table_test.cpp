// Evidence that the per-point coverage table (tables/coverage_points.*) carries each point's age of the data
// when the design has ground stations (issue 18 item 4: "mean and 95th percentile per point and
// area-weighted, in the coverage output"): the columns hold exactly the evaluator's per-point figures (the
// same numbers, no rounding: the table keeps doubles), and are empty where no observation reached the ground.
// Without stations the columns are absent. Reference: CoverageResult::data_age->per_point (data_age.hpp).
#include <doctest/doctest.h>

#include <string>
#include <variant>

#include "skein/coverage/evaluate.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/coverage_tables.hpp"

using namespace skein;

namespace {

std::string design_text(bool stations) {
  return std::string(stations ? "ground_stations:\n  - {name: Cairn Point, lat_deg: 62, lon_deg: -7}\n" : "") +
         "name: point table\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n"
         "  drag_coefficient: 2.2\nshells:\n  - name: w\n    pattern: walker-delta\n    satellites: 6\n    planes: 3\n"
         "    phasing: 1\n    altitude_km: 650\n    inclination_deg: 97.9\ncoverage:\n  grid:\n    spacing_deg: 15\n"
         "  span_h: 6\n  step_s: 60\n  max_fold: 1\n";
}

int column_of(const Table& t, const std::string& key) {
  for (size_t c = 0; c < t.columns.size(); ++c)
    if (t.columns[c].key == key) return static_cast<int>(c);
  return -1;
}

}  // namespace

TEST_CASE("coverage point table: each point's data age, exactly the evaluator's, empty where none reached the ground") {
  const Design d = read_design_text(design_text(true), "points.yaml");
  const CoverageResult r = evaluate_coverage(d);
  REQUIRE(r.data_age.has_value());
  const Table t = coverage_point_table(r);
  const int obs = column_of(t, "data_age_observations"), cens = column_of(t, "data_age_censored");
  const int mean = column_of(t, "mean_data_age_s"), p95 = column_of(t, "p95_data_age_s"), mx = column_of(t, "max_data_age_s");
  REQUIRE(obs >= 0);
  REQUIRE(cens >= 0);
  REQUIRE(mean >= 0);
  REQUIRE(p95 >= 0);
  REQUIRE(mx >= 0);
  REQUIRE(t.rows.size() == r.points.size());
  int with_age = 0, without = 0;
  for (size_t p = 0; p < r.points.size(); ++p) {
    const DataAgeFigures& a = r.data_age->per_point[p];
    const auto& row = t.rows[p];
    CHECK(std::get<long>(row[static_cast<size_t>(obs)]) == a.observations);
    CHECK(std::get<long>(row[static_cast<size_t>(cens)]) == a.censored);
    if (a.observations > a.censored) {
      ++with_age;
      CHECK(std::get<double>(row[static_cast<size_t>(mean)]) == a.mean_s);
      CHECK(std::get<double>(row[static_cast<size_t>(p95)]) == a.p95_s);
      CHECK(std::get<double>(row[static_cast<size_t>(mx)]) == a.max_s);
    } else {
      ++without;
      CHECK(std::holds_alternative<std::monostate>(row[static_cast<size_t>(p95)]));
    }
  }
  // Six satellites over 6 h on a 15 deg grid: most cells are seen and downlinked, some are not seen at all.
  CHECK(with_age > 0);
  CHECK(without > 0);
}

TEST_CASE("coverage point table: no data-age columns without ground stations") {
  const Design d = read_design_text(design_text(false), "points.yaml");
  const CoverageResult r = evaluate_coverage(d);
  CHECK_FALSE(r.data_age.has_value());
  CHECK(column_of(coverage_point_table(r), "p95_data_age_s") < 0);
}
