// A sweep layout whose budget cannot be flown is marked in its row (status cannot-fly, a note that says
// why) and never meets the requirement; the flag agrees with compute_budget on the layout's own design.
#include <doctest/doctest.h>

#include <string>
#include <variant>

#include "skein/budget/budget.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/results_rows.hpp"
#include "skein/input/sweep_file.hpp"

using namespace skein;

TEST_CASE("sweep: a layout at 180 km is cannot-fly and never meets, and 540 km is ok") {
  // 180 km with the demo spacecraft decays in about a day (far below the 7-day limit in plausibility.hpp).
  const std::string text =
      "name: low trade\nbase: demo.yaml\nshell: imaging\ncoverage:\n  grid:\n    kind: global\n    spacing_deg: 30\n"
      "  span_h: 1\n  step_s: 300\naxes:\n  satellites: [12]\n  planes: [3]\n  phasing: [1]\n"
      "  altitude_km: [180, 540]\nrequirement:\n  fold: 1\n  min_percent_covered: 0\ncost: [satellites]\n";
  const Sweep sweep = read_sweep_text(text, "low.yaml", std::string(SKEIN_SOURCE_DIR) + "/designs");
  const LayoutSet set = expand_layouts(sweep);
  REQUIRE(set.layouts.size() == 2);
  const auto cols = sweep_columns(sweep);
  auto col = [&](const std::string& key) {
    for (size_t i = 0; i < cols.size(); ++i)
      if (cols[i].key == key) return i;
    FAIL("no column " << key);
    return size_t{0};
  };
  for (const Layout& l : set.layouts) {
    CAPTURE(l.shells.front().altitude_km);
    const LayoutMetrics m = evaluate_layout(sweep, l);
    REQUIRE(m.evaluated);
    // Brute force: the budget of the layout's design, shell by shell.
    const BudgetResult bud = compute_budget(layout_design(sweep, l));
    bool flyable = true;
    for (const auto& s : bud.shells) flyable = flyable && s.flyable();
    CHECK(m.cannot_fly.empty() == flyable);
    const auto row = layout_row(sweep, l, m);
    const std::string status = std::get<std::string>(row.at(col("status")));
    const RowSummary summary = summarize_row(sweep, row);
    CHECK(summary.evaluated);
    if (l.shells.front().altitude_km < 200.0) {
      CHECK(!flyable);
      CHECK(status == "cannot-fly");
      CHECK(!m.meets);
      CHECK(std::get<std::string>(row.at(col("note"))).find("cannot be flown: shell imaging: the orbit decays") == 0);
    } else {
      CHECK(flyable);
      CHECK(status == "ok");
      CHECK(m.meets);  // min_percent_covered 0: every flyable layout meets
    }
  }
}
