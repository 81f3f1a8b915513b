#include "skein/sweep/sweep_outputs.hpp"

#include <algorithm>
#include <cassert>

#include <fmt/format.h>

#include "skein/report/svg_plot.hpp"
#include "skein/sweep/pareto.hpp"
#include "skein/sweep/ranking.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {
namespace {

std::string figure_heading(const Sweep& sweep) {
  const int k = sweep.requirement.fold;
  // Gap figures at fold k > 1 say their fold; at fold 1 the plain heading.
  const std::string gap_fold = k > 1 ? fmt::format(", fold {}", k) : "";
  switch (sweep.requirement.figure) {
    case RequirementFigure::percent_covered: return fmt::format("time covered, fold {} (%)", k);
    case RequirementFigure::worst_instant_percent: return fmt::format("worst-instant grid share covered, fold {} (%)", k);
    case RequirementFigure::worst_point_percent: return fmt::format("time covered at the least-covered point, fold {} (%)", k);
    case RequirementFigure::max_gap_s: return "maximum revisit gap" + gap_fold + " (s)";
    case RequirementFigure::p95_gap_s: return "95th-percentile revisit gap" + gap_fold + " (s)";
    case RequirementFigure::mean_response_time_s: return "mean response time" + gap_fold + " (s)";
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
    case CostFigure::planes: return "orbit planes in the design";
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
    case CostFigure::planes: return {"planes_cost", "planes", "", 0};
  }
  return {};
}

// The Pareto set of the rows at `candidates` on (figure, every cost), all minimised (higher-is-better figures
// negated); returned ranked by ranks_before.
std::vector<size_t> front_of(const Sweep& sweep, const std::vector<RowSummary>& sums, const std::vector<size_t>& candidates) {
  const double sign = higher_is_better(sweep.requirement.figure) ? -1.0 : 1.0;
  std::vector<std::vector<double>> objectives;
  for (size_t i : candidates) {
    std::vector<double> o = {sign * sums[i].figure};
    o.insert(o.end(), sums[i].costs.begin(), sums[i].costs.end());
    objectives.push_back(std::move(o));
  }
  std::vector<size_t> front;
  for (size_t k : pareto_front(objectives)) front.push_back(candidates[k]);
  std::sort(front.begin(), front.end(),
            [&](size_t a, size_t b) { return ranks_before(sums[a], sums[b], sweep.requirement.figure); });
  return front;
}


}  // namespace

Table front_table(const Sweep& sweep, const LayoutSet& set, const std::vector<RowSummary>& sums,
                  const std::vector<size_t>& members, std::string_view name, bool with_meets) {
  Table t;
  std::string costs;
  for (CostFigure c : sweep.costs) costs += (costs.empty() ? "" : ", ") + std::string(to_string(c));
  t.title = fmt::format("Sweep {}: {}, {} against {}, cheapest first", sweep.name, name,
                        to_string(sweep.requirement.figure), costs);
  t.columns = front_layout_columns(sweep);
  t.columns.push_back(
      {std::string(to_string(sweep.requirement.figure)), std::string(to_string(sweep.requirement.figure)), "", 3});
  for (CostFigure c : sweep.costs) t.columns.push_back(cost_column(c));
  if (with_meets) t.columns.push_back({"meets_requirement", "meets requirement", "", 0});
  for (size_t i : members) {
    const Layout& l = set.layouts[sums[i].layout];
    std::vector<Cell> r = front_layout_cells(sweep, l);
    r.emplace_back(sums[i].figure);
    for (size_t k = 0; k < sweep.costs.size(); ++k) {
      if (sweep.costs[k] == CostFigure::satellites || sweep.costs[k] == CostFigure::planes)
        r.emplace_back(static_cast<long>(sums[i].costs[k]));
      else
        r.emplace_back(sums[i].costs[k]);
    }
    if (with_meets) r.emplace_back(std::string(sums[i].meets ? "yes" : "no"));
    t.add_row(std::move(r));
  }
  return t;
}


