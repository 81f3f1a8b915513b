#include "skein/sweep/sweep_outputs.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

#include "skein/report/colour_ramp.hpp"
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
    case RequirementFigure::p95_data_age_s: return "95th-percentile age of the data at downlink (s)";
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

namespace {

// A front member's label: T/P/F and altitude of each varied shell ("24/4/1 550 km", shells joined by " + ").
std::string layout_label(const Layout& l) {
  std::string out;
  for (const ShellChoice& c : l.shells)
    out += fmt::format("{}{}/{}/{} {:g} km", out.empty() ? "" : " + ", c.satellites, c.planes, c.phasing, c.altitude_km);
  return out;
}

bool is_count(CostFigure c) { return c == CostFigure::satellites || c == CostFigure::planes; }

// The front figure: every evaluated layout against the first cost (x) and the requirement figure (y); meeting
// layouts as circles, failing ones as crosses in orange-brown (shape and colour both differ); with a second
// cost, the circles coloured by it on the sequential ramp (cheaper darker); the requirement's threshold as a
// dashed line; both fronts drawn through their members, the members labelled (at most max_front_labels, by
// rank: the best front first).
constexpr size_t max_front_labels = 14;
std::string fronts_figure(const Sweep& sweep, const LayoutSet& set, const std::vector<RowSummary>& sums,
                          const std::vector<size_t>& evaluated, const std::vector<size_t>& best,
                          const std::vector<size_t>& trade) {
  ScatterPlot p;
  p.axes.title = fmt::format("{}: best front (passing) and trade front (all)", sweep.name);
  p.axes.x_label = cost_heading(sweep.costs.front());
  p.axes.y_label = figure_heading(sweep);
  p.axes.x_integer = is_count(sweep.costs.front());
  const std::string fail_colour = to_hex(diverging_colour(-0.8)), meet_colour = to_hex(diverging_colour(0.8));
  const bool second = sweep.costs.size() > 1;
  double c2lo = 0, c2hi = 0;
  if (second) {
    c2lo = c2hi = sums[evaluated.front()].costs[1];
    for (size_t i : evaluated) {
      c2lo = std::min(c2lo, sums[i].costs[1]);
      c2hi = std::max(c2hi, sums[i].costs[1]);
    }
  }
  auto cost2_colour = [&](double c) { return to_hex(sequential_colour(c2hi > c2lo ? 1.0 - (c - c2lo) / (c2hi - c2lo) : 1.0)); };
  std::vector<std::string> label(sums.size());
  std::vector<size_t> rank(sums.size(), 0);
  size_t labelled = 0;
  for (const auto* members : {&best, &trade})
    for (size_t i : *members)
      if (label[i].empty() && labelled < max_front_labels) {
        label[i] = layout_label(set.layouts[sums[i].layout]);
        rank[i] = labelled++;
      }
  // Failing layouts first, so that meeting ones are drawn on top.
  for (bool meets : {false, true})
    for (size_t i : evaluated) {
      if (sums[i].meets != meets) continue;
      p.points.push_back({sums[i].costs[0], sums[i].figure, meets ? MarkerShape::circle : MarkerShape::cross,
                          meets ? (second ? cost2_colour(sums[i].costs[1]) : meet_colour) : fail_colour, label[i], rank[i]});
    }
  p.legend.push_back({"meets requirement", MarkerShape::circle, second ? cost2_colour(c2lo) : meet_colour});
  p.legend.push_back({"fails requirement", MarkerShape::cross, fail_colour});
  auto line_through = [&](const std::vector<size_t>& members, const std::string& name, const std::string& colour, bool dashed) {
    std::vector<size_t> v = members;
    std::sort(v.begin(), v.end(), [&](size_t a, size_t b) {
      if (sums[a].costs[0] != sums[b].costs[0]) return sums[a].costs[0] < sums[b].costs[0];
      if (sums[a].figure != sums[b].figure) return sums[a].figure < sums[b].figure;
      return a < b;
    });
    ScatterPolyline l{name, {}, {}, colour, dashed};
    for (size_t i : v) {
      l.x.push_back(sums[i].costs[0]);
      l.y.push_back(sums[i].figure);
    }
    if (!l.x.empty()) p.lines.push_back(std::move(l));
  };
  // Short legend words; the title and the README give the full names.
  line_through(trade, "trade front", "#777777", true);
  line_through(best, "best front", "#000000", false);
  for (const Threshold& t : sweep.requirement.thresholds)
    if (t.figure == sweep.requirement.figure)
      p.references.push_back({t.value, fmt::format("required: {} {:g}", higher_is_better(t.figure) ? "at least" : "at most", t.value)});
  if (second) {
    ScatterColourKey k{cost_heading(sweep.costs[1]), c2lo, c2hi, {}};
    for (int j = 0; j < 24; ++j) k.colours.push_back(cost2_colour(c2lo + (c2hi - c2lo) * (j + 0.5) / 24.0));
    p.colour_key = std::move(k);
  }
  // Ranges padded by 5 % (at least 0.5) so that no point sits on the frame.
  double x0 = INFINITY, x1 = -INFINITY, y0 = INFINITY, y1 = -INFINITY;
  for (const auto& q : p.points) {
    x0 = std::min(x0, q.x); x1 = std::max(x1, q.x);
    y0 = std::min(y0, q.y); y1 = std::max(y1, q.y);
  }
  for (const auto& r : p.references) {
    y0 = std::min(y0, r.y);
    y1 = std::max(y1, r.y);
  }
  const double px = std::max(0.05 * (x1 - x0), 0.5), py = std::max(0.05 * (y1 - y0), 0.5);
  p.axes.x_min = x0 - px;
  p.axes.x_max = x1 + px;
  p.axes.y_min = y0 - py;
  p.axes.y_max = y1 + py;
  return scatter_svg(p);
}

}  // namespace

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

  out.fronts_svg = evaluated.empty() ? std::string() : fronts_figure(sweep, set, sums, evaluated, best, trade);
  return out;
}

}  // namespace skein
