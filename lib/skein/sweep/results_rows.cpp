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

namespace {

// "imaging." before a per-shell key and "imaging " before its heading when several shells are varied.
struct ShellPrefix {
  std::string key, heading;
};
ShellPrefix prefix_of(const Sweep& sweep, size_t k) {
  if (sweep.axes.shells.size() == 1) return {};
  const std::string& name = sweep.base.shells[sweep.axes.shells[k].shell_index].name;
  return {name + ".", name + " "};
}

void add_design_wide_columns(const Sweep& sweep, std::vector<Column>& c) {
  const SweepAxes& ax = sweep.axes;
  c.push_back({"min_elevation_deg", "elevation mask", "deg", 1});
  if (ax.nadir_given) c.push_back({"nadir_half_angle_deg", "nadir half-angle", "deg", 2});
  if (ax.drag_area_given) c.push_back({"drag_area_m2", "drag area", "m2", 4});
  if (ax.dry_mass_given) c.push_back({"dry_mass_kg", "dry mass", "kg", 2});
  if (ax.mission_life_given) c.push_back({"mission_life_years", "mission life", "years", 2});
  if (ax.solar_given) c.push_back({"solar_activity", "solar activity", "", 0});
  if (ax.sun_given) c.push_back({"min_sun_elevation_deg", "least Sun elevation", "deg", 2});
}

void add_design_wide_cells(const Sweep& sweep, const Layout& l, std::vector<Cell>& r) {
  const SweepAxes& ax = sweep.axes;
  r.emplace_back(l.min_elevation_deg);
  if (ax.nadir_given) r.push_back(l.nadir_half_angle_deg ? Cell(*l.nadir_half_angle_deg) : Cell());
  if (ax.drag_area_given) r.emplace_back(l.drag_area_m2);
  if (ax.dry_mass_given) r.emplace_back(l.dry_mass_kg);
  if (ax.mission_life_given) r.emplace_back(l.mission_life_years);
  if (ax.solar_given) r.emplace_back(std::string(to_string(l.solar_activity)));
  if (ax.sun_given) r.push_back(l.min_sun_elevation_deg ? Cell(*l.min_sun_elevation_deg) : Cell());
}

}  // namespace

std::vector<Column> layout_columns(const Sweep& sweep) {
  std::vector<Column> c = {{"layout", "layout", "", 0}};
  for (size_t k = 0; k < sweep.axes.shells.size(); ++k) {
    const ShellPrefix p = prefix_of(sweep, k);
    c.push_back({p.key + "satellites", p.heading + "T", "", 0});
    c.push_back({p.key + "planes", p.heading + "P", "", 0});
    c.push_back({p.key + "phasing", p.heading + "F", "", 0});
    if (sweep.axes.shells[k].pattern_given) c.push_back({p.key + "pattern", p.heading + "pattern", "", 0});
    c.push_back({p.key + "altitude_km", p.heading + "altitude", "km", 1});
    c.push_back({p.key + "inclination_deg", p.heading + "inclination", "deg", 3});
    c.push_back({p.key + "sun_synchronous", p.heading + "SSO", "", 0});
    c.push_back({p.key + "ltan", p.heading + "LTAN", "", 0});
  }
  add_design_wide_columns(sweep, c);
  return c;
}

std::vector<Cell> layout_cells(const Sweep& sweep, const Layout& l) {
  std::vector<Cell> r = {static_cast<long>(l.index)};
  for (size_t k = 0; k < l.shells.size(); ++k) {
    const ShellChoice& s = l.shells[k];
    r.emplace_back(static_cast<long>(s.satellites));
    r.emplace_back(static_cast<long>(s.planes));
    r.emplace_back(static_cast<long>(s.phasing));
    if (sweep.axes.shells[k].pattern_given) r.emplace_back(std::string(to_string(s.pattern)));
    r.emplace_back(s.altitude_km);
    r.emplace_back(s.inclination_deg);
    r.push_back(yes_no(s.sun_synchronous));
    r.push_back(s.ltan ? Cell(s.ltan->text) : Cell());
  }
  add_design_wide_cells(sweep, l, r);
  return r;
}

bool row_is_layout(const Sweep& sweep, const Layout& layout, const std::vector<Cell>& cells) {
  const std::vector<Cell> want = layout_cells(sweep, layout);
  return cells.size() >= want.size() && std::equal(want.begin(), want.end(), cells.begin());
}

std::vector<Column> front_layout_columns(const Sweep& sweep) {
  std::vector<Column> c = {{"layout", "layout", "", 0}, {"walker", "T/P/F", "", 0}};
  for (size_t k = 0; k < sweep.axes.shells.size(); ++k) {
    const ShellPrefix p = prefix_of(sweep, k);
    if (sweep.axes.shells[k].pattern_given) c.push_back({p.key + "pattern", p.heading + "pattern", "", 0});
    c.push_back({p.key + "altitude_km", p.heading + "altitude", "km", 1});
    c.push_back({p.key + "inclination_deg", p.heading + "inclination", "deg", 3});
    c.push_back({p.key + "ltan", p.heading + "LTAN", "", 0});
  }
  add_design_wide_columns(sweep, c);
  return c;
}

