#include "skein/report/report_plots.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <limits>

#include <fmt/format.h>

#include "skein/design/constellation.hpp"
#include "skein/orbit/ground_track.hpp"
#include "skein/report/svg_plot.hpp"

namespace skein {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

std::vector<MapCell> cells_of(const CoverageResult& r, double (*value)(const PointCoverage&)) {
  std::vector<MapCell> cells;
  for (const auto& p : r.points)
    if (p.point.cell)
      cells.push_back({p.point.cell->lon_min_deg, p.point.cell->lon_max_deg, p.point.cell->lat_min_deg,
                       p.point.cell->lat_max_deg, value(p)});
  return cells;
}

PlotAxes map_axes(const std::string& title, const std::vector<MapCell>& cells) {
  PlotAxes a{title, "longitude (deg)", "latitude (deg)", -180.0, 180.0, -90.0, 90.0};
  if (!cells.empty()) {
    double lo = 90, hi = -90;
    for (const auto& c : cells) { lo = std::min(lo, c.lat_min_deg); hi = std::max(hi, c.lat_max_deg); }
    a.y_min = lo;
    a.y_max = hi;
  }
  return a;
}

}  // namespace

std::string coverage_map_svg(const CoverageResult& r) {
  const auto cells = cells_of(r, [](const PointCoverage& p) { return p.percent_by_fold.empty() ? 0.0 : p.percent_by_fold[0]; });
  return map_svg(map_axes("Time covered by at least one satellite", cells), cells, {0.0, 100.0, "time covered (%)"});
}

std::string max_gap_map_svg(const CoverageResult& r) {
  const auto cells = cells_of(r, [](const PointCoverage& p) { return p.max_gap_s / 60.0; });
  double hi = 0;
  for (const auto& c : cells) hi = std::max(hi, c.value);
  return map_svg(map_axes("Longest revisit gap", cells), cells, {0.0, hi > 0 ? hi : 1.0, "longest gap (min)"});
}

std::string coverage_by_latitude_svg(const CoverageResult& r) {
  std::vector<Series> series;
  for (int k = 0; k < r.max_fold; ++k) {
    Series s{fmt::format("at least {} in view", k + 1), {}, {}, SeriesStyle::line};
    for (const auto& b : r.bands) {
      s.x.push_back(0.5 * (b.lat_min_deg + b.lat_max_deg));
      s.y.push_back(b.metrics.percent_by_fold[static_cast<size_t>(k)]);
    }
    series.push_back(std::move(s));
  }
  return line_plot_svg({"Coverage against latitude", "latitude (deg)", "time covered (%)", -90.0, 90.0, 0.0, 100.0}, series);
}

std::string in_view_histogram_svg(const CoverageResult& r) {
  std::vector<BarGroup> groups;
  for (size_t n = 0; n < r.in_view_fraction.size(); ++n)
    groups.push_back({n + 1 == r.in_view_fraction.size() && n > 0 ? fmt::format("{}+", n) : std::to_string(n),
                      {100.0 * r.in_view_fraction[n]}});
  return bar_chart_svg({"Satellites in view", "satellites in view above the mask", "share of time and area (%)"},
                       {"share"}, groups);
}

std::string gap_cdf_svg(const CoverageResult& r) {
  Series s{"all points, area-weighted", {}, {}, SeriesStyle::line};
  for (size_t q = 0; q < r.gap_quantiles_s.size(); ++q) {
    s.x.push_back(r.gap_quantiles_s[q] / 60.0);
    s.y.push_back(100.0 * static_cast<double>(q) / static_cast<double>(r.gap_quantiles_s.size() - 1));
  }
  PlotAxes a{"Cumulative distribution of revisit gaps", "gap duration (min)", "gaps no longer than (%)"};
  a.y_min = 0.0;
  a.y_max = 100.0;
  a.x_min = 0.0;
  return line_plot_svg(a, {s});
}

std::string dv_budget_svg(const BudgetResult& b) {
  std::vector<std::string> labels;
  if (!b.shells.empty())
    for (const auto& l : b.shells.front().dv_lines) labels.push_back(l.name);
  std::vector<BarGroup> groups;
  for (const auto& s : b.shells) {
    BarGroup g{s.name, {}};
    for (const auto& l : s.dv_lines) g.values.push_back(l.dv_m_s);
    groups.push_back(std::move(g));
  }
  return bar_chart_svg({"Delta-v budget per satellite over the mission life", "shell", "delta-v (m/s)"}, labels, groups);
}

