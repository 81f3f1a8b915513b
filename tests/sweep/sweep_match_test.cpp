// Evidence for lib/skein/sweep: a sweep's rows hold the same numbers as the coverage evaluator and the budget
// run on each layout written out as an ordinary design file (read by the design reader, not by the sweep),
// and rows round-trip through their encoding exactly.
#include <doctest/doctest.h>

#include <fmt/format.h>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <variant>

#include "skein/input/sweep_file.hpp"
#include "skein/budget/budget.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/input/design_file.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/results_rows.hpp"
#include "skein/sweep/sweep_run.hpp"
#include "skein/time/sun.hpp"

using namespace skein;

namespace {

const std::string root = SKEIN_SOURCE_DIR;

std::string read_text(const std::string& path) {
  std::ifstream in(path);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// The demo design with its imaging shell rewritten for the layout, and the small sweep's coverage block.
std::string layout_yaml(const Layout& l, double base_raan_deg) {
  const ShellChoice& c = l.shells.at(0);
  std::string text = read_text(root + "/designs/demo.yaml");
  const std::string block =
      "    satellites: 12\n    planes: 3\n    phasing: 1\n    altitude_km: 540\n    inclination_deg: sun-synchronous\n"
      "    ltan: \"10:30\"\n";
  const size_t at = text.find(block);
  REQUIRE(at != std::string::npos);
  std::string shell = fmt::format("    satellites: {}\n    planes: {}\n    phasing: {}\n    altitude_km: {}\n",
                                  c.satellites, c.planes, c.phasing, c.altitude_km);
  if (c.sun_synchronous)
    shell += fmt::format("    inclination_deg: sun-synchronous\n    ltan: \"{}\"\n", c.ltan->text);
  else
    shell += fmt::format("    inclination_deg: {}\n    raan_deg: {:.17g}\n", c.inclination_deg, base_raan_deg);
  text.replace(at, block.size(), shell);
  text += fmt::format("coverage:\n  grid:\n    kind: global\n    spacing_deg: 10\n  span_h: 6\n  step_s: 120\n"
                      "  min_elevation_deg: {}\n",
                      l.min_elevation_deg);
  return text;
}

double num(const Cell& c) { return std::holds_alternative<double>(c) ? std::get<double>(c) : static_cast<double>(std::get<long>(c)); }

}  // namespace

TEST_CASE("sweep: rows equal evaluate_coverage and compute_budget on each layout's own design file") {
  const Sweep s = read_sweep_file(root + "/designs/sweeps/kestrel-small.yaml");
  const LayoutSet set = expand_layouts(s);
  const double base_raan = s.base.shells[0].raan0_deg;  // the 10:30 node of the base, kept by fixed-inclination layouts
  const auto cols = sweep_columns(s);
  auto col = [&](const std::string& key) {
    for (size_t i = 0; i < cols.size(); ++i)
      if (cols[i].key == key) return i;
    FAIL("no column " << key);
    return size_t{0};
  };
  // A sun-synchronous layout at each LTAN, a fixed-inclination one, and the last (24/4/3 at 580 km, 70 deg).
  for (size_t index : {size_t{0}, size_t{1}, size_t{2}, size_t{71}}) {
    CAPTURE(index);
    const Layout& l = set.layouts[index];
    std::map<size_t, std::string> got;
    evaluate_layouts(s, set, {index}, [&](size_t i, const std::string& row) { got[i] = row; });
    REQUIRE(got.count(index) == 1);
    const auto cells = decode_row(got[index], cols.size());
    REQUIRE(cells);
    const Design d = read_design_text(layout_yaml(l, base_raan), "layout.yaml");
    CoverageOptions copt;
    copt.max_fold = 1;
    const CoverageResult c = evaluate_coverage(d, copt);
    const BudgetResult b = compute_budget(d);  // the CLI's default options (level curves on)
    // The same evaluators on the same orbit values: equal to rounding of the decimal text of the design
    // (1e-12 relative; the values printed at 17 digits are exact, so in practice the numbers are identical).
    const double eps = 1e-12;
    CHECK(num((*cells)[col("percent_covered")]) == doctest::Approx(c.total.percent_by_fold[0]).epsilon(eps));
    CHECK(num((*cells)[col("worst_instant_percent")]) == doctest::Approx(c.worst_instant_covered_percent[0]).epsilon(eps));
    CHECK(num((*cells)[col("max_gap_s")]) == doctest::Approx(c.total.max_gap_s).epsilon(eps));
    CHECK(num((*cells)[col("mean_gap_s")]) == doctest::Approx(c.total.mean_gap_s).epsilon(eps));
    CHECK(num((*cells)[col("p95_gap_s")]) == doctest::Approx(c.total.p95_gap_s).epsilon(eps));
    CHECK(num((*cells)[col("mean_response_time_s")]) == doctest::Approx(c.total.mean_response_time_s).epsilon(eps));
    CHECK(num((*cells)[col("mean_in_view")]) == doctest::Approx(c.total.mean_in_view).epsilon(eps));
    CHECK(num((*cells)[col("inclination_deg")]) == doctest::Approx(d.shells[0].inclination_deg).epsilon(eps));
    CHECK(num((*cells)[col("design_satellites")]) == d.shells[0].satellites + d.shells[1].satellites);
    CHECK(num((*cells)[col("lifetime_days")]) == doctest::Approx(b.shells[0].lifetime_natural_days).epsilon(eps));
    CHECK(num((*cells)[col("dv_per_satellite_m_s")]) == doctest::Approx(b.shells[0].total_dv_m_s).epsilon(eps));
    CHECK(num((*cells)[col("fleet_dv_m_s")]) == doctest::Approx(b.fleet_dv_m_s).epsilon(eps));
    REQUIRE(b.fleet_propellant_kg);
    CHECK(num((*cells)[col("fleet_propellant_kg")]) == doctest::Approx(*b.fleet_propellant_kg).epsilon(eps));
    // The requirement (min 55 % covered, max gap 10000 s) re-derived from the evaluator's numbers.
    const bool meets = c.total.percent_by_fold[0] >= 55.0 && c.total.max_gap_s <= 10000.0;
    CHECK(std::get<std::string>((*cells)[col("meets_requirement")]) == (meets ? "yes" : "no"));
    // The cap-area bound (global grid, fold 1), re-derived with the equivalent form of SMAD sec. 5.2's central
    // angle, lambda = acos(R cos eps / r) - eps, on each shell's apogee radius: caps' sphere shares summed over
    // the other shell, and the least T of the varied one. And a consequence the simulation must obey: at each
    // instant the covered share is at most the caps' summed share, so percent covered <= 100 x that sum
    // (plus 2 points for the 10 deg grid's cell weighting and the ellipsoid against the sphere: common practice).
    const double eps_rad = l.min_elevation_deg * rad_per_deg;
    auto cap = [&](const Shell& sh) {
      const double lambda = std::acos(d.earth.radius_km * std::cos(eps_rad) / (sh.a_km * (1.0 + sh.e))) - eps_rad;
      return 0.5 * (1.0 - std::cos(lambda));
    };
    const double others = d.shells[1].satellites * cap(d.shells[1]);
    CHECK(num((*cells)[col("cap_bound_satellites")]) == std::ceil((1.0 - others) / cap(d.shells[0])));
    CHECK(c.total.percent_by_fold[0] <= 100.0 * (others + d.shells[0].satellites * cap(d.shells[0])) + 2.0);
  }
}

TEST_CASE("sweep: an encoded row decodes to the same cells, numbers bit for bit") {
  // JSON numbers written by nlohmann-json round-trip doubles exactly (shortest round-trip form, RFC 8259 sec. 6).
  const std::vector<Cell> row = {7L, 0.1 + 0.2, std::string("a \"quoted\" note"), Cell(), 1e-300, -0.0, 123456789.125};
  const auto back = decode_row(encode_row(row), row.size());
  REQUIRE(back);
  CHECK(*back == row);
  CHECK_FALSE(decode_row(encode_row(row), row.size() + 1));
  CHECK_FALSE(decode_row("[1, 2", 2));
}

TEST_CASE("sweep: round-robin shares cover the pending layouts once") {
  const std::vector<size_t> pending = {0, 2, 3, 5, 8};
  CHECK(round_robin_share(pending, 0, 2) == std::vector<size_t>{0, 3, 8});
  CHECK(round_robin_share(pending, 1, 2) == std::vector<size_t>{2, 5});
  CHECK(round_robin_share(pending, 4, 5) == std::vector<size_t>{8});
}
