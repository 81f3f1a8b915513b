#include "skein/report/coverage_tables.hpp"

#include <cassert>
#include <cctype>

#include <fmt/format.h>

#include "skein/coverage/requirement_check.hpp"

namespace skein {

std::string lit_title_text(const std::string& title) {
  assert(!title.empty());
  return "Lit " + std::string(1, static_cast<char>(std::tolower(static_cast<unsigned char>(title[0])))) + title.substr(1);
}

namespace {

// A point's label for a table: its site name, or "lat LAT lon LON" of a grid cell's centre (deg).
std::string point_label(const GridPoint& p) {
  return !p.name.empty() ? p.name : fmt::format("lat {:.2f} lon {:.2f}", p.lat_deg, p.lon_deg);
}

// The columns "covered k>=1" .. "covered k>=K" (percent of time with at least k in view).
void add_fold_percent_columns(Table& t, int max_fold) {
  for (int k = 0; k < max_fold; ++k)
    t.columns.push_back({fmt::format("percent_covered_k{}", k + 1), fmt::format("covered k>={}", k + 1), "%", 3});
}

// With the daylight mask every coverage figure counts lit coverage only (in view while the Sun stands at least
// the threshold high at the point): the title says so and every heading of a coverage figure gets "lit".
// The JSON keys and CSV headers stay the same; coverage_json records the threshold beside them.
Table lit(Table t, const CoverageResult& r) {
  if (!r.min_sun_elevation_deg) return t;
  t.title = fmt::format("{} [lit: in view with the Sun at least {:g} deg above the point's horizon]",
                        lit_title_text(t.title.empty() ? std::string("coverage") : t.title), *r.min_sun_elevation_deg);
  for (Column& c : t.columns) {
    const std::string& h = c.heading;
    for (const char* word : {"covered", "gap", "response", "in view", "pass", "worst"})
      if (h.find(word) != std::string::npos) {
        c.heading = "lit " + h;
        break;
      }
  }
  return t;
}

}  // namespace

std::string lit_caption(const CoverageResult& r, const std::string& caption) {
  if (!r.min_sun_elevation_deg) return caption;
  return fmt::format("Lit coverage (Sun at least {:g} deg above the point's horizon): {}", *r.min_sun_elevation_deg,
                     caption);
}

Table coverage_overview_table(const CoverageResult& r) {
  Table t;
  t.title = fmt::format("Coverage of {} ({} grid, {} points, {} satellites, mask {} deg, {} mode)", r.design,
                        to_string(r.grid), r.points.size(), r.satellites, r.min_elevation_deg, to_string(r.mode));
  t.columns = {{"grid_points", "points", "", 0},
               {"percent_covered", "covered", "%", 3},
               {"max_gap_s", "max gap", "s", 1},
               {"mean_gap_s", "mean gap", "s", 1},
               {"p95_gap_s", "p95 gap", "s", 1},
               {"gap_count", "gaps", "", 0},
               {"mean_response_time_s", "mean response", "s", 1},
               {"mean_in_view", "mean in view", "", 3},
               {"max_in_view", "max in view", "", 0}};
  const CoverageAggregate& a = r.total;
  t.add_row({static_cast<long>(r.points.size()), a.percent_by_fold.at(0), a.max_gap_s, a.mean_gap_s, a.p95_gap_s,
             a.gap_count, a.mean_response_time_s, a.mean_in_view, static_cast<long>(a.max_in_view)});
  return lit(std::move(t), r);
}

Table coverage_fold_table(const CoverageResult& r) {
  Table t;
  t.title = "Coverage by fold (covered: at least k satellites in view; gap: fewer than k)";
  t.columns = {{"fold", "k", "", 0},
               {"percent_covered", "time covered", "%", 3},
               {"worst_instant_covered_percent", "worst instant area", "%", 3},
               {"worst_point_percent", "worst point", "%", 3},
               {"worst_point", "worst point at", "", 0},
               {"worst_point_max_gap_s", "its max gap", "s", 1},
               {"max_gap_s", "max gap", "s", 1},
               {"mean_gap_s", "mean gap", "s", 1},
               {"p95_gap_s", "p95 gap", "s", 1},
               {"gap_count", "gaps", "", 0},
               {"mean_response_time_s", "mean response", "s", 1},
               {"required_radius_deg", "required radius", "deg", 3}};
  for (int k = 0; k < r.max_fold; ++k) {
    const size_t i = static_cast<size_t>(k);
    const WorstPoint& w = r.worst_point_by_fold[i];
    const GapFigures& g = r.total.gaps_by_fold[i];
    t.add_row({static_cast<long>(k + 1), r.total.percent_by_fold[i], r.worst_instant_covered_percent[i],
               w.percent_covered, point_label(r.points[w.point].point), w.max_gap_s, g.max_gap_s, g.mean_gap_s, g.p95_gap_s,
               g.gap_count, g.mean_response_time_s, r.required_radius_deg[i]});
  }
  return lit(std::move(t), r);
}

Table coverage_requirement_table(const CoverageResult& r) {
  Table t;
  t.title = "Requirement";
  t.columns = {{"figure", "figure", "", 0},     {"fold", "k", "", 0},
               {"condition", "condition", "", 0}, {"threshold", "threshold", "", 3},
               {"value", "value", "", 3},       {"judged", "judged on", "", 0},
               {"met", "met", "", 0},           {"failing_sites", "failing sites", "", 0}};
  if (!r.requirement) return t;
  const RequirementVerdict& v = *r.requirement;
  for (const ThresholdVerdict& c : v.checks) {
    std::string sites;
    for (const std::string& n : c.failing_sites) sites += (sites.empty() ? "" : "; ") + n;
    t.add_row({std::string(to_string(c.threshold.figure)), static_cast<long>(v.fold),
               std::string(higher_is_better(c.threshold.figure) ? "at least" : "at most"), c.threshold.value, c.value,
               std::string(c.per_site ? "every site (worst shown)" : "the grid"), std::string(c.met ? "yes" : "no"),
               sites.empty() ? Cell() : Cell(sites)});
  }
  return lit(std::move(t), r);
}

std::string coverage_requirement_line(const CoverageResult& r) {
  if (!r.requirement) return "";
  const RequirementVerdict& v = *r.requirement;
  if (v.met) return fmt::format("Requirement at fold {}: met ({} condition{})", v.fold, v.checks.size(), v.checks.size() == 1 ? "" : "s");
  std::string line = fmt::format("Requirement at fold {}: NOT met", v.fold);
  for (const std::string& f : failed_check_texts(v)) line += "; " + f;
  return line;
}

Table coverage_band_table(const CoverageResult& r) {
  Table t;
  t.title = "Coverage by latitude band";
  t.columns = {{"lat_min_deg", "lat from", "deg", 1}, {"lat_max_deg", "lat to", "deg", 1}, {"points", "points", "", 0},
               {"area_percent", "area", "%", 3}};
  add_fold_percent_columns(t, r.max_fold);
  for (Column c : std::vector<Column>{{"max_gap_s", "max gap", "s", 1},
                                      {"mean_gap_s", "mean gap", "s", 1},
                                      {"p95_gap_s", "p95 gap", "s", 1},
                                      {"mean_response_time_s", "mean response", "s", 1},
                                      {"mean_in_view", "mean in view", "", 3},
                                      {"max_in_view", "max in view", "", 0}})
    t.columns.push_back(c);
  for (const LatitudeBand& b : r.bands) {
    std::vector<Cell> row{b.lat_min_deg, b.lat_max_deg, b.metrics.points, 100.0 * b.metrics.area_weight};
    for (double v : b.metrics.percent_by_fold) row.emplace_back(v);
    for (Cell c : std::vector<Cell>{b.metrics.max_gap_s, b.metrics.mean_gap_s, b.metrics.p95_gap_s,
                                    b.metrics.mean_response_time_s, b.metrics.mean_in_view,
                                    static_cast<long>(b.metrics.max_in_view)})
      row.push_back(c);
    t.add_row(std::move(row));
  }
  return lit(std::move(t), r);
}

Table coverage_point_table(const CoverageResult& r) {
  Table t;
  t.title = "Coverage by grid point";
  t.columns = {{"name", "name", "", 0},          {"lat_deg", "lat", "deg", 4},
               {"lon_deg", "lon", "deg", 4},     {"height_km", "height", "km", 3},
               {"area_weight", "weight", "", 8}, {"cell_lat_min_deg", "cell lat min", "deg", 4},
               {"cell_lat_max_deg", "cell lat max", "deg", 4}, {"cell_lon_min_deg", "cell lon min", "deg", 4},
               {"cell_lon_max_deg", "cell lon max", "deg", 4}};
  add_fold_percent_columns(t, r.max_fold);
  for (Column c : std::vector<Column>{{"max_gap_s", "max gap", "s", 1},
                                      {"mean_gap_s", "mean gap", "s", 1},
                                      {"p95_gap_s", "p95 gap", "s", 1},
                                      {"gap_count", "gaps", "", 0},
                                      {"mean_response_time_s", "mean response", "s", 1},
                                      {"mean_in_view", "mean in view", "", 3},
                                      {"max_in_view", "max in view", "", 0}})
    t.columns.push_back(c);
  for (int k = 0; k < r.max_fold; ++k)
    t.columns.push_back({fmt::format("radius_deg_k{}", k + 1), fmt::format("radius k={}", k + 1), "deg", 3});
  // Gaps at folds 2..K (fewer than k in view); the fold-1 figures are the plain columns above.
  for (int k = 2; k <= r.max_fold; ++k) {
    t.columns.push_back({fmt::format("max_gap_s_k{}", k), fmt::format("max gap k<{}", k), "s", 1});
    t.columns.push_back({fmt::format("p95_gap_s_k{}", k), fmt::format("p95 gap k<{}", k), "s", 1});
    t.columns.push_back({fmt::format("mean_response_time_s_k{}", k), fmt::format("mean response k={}", k), "s", 1});
  }
  // Age of the data per point (designs with ground stations): the point's own figures, as in data_age.*; empty
  // where no observation reached the ground within the span.
  if (r.data_age) {
    for (Column c : std::vector<Column>{{"data_age_observations", "observations", "", 0},
                                        {"data_age_censored", "not downlinked", "", 0},
                                        {"mean_data_age_s", "mean data age", "s", 1},
                                        {"p95_data_age_s", "p95 data age", "s", 1},
                                        {"max_data_age_s", "max data age", "s", 1}})
      t.columns.push_back(c);
  }
  for (size_t index = 0; index < r.points.size(); ++index) {
    const PointCoverage& p = r.points[index];
    std::vector<Cell> row{p.point.name, p.point.lat_deg, p.point.lon_deg, p.point.height_km, p.point.area_weight};
    if (p.point.cell) {
      for (double v : {p.point.cell->lat_min_deg, p.point.cell->lat_max_deg, p.point.cell->lon_min_deg,
                       p.point.cell->lon_max_deg})
        row.emplace_back(v);
    } else {
      for (int i = 0; i < 4; ++i) row.emplace_back(std::monostate{});
    }
    for (double v : p.percent_by_fold) row.emplace_back(v);
    for (Cell c : std::vector<Cell>{p.max_gap_s, p.mean_gap_s, p.p95_gap_s, p.gap_count, p.mean_response_time_s,
                                    p.mean_in_view, static_cast<long>(p.max_in_view)})
      row.push_back(c);
    for (double v : p.radius_deg_by_fold) row.emplace_back(v);
    for (size_t k = 1; k < p.gaps_by_fold.size(); ++k) {
      row.emplace_back(p.gaps_by_fold[k].max_gap_s);
      row.emplace_back(p.gaps_by_fold[k].p95_gap_s);
      row.emplace_back(p.gaps_by_fold[k].mean_response_time_s);
    }
    if (r.data_age) {
      const DataAgeFigures& a = r.data_age->per_point[index];
      row.emplace_back(a.observations);
      row.emplace_back(a.censored);
      if (a.observations > a.censored) {
        for (double v : {a.mean_s, a.p95_s, a.max_s}) row.emplace_back(v);
      } else {
        for (int j = 0; j < 3; ++j) row.emplace_back(std::monostate{});
      }
    }
    t.add_row(std::move(row));
  }
  return lit(std::move(t), r);
}

Table coverage_site_table(const CoverageResult& r) {
  Table t;
  t.title = "Coverage by site";
  t.columns = {{"name", "site", "", 0}, {"lat_deg", "lat", "deg", 4}, {"lon_deg", "lon", "deg", 4}};
  add_fold_percent_columns(t, r.max_fold);
  for (Column c : std::vector<Column>{{"max_gap_s", "max gap", "s", 1},
                                      {"mean_gap_s", "mean gap", "s", 1},
                                      {"mean_response_time_s", "mean response", "s", 1},
                                      {"passes_per_day", "passes per day", "", 2},
                                      {"mean_pass_min", "mean pass", "min", 2}})
    t.columns.push_back(c);
  const double days = r.span_s / seconds_per_day;
  for (const PointCoverage& p : r.points) {
    std::vector<Cell> row{p.point.name, p.point.lat_deg, p.point.lon_deg};
    for (double v : p.percent_by_fold) row.emplace_back(v);
    for (Cell c : std::vector<Cell>{p.max_gap_s, p.mean_gap_s, p.mean_response_time_s,
                                    static_cast<double>(p.passes) / days, p.mean_pass_s / 60.0})
      row.push_back(c);
    t.add_row(std::move(row));
  }
  return lit(std::move(t), r);
}

Table site_pass_table(const CoverageResult& r, const std::vector<SitePass>& passes, const UtcEpoch& epoch) {
  Table t;
  t.title = "Passes over each site (rise and set at the elevation mask; cut at the span's start and end)";
  t.columns = {{"site", "site", "", 0},          {"satellite", "satellite", "", 0},
               {"rise_utc", "rise", "UTC", 0},   {"set_utc", "set", "UTC", 0},
               {"rise_s", "rise", "s", 3},       {"set_s", "set", "s", 3},
               {"duration_min", "duration", "min", 2}, {"max_elevation_deg", "max elevation", "deg", 2},
               {"max_elevation_utc", "max at", "UTC", 0}};
  for (const SitePass& p : passes)
    t.add_row({r.points.at(p.site).point.name, p.satellite, format_utc_iso8601(add_seconds(epoch, p.rise_s), 0),
               format_utc_iso8601(add_seconds(epoch, p.set_s), 0), p.rise_s, p.set_s, (p.set_s - p.rise_s) / 60.0,
               p.max_elevation_deg, format_utc_iso8601(add_seconds(epoch, p.max_elevation_s), 0)});
  return t;
}

Table in_view_distribution_table(const CoverageResult& r) {
  Table t;
  t.title = "Satellites in view (share of time and area)";
  t.columns = {{"in_view", "in view", "", 0}, {"or_more", "or more", "", 0}, {"percent", "share", "%", 4}};
  size_t last = 0;
  for (size_t n = 0; n < r.in_view_fraction.size(); ++n)
    if (r.in_view_fraction[n] > 0.0) last = n;
  for (size_t n = 0; n <= last && n < r.in_view_fraction.size(); ++n)
    t.add_row({static_cast<long>(n), std::string(n + 1 == r.in_view_fraction.size() ? "yes" : "no"),
               100.0 * r.in_view_fraction[n]});
  return lit(std::move(t), r);
}

Table gap_distribution_table(const CoverageResult& r) {
  Table t;
  t.title = "Revisit gap distribution (area-weighted quantiles)";
  t.columns = {{"quantile_percent", "quantile", "%", 0}, {"gap_s", "gap", "s", 1}};
  for (size_t q = 0; q < r.gap_quantiles_s.size(); ++q) t.add_row({static_cast<long>(q), r.gap_quantiles_s[q]});
  return lit(std::move(t), r);
}

Table data_age_table(const CoverageResult& r) {
  const bool sites = r.grid == GridKind::sites;
  Table t;
  std::string bins;
  if (r.data_age && r.data_age->bin_ratio != 1.0)
    bins = fmt::format("p95 from log-spaced bins, high by under the larger of {:g} s and {:.1f} %", r.data_age->bin_s,
                       100.0 * (r.data_age->bin_ratio - 1.0));
  else
    bins = fmt::format("p95 from {:g} s bins", r.data_age ? r.data_age->bin_s : 0.0);
  t.title = fmt::format("Age of the data at downlink, from the start of each {}pass to the satellite's next "
                        "contact with any station (censored: no contact before the span's end; {}){}",
                        r.min_sun_elevation_deg ? "lit " : "", bins,
                        sites ? "" : fmt::format("; the grid (area-weighted), then the {} cells of largest p95",
                                                 data_age_worst_cells));
  t.columns = {{"name", sites ? "site" : "cell (lat, lon)", "", 0},
               {"observations", r.min_sun_elevation_deg ? "lit passes" : "passes", "", 0},
               {"censored", "censored", "", 0},
               {"mean_data_age_s", "mean age", "s", 1},
               {"p95_data_age_s", "p95 age", "s", 1},
               {"max_data_age_s", "max age", "s", 1}};
  if (!r.data_age) return t;
  const auto add = [&](const std::string& name, const DataAgeFigures& f) {
    t.add_row({name, f.observations, f.censored, f.mean_s, f.p95_s, f.max_s});
  };
  if (sites) {
    for (size_t p = 0; p < r.points.size(); ++p) add(r.points[p].point.name, r.data_age->per_point[p]);
    add("all sites (weighted)", r.data_age->total);
    return t;
  }
  // Cells: the grid's figures first, then the worst cells (largest p95, then largest mean, then grid order).
  add("all cells (area-weighted)", r.data_age->total);
  std::vector<size_t> order(r.points.size());
  for (size_t p = 0; p < order.size(); ++p) order[p] = p;
  const auto& f = r.data_age->per_point;
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) {
    return f[a].p95_s > f[b].p95_s || (f[a].p95_s == f[b].p95_s && f[a].mean_s > f[b].mean_s);
  });
  for (size_t k = 0; k < order.size() && k < data_age_worst_cells; ++k) {
    const GridPoint& g = r.points[order[k]].point;
    add(fmt::format("{:.2f}, {:.2f}", g.lat_deg, g.lon_deg), f[order[k]]);
  }
  return t;
}

