#include "skein/report/budget_tables.hpp"

#include <string>

#include "skein/constants.hpp"
#include "skein/report/deployment_tables.hpp"

namespace skein {
namespace {
Cell opt(const std::optional<double>& v) { return v ? Cell(*v) : Cell(); }
nlohmann::ordered_json opt_json(const std::optional<double>& v) { return v ? nlohmann::ordered_json(*v) : nlohmann::ordered_json(); }
std::string yes_no(bool b) { return b ? "yes" : "no"; }
}  // namespace

Table budget_shell_table(const BudgetResult& r) {
  Table t;
  t.title = "Station-keeping budget per shell (per satellite over " + format_fixed(r.mission_life_years, 2) +
            " yr; " + std::string(to_string(r.atmosphere)) + " atmosphere, " + std::string(to_string(r.solar)) +
            " solar activity)";
  t.columns = {{"name", "shell", "", 0},
               {"satellites", "sats", "", 0},
               {"altitude_km", "altitude", "km", 1},
               {"ballistic_coefficient_m2_kg", "Cd A/m", "m^2/kg", 5},
               {"lifetime_natural_days", "natural life", "days", 1},
               {"lifetime_natural_years", "natural life", "yr", 2},
               {"lifetime_lower_bound", "at least", "", 0},
               {"drag_makeup_dv_m_s_per_year", "drag make-up", "m/s/yr", 3},
               {"drag_makeup_manoeuvres", "raises", "", 0},
               {"sso_inclination_drift_deg_per_year", "SSO di/dt", "deg/yr", 4},
               {"total_dv_m_s", "total dv", "m/s", 2},
               {"fleet_dv_m_s", "fleet dv", "m/s", 1},
               {"propellant_kg", "propellant", "kg", 3},
               {"fleet_propellant_kg", "fleet propellant", "kg", 2},
               {"exceeds_tank", "over tank", "", 0},
               {"disposal_perigee_km", "disposal perigee", "km", 1},
               {"status", "status", "", 0}};
  for (const auto& s : r.shells)
    t.add_row({s.name, static_cast<long>(s.satellites), s.altitude_km, s.ballistic_coefficient_m2_kg,
               s.lifetime_natural_days, s.lifetime_natural_days / days_per_julian_year, yes_no(s.lifetime_lower_bound),
               s.drag_makeup_dv_m_s_per_year, s.drag_makeup_manoeuvres, s.sso_inclination_drift_deg_per_year,
               s.total_dv_m_s, s.fleet_dv_m_s, opt(s.propellant_kg), opt(s.fleet_propellant_kg), yes_no(s.exceeds_tank),
               s.disposal_perigee_km, std::string(s.flyable() ? "ok" : "cannot be flown")});
  return t;
}

Table budget_lines_table(const BudgetResult& r) {
  Table t;
  t.title = "Delta-v lines per satellite over the mission life";
  t.columns = {{"shell", "shell", "", 0}, {"name", "line", "", 0}, {"dv_m_s", "delta-v", "m/s", 3}, {"basis", "basis", "", 0}};
  for (const auto& s : r.shells) {
    for (const auto& l : s.dv_lines) t.add_row({s.name, l.name, l.dv_m_s, l.basis});
    t.add_row({s.name, std::string("total"), s.total_dv_m_s, std::string("sum of the lines")});
  }
  return t;
}

Table lifetime_by_level_table(const BudgetResult& r) {
  Table t;
  t.title = "Natural lifetime by solar activity (from the design orbit at epoch)";
  t.columns = {{"shell", "shell", "", 0}, {"solar_activity", "solar activity", "", 0},
               {"lifetime_days", "lifetime", "days", 1}, {"lifetime_years", "lifetime", "yr", 2},
               {"lower_bound", "at least", "", 0}};
  for (const auto& s : r.shells)
    for (const auto& d : s.decay)
      t.add_row({s.name, std::string(to_string(d.level)), d.lifetime_days, d.lifetime_days / days_per_julian_year,
                 yes_no(d.lower_bound)});
  return t;
}

Table decay_curve_table(const ShellBudget& s, const LevelDecay& d, double re) {
  Table t;
  t.title = "Natural decay of shell " + s.name + " (" + std::string(to_string(d.level)) + " solar activity)";
  t.columns = {{"t_days", "time", "days", 2},          {"t_years", "time", "yr", 3},
               {"altitude_km", "mean altitude", "km", 2}, {"perigee_km", "perigee", "km", 2},
               {"apogee_km", "apogee", "km", 2}};
  for (const auto& p : d.curve)
    t.add_row({p.t_days, p.t_days / days_per_julian_year, p.a_km - re, p.a_km * (1.0 - p.e) - re, p.a_km * (1.0 + p.e) - re});
  return t;
}

nlohmann::ordered_json budget_to_json(const BudgetResult& r, double re) {
  using J = nlohmann::ordered_json;
  J j;
  j["design"] = r.design;
  j["mission_life_years"] = r.mission_life_years;
  j["atmosphere"] = std::string(to_string(r.atmosphere));
  j["solar_activity"] = std::string(to_string(r.solar));
  j["solar_cycle_phase_at_epoch"] = r.solar_cycle_phase_at_epoch;
  j["reentry_altitude_km"] = r.reentry_altitude_km;
  j["caution"] = std::string(caution_text);
  j["warnings"] = r.warnings;
  j["fleet_dv_m_s"] = r.fleet_dv_m_s;
  j["fleet_propellant_kg"] = opt_json(r.fleet_propellant_kg);
  j["fleet_propellant_status"] = r.fleet_propellant_kg ? "computed" : "no isp_s";
  J shells = J::array();
  for (const auto& s : r.shells) {
    J o;
    o["name"] = s.name;
    o["satellites"] = s.satellites;
    o["altitude_km"] = s.altitude_km;
    o["inclination_deg"] = s.inclination_deg;
    o["sun_synchronous"] = s.sun_synchronous;
    o["ballistic_coefficient_m2_kg"] = s.ballistic_coefficient_m2_kg;
    o["bulge_weight"] = opt_json(s.bulge_weight);
    o["lifetime_natural_days"] = s.lifetime_natural_days;
    o["lifetime_natural_years"] = s.lifetime_natural_days / days_per_julian_year;
    o["lifetime_lower_bound"] = s.lifetime_lower_bound;
    J by_level = J::object();
    for (const auto& d : s.decay) by_level[std::string(to_string(d.level))] = d.lifetime_days;
    o["lifetime_by_level_days"] = by_level;
    o["drag_makeup_dv_m_s_per_year"] = s.drag_makeup_dv_m_s_per_year;
    o["drag_makeup_manoeuvres"] = s.drag_makeup_manoeuvres;
    o["drag_makeup_interval_days"] = s.drag_makeup_interval_days;
    o["node_spread_uncontrolled_deg"] = s.node_spread_uncontrolled_deg;
    o["sso_inclination_drift_deg_per_year"] = s.sso_inclination_drift_deg_per_year;
    J lines = J::array();
    for (const auto& l : s.dv_lines) lines.push_back(J{{"name", l.name}, {"dv_m_s", l.dv_m_s}, {"basis", l.basis}});
    o["dv_lines"] = lines;
    if (s.raising) {  // only with budget.injection, so designs without it keep their JSON unchanged
      const RaisingFigures& f = *s.raising;
      o["raising"] = J{{"propulsion", std::string(to_string(f.propulsion))},
                       {"dv_m_s", f.dv_m_s},
                       {"plane_change_deg", f.plane_change_deg},
                       {"isp_s", f.isp_s > 0.0 ? J(f.isp_s) : J()},
                       {"propellant_kg", opt_json(f.propellant_kg)},
                       {"transfer_days", opt_json(f.transfer_days)}};
    }
    if (s.deployment)  // only with budget.deployment, so designs without it keep their JSON unchanged
      o["deployment"] = deployment_to_json(s);
    o["total_dv_m_s"] = s.total_dv_m_s;
    o["fleet_dv_m_s"] = s.fleet_dv_m_s;
    o["propellant_kg"] = opt_json(s.propellant_kg);
    // Why propellant_kg is null: "computed" or "no isp_s". A non-finite propellant never reaches here
    // (compute_budget refuses it), so null always means "not computed" and this says why.
    o["propellant_status"] = s.propellant_missing.empty() ? std::string("computed") : s.propellant_missing;
    o["fleet_propellant_kg"] = opt_json(s.fleet_propellant_kg);
    o["exceeds_tank"] = s.exceeds_tank;
    o["disposal_perigee_km"] = s.disposal_perigee_km;
    o["disposal_lifetime_days"] = opt_json(s.disposal_lifetime_days);
    J curves = J::object();
    for (const auto& d : s.decay) curves[std::string(to_string(d.level))] = rows_to_json(decay_curve_table(s, d, re));
    o["decay_curves"] = curves;
    o["flyable"] = s.flyable();
    o["cannot_fly"] = s.cannot_fly;
    o["warnings"] = s.warnings;
    shells.push_back(o);
  }
  j["shells"] = shells;
  return j;
}

}  // namespace skein
