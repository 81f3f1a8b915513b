#include "skein/report/report_plots.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <optional>
#include <limits>

#include <fmt/format.h>

#include <functional>

#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/ground_track.hpp"
#include "skein/report/coverage_tables.hpp"
#include "skein/report/map_plot.hpp"
#include "skein/report/svg_plot.hpp"

namespace skein {
namespace {

// With the daylight mask every coverage figure counts lit coverage (coverage_tables.cpp, lit): a plot's title
// then starts with "Lit" as the tables' titles do, and a key or axis label of a coverage figure reads "lit".
std::string lit_title(const CoverageResult& r, const std::string& title) {
  return r.min_sun_elevation_deg && !title.empty() ? lit_title_text(title) : title;
}
std::string lit_label(const CoverageResult& r, const std::string& label) {
  return r.min_sun_elevation_deg ? "lit " + label : label;
}

std::vector<MapCell> cells_of(const CoverageResult& r, const std::function<double(const PointCoverage&)>& value) {
  std::vector<MapCell> cells;
  for (const auto& p : r.points)
    if (p.point.cell)
      cells.push_back({p.point.cell->lon_min_deg, p.point.cell->lon_max_deg, p.point.cell->lat_min_deg,
                       p.point.cell->lat_max_deg, value(p)});
  return cells;
}

// The view of a cell map: the region's polygon with a margin for region grids, the world otherwise.
MapView cell_view(const Design& d, const CoverageResult& r) {
  if (r.grid == GridKind::region && !d.coverage.region.empty()) {
    std::vector<LonLat> pts;
    for (const GeoVertex& v : d.coverage.region) pts.push_back({v.lon_deg, v.lat_deg});
    for (const auto& p : r.points)
      if (p.point.cell) {
        pts.push_back({p.point.cell->lon_min_deg, p.point.cell->lat_min_deg});
        pts.push_back({p.point.cell->lon_max_deg, p.point.cell->lat_max_deg});
      }
    return zoomed_view(pts);
  }
  return world_view();
}

std::vector<Ring> region_outline(const Design& d, const CoverageResult& r) {
  if (r.grid != GridKind::region || d.coverage.region.empty()) return {};
  Ring ring;
  for (const GeoVertex& v : d.coverage.region) ring.push_back({v.lon_deg, v.lat_deg});
  ring.push_back(ring.front());
  return {ring};
}

// The requirement's threshold on a figure, when the design's requirement holds one.
std::optional<Threshold> threshold_on(const CoverageResult& r, std::initializer_list<RequirementFigure> figures) {
  if (!r.requirement) return std::nullopt;
  for (RequirementFigure f : figures)
    for (const ThresholdVerdict& c : r.requirement->checks)
      if (c.threshold.figure == f) return c.threshold;
  return std::nullopt;
}

// The key of a map of durations (s) where shorter is better: 0 to the longest shown, or, with an upper-limit
// threshold, the shortest and longest of the values and the threshold with a margin (5 % of the range, at
// least 1 s), so the threshold sits inside the ramp and cells on both sides of it read apart.
ColourKey seconds_key(std::string label, double lo, double hi, const std::optional<Threshold>& t,
                      std::string threshold_label) {
  ColourKey key;
  key.label = std::move(label);
  key.min = 0.0;
  key.max = hi > 0 ? hi : 1.0;
  key.higher_is_better = false;
  if (t) {
    const double top = std::max(hi, t->value), bottom = std::min(lo, t->value);
    const double margin = std::max(1.0, 0.05 * (top - bottom));
    key.threshold = t->value;
    key.threshold_label = std::move(threshold_label);
    key.min = std::max(0.0, bottom - margin);
    key.max = top + margin;
  }
  return key;
}

// The fold a map shows: the requirement's when it judges the mapped figure, else 1; held to the folds evaluated.
int shown_fold(const CoverageResult& r, bool judged) {
  const int k = judged && r.requirement ? r.requirement->fold : 1;
  if (r.points.empty()) return 1;
  return std::clamp(k, 1, static_cast<int>(r.points.front().percent_by_fold.size()));
}

double percent_at(const PointCoverage& p, int k) {
  return p.percent_by_fold.size() >= static_cast<size_t>(k) ? p.percent_by_fold[static_cast<size_t>(k - 1)] : 0.0;
}
double max_gap_at(const PointCoverage& p, int k) {
  return p.gaps_by_fold.size() >= static_cast<size_t>(k) ? p.gaps_by_fold[static_cast<size_t>(k - 1)].max_gap_s : p.max_gap_s;
}

// The key of a percent-covered map or site marker set at fold k.
ColourKey percent_key(const CoverageResult& r, int k, const std::optional<Threshold>& t) {
  ColourKey key;
  key.label = lit_label(r, fmt::format("time covered by at least {} satellite{} (%)", k, k > 1 ? "s" : ""));
  key.min = 0.0;
  key.max = 100.0;
  key.higher_is_better = true;
  if (t) {
    key.threshold = t->value;
    key.threshold_label = fmt::format("required: at least {:g} % ({})", t->value, to_string(t->figure));
    // Around a threshold the key spans the values shown and the threshold, a little wider (a margin of 5 % of
    // the span, at least 1 percentage point), so that neither arm of the ramp is spent on empty range.
    double lo = t->value, hi = t->value;
    for (const auto& p : r.points) {
      lo = std::min(lo, percent_at(p, k));
      hi = std::max(hi, percent_at(p, k));
    }
    const double m = std::max(1.0, 0.05 * (hi - lo));
    key.min = std::max(0.0, lo - m);
    key.max = std::min(100.0, hi + m);
  }
  return key;
}

MapFigure base_map(const std::string& id, const std::string& title, const MapContext& m) {
  MapFigure f;
  f.id = id;
  f.title = title;
  f.land = m.land;
  f.land_note = m.land_note;
  return f;
}

}  // namespace

std::string coverage_map_svg(const Design& d, const CoverageResult& r, const MapContext& m) {
  const auto t = threshold_on(r, {RequirementFigure::worst_point_percent, RequirementFigure::percent_covered});
  const int k = shown_fold(r, t.has_value());
  MapFigure f = base_map("coverage_map", lit_title(r, k > 1 ? fmt::format("Time covered by at least {} satellites", k)
                                                            : std::string("Time covered by at least one satellite")), m);
  f.view = cell_view(d, r);
  f.cells = cells_of(r, [k](const PointCoverage& p) { return percent_at(p, k); });
  f.key = percent_key(r, k, t);
  f.outlines = region_outline(d, r);
  return map_figure_svg(f);
}

std::string max_gap_map_svg(const Design& d, const CoverageResult& r, const MapContext& m) {
  const auto t = threshold_on(r, {RequirementFigure::max_gap_s});
  const int k = shown_fold(r, t.has_value());
  MapFigure f = base_map(
      "max_gap_map",
      lit_title(r, k > 1 ? fmt::format("Longest revisit gap at fold {}", k) : std::string("Longest revisit gap")), m);
  f.view = cell_view(d, r);
  f.cells = cells_of(r, [k](const PointCoverage& p) { return max_gap_at(p, k); });
  double lo = 0.0, hi = 0.0;
  for (size_t i = 0; i < f.cells.size(); ++i) {
    lo = i == 0 ? f.cells[i].value : std::min(lo, f.cells[i].value);
    hi = std::max(hi, f.cells[i].value);
  }
  f.key = seconds_key(lit_label(r, k > 1 ? fmt::format("longest gap with fewer than {} in view (s)", k) : std::string("longest gap (s)")),
                      lo, hi, t, t ? fmt::format("required: at most {:g} s", t->value) : std::string());
  f.outlines = region_outline(d, r);
  return map_figure_svg(f);
}

std::string data_age_map_svg(const Design& d, const CoverageResult& r, const MapContext& m) {
  assert(r.data_age.has_value());
  const auto t = threshold_on(r, {RequirementFigure::p95_data_age_s});
  MapFigure f = base_map("data_age_map", lit_title(r, "95th-percentile age of the data at downlink"), m);
  f.view = cell_view(d, r);
  // Cells with no observation that reached the ground have no age: left blank, not drawn as the best colour.
  double lo = 0.0, hi = 0.0;
  for (size_t p = 0; p < r.points.size(); ++p) {
    const DataAgeFigures& a = r.data_age->per_point[p];
    const auto& c = r.points[p].point.cell;
    if (!c || a.observations == a.censored) continue;
    f.cells.push_back({c->lon_min_deg, c->lon_max_deg, c->lat_min_deg, c->lat_max_deg, a.p95_s});
    lo = f.cells.size() == 1 ? a.p95_s : std::min(lo, a.p95_s);
    hi = std::max(hi, a.p95_s);
  }
  // The threshold judges the grid's area-weighted p95; the map shows which cells lie on which side of it.
  f.key = seconds_key(lit_label(r, "p95 age of the data (s)"), lo, hi, t,
                      t ? fmt::format("grid required: at most {:g} s", t->value) : std::string());
  f.outlines = region_outline(d, r);
  return map_figure_svg(f);
}

std::string sites_map_svg(const Design& d, const CoverageResult& r, const MapContext& m) {
  const auto t = threshold_on(r, {RequirementFigure::worst_point_percent, RequirementFigure::percent_covered});
  const int k = shown_fold(r, t.has_value());
  MapFigure f = base_map("sites_map", r.min_sun_elevation_deg ? "Sites and their lit time covered" : "Sites and their time covered", m);
  std::vector<LonLat> pts;
  for (const auto& p : r.points) {
    f.sites.push_back({{p.point.lon_deg, p.point.lat_deg}, p.point.name, percent_at(p, k)});
    pts.push_back({p.point.lon_deg, p.point.lat_deg});
  }
  // Sites close together get a zoomed view (margin 25 %, at least 5 deg); spread ones the world.
  f.view = zoomed_view(pts, 0.25, 5.0);
  if (f.view.lon_max_deg - f.view.lon_min_deg > 180.0 || f.view.lat_max_deg - f.view.lat_min_deg > 90.0) f.view = world_view();
  f.key = percent_key(r, k, t);
  (void)d;
  return map_figure_svg(f);
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
  return line_plot_svg({lit_title(r, "Coverage against latitude"), "latitude (deg)", lit_label(r, "time covered (%)"),
                        -90.0, 90.0, 0.0, 100.0},
                       series);
}

std::string in_view_histogram_svg(const CoverageResult& r) {
  std::vector<BarGroup> groups;
  for (size_t n = 0; n < r.in_view_fraction.size(); ++n)
    groups.push_back({n + 1 == r.in_view_fraction.size() && n > 0 ? fmt::format("{}+", n) : std::to_string(n),
                      {100.0 * r.in_view_fraction[n]}});
  return bar_chart_svg({lit_title(r, "Satellites in view"), lit_label(r, "satellites in view above the mask"),
                        "share of time and area (%)"},
                       {"share"}, groups);
}

std::string gap_cdf_svg(const CoverageResult& r) {
  Series s{"all points, area-weighted", {}, {}, SeriesStyle::line};
  for (size_t q = 0; q < r.gap_quantiles_s.size(); ++q) {
    s.x.push_back(r.gap_quantiles_s[q] / 60.0);
    s.y.push_back(100.0 * static_cast<double>(q) / static_cast<double>(r.gap_quantiles_s.size() - 1));
  }
  PlotAxes a{lit_title(r, "Cumulative distribution of revisit gaps"), lit_label(r, "gap duration (min)"),
             "gaps no longer than (%)"};
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

std::string ground_track_svg(const Design& d, double min_elevation_deg, std::optional<double> nadir_half_angle_deg,
                             const MapContext& m) {
  const auto sats = expand_constellation(d);
  const JulianDate jd = julian_date(d.epoch);
  // The planes: (shell, plane) of the first satellite met in each, then evenly chosen when there are too many.
  std::vector<const Satellite*> firsts;
  for (const auto& sat : sats)
    if (firsts.empty() || firsts.back()->shell != sat.shell || firsts.back()->plane != sat.plane) firsts.push_back(&sat);
  std::vector<const Satellite*> drawn = firsts;
  if (firsts.size() > max_track_planes) {
    drawn.clear();
    for (size_t k = 0; k < max_track_planes; ++k) drawn.push_back(firsts[k * (firsts.size() - 1) / (max_track_planes - 1)]);
  }
  MapFigure f = base_map("ground_tracks", drawn.size() < firsts.size()
                                              ? fmt::format("One orbit of one satellite per plane ({} of {} planes)", drawn.size(), firsts.size())
                                              : std::string("One orbit of one satellite per plane"), m);
  f.view = world_view();
  for (size_t j = 0; j < drawn.size(); ++j) {
    const Satellite& sat = *drawn[j];
    const double period_s = two_pi * std::sqrt(std::pow(sat.elements.a_km, 3) / d.earth.mu_km3_s2);
    const auto track = ground_track(d.earth, make_secular_orbit(d.earth, sat.elements), jd, period_s, period_s / 240.0);
    MapTrace t;
    t.colour = j;
    for (const auto& p : track) t.points.push_back({p.lon_deg, p.lat_deg});
    f.traces.push_back(std::move(t));
    f.trace_legend.push_back(fmt::format("{} plane {}", d.shells[static_cast<size_t>(sat.shell)].name, sat.plane + 1));
  }
  // Footprints at the epoch: the small circle of central angle lambda round each sub-satellite point (on a
  // sphere of the equatorial radius; the geodetic sub-satellite point is used as the centre, which moves the
  // circle by less than 0.2 deg, well under a pixel of a 2 px per degree map), in the colour of its plane
  // when that plane is drawn, grey otherwise.
  const double eps = min_elevation_deg * rad_per_deg;
  for (const auto& sat : sats) {
    const SecularOrbit orbit = make_secular_orbit(d.earth, sat.elements);
    const double radius_km = state_at(d.earth, orbit, 0.0).r_km.norm();
    const double lambda = nadir_half_angle_deg
                              ? footprint_central_angle_rad(d.earth.radius_km, radius_km, eps, *nadir_half_angle_deg * rad_per_deg)
                              : footprint_central_angle_rad(d.earth.radius_km, radius_km, eps);
    const auto sub = ground_track(d.earth, orbit, jd, 0.0, 1.0).front();
    const double la = sub.lat_deg * rad_per_deg, lo = sub.lon_deg * rad_per_deg;
    MapTrace t;
    t.thin = true;
    t.colour = drawn.size();  // a colour past the planes' unless its plane is drawn
    for (size_t j = 0; j < drawn.size(); ++j)
      if (drawn[j]->shell == sat.shell && drawn[j]->plane == sat.plane) t.colour = j;
    for (int s = 0; s <= 120; ++s) {
      // Destination point at distance lambda on bearing b (spherical trigonometry, e.g. Snyder, "Map
      // Projections: A Working Manual", USGS PP 1395, 1987, eq. 5-5 and 5-6).
      const double b = two_pi * s / 120.0;
      const double lat2 = std::asin(std::sin(la) * std::cos(lambda) + std::cos(la) * std::sin(lambda) * std::cos(b));
      const double lon2 = lo + std::atan2(std::sin(b) * std::sin(lambda) * std::cos(la), std::cos(lambda) - std::sin(la) * std::sin(lat2));
      double lon_deg = std::remainder(lon2 * deg_per_rad, 360.0);
      t.points.push_back({lon_deg, lat2 * deg_per_rad});
    }
    f.traces.push_back(std::move(t));
  }
  f.thin_trace_legend = fmt::format("footprint at the epoch ({:g} deg mask{})", min_elevation_deg,
                                    nadir_half_angle_deg ? fmt::format(", {:g} deg cone", *nadir_half_angle_deg) : "");
  return map_figure_svg(f);
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
