// Evidence for sweep requirements at fold k over a site grid: every layout's verdict (every site must meet each
// threshold, at fold 2) and the sites it names as failing equal a brute force over the same coverage result,
// site by site; the gap columns are the fold-2 figures (fewer than 2 in view).
#include <doctest/doctest.h>

#include <map>
#include <set>
#include <string>
#include <variant>

#include "skein/input/sweep_file.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/error.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/results_rows.hpp"
#include "skein/sweep/sweep_run.hpp"

using namespace skein;

namespace {

const std::string root = SKEIN_SOURCE_DIR;

// Four layouts of the Harbour Watch shell around its base (36/6/1 at 1200 km): T 24 or 36, at 1000 or
// 1200 km; the base's four ports, 24 h at 60 s; fold 2 with two thresholds that some layouts meet at some
// ports only.
const std::string sweep_text =
    "name: harbour two-look trade\n"
    "base: harbour-watch.yaml\n"
    "shell: radar\n"
    "axes:\n"
    "  satellites: [24, 36]\n"
    "  planes: [6]\n"
    "  phasing: [1]\n"
    "  altitude_km: [1000, 1200]\n"
    "  inclination_deg: [50]\n"
    "requirement:\n"
    "  fold: 2\n"
    "  min_percent_covered: 30\n"
    "  max_gap_s: 1800\n"
    "  min_worst_point_percent: 5\n"
    "  every_site: true\n"
    "cost: [satellites]\n";

std::string text_of(const Cell& c) { return std::holds_alternative<std::string>(c) ? std::get<std::string>(c) : ""; }
double num(const Cell& c) { return std::holds_alternative<double>(c) ? std::get<double>(c) : static_cast<double>(std::get<long>(c)); }

}  // namespace

TEST_CASE("sweep: fold-2 every-site verdicts and failing sites equal a brute force over the sites") {
  const Sweep s = read_sweep_text(sweep_text, "harbour-trade.yaml", root + "/designs");
  REQUIRE(s.requirement.fold == 2);
  REQUIRE(s.requirement.every_site);
  const LayoutSet set = expand_layouts(s);
  REQUIRE(set.layouts.size() == 4);
  const auto cols = sweep_columns(s);
  auto col = [&](const std::string& key) {
    for (size_t i = 0; i < cols.size(); ++i)
      if (cols[i].key == key) return i;
    FAIL("no column " << key);
    return size_t{0};
  };
  std::map<size_t, std::string> rows;
  std::vector<size_t> all;
  for (size_t i = 0; i < set.layouts.size(); ++i) all.push_back(i);
  evaluate_layouts(s, set, all, [&](size_t i, const std::string& row) { rows[i] = row; });
  int meeting = 0, failing = 0;
  for (size_t i = 0; i < set.layouts.size(); ++i) {
    CAPTURE(i);
    const auto cells = decode_row(rows.at(i), cols.size());
    REQUIRE(cells);
    CoverageOptions copt;
    copt.max_fold = 2;
    const CoverageResult c = evaluate_coverage(layout_design(s, set.layouts[i]), copt);
    REQUIRE(c.points.size() == 4);
    // Brute force: each threshold checked at each site, at fold 2.
    std::set<std::string> fail_pct, fail_gap;
    double worst_pct = 1e300;
    for (const PointCoverage& p : c.points) {
      if (p.percent_by_fold[1] < 30.0) fail_pct.insert(p.point.name);
      if (p.gaps_by_fold[1].max_gap_s > 1800.0) fail_gap.insert(p.point.name);
      worst_pct = std::min(worst_pct, p.percent_by_fold[1]);
    }
    const bool worst_ok = worst_pct >= 5.0;
    const bool meets = fail_pct.empty() && fail_gap.empty() && worst_ok;
    CHECK(text_of((*cells)[col("meets_requirement")]) == (meets ? "yes" : "no"));
    meets ? ++meeting : ++failing;
    const std::string failed = text_of((*cells)[col("failed_checks")]);
    for (const std::string& n : fail_pct) CHECK(failed.find(n) != std::string::npos);
    for (const std::string& n : fail_gap) CHECK(failed.find(n) != std::string::npos);
    CHECK((failed.find("percent_covered") != std::string::npos) == !fail_pct.empty());
    CHECK((failed.find("max_gap_s") != std::string::npos) == !fail_gap.empty());
    CHECK((failed.find("worst_point_percent") != std::string::npos) == !worst_ok);
    for (const PointCoverage& p : c.points)
      if (!fail_pct.count(p.point.name) && !fail_gap.count(p.point.name))
        CHECK(failed.find(p.point.name) == std::string::npos);
    // The row's figures are the fold-2 ones.
    CHECK(num((*cells)[col("percent_covered")]) == c.total.percent_by_fold[1]);
    CHECK(num((*cells)[col("worst_point_percent")]) == worst_pct);
    CHECK(num((*cells)[col("max_gap_s")]) == c.total.gaps_by_fold[1].max_gap_s);
    CHECK(num((*cells)[col("p95_gap_s")]) == c.total.gaps_by_fold[1].p95_gap_s);
    CHECK(num((*cells)[col("mean_response_time_s")]) == c.total.gaps_by_fold[1].mean_response_time_s);
  }
  // The case is not one-sided: some layouts meet the requirement and some do not.
  CHECK(meeting > 0);
  CHECK(failing > 0);
}

TEST_CASE("sweep: every_site needs a site grid, refused at its key") {
  std::string text = sweep_text;
  text.replace(text.find("shell: radar\n"), 0, "coverage:\n  grid:\n    kind: global\n    spacing_deg: 10\n");
  try {
    read_sweep_text(text, "harbour-trade.yaml", root + "/designs");
    FAIL("accepted every_site on a global grid");
  } catch (const InputError& e) {
    const std::string m = e.what();
    CHECK(m.find("harbour-trade.yaml:") == 0);
    CHECK(m.find("requirement.every_site") != std::string::npos);
    CHECK(m.find("grid of kind sites") != std::string::npos);
  }
}