nlohmann::ordered_json coverage_json(const CoverageResult& result) {
  nlohmann::ordered_json j;
  const CoverageAggregate& a = result.total;
  j["design"] = result.design;
  j["grid"] = std::string(to_string(result.grid));
  j["spacing_deg"] = result.spacing_deg;
  j["grid_points"] = result.points.size();
  j["satellites"] = result.satellites;
  j["span_s"] = result.span_s;
  j["step_s"] = result.step_s;
  j["min_elevation_deg"] = result.min_elevation_deg;
  j["nadir_half_angle_deg"] = result.nadir_half_angle_deg ? nlohmann::ordered_json(*result.nadir_half_angle_deg)
                                                          : nlohmann::ordered_json(nullptr);
  j["min_sun_elevation_deg"] = result.min_sun_elevation_deg ? nlohmann::ordered_json(*result.min_sun_elevation_deg)
                                                            : nlohmann::ordered_json(nullptr);
  // What the coverage figures count: "in view", or "lit" (in view while the Sun is at least
  // min_sun_elevation_deg above the point's horizon).
  j["coverage_counts"] = result.min_sun_elevation_deg ? "lit" : "in view";
  j["max_fold"] = result.max_fold;
  j["mode"] = std::string(to_string(result.mode));
  j["percent_covered"] = a.percent_by_fold.at(0);
  j["percent_covered_by_fold"] = a.percent_by_fold;
  j["max_gap_s"] = a.max_gap_s;
  j["mean_gap_s"] = a.mean_gap_s;
  j["p95_gap_s"] = a.p95_gap_s;
  j["gap_count"] = a.gap_count;
  j["mean_response_time_s"] = a.mean_response_time_s;
  j["mean_in_view"] = a.mean_in_view;
  j["max_in_view"] = a.max_in_view;
  j["required_radius_deg"] = result.required_radius_deg;
  j["worst_instant_covered_percent_by_fold"] = result.worst_instant_covered_percent;
  j["by_fold"] = rows_to_json(coverage_fold_table(result));
  if (result.requirement) {
    nlohmann::ordered_json req;
    req["fold"] = result.requirement->fold;
    req["every_site"] = result.requirement->every_site;
    req["met"] = result.requirement->met;
    req["checks"] = rows_to_json(coverage_requirement_table(result));
    req["failing_sites"] = result.requirement->failing_sites;
    j["requirement"] = std::move(req);
  } else {
    j["requirement"] = nullptr;
  }
  if (result.data_age) {
    nlohmann::ordered_json age;
    age["observation_instant"] = result.min_sun_elevation_deg ? "start of each lit pass" : "start of each pass";
    age["censored_means"] = "no contact of that satellite before the span's end; left out of mean and p95";
    age["histogram_bin_s"] = result.data_age->bin_s;
    // 1 for linear bins (sites); cells: each bin this many times as wide as the one before it.
    age["histogram_bin_ratio"] = result.data_age->bin_ratio;
    age["observations"] = result.data_age->total.observations;
    age["censored"] = result.data_age->total.censored;
    age["mean_s"] = result.data_age->total.mean_s;
    age["p95_s"] = result.data_age->total.p95_s;
    age["max_s"] = result.data_age->total.max_s;
    age[result.grid == GridKind::sites ? "sites" : "grid_and_worst_cells"] = rows_to_json(data_age_table(result));
    j["data_age"] = std::move(age);
  } else {
    j["data_age"] = nullptr;
  }
  j["latitude_bands"] = rows_to_json(coverage_band_table(result));
  j["in_view_distribution"] = rows_to_json(in_view_distribution_table(result));
  j["gap_quantiles_s"] = result.gap_quantiles_s;
  j["passes_between_instants"] = result.hidden_passes;
  j["path_error_bound_m"] = result.path_error_bound_m;
  j["pair_tests"] = result.pair_tests;
  j["point_steps"] = result.point_steps;
  return j;
}

std::string coverage_between_instants_note(const CoverageResult& result) {
  return fmt::format("Passes shorter than the step, found between sample instants: {} (satellite path between "
                     "instants good to {:.2g} m)",
                     result.hidden_passes, result.path_error_bound_m);
}

}  // namespace skein
