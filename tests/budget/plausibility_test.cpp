// Budgets are finite or refused, and implausible designs are flagged: the decay of a huge ballistic
// coefficient, the refusal of non-finite figures, each plausibility warning on its absurd case and not on the
// demo design's imaging shell, the no-burn wording, and the cannot-fly status of sweep rows.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "skein/atmosphere/atmosphere.hpp"
#include "skein/budget/budget.hpp"
#include "skein/budget/plausibility.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/lifetime/decay.hpp"
#include "skein/report/budget_tables.hpp"

using namespace skein;

namespace {

// One walker shell at altitude_km; spacecraft mass, area and the optional isp line as given.
Design probe(double dry_kg, double area_m2, double altitude_km, const std::string& isp_line, double life_years = 5.0) {
  const std::string text =
      "name: probe\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: " + std::to_string(dry_kg) +
      "\n  drag_area_m2: " + std::to_string(area_m2) + "\n  drag_coefficient: 2.2\n" + isp_line +
      "shells:\n  - name: s1\n    pattern: walker-delta\n    satellites: 4\n    planes: 2\n    phasing: 1\n"
      "    altitude_km: " + std::to_string(altitude_km) + "\n    inclination_deg: 53\nbudget:\n  mission_life_years: " +
      std::to_string(life_years) + "\n";
  return read_design_text(text, "probe.yaml");
}

bool has_warning(const ShellBudget& s, const std::string& part) {
  return std::any_of(s.warnings.begin(), s.warnings.end(), [&](const std::string& w) { return w.find(part) != std::string::npos; });
}

BudgetOptions quick() {
  BudgetOptions o;
  o.level_curves = false;
  return o;
}

// The warnings and the figures they are about, judged directly from the result (the brute force the
// warning logic must agree with).
void check_warnings_match_figures(const Design& d, const ShellBudget& s) {
  const double life_days = d.budget.mission_life_years * days_per_julian_year;
  const double m_cda = 1.0 / s.ballistic_coefficient_m2_kg;
  CHECK(has_warning(s, "is shorter than the") == (!s.lifetime_lower_bound && s.lifetime_natural_days < life_days));
  CHECK(has_warning(s, "mass-to-drag-area ratio") == (m_cda < 10.0 || m_cda > 1000.0));
  CHECK(has_warning(s, "heavier than the dry mass") == (s.propellant_kg && *s.propellant_kg > d.spacecraft.dry_mass_kg));
  CHECK(has_warning(s, "single chemical stage") == (s.total_dv_m_s > single_stage_dv_limit_m_s()));
  CHECK(has_warning(s, "decays naturally within") == (s.lifetime_natural_days < 7.0));
  CHECK(s.flyable() == (s.lifetime_natural_days >= 7.0 && s.total_dv_m_s <= single_stage_dv_limit_m_s() &&
                        (s.drag_makeup_manoeuvres == 0 ||
                         life_days / static_cast<double>(s.drag_makeup_manoeuvres) >= 1.0)));
}

}  // namespace