std::string decay_curves_svg(const ShellBudget& s, double earth_radius_km) {
  std::vector<Series> series;
  for (const auto& d : s.decay) {
    Series se{fmt::format("{} solar activity{}", to_string(d.level), d.lower_bound ? " (still in orbit)" : ""), {}, {},
              SeriesStyle::line};
    for (const auto& p : d.curve) {
      se.x.push_back(p.t_days / days_per_julian_year);
      se.y.push_back(p.a_km - earth_radius_km);
    }
    series.push_back(std::move(se));
  }
  PlotAxes a{fmt::format("Natural decay of shell {}", s.name), "time after epoch (years)", "mean altitude (km)"};
  a.x_min = 0.0;
  return line_plot_svg(a, series);
}

std::string ground_track_svg(const Design& d) {
  std::vector<Series> series;
  const auto sats = expand_constellation(d);
  const JulianDate jd = julian_date(d.epoch);
  for (const auto& sat : sats) {
    if (sat.shell != 0 || sat.plane != 0) continue;
    const auto track = ground_track(d.earth, make_secular_orbit(d.earth, sat.elements), jd, seconds_per_day, 30.0);
    Series s{sat.id, {}, {}, SeriesStyle::line};
    for (size_t k = 0; k < track.size(); ++k) {
      // Break the line where it wraps across the antimeridian.
      if (k > 0 && std::abs(track[k].lon_deg - track[k - 1].lon_deg) > 180.0) {
        s.x.push_back(nan);
        s.y.push_back(nan);
      }
      s.x.push_back(track[k].lon_deg);
      s.y.push_back(track[k].lat_deg);
    }
    series.push_back(std::move(s));
    if (series.size() == 8) break;  // legend room; a plane of more satellites repeats the same track shifted
  }
  return line_plot_svg({fmt::format("Ground tracks of plane 1 of shell {} over one day", d.shells.front().name),
                        "longitude (deg)", "geodetic latitude (deg)", -180.0, 180.0, -90.0, 90.0},
                       series);
}

namespace {

// The planes drawn in the beta and eclipse figures: all when they fit the legend, else evenly spaced ones
// (the first and last included).
std::vector<std::pair<const ShellBetaEclipse*, const PlaneBetaEclipse*>> drawn_planes(const BetaEclipseResult& r) {
  std::vector<std::pair<const ShellBetaEclipse*, const PlaneBetaEclipse*>> all, out;
  for (const auto& sh : r.shells)
    for (const auto& p : sh.planes) all.push_back({&sh, &p});
  if (all.size() <= max_beta_eclipse_series) return all;
  for (size_t k = 0; k < max_beta_eclipse_series; ++k)
    out.push_back(all[k * (all.size() - 1) / (max_beta_eclipse_series - 1)]);
  return out;
}

std::string beta_eclipse_svg(const BetaEclipseResult& r, const std::string& title, const std::string& y_label,
                             double (*value)(const BetaEclipseSample&), std::optional<double> y_min,
                             std::optional<double> y_max) {
  std::vector<Series> series;
  size_t planes = 0;
  for (const auto& sh : r.shells) planes += sh.planes.size();
  const auto drawn = drawn_planes(r);
  for (const auto& [sh, p] : drawn) {
    Series s{fmt::format("{} plane {}", sh->name, p->plane + 1), {}, {}, SeriesStyle::line};
    for (const auto& x : p->samples) {
      s.x.push_back(x.day);
      s.y.push_back(value(x));
    }
    series.push_back(std::move(s));
  }
  PlotAxes a{drawn.size() < planes ? fmt::format("{} ({} of {} planes)", title, drawn.size(), planes) : title,
             "days from the epoch", y_label};
  a.x_min = 0.0;
  a.x_max = r.span_days;
  a.y_min = y_min;
  a.y_max = y_max;
  return line_plot_svg(a, series);
}

}  // namespace

std::string beta_angle_svg(const BetaEclipseResult& r) {
  return beta_eclipse_svg(r, "Beta angle per plane", "beta angle (deg)",
                          [](const BetaEclipseSample& x) { return x.beta_deg; }, -90.0, 90.0);
}

std::string eclipse_minutes_svg(const BetaEclipseResult& r) {
  double most = 0.0;
  for (const auto& sh : r.shells)
    for (const auto& p : sh.planes) most = std::max(most, p.longest_eclipse_min);
  return beta_eclipse_svg(r, "Eclipse per orbit (cylindrical shadow)", "eclipse per orbit (min)",
                          [](const BetaEclipseSample& x) { return x.eclipse_min_per_orbit; }, 0.0,
                          most > 0.0 ? std::nullopt : std::optional<double>(1.0));
}

}  // namespace skein
