// The budget evaluator: lines, totals, flags, bad input, and the budget block reader.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "skein/atmosphere/exponential_table.hpp"
#include "skein/budget/budget.hpp"
#include "skein/budget/impulses.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/report/budget_tables.hpp"

using namespace skein;

namespace {

std::string design_text(const std::string& shell, const std::string& budget, const std::string& spacecraft_extra = "  isp_s: 220\n") {
  return "name: Kestrel budget test\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 150\n  drag_area_m2: 1.0\n"
         "  drag_coefficient: 2.2\n" + spacecraft_extra + "shells:\n" + shell + budget;
}

const std::string shell_500 =
    "  - name: low\n    pattern: walker-delta\n    satellites: 4\n    planes: 2\n    phasing: 1\n"
    "    altitude_km: 500\n    inclination_deg: 53\n";
const std::string shell_sso =
    "  - name: sso\n    pattern: walker-delta\n    satellites: 6\n    planes: 3\n    phasing: 1\n"
    "    altitude_km: 600\n    inclination_deg: sun-synchronous\n    ltan: \"10:30\"\n";

BudgetOptions options(bool curves, double horizon_years = 200.0) {
  BudgetOptions o;
  o.level_curves = curves;
  o.lifetime_horizon_years = horizon_years;
  return o;
}

const ShellBudget& only(const BudgetResult& r) {
  REQUIRE(r.shells.size() == 1);
  return r.shells.front();
}

double line(const ShellBudget& s, const std::string& name) {
  for (const auto& l : s.dv_lines)
    if (l.name == name) return l.dv_m_s;
  FAIL("no line " << name);
  return 0.0;
}

}  // namespace

