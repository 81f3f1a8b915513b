#include "skein/input/budget_block.hpp"

#include <algorithm>

#include <fmt/format.h>

#include "skein/constants.hpp"
#include "skein/input/yaml_reader.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

namespace {

// budget.injection: the orbit the launcher leaves the satellites in and the propulsion that raises them.
InjectionSpec read_injection(const yaml::MapReader& budget, double reentry_altitude_km) {
  const yaml::MapReader m = budget.map("injection", {"altitude_km", "perigee_altitude_km", "apogee_altitude_km",
                                                     "inclination_deg", "propulsion", "thrust_n", "isp_s"});
  InjectionSpec inj;
  // Wide bounds here; the floor below names the re-entry altitude it enforces.
  constexpr double top_km = max_semi_major_axis_km;
  const double floor_km = std::max(minimum_perigee_altitude_km, reentry_altitude_km);
  auto above_floor = [&](std::string_view key, double km) {
    if (km < floor_km)
      m.fail_key(key, fmt::format("injection altitude {} km is below the re-entry altitude; expected a perigee of at "
                                  "least {} km (the larger of budget.reentry_altitude_km {} km and the {} km floor)",
                                  km, floor_km, reentry_altitude_km, minimum_perigee_altitude_km));
  };
  if (m.has("altitude_km")) {
    if (m.has("perigee_altitude_km") || m.has("apogee_altitude_km"))
      m.fail_key("altitude_km", "give altitude_km (a circular orbit) or perigee_altitude_km and apogee_altitude_km, not both");
    inj.perigee_km = inj.apogee_km = m.number("altitude_km", -top_km, top_km, "an injection altitude in km");
    above_floor("altitude_km", inj.perigee_km);
  } else if (m.has("perigee_altitude_km") || m.has("apogee_altitude_km")) {
    inj.perigee_km = m.number("perigee_altitude_km", -top_km, top_km, "an injection perigee altitude in km");
    inj.apogee_km = m.number("apogee_altitude_km", -top_km, top_km, "an injection apogee altitude in km");
    above_floor("perigee_altitude_km", inj.perigee_km);
    if (inj.apogee_km < inj.perigee_km)
      m.fail_key("apogee_altitude_km", fmt::format("apogee altitude {} km is below the perigee altitude {} km; expected "
                                                   "an apogee at or above the perigee",
                                                   inj.apogee_km, inj.perigee_km));
  } else {
    m.fail(m.self(), m.path(), "missing the injection orbit; expected altitude_km (circular) or perigee_altitude_km and "
                               "apogee_altitude_km");
  }
  inj.inclination_deg = m.optional_number("inclination_deg", 0.0, 180.0, "an injection inclination in degrees (0 to 180)");
  if (m.has("propulsion"))
    inj.propulsion = m.choice("propulsion", {"chemical", "electric"}) == "electric" ? RaisingPropulsion::electric
                                                                                      : RaisingPropulsion::chemical;
  if (m.has("thrust_n")) {
    if (inj.propulsion != RaisingPropulsion::electric)
      m.fail_key("thrust_n", "applies only to propulsion: electric (a chemical raise is budgeted as impulses)");
    const double f = m.number("thrust_n", -1e9, 1e9, "a thrust in newtons");
    if (!(f > 0.0) || f > 1000.0)
      m.fail_key("thrust_n", fmt::format("thrust {} N is {}; expected a thrust above 0 and at most 1000 N", f,
                                         f > 0.0 ? "too large for an electric thruster" : "not positive"));
    inj.thrust_n = f;
  } else if (inj.propulsion == RaisingPropulsion::electric) {
    m.fail(m.self(), m.path(), "propulsion: electric needs thrust_n, the thrust in newtons (above 0, at most 1000)");
  }
  inj.isp_s = m.optional_number("isp_s", 1.0, 1e5, "a specific impulse of the raising engine in s");
  if (inj.propulsion == RaisingPropulsion::electric && inj.apogee_km != inj.perigee_km)
    m.fail_key("apogee_altitude_km", "propulsion: electric is Edelbaum's transfer between circular orbits; expected a "
                                     "circular injection orbit (altitude_km)");
  return inj;
}

// budget.deployment: the deadline and the drift offsets traded (the plan itself is checked in design_file.cpp,
// where the shells are known).
DeploymentSpec read_deployment(const yaml::MapReader& budget) {
  const yaml::MapReader m = budget.map("deployment", {"deadline_days", "plane_offsets_km", "phasing_offsets_km"});
  DeploymentSpec dep;
  dep.deadline_days = m.number("deadline_days", 0.0, 36525.0, "a deployment deadline in days (above 0, at most 36525)");
  if (!(dep.deadline_days > 0.0))
    m.fail_key("deadline_days", fmt::format("deadline {} days is not positive; expected a deadline above 0 days",
                                            dep.deadline_days));
  auto offsets = [&](std::string_view key, double max_km, std::vector<double>& out) {
    if (!m.has(key)) return;
    const auto items = m.sequence(key);
    if (items.size() > 64) m.fail_key(key, fmt::format("{} offsets; expected at most 64", items.size()));
    out.clear();
    for (size_t k = 0; k < items.size(); ++k) {
      const std::string path = fmt::format("{}[{}]", m.path_of(key), k);
      const double h = yaml::scalar_number(m.file(), items[k], path, -1e9, 1e9, "a drift-altitude offset in km");
      if (!(h > 0.0) || h > max_km)
        yaml::fail_at(m.file(), items[k], path,
                      fmt::format("offset {} km is {}; expected an offset above 0 and at most {} km", h,
                                  h > 0.0 ? "too large" : "not positive", max_km));
      out.push_back(h);
    }
  };
  offsets("plane_offsets_km", 2000.0, dep.plane_offsets_km);
  offsets("phasing_offsets_km", 200.0, dep.phasing_offsets_km);
  return dep;
}

}  // namespace

