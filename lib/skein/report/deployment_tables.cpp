#include "skein/report/deployment_tables.hpp"

#include <string>

namespace skein {
namespace {

Cell offset_cell(const DeploymentResult& d, int plane_plan, bool phasing) {
  if (plane_plan < 0) return Cell();
  return (phasing ? d.phasing : d.planes)[static_cast<size_t>(plane_plan)].offset_km;
}

bool is_chosen(const DeploymentResult& d, const DeploymentPoint& p) {
  return d.chosen && d.chosen->plane_plan == p.plane_plan && d.chosen->phasing_plan == p.phasing_plan;
}

}  // namespace

Table deployment_plans_table(const ShellBudget& s) {
  Table t;
  t.title = "Deployment by differential J2 drift, shell " + s.name + ": every drift offset traded";
  t.columns = {{"mechanism", "spreads", "", 0},
               {"offset_km", "offset", "km", 1},
               {"lower_rate_deg_day", "rate below", "deg/day", 4},
               {"higher_rate_deg_day", "rate above", "deg/day", 4},
               {"lower_groups", "groups below", "", 0},
               {"higher_groups", "groups above", "", 0},
               {"leg_days", "one transfer", "days", 2},
               {"days", "time", "days", 1},
               {"dv_m_s", "delta-v", "m/s", 2},
               {"fleet_dv_m_s", "fleet delta-v", "m/s", 1}};
  if (!s.deployment) return t;
  auto add = [&](const DriftPlan& p, const char* what) {
    t.add_row({std::string(what), p.offset_km, p.lower_rate_deg_day, p.higher_rate_deg_day,
               static_cast<long>(p.lower_groups), static_cast<long>(p.higher_groups), p.leg_days, p.days, p.dv_m_s,
               p.fleet_dv_m_s});
  };
  for (const auto& p : s.deployment->planes) add(p, "planes (node)");
  for (const auto& p : s.deployment->phasing) add(p, "slots (in plane)");
  return t;
}

Table deployment_curve_table(const ShellBudget& s) {
  Table t;
  t.title = "Deployment trade curve, shell " + s.name + " (planes, then slots; fewest days first)";
  t.columns = {{"plane_offset_km", "plane offset", "km", 1},
               {"phasing_offset_km", "slot offset", "km", 1},
               {"days", "time", "days", 1},
               {"dv_m_s", "delta-v (worst)", "m/s", 2},
               {"fleet_dv_m_s", "fleet delta-v", "m/s", 1},
               {"chosen", "chosen", "", 0}};
  if (!s.deployment) return t;
  const DeploymentResult& d = *s.deployment;
  for (const auto& p : d.curve)
    t.add_row({offset_cell(d, p.plane_plan, false), offset_cell(d, p.phasing_plan, true), p.days, p.dv_m_s,
               p.fleet_dv_m_s, std::string(is_chosen(d, p) ? "yes" : "")});
  return t;
}

nlohmann::ordered_json deployment_to_json(const ShellBudget& s) {
  using J = nlohmann::ordered_json;
  if (!s.deployment) return J();
  const DeploymentResult& d = *s.deployment;
  J j;
  j["deadline_days"] = d.deadline_days ? J(*d.deadline_days) : J();
  j["fastest_days"] = d.fastest_days;
  if (d.chosen) {
    const DeploymentPoint& c = *d.chosen;
    j["chosen"] = J{{"plane_offset_km", c.plane_plan >= 0 ? J(d.planes[static_cast<size_t>(c.plane_plan)].offset_km) : J()},
                    {"phasing_offset_km",
                     c.phasing_plan >= 0 ? J(d.phasing[static_cast<size_t>(c.phasing_plan)].offset_km) : J()},
                    {"days", c.days},
                    {"dv_m_s", c.dv_m_s},
                    {"fleet_dv_m_s", c.fleet_dv_m_s}};
  } else {
    j["chosen"] = J();
  }
  j["propellant_kg"] = s.deployment_propellant_kg ? J(*s.deployment_propellant_kg) : J();
  j["plans"] = rows_to_json(deployment_plans_table(s));
  j["curve"] = rows_to_json(deployment_curve_table(s));
  j["skipped"] = d.skipped;
  return j;
}

}  // namespace skein