TEST_SUITE("budget") {

TEST_CASE("drag make-up per year agrees with the per-revolution formula") {
  // SMAD (Wertz & Larson 1999) Table 6-3: dv per rev = pi B rho a v (MEMORY; it is the drag acceleration over
  // one period). With mean activity and the exponential table the density is Vallado's; the satellite moves
  // inside a 0.2 km deadband, so its mean density is within 0.05 % of that at mid-band (H = 61 km); the
  // end-of-life remainder and the crossing interpolation add less: tolerance 0.3 %.
  const Design d = read_design_text(
      design_text(shell_500, "budget:\n  atmosphere: exponential\n  deadband_km: 0.2\n  mission_life_years: 2\n"), "t.yaml");
  const BudgetResult r = compute_budget(d, options(false));
  const ShellBudget& s = only(r);
  const double b = 2.2 * 1.0 / 150.0;
  const double a = d.shells[0].a_km;
  const double period = two_pi * std::sqrt(a * a * a / d.earth.mu_km3_s2);
  const double per_year = drag_dv_per_rev_m_s(d.earth.mu_km3_s2, a - 0.1, b, exponential_density_kg_m3(499.9)) *
                          seconds_per_julian_year / period;
  CHECK(s.drag_makeup_dv_m_s_per_year == doctest::Approx(per_year).epsilon(0.003));
  CHECK(line(s, "drag_makeup") == doctest::Approx(2.0 * s.drag_makeup_dv_m_s_per_year));
  // Raises: loss per year / loss per raise, at about 31.5 m/day x (B / 0.01) (digest COMPUTED from Vallado).
  CHECK(s.drag_makeup_manoeuvres > 0);
  CHECK(s.drag_makeup_interval_days == doctest::Approx(0.2 / (0.0315 * b / 0.01)).epsilon(0.05));
}

TEST_CASE("every line, totals, propellant and margin") {
  const Design d = read_design_text(design_text(shell_sso, "budget:\n  margin_percent: 20\n  disposal:\n    mode: direct\n"), "t.yaml");
  const BudgetResult r = compute_budget(d);
  const ShellBudget& s = only(r);
  REQUIRE(s.dv_lines.size() == 7);
  double sum = 0.0;
  for (const auto& l : s.dv_lines) {
    CHECK(std::isfinite(l.dv_m_s));
    CHECK(l.dv_m_s >= 0.0);
    if (l.name != "margin") sum += l.dv_m_s;
  }
  CHECK(line(s, "margin") == doctest::Approx(0.2 * sum));
  CHECK(s.total_dv_m_s == doctest::Approx(1.2 * sum));
  CHECK(s.fleet_dv_m_s == doctest::Approx(6 * s.total_dv_m_s));
  // Defaults: collision avoidance 2/yr x 0.5 m/s x 5 yr; slot keeping 4/yr of 1 deg in 10 days.
  CHECK(line(s, "collision_avoidance") == doctest::Approx(5.0));
  CHECK(line(s, "slot_keeping") == doctest::Approx(20.0 * phasing_dv_m_s(d.shells[0].a_km, 1.0 * rad_per_deg, 10.0 * 86400.0)));
  // Direct disposal to 50 km: the vis-viva burn.
  CHECK(s.disposal_perigee_km == doctest::Approx(50.0));
  CHECK(line(s, "disposal") == doctest::Approx(perigee_lowering_dv_m_s(d.earth.mu_km3_s2, d.shells[0].a_km, d.shells[0].a_km,
                                                                        d.earth.radius_km + 50.0)));
  // SSO line: three planes at 10:30, 18:30 and 02:30; the worst is 02:30 (sin 2D = 0.966 against 0.707).
  CHECK(s.sso_inclination_drift_deg_per_year != 0.0);
  CHECK(line(s, "sso_inclination") > 0.0);
  // Rocket equation.
  REQUIRE(s.propellant_kg);
  CHECK(*s.propellant_kg == doctest::Approx(propellant_mass_kg(150.0, s.total_dv_m_s, 220.0)));
  CHECK(!s.exceeds_tank);
  // Decay curves for low, mean and high, lifetimes ordered.
  REQUIRE(s.decay.size() == 3);
  CHECK(s.decay[0].lifetime_days > s.decay[1].lifetime_days);
  CHECK(s.decay[1].lifetime_days > s.decay[2].lifetime_days);
  for (const auto& dec : s.decay) {
    CHECK(dec.curve.size() >= 2);
    CHECK(dec.curve.size() < 600);
    CHECK(dec.curve.back().a_km < dec.curve.front().a_km);
  }
}

TEST_CASE("natural-decay disposal meets its rule, and node control strategy") {
  const Design d = read_design_text(design_text(shell_sso, "budget:\n  disposal:\n    mode: natural-decay\n    rule_years: 5\n"
                                                           "  injection_sigma:\n    altitude_km: 2\n    inclination_deg: 0.05\n"),
                                    "t.yaml");
  const ShellBudget s = only(compute_budget(d));
  REQUIRE(s.disposal_lifetime_days);
  CHECK(*s.disposal_lifetime_days <= 5.0 * 365.25);
  CHECK(s.disposal_perigee_km < 600.0);
  // Node control removes the 3-sigma errors once: Hohmann over 6 km plus a 0.15 deg plane change.
  const double a = d.shells[0].a_km, v = circular_speed_m_s(d.earth.mu_km3_s2, a);
  CHECK(line(s, "node_drift_control") == doctest::Approx(hohmann_dv_m_s(d.earth.mu_km3_s2, a, a + 6.0) +
                                                         plane_change_dv_m_s(v, 0.15 * rad_per_deg)));
  CHECK(s.node_spread_uncontrolled_deg > 0.0);
}

TEST_CASE("warnings: no propulsion, altitude above the table, tank capacity, lower-bound lifetime") {
  const std::string low = "  - name: low\n    pattern: walker-delta\n    satellites: 2\n    planes: 1\n    phasing: 0\n"
                          "    altitude_km: 350\n    inclination_deg: 53\n";
  const Design d = read_design_text(design_text(low, "budget:\n  mission_life_years: 5\n", ""), "t.yaml");
  const ShellBudget s = only(compute_budget(d, options(false)));
  CHECK(!s.propellant_kg);
  bool life_warned = false;
  for (const auto& w : s.warnings) life_warned |= w.find("no propulsion") != std::string::npos;
  CHECK(life_warned);

  const std::string high = "  - name: high\n    pattern: walker-delta\n    satellites: 2\n    planes: 1\n    phasing: 0\n"
                           "    altitude_km: 1200\n    inclination_deg: 53\n";
  const Design h = read_design_text(design_text(high, "", "  isp_s: 220\n  propellant_capacity_kg: 1\n"), "t.yaml");
  const BudgetResult r = compute_budget(h, options(false, 50.0));
  const ShellBudget& sh = only(r);
  CHECK(sh.lifetime_lower_bound);
  CHECK(sh.lifetime_natural_days == doctest::Approx(50.0 * 365.25));
  CHECK(sh.exceeds_tank);
  int above = 0;
  for (const auto& w : r.warnings) above += w.find("above the harris-priester table") != std::string::npos;
  CHECK(above == 1);
}

TEST_CASE("bad input: ballistic coefficient, budget block keys and values") {
  Design d = read_design_text(design_text(shell_500, ""), "t.yaml");
  d.spacecraft.drag_area_m2 = 0.0;
  CHECK_THROWS_AS(compute_budget(d), InputError);
  d.spacecraft.drag_area_m2 = 1.0;
  d.spacecraft.dry_mass_kg = std::nan("");
  CHECK_THROWS_AS(compute_budget(d), InputError);

  auto message = [](const std::string& text) {
    try {
      (void)read_design_text(text, "bad.yaml");
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  // Unknown key with a suggestion, naming file:line:column.
  const std::string m1 = message(design_text(shell_500, "budget:\n  mission_life_yrs: 5\n"));
  CHECK(m1.find("bad.yaml:17:3") != std::string::npos);
  CHECK(m1.find("mission_life_years") != std::string::npos);
  // A solar level that does not exist.
  const std::string m2 = message(design_text(shell_500, "budget:\n  solar_activity: medium\n"));
  CHECK(m2.find("low, mean, high, cycle") != std::string::npos);
  // A value out of range.
  const std::string m3 = message(design_text(shell_500, "budget:\n  deadband_km: -1\n"));
  CHECK(m3.find("deadband") != std::string::npos);
  // A key of another disposal mode.
  const std::string m4 = message(design_text(shell_500, "budget:\n  disposal:\n    mode: direct\n    rule_years: 25\n"));
  CHECK(m4.find("applies only to mode: natural-decay") != std::string::npos);
  // Defaults when the block is absent.
  const Design ok = read_design_text(design_text(shell_500, ""), "t.yaml");
  CHECK(!ok.budget.present);
  CHECK(ok.budget.mission_life_years == 5.0);
  CHECK(ok.budget.disposal == DisposalMode::natural_decay);
  CHECK(ok.budget.atmosphere == AtmosphereKind::harris_priester);
}

TEST_CASE("solar cycle start: phase, minimum date, or the reference minimum") {
  // Epoch 2027-03-01 is 2633 days after the reference minimum 2019-12-15: phase 2633 / (11 x 365.25) = 0.6553.
  const Design ref = read_design_text(design_text(shell_500, "budget:\n  solar_activity: cycle\n"), "t.yaml");
  CHECK(compute_budget(ref, options(false)).solar_cycle_phase_at_epoch == doctest::Approx(2633.0 / (11.0 * 365.25)).epsilon(1e-9));
  // A minimum given about 5.5 years (2006.5 days) before the epoch: phase 2006.5 / 4017.75 = 0.4994.
  const Design dated = read_design_text(
      design_text(shell_500, "budget:\n  solar_activity: cycle\n  solar_minimum_date: 2021-09-01T12:00:00Z\n"), "t.yaml");
  CHECK(compute_budget(dated, options(false)).solar_cycle_phase_at_epoch == doctest::Approx(2006.5 / 4017.75).epsilon(1e-9));
  const Design phased = read_design_text(design_text(shell_500, "budget:\n  solar_cycle_phase: 0.5\n"), "t.yaml");
  CHECK(compute_budget(phased, options(false)).solar_cycle_phase_at_epoch == doctest::Approx(0.5));
  CHECK_THROWS_AS((void)read_design_text(design_text(shell_500, "budget:\n  solar_cycle_phase: 0.5\n  solar_minimum_date: 2019-12-15T00:00:00Z\n"), "t.yaml"), InputError);
  CHECK_THROWS_AS((void)read_design_text(design_text(shell_500, "budget:\n  solar_minimum_date: December 2019\n"), "t.yaml"), InputError);
}

TEST_CASE("JSON carries the required keys and no NaN") {
  const Design d = read_design_file(std::string(SKEIN_SOURCE_DIR) + "/designs/demo.yaml");
  for (SolarLevel l : {SolarLevel::low, SolarLevel::mean, SolarLevel::high, SolarLevel::cycle}) {
    BudgetOptions o;
    o.solar = l;
    o.level_curves = l == SolarLevel::mean;
    const nlohmann::ordered_json j = budget_to_json(compute_budget(d, o), d.earth.radius_km);
    REQUIRE(j["shells"].size() == d.shells.size());
    for (const auto& s : j["shells"]) {
      for (const char* key : {"name", "lifetime_natural_days", "drag_makeup_dv_m_s_per_year", "dv_lines", "total_dv_m_s",
                              "propellant_kg", "disposal_perigee_km"})
        CHECK(s.contains(key));
      for (const auto& line_j : s["dv_lines"]) {
        CHECK(line_j.contains("name"));
        CHECK(std::isfinite(line_j["dv_m_s"].get<double>()));
      }
    }
    CHECK(j.dump().find("NaN") == std::string::npos);
    CHECK(j.dump().find("null") == std::string::npos);  // the demo has isp and a tank: nothing is missing
  }
}

}  // TEST_SUITE
