// Evidence for lib/skein/sweep: reading sweep files, expanding axes into layouts (counts and skipped
// combinations checked by hand counting) and the messages for bad input.
#include <doctest/doctest.h>

#include <string>

#include "skein/error.hpp"
#include "skein/budget/budget.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/input/sweep_file.hpp"

using namespace skein;

namespace {

const std::string folder = std::string(SKEIN_SOURCE_DIR) + "/designs/sweeps";

std::string sweep_text(const std::string& axes, const std::string& extra = "") {
  return "name: t\nbase: ../demo.yaml\nshell: imaging\ncoverage:\n  grid:\n    spacing_deg: 10\n  span_h: 6\n  step_s: 120\n"
         "axes:\n" + axes + "requirement:\n  min_percent_covered: 50\n" + extra;
}

std::string error_of(const std::string& text, bool expand = false, double limit = default_max_layouts) {
  try {
    const Sweep s = read_sweep_text(text, "s.yaml", folder);
    if (expand) expand_layouts(s, limit);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("sweep: the small example sweep expands to the hand-counted layouts and skips") {
  // Hand count (common practice: Walker T/P/F needs P | T and 0 <= F <= P-1, Walker 1984):
  //   T=12: P=3 F0,F1 (F3 out of range), P=4 F0,F1,F3 -> 5;  T=18: P=3 F0,F1 (F3 out), P=4 (4 does not divide 18)
  //   -> 2;  T=24: as T=12 -> 5. 12 Walker layouts x 2 altitudes x (SSO at 2 LTANs + 70 deg) = 72.
  //   Skipped, each standing for 2 x 3 = 6 combinations: F out of range 3 x 6 = 18; P = 4 not dividing T = 18,
  //   for each of the 3 F values: 3 x 6 = 18. Layouts plus skipped = all 3 T x 2 P x 3 F x 6 = 108 combinations.
  const Sweep s = read_sweep_file(folder + "/kestrel-small.yaml");
  const LayoutSet set = expand_layouts(s);
  CHECK(set.layouts.size() == 72);
  CHECK(set.skipped.phasing_out_of_range == 18);
  CHECK(set.skipped.planes_not_dividing == 18);
  CHECK(set.skipped.total() == 36);
  CHECK(combination_count(s) == doctest::Approx(108.0));  // whole numbers: exact
  // Nesting order T, P, F, altitude, inclination (LTANs inside SSO), elevation.
  const Layout& first = set.layouts[0];
  CHECK(first.shells[0].satellites == 12);
  CHECK(first.shells[0].planes == 3);
  CHECK(first.shells[0].phasing == 0);
  CHECK(first.shells[0].altitude_km == 520.0);
  CHECK(first.shells[0].sun_synchronous);
  CHECK(first.shells[0].ltan->text == "10:30");
  CHECK(set.layouts[1].shells[0].ltan->text == "13:30");
  CHECK_FALSE(set.layouts[2].shells[0].sun_synchronous);
  CHECK(set.layouts[2].shells[0].inclination_deg == 70.0);
  CHECK(set.layouts[3].shells[0].altitude_km == 580.0);
  const Layout& last = set.layouts.back();
  CHECK(last.index == 71);
  CHECK(last.shells[0].satellites == 24);
  CHECK(last.shells[0].planes == 4);
  CHECK(last.shells[0].phasing == 3);
  // Sun-synchronous inclination at 520 km circular: about 97.4 deg (Wertz & Larson, "Space Mission Analysis and
  // Design", 3rd ed., fig. 6-10 / table of SSO inclinations: 97.4 deg near 500 km, 97.8 deg near 600 km); 0.1 deg
  // covers reading the published figure.
  CHECK(first.shells[0].inclination_deg == doctest::Approx(97.45).epsilon(0.1 / 97.45));
}

TEST_CASE("sweep: ranges include both ends, phasing all expands 0..P-1") {
  const Sweep s = read_sweep_text(sweep_text("  satellites: {from: 12, to: 24, step: 6}\n  planes: [2, 3]\n  phasing: all\n"
                                             "  altitude_km: {from: 500, to: 600, step: 25}\n"),
                                  "s.yaml", folder);
  CHECK(s.axes.shells[0].satellites == std::vector<int>{12, 18, 24});
  REQUIRE(s.axes.shells[0].altitude_km.size() == 5);
  CHECK(s.axes.shells[0].altitude_km.back() == 600.0);
  const LayoutSet set = expand_layouts(s);
  // (2 + 3) F values for each of the 3 T (all divisible by 2 and 3) x 5 altitudes, base SSO at its 10:30 LTAN.
  CHECK(set.layouts.size() == 75);
  CHECK(set.skipped.total() == 0);
}

TEST_CASE("sweep: bad input is refused with its position") {
  // An axis that expands to nothing.
  std::string e = error_of(sweep_text("  altitude_km: {from: 600, to: 500, step: 10}\n"));
  CHECK(e.find("s.yaml:10:16") != std::string::npos);
  CHECK(e.find("expands to no values") != std::string::npos);
  e = error_of(sweep_text("  satellites: []\n"));
  CHECK(e.find("expands to no values") != std::string::npos);
  // Above the limit without --force; with a raised limit it expands.
  e = error_of(sweep_text("  satellites: {from: 1, to: 400, step: 1}\n  phasing: all\n  planes: {from: 1, to: 50, step: 1}\n"), true);
  CHECK(e.find("pass --force") != std::string::npos);
  CHECK(e.find("s.yaml:10:3") != std::string::npos);  // the axes block
  // Nothing valid at all.
  e = error_of(sweep_text("  satellites: [7]\n  planes: [2]\n"), true);
  CHECK(e.find("no valid layout") != std::string::npos);
  // ltan without any sun-synchronous choice; an unknown axis; a requirement with no threshold.
  CHECK(error_of(sweep_text("  inclination_deg: [53]\n  ltan: [\"10:30\"]\n")).find("applies only to sun-synchronous") != std::string::npos);
  CHECK(error_of(sweep_text("  satelites: [12]\n")).find("satellites") != std::string::npos);
  CHECK(error_of("name: t\nbase: ../demo.yaml\naxes:\n  planes: [3]\nrequirement:\n  fold: 1\n").find("no threshold") !=
        std::string::npos);
  CHECK(error_of("name: t\nbase: ../nothere.yaml\naxes:\n  planes: [3]\nrequirement:\n  max_gap_s: 1\n").find("s.yaml:2:7") !=
        std::string::npos);
  CHECK(error_of(sweep_text("  altitude_km: [20]\n")).find("below 100 km") != std::string::npos);
  CHECK(error_of(sweep_text("  planes: [3, 3]\n")).find("appears twice") != std::string::npos);
}

TEST_CASE("sweep: an unknown shell, a fold no layout can reach and a design file are refused at their key") {
  // The varied shell's name, with the nearest name offered (line 3, column 8: the value of shell).
  CHECK(error_of("name: t\nbase: ../demo.yaml\nshell: imagin\naxes:\n  planes: [3]\nrequirement:\n  max_gap_s: 1\n") ==
        "s.yaml:3:8: shell: the base design has no shell \"imagin\"; expected one of its shells (did you mean "
        "\"imaging\"?)");
  // The largest satellite count of a layout: the largest T (6) plus the relay shell's 8 = 14. Fold 15 is
  // refused; fold 14 is accepted, and the T = 3 layout (11 satellites) is skipped and counted, not refused.
  const std::string small_t = "  satellites: [3, 6]\n  planes: [3]\n  phasing: [0]\n";
  const std::string e = error_of("name: t\nbase: ../demo.yaml\nshell: imaging\naxes:\n" + small_t +
                                 "requirement:\n  fold: 15\n  min_percent_covered: 50\n");
  CHECK(e == "s.yaml:9:9: requirement.fold: fold 15 is larger than any layout's satellite count (at most 14: 6 in "
             "shell imaging and 8 in the other shells); expected a fold from 1 to 14");
  CHECK(error_of("name: t\nbase: ../demo.yaml\nshell: imaging\naxes:\n  satellites: [3, 6]\n  planes: [3]\n"
                 "  phasing: [0]\nrequirement:\n  fold: 14\n  min_percent_covered: 50\n",
                 true) == "");
  // A design file given as a sweep: named as such at its shells key.
  CHECK(error_of("name: d\nepoch: 2027-03-01T00:00:00Z\nshells:\n  - name: a\n") ==
        "s.yaml:3:1: (top level): this is a design file (it has shells, no base or axes), not a sweep; run skein "
        "check, coverage, budget or report on it, or give skein sweep a sweep file (name, base, axes, requirement)");
}

TEST_CASE("sweep: the design's 100000-satellite cap holds for every layout, refused at the T axis") {
  // demo.yaml: imaging (varied, 12) and relay (8 satellites). T = 99992 makes exactly 100000: accepted;
  // T = 99993 makes 100001: refused at axes.satellites (line 10 of the text, column 15: the list).
  CHECK(error_of(sweep_text("  satellites: [12, 99992]\n  planes: [4]\n")).empty());
  const std::string e = error_of(sweep_text("  satellites: [12, 99993]\n  planes: [4]\n"));
  CHECK_MESSAGE(e.find("s.yaml:10:15: axes.satellites:") != std::string::npos, e);
  CHECK(e.find("T = 99993 with the 8 satellites of the other shells makes 100001 satellites") != std::string::npos);
}

namespace {

// demo.yaml varied on both shells (axes.shells), with design-wide axes after.
std::string two_shell_text(const std::string& shells, const std::string& wide = "", const std::string& top = "") {
  return "name: t\nbase: ../demo.yaml\n" + top +
         "coverage:\n  grid:\n    spacing_deg: 10\n  span_h: 6\n  step_s: 120\naxes:\n  shells:\n" + shells + wide +
         "requirement:\n  min_percent_covered: 50\n";
}

}  // namespace

TEST_CASE("sweep: axes over two shells and the design-wide axes expand in the documented nesting order") {
  const Sweep s = read_sweep_text(
      two_shell_text("    - shell: relay\n      pattern: [walker-delta, walker-star]\n      altitude_km: [1000, 1100]\n"
                     "    - shell: imaging\n      satellites: [12, 18]\n      planes: [3, 4]\n",
                     "  nadir_half_angle_deg: [45, 60]\n  drag_area_m2: [0.5, 0.85]\n  dry_mass_kg: [100, 145]\n"
                     "  mission_life_years: [3, 7]\n  solar_activity: [low, high]\n"),
      "s.yaml", folder);
  // The first entry names relay: it is the first varied shell (its per-satellite figures fill the rows).
  REQUIRE(s.axes.shells.size() == 2);
  CHECK(s.shell_index == 1);
  CHECK(s.axes.shells[1].shell_index == 0);
  // Hand count: relay 2 patterns x 2 altitudes = 4; imaging T=12: P=3, P=4 (both divide 12); T=18: P=3 only
  // (P=4 skipped) -> 3 valid of 4; design-wide 2^5 = 32. Layouts 4 x 3 x 32 = 384; skipped: 4 x 1 x 32 = 128.
  const LayoutSet set = expand_layouts(s);
  CHECK(set.layouts.size() == 384);
  CHECK(set.skipped.planes_not_dividing == 128);
  CHECK(combination_count(s) == doctest::Approx(512.0));  // whole numbers: exact
  // Nesting, outermost first: relay (T, P, F, pattern, altitude), imaging (T, P, ...), then nadir half-angle,
  // drag area, dry mass, mission life, solar activity (elevation mask has one value). The last axis varies fastest.
  const Layout& l0 = set.layouts[0];
  CHECK(l0.shells[0].pattern == PatternKind::walker_delta);
  CHECK(l0.shells[0].altitude_km == 1000.0);
  CHECK(l0.shells[1].satellites == 12);
  CHECK(l0.shells[1].planes == 3);
  CHECK(*l0.nadir_half_angle_deg == 45.0);
  CHECK(l0.solar_activity == SolarLevel::low);
  CHECK(set.layouts[1].solar_activity == SolarLevel::high);
  CHECK(set.layouts[2].mission_life_years == 7.0);
  CHECK(set.layouts[4].dry_mass_kg == 145.0);
  CHECK(set.layouts[8].drag_area_m2 == 0.85);
  CHECK(*set.layouts[16].nadir_half_angle_deg == 60.0);
  CHECK(set.layouts[32].shells[1].planes == 4);
  CHECK(set.layouts[64].shells[1].satellites == 18);  // T=18, P=3: P=4 skipped
  CHECK(set.layouts[96].shells[0].altitude_km == 1100.0);
  CHECK(set.layouts[192].shells[0].pattern == PatternKind::walker_star);
  // Every layout is distinct and numbered in order.
  for (size_t i = 0; i < set.layouts.size(); ++i) CHECK(set.layouts[i].index == i);
  // layout_design applies every value to its shell and to the design; the rest stays as in the base design.
  const Layout& l = set.layouts[192 + 64 + 16 + 8 + 4 + 2 + 1];
  const Design d = layout_design(s, l);
  CHECK(d.shells[1].pattern == PatternKind::walker_star);
  CHECK(d.shells[1].a_km == doctest::Approx(d.earth.radius_km + 1000.0));
  CHECK(d.shells[1].satellites == 8);        // relay's T is not varied: the base's 8
  CHECK(d.shells[1].inclination_deg == 53.0);
  CHECK(d.shells[0].satellites == 18);
  CHECK(d.shells[0].planes == 3);
  CHECK(d.shells[0].sun_synchronous);
  CHECK(*d.coverage.nadir_half_angle_deg == 60.0);
  CHECK(d.spacecraft.drag_area_m2 == 0.85);
  CHECK(d.spacecraft.dry_mass_kg == 145.0);
  CHECK(d.budget.mission_life_years == 7.0);
  CHECK(d.budget.solar == SolarLevel::high);
  CHECK(walker_label(l) == "8/2/1 + 18/3/1");
}

TEST_CASE("sweep: layouts plus skipped equal the combinations over two shells, whatever the reasons") {
  // A brute force over the raw combinations: imaging T x P x F, relay T x P; a combination is a layout when
  // every shell has P | T and 0 <= F < P (Walker 1984) and the design's satellites reach the fold.
  const Sweep s = read_sweep_text(
      two_shell_text("    - shell: imaging\n      satellites: [6, 9, 12]\n      planes: [2, 3]\n      phasing: [0, 2]\n"
                     "    - shell: relay\n      satellites: [4, 6]\n      planes: [2, 4]\n"),
      "s.yaml", folder);
  long valid = 0;
  for (int t1 : {6, 9, 12})
    for (int p1 : {2, 3})
      for (int f1 : {0, 2})
        for (int t2 : {4, 6})
          for (int p2 : {2, 4})
            valid += (t1 % p1 == 0 && f1 < p1 && t2 % p2 == 0) ? 1 : 0;
  const LayoutSet set = expand_layouts(s);
  CHECK(static_cast<long>(set.layouts.size()) == valid);
  CHECK(static_cast<double>(set.layouts.size() + set.skipped.total()) == combination_count(s));
  CHECK(combination_count(s) == doctest::Approx(48.0));
}

TEST_CASE("sweep: the shells form is refused where it is wrong, at its file:line:column") {
  // An axis naming an unknown shell (line 12, column 14: the value of shell), with the nearest name offered.
  CHECK(error_of(two_shell_text("    - shell: imaging\n      planes: [3]\n    - shell: relai\n      planes: [2]\n")) ==
        "s.yaml:12:14: axes.shells[1].shell: the base design has no shell \"relai\"; expected one of its shells (did "
        "you mean \"relay\"?)");
  // An entry without its shell.
  CHECK(error_of(two_shell_text("    - planes: [3]\n")).find("s.yaml:10:7: axes.shells[0]: missing key shell") == 0);
  // A shell named twice.
  CHECK(error_of(two_shell_text("    - shell: relay\n    - shell: relay\n")).find("named by two entries") !=
        std::string::npos);
  // A per-shell axis beside axes.shells, and the single-shell `shell` key beside it (positions of their values).
  CHECK(error_of(two_shell_text("    - shell: relay\n", "  planes: [3]\n"))
            .find("s.yaml:11:11: axes.planes: planes varies one shell, but axes.shells is given") == 0);
  CHECK(error_of(two_shell_text("    - shell: relay\n", "", "shell: imaging\n")).find("s.yaml:3:8: shell: shell names the one varied shell") == 0);
  // A pattern that is not a Walker pattern, a solar level that does not exist, a drag area of zero.
  CHECK(error_of(two_shell_text("    - shell: relay\n      pattern: [explicit]\n"))
            .find("axes.shells[0].pattern[0]: \"explicit\" is not a Walker pattern") != std::string::npos);
  CHECK(error_of(two_shell_text("    - shell: relay\n", "  solar_activity: [extreme]\n")).find("not a solar activity level") !=
        std::string::npos);
  CHECK(error_of(two_shell_text("    - shell: relay\n", "  drag_area_m2: [0]\n")).find("axes.drag_area_m2") !=
        std::string::npos);
  // The satellite cap with two varied shells: imaging at its largest T with relay at its largest.
  const std::string e = error_of(two_shell_text("    - shell: imaging\n      satellites: [12, 99980]\n      planes: [4]\n"
                                                "    - shell: relay\n      satellites: [8, 24]\n"));
  CHECK(e.find("T = 99980 with the 24 satellites of the other shells makes 100004 satellites") != std::string::npos);
}

TEST_CASE("sweep: planes is a cost, read from the design's plane count") {
  const Sweep s = read_sweep_text(
      two_shell_text("    - shell: relay\n      planes: [2, 4]\n") + "cost: [planes, satellites]\n", "s.yaml", folder);
  REQUIRE(s.costs.size() == 2);
  CHECK(s.costs[0] == CostFigure::planes);
  CHECK(*cost_figure_from_string("planes") == CostFigure::planes);
}

TEST_CASE("sweep: the design-wide axes reach the evaluators") {
  // One relay layout (moved to 600 km, where it decays within the 200-year horizon) per value of each axis,
  // coarse grid. Directions, not values:
  // a narrower payload cone sees less ground (footprint from the cone, Wertz & Larson, SMAD 3rd ed. sec. 5.2,
  // MEMORY); a longer life needs more station-keeping delta-v (every yearly line scales with the life); high
  // solar activity heats and expands the thermosphere, so the natural lifetime is shorter (Vallado 2013
  // sec. 8.6.2, MEMORY).
  const Sweep s = read_sweep_text(
      two_shell_text("    - shell: relay\n      altitude_km: 600\n",
                     "  nadir_half_angle_deg: [30, 60]\n  mission_life_years: [3, 7]\n"
                                             "  solar_activity: [low, high]\n"),
      "s.yaml", folder);
  const LayoutSet set = expand_layouts(s);
  REQUIRE(set.layouts.size() == 8);  // nadir (outer) x life x solar (inner)
  std::vector<LayoutMetrics> m;
  for (const Layout& l : set.layouts) m.push_back(evaluate_layout(s, l));
  for (const LayoutMetrics& x : m) REQUIRE(x.evaluated);
  CHECK(m[0].percent_covered < m[4].percent_covered);        // cone 30 deg < 60 deg
  CHECK(m[0].dv_per_satellite_m_s < m[2].dv_per_satellite_m_s);  // 3 years < 7 years
  CHECK(m[0].lifetime_days > m[1].lifetime_days);            // low activity outlives high
  // Per-satellite figures are the first varied shell's (relay, shell 1): its lifetime, not imaging's.
  const BudgetResult b = compute_budget(layout_design(s, set.layouts[0]), BudgetOptions{});
  CHECK(m[0].lifetime_days == b.shells.at(1).lifetime_natural_days);
}

TEST_CASE("sweep: the daylight axis nests innermost and reaches the layout's coverage block") {
  // Numbering rule (README "Layout numbering"): a new axis is appended innermost, so layout i has the
  // daylight value i mod 3 and the T value i / 3.
  const Sweep s = read_sweep_text(sweep_text("  satellites: [12, 24]\n  planes: [3]\n  phasing: [1]\n"
                                             "  min_sun_elevation_deg: [-6, 10, 20]\n"),
                                  "s.yaml", folder);
  CHECK(s.axes.sun_given);
  const LayoutSet set = expand_layouts(s);
  REQUIRE(set.layouts.size() == 6);
  const double sun[] = {-6, 10, 20};
  for (size_t i = 0; i < 6; ++i) {
    CAPTURE(i);
    REQUIRE(set.layouts[i].min_sun_elevation_deg.has_value());
    CHECK(*set.layouts[i].min_sun_elevation_deg == sun[i % 3]);
    CHECK(set.layouts[i].shells.front().satellites == (i < 3 ? 12 : 24));
    const Design d = layout_design(s, set.layouts[i]);
    CHECK(*d.coverage.min_sun_elevation_deg == sun[i % 3]);
  }
  // Without the axis every layout keeps the base design's value (none in the demo base).
  const Sweep plain = read_sweep_text(sweep_text("  satellites: [12]\n  planes: [3]\n  phasing: [1]\n"), "s.yaml", folder);
  CHECK(!plain.axes.sun_given);
  CHECK(!expand_layouts(plain).layouts.front().min_sun_elevation_deg.has_value());
  CHECK(error_of(sweep_text("  satellites: [12]\n  min_sun_elevation_deg: [95]\n")).find("axes.min_sun_elevation_deg[0]: 95 is out of range") !=
        std::string::npos);
}
