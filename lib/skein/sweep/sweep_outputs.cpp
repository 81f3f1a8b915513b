#include "skein/sweep/sweep_outputs.hpp"

#include <algorithm>
#include <cassert>

#include <fmt/format.h>

#include "skein/report/svg_plot.hpp"
#include "skein/sweep/pareto.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {
namespace {

std::string figure_heading(const Sweep& sweep) {
  switch (sweep.requirement.figure) {
    case RequirementFigure::percent_covered: return fmt::format("time covered, fold {} (%)", sweep.requirement.fold);
    case RequirementFigure::worst_instant_percent:
      return fmt::format("worst-instant grid share covered, fold {} (%)", sweep.requirement.fold);
    case RequirementFigure::max_gap_s: return "maximum revisit gap (s)";
    case RequirementFigure::p95_gap_s: return "95th-percentile revisit gap (s)";
    case RequirementFigure::mean_response_time_s: return "mean response time (s)";
  }
  return "";
}

std::string cost_heading(CostFigure c) {
  switch (c) {
    case CostFigure::satellites: return "satellites in the design";
    case CostFigure::fleet_dv_m_s: return "fleet delta-v (m/s)";
    case CostFigure::fleet_propellant_kg: return "fleet propellant (kg)";
    case CostFigure::dv_per_satellite_m_s: return "delta-v per satellite (m/s)";
    case CostFigure::propellant_per_satellite_kg: return "propellant per satellite (kg)";
  }
  return "";
}

Column cost_column(CostFigure c) {
  switch (c) {
    case CostFigure::satellites: return {"satellites_cost", "satellites", "", 0};
    case CostFigure::fleet_dv_m_s: return {"fleet_dv_m_s", "fleet delta-v", "m/s", 2};
    case CostFigure::fleet_propellant_kg: return {"fleet_propellant_kg", "fleet propellant", "kg", 2};
    case CostFigure::dv_per_satellite_m_s: return {"dv_per_satellite_m_s", "delta-v per satellite", "m/s", 3};
    case CostFigure::propellant_per_satellite_kg:
      return {"propellant_per_satellite_kg", "propellant per satellite", "kg", 3};
  }
  return {};
}

}  // namespace

