#include "skein/sweep/results_rows.hpp"

#include <algorithm>
#include <cassert>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

namespace skein {
namespace {

Cell opt(const std::optional<double>& v) { return v ? Cell(*v) : Cell(); }
Cell yes_no(bool b) { return std::string(b ? "yes" : "no"); }

size_t column_of(const Sweep& sweep, std::string_view key) {
  const auto cols = sweep_columns(sweep);
  auto it = std::find_if(cols.begin(), cols.end(), [&](const Column& c) { return c.key == key; });
  assert(it != cols.end());
  return static_cast<size_t>(it - cols.begin());
}

double number_of(const Cell& c) {
  if (const double* d = std::get_if<double>(&c)) return *d;
  if (const long* l = std::get_if<long>(&c)) return static_cast<double>(*l);
  return 0.0;
}

}  // namespace

std::vector<Column> sweep_columns(const Sweep& sweep) {
  const std::string k = std::to_string(sweep.requirement.fold);
  return {
      {"layout", "layout", "", 0},
      {"satellites", "T", "", 0},
      {"planes", "P", "", 0},
      {"phasing", "F", "", 0},
      {"altitude_km", "altitude", "km", 1},
      {"inclination_deg", "inclination", "deg", 3},
      {"sun_synchronous", "SSO", "", 0},
      {"ltan", "LTAN", "", 0},
      {"min_elevation_deg", "elevation mask", "deg", 1},
      {"design_satellites", "design satellites", "", 0},
      {"status", "status", "", 0},
      {"percent_covered", "covered k>=" + k, "%", 3},
      {"cap_bound_satellites", "cap bound T k>=" + k, "", 0},
      {"worst_instant_percent", "worst instant k>=" + k, "%", 3},
      {"max_gap_s", "max gap", "s", 1},
      {"mean_gap_s", "mean gap", "s", 1},
      {"p95_gap_s", "p95 gap", "s", 1},
      {"mean_response_time_s", "mean response", "s", 1},
      {"mean_in_view", "mean in view", "", 3},
      {"lifetime_days", "natural lifetime", "days", 1},
      {"dv_per_satellite_m_s", "delta-v per satellite", "m/s", 3},
      {"fleet_dv_m_s", "fleet delta-v", "m/s", 2},
      {"propellant_per_satellite_kg", "propellant per satellite", "kg", 3},
      {"fleet_propellant_kg", "fleet propellant", "kg", 2},
      {"exceeds_tank", "exceeds tank", "", 0},
      {"meets_requirement", "meets requirement", "", 0},
      {"failed_checks", "failed checks", "", 0},
      {"note", "note", "", 0},
  };
}

std::vector<Cell> layout_row([[maybe_unused]] const Sweep& sweep, const Layout& l, const LayoutMetrics& m) {
  std::vector<Cell> row = {
      static_cast<long>(l.index),
      static_cast<long>(l.satellites),
      static_cast<long>(l.planes),
      static_cast<long>(l.phasing),
      l.altitude_km,
      l.inclination_deg,
      yes_no(l.sun_synchronous),
      l.ltan ? Cell(l.ltan->text) : Cell(),
      l.min_elevation_deg,
      static_cast<long>(m.design_satellites),
      // ok, cannot-fly (evaluated, but some shell's budget cannot be flown: see note), or error
      std::string(!m.evaluated ? "error" : m.cannot_fly.empty() ? "ok" : "cannot-fly"),
  };
  if (m.evaluated) {
    std::string failed;
    for (const auto& f : m.failed) failed += (failed.empty() ? "" : "; ") + f;
    std::string note;
    if (m.lifetime_lower_bound) note = "natural lifetime is a lower bound (outlives the horizon)";
    std::string fly;
    for (const auto& why : m.cannot_fly) fly += (fly.empty() ? "cannot be flown: " : "; ") + why;
    if (!fly.empty()) note += (note.empty() ? "" : "; ") + fly;
    const Cell cap = m.cap_bound_satellites ? Cell(*m.cap_bound_satellites) : Cell();
    for (Cell c : {Cell(m.percent_covered), cap, Cell(m.worst_instant_percent), Cell(m.max_gap_s), Cell(m.mean_gap_s),
                   Cell(m.p95_gap_s), Cell(m.mean_response_time_s), Cell(m.mean_in_view), Cell(m.lifetime_days),
                   Cell(m.dv_per_satellite_m_s), Cell(m.fleet_dv_m_s), opt(m.propellant_per_satellite_kg),
                   opt(m.fleet_propellant_kg), yes_no(m.exceeds_tank), yes_no(m.meets),
                   failed.empty() ? Cell() : Cell(failed), note.empty() ? Cell() : Cell(note)})
      row.push_back(c);
  } else {
    for (int i = 0; i < 16; ++i) row.emplace_back();
    row.emplace_back(m.error);
  }
  assert(row.size() == sweep_columns(sweep).size());
  return row;
}

std::string encode_row(const std::vector<Cell>& cells) {
  nlohmann::json a = nlohmann::json::array();
  for (const Cell& c : cells) {
    if (const double* d = std::get_if<double>(&c)) {
      a.push_back(*d);
    } else if (const long* l = std::get_if<long>(&c)) {
      a.push_back(*l);
    } else if (const std::string* s = std::get_if<std::string>(&c)) {
      a.push_back(*s);
    } else {
      a.push_back(nullptr);
    }
  }
  // Non-ASCII bytes kept as they are; invalid UTF-8 (from a message) replaced rather than thrown on.
  return a.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
}

std::optional<std::vector<Cell>> decode_row(std::string_view text, size_t columns) {
  const nlohmann::json a = nlohmann::json::parse(text.begin(), text.end(), nullptr, false);
  if (a.is_discarded() || !a.is_array() || a.size() != columns) return std::nullopt;
  std::vector<Cell> out;
  for (const auto& v : a) {
    if (v.is_number_float()) {
      out.emplace_back(v.get<double>());
    } else if (v.is_number_integer()) {
      out.emplace_back(v.get<long>());
    } else if (v.is_string()) {
      out.emplace_back(v.get<std::string>());
    } else if (v.is_null()) {
      out.emplace_back();
    } else {
      return std::nullopt;
    }
  }
  return out;
}

RowSummary summarize_row(const Sweep& sweep, const std::vector<Cell>& cells) {
  RowSummary s;
  s.layout = static_cast<size_t>(number_of(cells.at(column_of(sweep, "layout"))));
  const auto* status = std::get_if<std::string>(&cells.at(column_of(sweep, "status")));
  s.evaluated = status && (*status == "ok" || *status == "cannot-fly");
  if (!s.evaluated) return s;
  const auto* meets = std::get_if<std::string>(&cells.at(column_of(sweep, "meets_requirement")));
  s.meets = meets && *meets == "yes";
  s.figure = number_of(cells.at(column_of(sweep, to_string(sweep.requirement.figure))));
  for (CostFigure c : sweep.costs) {
    double v = 0.0;
    switch (c) {
      case CostFigure::satellites: v = number_of(cells.at(column_of(sweep, "design_satellites"))); break;
      default: v = number_of(cells.at(column_of(sweep, to_string(c)))); break;
    }
    s.costs.push_back(v);
  }
  return s;
}

}  // namespace skein