std::vector<Cell> front_layout_cells(const Sweep& sweep, const Layout& l) {
  std::vector<Cell> r = {static_cast<long>(l.index), walker_label(l)};
  for (size_t k = 0; k < l.shells.size(); ++k) {
    const ShellChoice& s = l.shells[k];
    if (sweep.axes.shells[k].pattern_given) r.emplace_back(std::string(to_string(s.pattern)));
    r.emplace_back(s.altitude_km);
    r.emplace_back(s.inclination_deg);
    r.push_back(s.ltan ? Cell(s.ltan->text) : Cell());
  }
  add_design_wide_cells(sweep, l, r);
  return r;
}

std::vector<Column> sweep_columns(const Sweep& sweep) {
  const std::string k = std::to_string(sweep.requirement.fold);
  // Gaps at fold k are intervals with fewer than k in view; at k = 1 the headings stay the plain ones.
  const std::string gk = sweep.requirement.fold > 1 ? " k<" + k : "";
  std::vector<Column> c = layout_columns(sweep);
  const std::vector<Column> figures = {
      {"design_satellites", "design satellites", "", 0},
      {"design_planes", "design planes", "", 0},
      {"status", "status", "", 0},
      {"percent_covered", "covered k>=" + k, "%", 3},
      {"cap_bound_satellites", "cap bound T k>=" + k, "", 0},
      {"worst_instant_percent", "worst instant k>=" + k, "%", 3},
      {"worst_point_percent", "worst point k>=" + k, "%", 3},
      {"max_gap_s", "max gap" + gk, "s", 1},
      {"mean_gap_s", "mean gap" + gk, "s", 1},
      {"p95_gap_s", "p95 gap" + gk, "s", 1},
      {"mean_response_time_s", "mean response" + gk, "s", 1},
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
  c.insert(c.end(), figures.begin(), figures.end());
  // The age of the data, only when the requirement uses it (so other sweeps keep their columns).
  if (uses_data_age(sweep.requirement)) c.push_back({"p95_data_age_s", "p95 data age", "s", 1});
  return c;
}

std::vector<Cell> layout_row(const Sweep& sweep, const Layout& l, const LayoutMetrics& m) {
  std::vector<Cell> row = layout_cells(sweep, l);
  row.emplace_back(static_cast<long>(m.design_satellites));
  row.emplace_back(static_cast<long>(m.design_planes));
  // ok, cannot-fly (evaluated, but some shell's budget cannot be flown: see note), or error
  row.emplace_back(std::string(!m.evaluated ? "error" : m.cannot_fly.empty() ? "ok" : "cannot-fly"));
  if (m.evaluated) {
    std::string failed;
    for (const auto& f : m.failed) failed += (failed.empty() ? "" : "; ") + f;
    std::string note;
    if (m.lifetime_lower_bound) note = "natural lifetime is a lower bound (outlives the horizon)";
    std::string fly;
    for (const auto& why : m.cannot_fly) fly += (fly.empty() ? "cannot be flown: " : "; ") + why;
    if (!fly.empty()) note += (note.empty() ? "" : "; ") + fly;
    const Cell cap = m.cap_bound_satellites ? Cell(*m.cap_bound_satellites) : Cell();
    for (Cell c : {Cell(m.percent_covered), cap, Cell(m.worst_instant_percent), Cell(m.worst_point_percent), Cell(m.max_gap_s), Cell(m.mean_gap_s),
                   Cell(m.p95_gap_s), Cell(m.mean_response_time_s), Cell(m.mean_in_view), Cell(m.lifetime_days),
                   Cell(m.dv_per_satellite_m_s), Cell(m.fleet_dv_m_s), opt(m.propellant_per_satellite_kg),
                   opt(m.fleet_propellant_kg), yes_no(m.exceeds_tank), yes_no(m.meets),
                   failed.empty() ? Cell() : Cell(failed), note.empty() ? Cell() : Cell(note)})
      row.push_back(c);
    if (uses_data_age(sweep.requirement)) row.emplace_back(m.p95_data_age_s);
  } else {
    for (int i = 0; i < 17; ++i) row.emplace_back();
    row.emplace_back(m.error);
    if (uses_data_age(sweep.requirement)) row.emplace_back();
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
      case CostFigure::planes: v = number_of(cells.at(column_of(sweep, "design_planes"))); break;
      default: v = number_of(cells.at(column_of(sweep, to_string(c)))); break;
    }
    s.costs.push_back(v);
  }
  return s;
}

std::vector<double> cost_values(const Sweep& sweep, const LayoutMetrics& m) {
  std::vector<double> out;
  for (CostFigure c : sweep.costs) {
    switch (c) {
      case CostFigure::satellites: out.push_back(static_cast<double>(m.design_satellites)); break;
      case CostFigure::planes: out.push_back(static_cast<double>(m.design_planes)); break;
      case CostFigure::fleet_dv_m_s: out.push_back(m.fleet_dv_m_s); break;
      case CostFigure::dv_per_satellite_m_s: out.push_back(m.dv_per_satellite_m_s); break;
      case CostFigure::fleet_propellant_kg: out.push_back(m.fleet_propellant_kg.value_or(0.0)); break;
      case CostFigure::propellant_per_satellite_kg: out.push_back(m.propellant_per_satellite_kg.value_or(0.0)); break;
    }
  }
  return out;
}

}  // namespace skein
