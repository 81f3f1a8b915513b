#include "skein/report/budget_spread_tables.hpp"

#include <string>

namespace skein {
namespace {

const std::string all_shells = "(all shells)";

std::vector<Cell> figure_row(const std::string& shell, const SpreadFigure& f) {
  const SampleSummary& s = f.summary;
  return {shell, f.name, f.unit, f.deterministic, s.mean, s.p5, s.p50, s.p95, s.p95_interval.standard_error};
}

nlohmann::ordered_json figure_json(const SpreadFigure& f) {
  const SampleSummary& s = f.summary;
  nlohmann::ordered_json j;
  j["name"] = f.name;
  j["unit"] = f.unit;
  j["deterministic"] = f.deterministic;
  j["mean"] = s.mean;
  j["p5"] = s.p5;
  j["p50"] = s.p50;
  j["p95"] = s.p95;
  j["p95_standard_error"] = s.p95_interval.standard_error;
  j["p95_interval_95"] = {s.p95_interval.low, s.p95_interval.high};
  return j;
}

}  // namespace

Table budget_spread_table(const BudgetSpreadResult& r) {
  Table t;
  t.title = "Monte Carlo budget: " + std::to_string(r.samples) + " samples, seed " + std::to_string(r.seed) +
            " (per satellite over the life unless fleet; " + std::string(budget_spread_caution) + ")";
  t.columns = {{"shell", "shell", "", 0},          {"figure", "figure", "", 0},
               {"unit", "unit", "", 0},            {"deterministic", "stated case", "", 3},
               {"mean", "mean", "", 3},            {"p5", "P5", "", 3},
               {"p50", "P50", "", 3},              {"p95", "P95", "", 3},
               {"p95_standard_error", "P95 s.e.", "", 3}};
  for (const auto& sh : r.shells)
    for (const auto& f : sh.figures) t.add_row(figure_row(sh.name, f));
  for (const auto& f : r.fleet) t.add_row(figure_row(all_shells, f));
  return t;
}

Table budget_spread_inputs_table(const BudgetSpreadResult& r) {
  Table t;
  t.title = "Monte Carlo input spreads";
  t.columns = {{"input", "input", "", 0}, {"spread", "spread", "", 4}, {"unit", "unit", "", 0}, {"basis", "basis", "", 0}};
  const BudgetSpread& s = r.spread;
  t.add_row({std::string("budget.spread.solar_minimum_years"), s.solar_minimum_years, std::string("yr (+-, uniform)"),
             std::string(r.solar == SolarLevel::cycle ? "date of the cycle minimum; cycle lengths vary (common practice)"
                                                      : "no effect: the solar level is fixed, not the cycle")});
  t.add_row({std::string("budget.spread.solar_amplitude"), s.solar_amplitude, std::string("relative 1-sigma"),
             std::string("activity swing above the low level; cycle maxima differ (common practice)")});
  t.add_row({std::string("budget.spread.drag_coefficient"), s.drag_coefficient, std::string("relative 1-sigma"),
             std::string("Cd is a convention, not a measurement (common practice)")});
  t.add_row({std::string("budget.spread.drag_area"), s.drag_area, std::string("relative 1-sigma"),
             std::string("mean projected area varies with attitude (common practice)")});
  t.add_row({std::string("budget.injection_sigma.altitude_km"), r.injection_sigma_altitude_km, std::string("km 1-sigma"),
             std::string("stated injection error, removed by the node line")});
  t.add_row({std::string("budget.injection_sigma.inclination_deg"), r.injection_sigma_inclination_deg,
             std::string("deg 1-sigma"), std::string("stated injection error, removed by the node line")});
  return t;
}

nlohmann::ordered_json budget_spread_to_json(const BudgetSpreadResult& r) {
  nlohmann::ordered_json j;
  j["samples"] = r.samples;
  j["seed"] = r.seed;
  j["caution"] = std::string(budget_spread_caution);
  j["notes"] = r.notes;
  j["warnings"] = r.warnings;
  j["spread"] = {{"solar_minimum_years", r.spread.solar_minimum_years},
                 {"solar_amplitude", r.spread.solar_amplitude},
                 {"drag_coefficient", r.spread.drag_coefficient},
                 {"drag_area", r.spread.drag_area},
                 {"injection_sigma_altitude_km", r.injection_sigma_altitude_km},
                 {"injection_sigma_inclination_deg", r.injection_sigma_inclination_deg}};
  j["shells"] = nlohmann::ordered_json::array();
  for (const auto& sh : r.shells) {
    nlohmann::ordered_json s;
    s["name"] = sh.name;
    s["lifetime_lower_bound_samples"] = sh.lifetime_lower_bounds;
    s["cannot_fly_samples"] = sh.cannot_fly;
    s["figures"] = nlohmann::ordered_json::array();
    for (const auto& f : sh.figures) s["figures"].push_back(figure_json(f));
    j["shells"].push_back(s);
  }
  j["fleet"] = nlohmann::ordered_json::array();
  for (const auto& f : r.fleet) j["fleet"].push_back(figure_json(f));
  return j;
}

}  // namespace skein