SweepOutputs assemble_outputs(const Sweep& sweep, const LayoutSet& set, const std::map<size_t, std::string>& rows) {
  assert(rows.size() == set.layouts.size());
  const std::vector<Column> cols = sweep_columns(sweep);
  const std::string shell = sweep.base.shells[sweep.shell_index].name;
  SweepOutputs out;
  out.summary.layouts = set.layouts.size();
  out.summary.skipped = set.skipped;

  std::vector<std::vector<Cell>> cells;
  std::vector<RowSummary> sums;
  cells.reserve(rows.size());
  for (const auto& [index, text] : rows) {
    auto c = decode_row(text, cols.size());
    assert(c && "rows are checked when read");
    sums.push_back(summarize_row(sweep, *c));
    cells.push_back(std::move(*c));
  }

  // The front over the evaluated rows: every objective minimised (higher-is-better figures negated).
  std::vector<size_t> evaluated;
  std::vector<std::vector<double>> objectives;
  const double sign = higher_is_better(sweep.requirement.figure) ? -1.0 : 1.0;
  for (size_t i = 0; i < sums.size(); ++i) {
    if (!sums[i].evaluated) {
      ++out.summary.errors;
      continue;
    }
    ++out.summary.evaluated;
    if (sums[i].meets) ++out.summary.meeting;
    evaluated.push_back(i);
    std::vector<double> o = {sign * sums[i].figure};
    o.insert(o.end(), sums[i].costs.begin(), sums[i].costs.end());
    objectives.push_back(std::move(o));
  }
  std::vector<bool> on_front(sums.size(), false);
  for (size_t k : pareto_front(objectives)) on_front[evaluated[k]] = true;

  out.results.title = fmt::format("Sweep {}: layouts of shell {}", sweep.name, shell);
  out.results.columns = cols;
  out.results.columns.push_back({"front", "on front", "", 0});
  for (size_t i = 0; i < cells.size(); ++i) {
    std::vector<Cell> r = cells[i];
    if (sums[i].evaluated)
      r.emplace_back(std::string(on_front[i] ? "yes" : "no"));
    else
      r.emplace_back();
    out.results.add_row(std::move(r));
  }

  // The front table, cheapest first (first cost, then the figure best first, then layout).
  std::vector<size_t> front;
  for (size_t i = 0; i < sums.size(); ++i)
    if (on_front[i]) front.push_back(i);
  std::sort(front.begin(), front.end(), [&](size_t a, size_t b) {
    if (sums[a].costs[0] != sums[b].costs[0]) return sums[a].costs[0] < sums[b].costs[0];
    if (sums[a].figure != sums[b].figure) return sign * sums[a].figure < sign * sums[b].figure;
    return a < b;
  });
  out.summary.front = front.size();
  out.front.title = fmt::format("Sweep {}: best front, {} against {}", sweep.name, to_string(sweep.requirement.figure),
                                to_string(sweep.costs.front()));
  out.front.columns = {{"layout", "layout", "", 0},          {"walker", "T/P/F", "", 0},
                       {"altitude_km", "altitude", "km", 1},  {"inclination_deg", "inclination", "deg", 3},
                       {"ltan", "LTAN", "", 0},               {"min_elevation_deg", "elevation mask", "deg", 1},
                       {std::string(to_string(sweep.requirement.figure)), "figure", "", 3}};
  out.front.columns.back().heading = to_string(sweep.requirement.figure);
  for (CostFigure c : sweep.costs) out.front.columns.push_back(cost_column(c));
  out.front.columns.push_back({"meets_requirement", "meets requirement", "", 0});
  for (size_t i : front) {
    const Layout& l = set.layouts[sums[i].layout];
    std::vector<Cell> r = {static_cast<long>(l.index), walker_label(l), l.altitude_km, l.inclination_deg,
                           l.ltan ? Cell(l.ltan->text) : Cell(), l.min_elevation_deg, sums[i].figure};
    for (size_t k = 0; k < sweep.costs.size(); ++k)
      r.push_back(sweep.costs[k] == CostFigure::satellites ? Cell(static_cast<long>(sums[i].costs[k])) : Cell(sums[i].costs[k]));
    r.emplace_back(std::string(sums[i].meets ? "yes" : "no"));
    out.front.add_row(std::move(r));
    if (sums[i].meets && !out.summary.cheapest_meeting) out.summary.cheapest_meeting = l.index;
  }

  out.results_csv = render_csv(out.results);
  for (const auto& j : rows_to_json(out.results)) out.results_jsonl += j.dump() + "\n";
  out.front_csv = render_csv(out.front);

  // Scatter: every evaluated layout, marked by the requirement, and the front on top.
  Series fails{"fails requirement", {}, {}, SeriesStyle::points};
  Series meets{"meets requirement", {}, {}, SeriesStyle::points};
  Series best{"best front", {}, {}, SeriesStyle::points};
  for (size_t i : evaluated) {
    Series& s = sums[i].meets ? meets : fails;
    s.x.push_back(sums[i].costs[0]);
    s.y.push_back(sums[i].figure);
  }
  for (size_t i : front) {
    best.x.push_back(sums[i].costs[0]);
    best.y.push_back(sums[i].figure);
  }
  std::vector<Series> series;
  for (Series* s : {&fails, &meets, &best})
    if (!s->x.empty()) series.push_back(std::move(*s));
  PlotAxes axes;
  axes.title = fmt::format("{}: best front", sweep.name);
  axes.x_label = cost_heading(sweep.costs.front());
  axes.y_label = figure_heading(sweep);
  // Ranges padded by 5 % so that no point sits on the frame.
  double x0 = 0.0, x1 = 0.0, y0 = 0.0, y1 = 0.0;
  bool first = true;
  for (const Series& s : series)
    for (size_t k = 0; k < s.x.size(); ++k) {
      x0 = first ? s.x[k] : std::min(x0, s.x[k]);
      x1 = first ? s.x[k] : std::max(x1, s.x[k]);
      y0 = first ? s.y[k] : std::min(y0, s.y[k]);
      y1 = first ? s.y[k] : std::max(y1, s.y[k]);
      first = false;
    }
  const double px = std::max(0.05 * (x1 - x0), 0.5), py = std::max(0.05 * (y1 - y0), 0.5);
  axes.x_min = x0 - px;
  axes.x_max = x1 + px;
  axes.y_min = y0 - py;
  axes.y_max = y1 + py;
  out.front_svg = series.empty() ? std::string() : line_plot_svg(axes, series);
  return out;
}

}  // namespace skein