BudgetSpec read_budget_spec(const yaml::MapReader& root) {
  BudgetSpec spec;
  if (!root.has("budget")) return spec;
  const yaml::MapReader m = root.map(
      "budget", {"mission_life_years", "atmosphere", "harris_priester_exponent", "solar_activity", "solar_cycle_phase",
                 "solar_minimum_date", "reentry_altitude_km", "deadband_km", "injection_sigma", "node_control",
                 "sso_inclination_control", "slot_keeping", "collision_avoidance", "disposal", "margin_percent", "injection",
                 "deployment", "spread", "samples", "seed"});
  spec.present = true;
  spec.mission_life_years =
      m.optional_number("mission_life_years", 0.01, 100.0, "a mission life in years (0.01 to 100)").value_or(5.0);
  if (m.has("atmosphere"))
    spec.atmosphere = *atmosphere_kind_from_string(m.choice("atmosphere", {"harris-priester", "exponential"}));
  spec.harris_priester_exponent =
      m.optional_number("harris_priester_exponent", 2.0, 6.0, "a Harris-Priester bulge exponent n from 2 to 6");
  if (spec.harris_priester_exponent && spec.atmosphere != AtmosphereKind::harris_priester)
    m.fail_key("harris_priester_exponent", "applies only with atmosphere: harris-priester");
  if (m.has("solar_activity"))
    spec.solar = *solar_level_from_string(m.choice("solar_activity", {"low", "mean", "high", "cycle"}));
  spec.solar_cycle_phase =
      m.optional_number("solar_cycle_phase", 0.0, 1.0, "a solar-cycle phase at the epoch (0 = minimum, 0.5 = maximum)");
  if (m.has("solar_minimum_date")) {
    if (spec.solar_cycle_phase) m.fail_key("solar_minimum_date", "give solar_cycle_phase or solar_minimum_date, not both");
    const std::string text = m.string("solar_minimum_date", "a UTC date of a solar-cycle minimum");
    const auto when = parse_utc_iso8601(text);
    if (!when)
      m.fail_key("solar_minimum_date",
                 fmt::format("\"{}\" is not a UTC instant; expected ISO 8601 like 2019-12-15T00:00:00Z", text));
    spec.solar_minimum_jd = julian_date(*when).value();
  }
  spec.reentry_altitude_km =
      m.optional_number("reentry_altitude_km", 80.0, 200.0, "a re-entry altitude in km (80 to 200)").value_or(120.0);
  spec.deadband_km =
      m.optional_number("deadband_km", 0.01, 50.0, "an altitude deadband in km (0.01 to 50)").value_or(1.0);
  if (m.has("injection_sigma")) {
    const yaml::MapReader s = m.map("injection_sigma", {"altitude_km", "inclination_deg", "multiple"});
    spec.injection_sigma_altitude_km =
        s.optional_number("altitude_km", 0.0, 100.0, "a 1-sigma injection altitude error in km").value_or(3.0);
    spec.injection_sigma_inclination_deg =
        s.optional_number("inclination_deg", 0.0, 5.0, "a 1-sigma injection inclination error in degrees").value_or(0.03);
    spec.sigma_multiple = s.optional_number("multiple", 0.0, 6.0, "a sigma multiple k (0 to 6)").value_or(3.0);
  }
  if (m.has("node_control")) spec.node_control = *node_control_from_string(m.choice("node_control", {"correct", "none"}));
  if (m.has("sso_inclination_control")) spec.sso_inclination_control = m.boolean("sso_inclination_control");
  if (m.has("slot_keeping")) {
    const yaml::MapReader s = m.map("slot_keeping", {"shift_deg", "shift_days", "shifts_per_year"});
    spec.slot_shift_deg = s.optional_number("shift_deg", 0.0, 180.0, "a slot shift in degrees").value_or(1.0);
    spec.slot_shift_days = s.optional_number("shift_days", 0.1, 365.0, "a shift duration in days").value_or(10.0);
    spec.slot_shifts_per_year = s.optional_number("shifts_per_year", 0.0, 365.0, "shifts per year").value_or(4.0);
  }
  if (m.has("collision_avoidance")) {
    const yaml::MapReader s = m.map("collision_avoidance", {"manoeuvres_per_year", "dv_per_manoeuvre_m_s"});
    spec.avoidance_per_year =
        s.optional_number("manoeuvres_per_year", 0.0, 1000.0, "avoidance manoeuvres per year").value_or(2.0);
    spec.avoidance_dv_m_s =
        s.optional_number("dv_per_manoeuvre_m_s", 0.0, 100.0, "a delta-v per avoidance manoeuvre in m/s").value_or(0.5);
  }
  if (m.has("disposal")) {
    const yaml::MapReader s = m.map("disposal", {"mode", "perigee_km", "rule_years"});
    if (s.has("mode")) spec.disposal = *disposal_mode_from_string(s.choice("mode", {"natural-decay", "direct", "none"}));
    spec.disposal_perigee_km =
        s.optional_number("perigee_km", -100.0, 200.0, "a disposal perigee altitude in km (-100 to 200)").value_or(50.0);
    spec.disposal_rule_years =
        s.optional_number("rule_years", 0.1, 100.0, "a re-entry rule period in years (e.g. 5 or 25)").value_or(5.0);
    if (s.has("perigee_km") && spec.disposal != DisposalMode::direct)
      s.fail_key("perigee_km", "applies only to mode: direct");
    if (s.has("rule_years") && spec.disposal != DisposalMode::natural_decay)
      s.fail_key("rule_years", "applies only to mode: natural-decay");
  }
  spec.margin_percent = m.optional_number("margin_percent", 0.0, 200.0, "a margin in percent").value_or(10.0);
  if (m.has("injection")) spec.injection = read_injection(m, spec.reentry_altitude_km);
  if (m.has("deployment")) {
    if (!spec.injection)
      m.fail_key("deployment", "the deployment plan starts from the injection orbit and uses its propulsion; expected "
                               "budget.injection as well");
    spec.deployment = read_deployment(m);
  }
  if (m.has("spread")) {
    const yaml::MapReader s = m.map("spread", {"solar_minimum_years", "solar_amplitude", "drag_coefficient", "drag_area"});
    BudgetSpread& sp = spec.spread;
    sp.solar_minimum_years =
        s.optional_number("solar_minimum_years", 0.0, 0.5 * solar_cycle_years,
                          "a half-width in years of the solar-minimum date's spread (5.5 is half a cycle)")
            .value_or(sp.solar_minimum_years);
    const std::string_view relative = "a relative 1-sigma spread (0.1 = 10 %; at most 0.3 so a factor clipped at 3 sigma "
                                      "stays positive)";
    sp.solar_amplitude = s.optional_number("solar_amplitude", 0.0, 0.3, relative).value_or(sp.solar_amplitude);
    sp.drag_coefficient = s.optional_number("drag_coefficient", 0.0, 0.3, relative).value_or(sp.drag_coefficient);
    sp.drag_area = s.optional_number("drag_area", 0.0, 0.3, relative).value_or(sp.drag_area);
  }
  spec.samples = m.optional_integer("samples", monte_carlo_min_samples, monte_carlo_max_samples,
                                    "a Monte Carlo sample count (fewer than 100 leave under 5 samples beyond P95)");
  if (const auto seed = m.optional_integer("seed", 0, static_cast<long>(monte_carlo_max_seed),
                                           "a Monte Carlo seed (the top is 2^53)"))
    spec.seed = static_cast<unsigned long long>(*seed);
  return spec;
}

}  // namespace skein