TEST_SUITE("budget plausibility") {

TEST_CASE("a huge ballistic coefficient re-enters fast, never 'at least 200 years'") {
  // B = Cd A / m = 2.2 x 10000 / 0.01 = 2.2e6 m^2/kg at 550 km (issue 12's case). Upper bound on the true
  // life: the density grows monotonically downward, so the circular decay rate |da/dt| = rho B sqrt(mu a)
  // (King-Hele, as in decay.hpp) is never below its starting value; the fall of (550 - 120) km therefore
  // takes at most 430 km / |da/dt(550 km)|. The integrator must re-enter within that bound.
  const EarthModel& earth = wgs84;
  OrbitAtmosphere atm;
  const double b = 2.2e6, a0 = earth.radius_km + 550.0;
  const DensityFn rho = [&](double h, double t) { return orbit_density_kg_m3(atm, h, t); };
  DecayOptions opt;
  opt.record = false;
  const DecayResult r = integrate_decay(earth, rho, b, {0.0, a0, 0.0}, opt);
  CHECK(r.stop == DecayStop::reentry);
  const double rate_km_day = std::abs(drag_rates(earth, rho, b, a0, 0.0, 0.0).da_km_per_day);
  CHECK(r.end.t_days > 0.0);
  CHECK(r.end.t_days <= 430.0 / rate_km_day);
  // Through the budget: the life is short, not a lower bound, and the budget is flagged as unflyable.
  const ShellBudget s = compute_budget(probe(0.01, 10000, 550, ""), quick()).shells.at(0);
  CHECK(!s.lifetime_lower_bound);
  CHECK(s.lifetime_natural_days < 1.0);
  CHECK(!s.flyable());
  CHECK(has_warning(s, "cannot be flown: the orbit decays naturally within"));
  CHECK(std::isfinite(s.total_dv_m_s));
}

TEST_CASE("a decay the integrator cannot follow is 'failed', never a lower bound") {
  // A density model that returns NaN (a broken model) must not end as "still in orbit at the horizon".
  const DensityFn broken = [](double, double) { return std::nan(""); };
  DecayOptions opt;
  opt.record = false;
  const DecayResult r = integrate_decay(wgs84, broken, 0.01, {0.0, wgs84.radius_km + 550.0, 0.0}, opt);
  CHECK(r.stop == DecayStop::failed);
}

TEST_CASE("a non-finite figure is refused with the shell and the cause") {
  // The same spacecraft with isp_s 220: the rocket equation's exp(dv / (g0 Isp)) overflows a double.
  try {
    compute_budget(probe(0.01, 10000, 550, "  isp_s: 220\n"), quick());
    FAIL("expected an InputError");
  } catch (const InputError& e) {
    const std::string m = e.what();
    CHECK(m.find("probe.yaml: shell s1: the propellant mass is not finite") == 0);
    CHECK(m.find("overflows") != std::string::npos);
  }
}

TEST_CASE("fleet propellant masses that are finite per shell but overflow in their sum are refused") {
  // Found by fuzz/design_fuzz.cpp. Two one-satellite shells at 20000 and 20100 km (drag negligible there), a
  // budget of collision avoidance only: 1000/yr x 100 m/s x 100 yr = 1e7 m/s per satellite. With isp_s 1438 s,
  // dv / (g0 isp_s) = 1e7 / 14101.96 = 709.12 and a 1 kg dry mass needs expm1(709.12) = 9.3e307 kg: finite
  // (below 1.797e308) in each shell, 1.9e308 summed over the fleet, beyond the largest double.
  const std::string text =
      "name: overflow\nepoch: 2027-06-15T12:00:00Z\n"
      "spacecraft: {dry_mass_kg: 1, drag_area_m2: 1, drag_coefficient: 2.2, isp_s: 1438}\n"
      "budget:\n  mission_life_years: 100\n  node_control: none\n  slot_keeping: {shifts_per_year: 0}\n"
      "  collision_avoidance: {manoeuvres_per_year: 1000, dv_per_manoeuvre_m_s: 100}\n"
      "  disposal: {mode: none}\n  margin_percent: 0\n"
      "shells:\n"
      "  - {name: a, pattern: walker-delta, satellites: 1, planes: 1, phasing: 0, altitude_km: 20000, inclination_deg: 53}\n"
      "  - {name: b, pattern: walker-delta, satellites: 1, planes: 1, phasing: 0, altitude_km: 20100, inclination_deg: 53}\n";
  const Design d = read_design_text(text, "overflow.yaml");
  BudgetOptions one_shell_options = quick();
  Design one = d;
  one.shells.pop_back();  // one shell alone is finite: the refusal is about the sum
  const BudgetResult single = compute_budget(one, one_shell_options);
  REQUIRE(single.fleet_propellant_kg.has_value());
  CHECK(std::isfinite(*single.fleet_propellant_kg));
  CHECK(*single.fleet_propellant_kg > 0.5 * std::numeric_limits<double>::max());
  try {
    compute_budget(d, quick());
    FAIL("expected an InputError");
  } catch (const InputError& e) {
    const std::string m = e.what();
    CHECK(m.find("overflow.yaml: the fleet propellant mass over all shells is not finite (inf)") == 0);
    CHECK(m.find("a 9.") != std::string::npos);  // each shell's figure is named
    CHECK(m.find("b 9.") != std::string::npos);
  }
}

TEST_CASE("JSON tells 'no isp_s' from a computed propellant") {
  const BudgetResult none = compute_budget(probe(100, 1, 550, ""), quick());
  const auto j = budget_to_json(none, wgs84.radius_km);
  CHECK(j["shells"][0]["propellant_kg"].is_null());
  CHECK(j["shells"][0]["propellant_status"] == "no isp_s");
  CHECK(j["fleet_propellant_status"] == "no isp_s");
  const BudgetResult with = compute_budget(probe(100, 1, 550, "  isp_s: 220\n"), quick());
  const auto k = budget_to_json(with, wgs84.radius_km);
  CHECK(k["shells"][0]["propellant_kg"].is_number());
  CHECK(k["shells"][0]["propellant_status"] == "computed");
  CHECK(k["fleet_propellant_status"] == "computed");
  CHECK(k["shells"][0]["flyable"] == true);
}

TEST_CASE("the single-stage delta-v limit") {
  // 450 s x 9.80665 m/s^2 x ln 10 = 10161.3 m/s (hand arithmetic: 4412.99 x 2.302585).
  CHECK(single_stage_dv_limit_m_s() == doctest::Approx(10161.3).epsilon(1e-4));
}

TEST_CASE("each warning fires on its absurd case and not on the demo's imaging shell") {
  SUBCASE("drag area entered in cm^2: 10000 for a 100 kg satellite") {
    const Design d = probe(100, 10000, 550, "  isp_s: 220\n");
    const ShellBudget s = compute_budget(d, quick()).shells.at(0);
    CHECK(has_warning(s, "mass-to-drag-area ratio m/(Cd A) = 0.00455 kg/m^2 is outside 10 to 1000"));
    CHECK(has_warning(s, "single chemical stage"));
    CHECK(has_warning(s, "heavier than the dry mass"));
    CHECK(!s.flyable());
    check_warnings_match_figures(d, s);
  }
  SUBCASE("a 350 km shell over a 5-year life, with propulsion") {
    const Design d = probe(145, 0.85, 350, "  isp_s: 220\n");
    const ShellBudget s = compute_budget(d, quick()).shells.at(0);
    CHECK(has_warning(s, "is shorter than the 5.00-year mission life"));
    check_warnings_match_figures(d, s);
  }
  SUBCASE("150 km: hundreds of thousands of raises and 250 km/s") {
    const Design d = probe(100, 1, 150, "  isp_s: 220\n");
    const ShellBudget s = compute_budget(d, quick()).shells.at(0);
    CHECK(has_warning(s, "cannot be flown: the orbit decays naturally within"));
    CHECK(has_warning(s, "(more than one a day)"));
    CHECK(has_warning(s, "exceeds 10161 m/s"));
    CHECK(!s.flyable());
    check_warnings_match_figures(d, s);
  }
  SUBCASE("isp_s 1: propellant heavier than the dry mass") {
    const Design d = probe(100, 1, 550, "  isp_s: 1\n");
    const ShellBudget s = compute_budget(d, quick()).shells.at(0);
    CHECK(has_warning(s, "heavier than the dry mass"));
    check_warnings_match_figures(d, s);
  }
  SUBCASE("the demo design: no plausibility warning on imaging") {
    const Design d = read_design_file(std::string(SKEIN_SOURCE_DIR) + "/designs/demo.yaml");
    const BudgetResult r = compute_budget(d, quick());
    const ShellBudget& s = r.shells.at(0);
    REQUIRE(s.name == "imaging");
    CHECK(s.flyable());
    CHECK(!has_warning(s, "shorter than the"));
    CHECK(!has_warning(s, "mass-to-drag-area"));
    CHECK(!has_warning(s, "heavier than the dry mass"));
    CHECK(!has_warning(s, "single chemical stage"));
    CHECK(!has_warning(s, "cannot be flown"));
    check_warnings_match_figures(d, s);
  }
}

TEST_CASE("a disposal that needs no burn says so") {
  // 350 km decays within the 5-year rule by itself (56 days at mean activity): no burn, and the basis says so.
  const ShellBudget s = compute_budget(probe(145, 0.85, 350, "  isp_s: 220\n"), quick()).shells.at(0);
  const auto it = std::find_if(s.dv_lines.begin(), s.dv_lines.end(), [](const DvLine& l) { return l.name == "disposal"; });
  REQUIRE(it != s.dv_lines.end());
  CHECK(it->dv_m_s == 0.0);
  CHECK(!s.disposal_burn);
  CHECK(it->basis.rfind("no burn needed: natural decay meets the 5-year rule", 0) == 0);
}

}  // TEST_SUITE