SweepOutputs assemble_outputs(const Sweep& sweep, const LayoutSet& set, const std::map<size_t, std::string>& rows) {
  assert(rows.size() == set.layouts.size());
  const std::vector<Column> cols = sweep_columns(sweep);
  std::string shell;
  for (const ShellAxes& a : sweep.axes.shells) shell += (shell.empty() ? "" : ", ") + sweep.base.shells[a.shell_index].name;
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
    assert(sums.back().layout == index && index == sums.size() - 1);
    cells.push_back(std::move(*c));
  }

  std::vector<size_t> evaluated, meeting;
  for (size_t i = 0; i < sums.size(); ++i) {
    if (!sums[i].evaluated) {
      ++out.summary.errors;
      continue;
    }
    evaluated.push_back(i);
    if (sums[i].meets) meeting.push_back(i);
  }
  out.summary.evaluated = evaluated.size();
  out.summary.meeting = meeting.size();
  const std::vector<size_t> best = front_of(sweep, sums, meeting);
  const std::vector<size_t> trade = front_of(sweep, sums, evaluated);
  out.summary.best_front = best.size();
  out.summary.trade_front = trade.size();
  if (const auto c = cheapest_meeting(sums, sweep.requirement.figure)) {
    out.summary.cheapest_meeting = sums[*c];
    // The lexicographic minimum is not dominated by any passing layout, so it heads the best front.
    assert(!best.empty() && best.front() == *c);
  }
  std::vector<bool> on_best(sums.size(), false), on_trade(sums.size(), false);
  for (size_t i : best) on_best[i] = true;
  for (size_t i : trade) on_trade[i] = true;

  out.results.title = fmt::format("Sweep {}: layouts of shell{} {}", sweep.name, sweep.axes.shells.size() > 1 ? "s" : "", shell);
  out.results.columns = cols;
  out.results.columns.push_back({"best_front", "best front", "", 0});
  out.results.columns.push_back({"trade_front", "trade front", "", 0});
  for (size_t i = 0; i < cells.size(); ++i) {
    std::vector<Cell> r = cells[i];
    if (sums[i].evaluated) {
      r.emplace_back(std::string(on_best[i] ? "yes" : "no"));
      r.emplace_back(std::string(on_trade[i] ? "yes" : "no"));
    } else {
      r.emplace_back();
      r.emplace_back();
    }
    out.results.add_row(std::move(r));
  }

  out.best_front = front_table(sweep, set, sums, best, best_front_name, false);
  out.trade_front = front_table(sweep, set, sums, trade, trade_front_name, true);
  out.results_csv = render_csv(out.results);
  for (const auto& j : rows_to_json(out.results)) out.results_jsonl += j.dump() + "\n";
  out.best_front_csv = render_csv(out.best_front);
  out.trade_front_csv = render_csv(out.trade_front);

  // Scatter: every evaluated layout, marked by the requirement, then the trade front and the best front on top
  // (each its own colour in the legend).
  Series fails{"fails requirement", {}, {}, SeriesStyle::points};
  Series meets{"meets requirement", {}, {}, SeriesStyle::points};
  // Short legend words: the legend column is about 118 px wide at 12 px (svg_plot.cpp margins); the title and
  // the README give the full names.
  // The fronts are drawn as lines through their members (ordered by x, then y), over the points of every
  // layout, so that each set stands out from the cloud and from the other.
  Series trade_s{"trade front", {}, {}, SeriesStyle::line};
  Series best_s{"best front", {}, {}, SeriesStyle::line};
  auto add = [&](Series& s, size_t i) {
    s.x.push_back(sums[i].costs[0]);
    s.y.push_back(sums[i].figure);
  };
  auto by_xy = [&](std::vector<size_t> v) {
    std::sort(v.begin(), v.end(), [&](size_t a, size_t b) {
      if (sums[a].costs[0] != sums[b].costs[0]) return sums[a].costs[0] < sums[b].costs[0];
      if (sums[a].figure != sums[b].figure) return sums[a].figure < sums[b].figure;
      return a < b;
    });
    return v;
  };
  for (size_t i : evaluated) add(sums[i].meets ? meets : fails, i);
  for (size_t i : by_xy(trade)) add(trade_s, i);
  for (size_t i : by_xy(best)) add(best_s, i);
  std::vector<Series> series;
  for (Series* s : {&fails, &meets, &trade_s, &best_s})
    if (!s->x.empty()) series.push_back(std::move(*s));
  PlotAxes axes;
  axes.title = fmt::format("{}: best front (passing) and trade front (all)", sweep.name);
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
  out.fronts_svg = series.empty() ? std::string() : line_plot_svg(axes, series);
  return out;
}

}  // namespace skein
