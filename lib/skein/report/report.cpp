#include "skein/report/report.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/coverage/grid.hpp"
#include "skein/coverage/site_passes.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/export/geojson.hpp"
#include "skein/export/oem.hpp"
#include "skein/drift/beta_eclipse.hpp"
#include "skein/drift/drift_summary.hpp"
#include "skein/report/budget_plots.hpp"
#include "skein/report/budget_spread_tables.hpp"
#include "skein/report/budget_tables.hpp"
#include "skein/report/deployment_plot.hpp"
#include "skein/report/deployment_tables.hpp"
#include "skein/report/contact_tables.hpp"
#include "skein/report/coverage_tables.hpp"
#include "skein/report/layout_tables.hpp"
#include "skein/report/report_pages.hpp"
#include "skein/report/report_plots.hpp"

namespace skein {

// Bytes per item in the estimate, measured on the reports of designs/small.yaml and designs/demo.yaml
// (2 deg grid, 3 and 20 satellites; tests/report/report_size_test.cpp checks the estimate against the bytes
// written, within -20 %/+25 %): an OEM data line (epoch and six numbers, 99 bytes measured), an OEM file's
// header, a satellite's rows in the satellite table (CSV and JSON, 370 to 420 measured), and a grid point's
// rows in the point table, the GeoJSON cells and the two maps, each drawn in its SVG and again in index.html
// (1680 to 1720 measured at fold 1 to 3). A plane drawn in the beta and eclipse figures: 4700 bytes per figure
// (365 daily points) measured on designs/demo.yaml, times two figures, each in its SVG and in index.html; a
// plane's row of the beta and eclipse table in CSV, JSON and HTML, about 600 bytes.
constexpr double oem_line_bytes = 100.0;
constexpr double beta_eclipse_drawn_plane_bytes = 4.0 * 4800.0;
constexpr double beta_eclipse_plane_row_bytes = 600.0;
constexpr double oem_header_bytes = 1000.0;
constexpr double satellite_table_bytes = 500.0;
constexpr double point_bytes = 1800.0;
constexpr double contact_pair_row_bytes = 400.0;  // a satellite-station row of the contact table, CSV and JSON
constexpr double fixed_bytes = 300000.0;  // summary, page, small tables and plots
// A pass of the site pass list: its row in CSV, JSON and the page (about 550 bytes measured on
// designs/harbour-watch.yaml), and at most two passes per orbit per satellite and site, the shortest orbit
// taken as 5300 s (about 88 min, the period just above the atmosphere).
constexpr double site_pass_bytes = 600.0;
constexpr double shortest_period_s = 5300.0;
// A world map's land outlines (land-110m.json, points closer than 0.4 px dropped), one path used up to three
// times: about 95 kB measured on designs/demo.yaml; each map is in its SVG and again in index.html.
constexpr double land_map_bytes = 2.0 * 95000.0;
// A cell of the data-age map (cell grids with ground stations): 77 bytes in its SVG measured on a 2 deg global
// grid (16,200 cells, 24 satellites, three stations), and again in index.html.
constexpr double data_age_map_point_bytes = 2.0 * 80.0;

ReportSizeEstimate estimate_report_size(const Design& design, const ReportOptions& options) {
  const CoverageSettings st = resolve_coverage_settings(design, options.coverage);
  const double sats = static_cast<double>(st.satellites);
  const double points = grid_point_count_bound(st.spec);
  const double samples = std::floor(options.ephemeris_span_s / options.ephemeris_step_s) + 1.0;
  const double levels = 4.0;  // solar levels of the decay tables, at most
  const double shells = static_cast<double>(design.shells.size());
  ReportSizeEstimate e;
  double planes = 0.0;
  for (const Shell& sh : design.shells) planes += sh.planes;
  // summary, page, the design's copy; 18 tables and the decay tables in CSV and JSON; up to 9 plots and one per
  // shell; GeoJSON; OEM. With ground stations, 4 contact tables in CSV and JSON.
  const double stations = static_cast<double>(design.ground_stations.size());
  e.files = 3.0 + 2.0 * (18.0 + shells * levels) + 9.0 + shells + 1.0 + sats + (stations > 0.0 ? 8.0 : 0.0);
  e.bytes = fixed_bytes + sats * (oem_header_bytes + samples * oem_line_bytes + satellite_table_bytes) +
            points * point_bytes + std::min(planes, static_cast<double>(max_beta_eclipse_series)) * beta_eclipse_drawn_plane_bytes +
            planes * beta_eclipse_plane_row_bytes + sats * stations * contact_pair_row_bytes +
            (options.land ? 3.0 * land_map_bytes : 0.0);
  if (st.spec.grid == GridKind::sites)
    e.bytes += points * sats * 2.0 * std::ceil(st.spec.span_s / shortest_period_s) * site_pass_bytes;
  else if (stations > 0.0) {
    e.files += 1.0;  // the data-age map
    e.bytes += points * data_age_map_point_bytes;
  }
  return e;
}

Report build_report(const Design& design, const ReportOptions& options) {
  Report rep;
  std::vector<OutputFile> files;
  rep = build_report(design, options, [&](const std::string& path, std::string_view content) {
    files.push_back({path, std::string(content)});
  });
  rep.files = std::move(files);
  return rep;
}

Report build_report(const Design& design, const ReportOptions& options, const ReportSink& sink_file) {
  if (!options.coverage.force) {
    const ReportSizeEstimate size = estimate_report_size(design, options);
    if (size.files > max_report_files || size.bytes > max_report_bytes)
      throw InputError(fmt::format(
          "the report would hold about {:.0f} files and {:.1f} GiB, above the limits of {:.0f} files and {:.1f} GiB; "
          "expected a smaller design, a coarser coverage grid or a longer --ephemeris-step, or --force",
          size.files, size.bytes / (1024.0 * 1024 * 1024), max_report_files, max_report_bytes / (1024.0 * 1024 * 1024)));
  }
  if (!design.ground_stations.empty()) check_contact_work(design, contact_options_for(design));
  Report rep;
  auto sink = [&](const std::string& path, std::string_view content) {
    sink_file(path, content);
    ++rep.files_written;
    rep.bytes_written += static_cast<double>(content.size());
  };
  rep.coverage = evaluate_coverage(design, options.coverage);
  rep.budget = compute_budget(design, options.budget);
  // The Monte Carlo budget when the design asks for it (budget.samples; the reader checked the count and seed).
  std::optional<BudgetSpreadResult> spread;
  if (design.budget.samples) {
    MonteCarloOptions mc;
    mc.samples = *design.budget.samples;
    mc.seed = design.budget.seed.value_or(1);
    mc.budget = options.budget;
    spread = compute_budget_spread(design, rep.budget, mc);
  }
  const auto sats = expand_constellation(design);
  const DriftResult drift = compute_drift(design);
  const BetaEclipseResult beta_eclipse = compute_beta_eclipse(design);

  std::vector<NamedTable> tables = {
      {"shells", shell_table(design)},
      {"planes", plane_table(design)},
      {"satellites", satellite_table(design, sats)},
      {"drift", drift_table(drift)},
      {"differential_drift", differential_drift_table(drift)},
      {"beta_eclipse", beta_eclipse_table(beta_eclipse)},
      {"coverage_overview", coverage_overview_table(rep.coverage)},
      {"coverage_folds", coverage_fold_table(rep.coverage)},
      {"coverage_bands", coverage_band_table(rep.coverage)},
      {"coverage_points", coverage_point_table(rep.coverage)},
      {"in_view_distribution", in_view_distribution_table(rep.coverage)},
      {"gap_distribution", gap_distribution_table(rep.coverage)},
      {"budget_shells", budget_shell_table(rep.budget)},
      {"budget_lines", budget_lines_table(rep.budget)},
      {"lifetime_by_level", lifetime_by_level_table(rep.budget)},
  };
  if (spread) {
    tables.push_back({"budget_spread", budget_spread_table(*spread)});
    tables.push_back({"budget_spread_inputs", budget_spread_inputs_table(*spread)});
  }
  if (rep.coverage.requirement) tables.push_back({"coverage_requirement", coverage_requirement_table(rep.coverage)});
  if (rep.coverage.grid == GridKind::sites) {
    tables.push_back({"coverage_sites", coverage_site_table(rep.coverage)});
    tables.push_back({"site_passes", site_pass_table(rep.coverage, find_site_passes(design, rep.coverage), design.epoch)});
  }
  if (rep.coverage.data_age) tables.push_back({"data_age", data_age_table(rep.coverage)});
  if (!design.ground_stations.empty()) {
    const ContactResult contacts = compute_contacts(design);
    tables.push_back({"station_load", station_load_table(contacts)});
    tables.push_back({"station_in_view", station_in_view_table(contacts)});
    tables.push_back({"contact_gaps", contact_gap_table(contacts)});
    tables.push_back({"contacts", contact_pair_table(contacts)});
  }
  for (const auto& sh : rep.budget.shells)
    if (sh.deployment) {
      tables.push_back({"deployment_plans_" + sh.name, deployment_plans_table(sh)});
      tables.push_back({"deployment_curve_" + sh.name, deployment_curve_table(sh)});
    }
  tables.push_back({"run_record", run_record_table(design, rep.coverage, rep.budget, options.record)});
  for (const auto& sh : rep.budget.shells)
    for (const auto& dec : sh.decay)
      tables.push_back({fmt::format("decay_{}_{}", sh.name, to_string(dec.level)),
                        decay_curve_table(sh, dec, design.earth.radius_km)});

  std::vector<Figure> figures;
  const bool has_cells = !rep.coverage.points.empty() && rep.coverage.points.front().point.cell.has_value();
  const MapContext maps{options.land ? &*options.land : nullptr, options.land_note};
  if (has_cells) {
    figures.push_back({"coverage_map", lit_caption(rep.coverage, "Percent of time covered, per grid cell"), coverage_map_svg(design, rep.coverage, maps)});
    figures.push_back({"max_gap_map", lit_caption(rep.coverage, "Longest revisit gap per grid cell"), max_gap_map_svg(design, rep.coverage, maps)});
    if (rep.coverage.data_age)
      figures.push_back({"data_age_map",
                         lit_caption(rep.coverage, "95th-percentile age of the data at downlink per grid cell (blank: "
                                                   "no observation reached the ground within the span)"),
                         data_age_map_svg(design, rep.coverage, maps)});
  }
  if (rep.coverage.grid == GridKind::sites && !rep.coverage.points.empty())
    figures.push_back({"sites_map", lit_caption(rep.coverage, "The sites and their percent of time covered"), sites_map_svg(design, rep.coverage, maps)});
  // A site list has no latitude profile to speak of (a few points): its map and table say more.
  if (!rep.coverage.bands.empty() && rep.coverage.grid != GridKind::sites)
    figures.push_back({"coverage_by_latitude", lit_caption(rep.coverage, "Percent of time covered against latitude, per fold"), coverage_by_latitude_svg(rep.coverage)});
  figures.push_back({"in_view_histogram", lit_caption(rep.coverage, "Distribution of the number of satellites in view"), in_view_histogram_svg(rep.coverage)});
  if (!rep.coverage.gap_quantiles_s.empty())
    figures.push_back({"gap_cdf", lit_caption(rep.coverage, "Cumulative distribution of revisit gaps"), gap_cdf_svg(rep.coverage)});
  figures.push_back({"dv_budget", "Delta-v per satellite by budget line", dv_budget_svg(rep.budget)});
  if (spread) {
    figures.push_back({"total_dv_histogram", "Total delta-v per satellite over the Monte Carlo samples",
                       total_dv_histogram_svg(*spread)});
    figures.push_back({"lifetime_distribution", "Natural lifetime over the Monte Carlo samples",
                       lifetime_distribution_svg(*spread)});
  }
  for (const auto& sh : rep.budget.shells)
    figures.push_back({"decay_" + sh.name, "Natural decay of the mean altitude of shell " + sh.name + " under each solar level",
                       decay_curves_svg(sh, design.earth.radius_km)});
  for (const auto& sh : rep.budget.shells)
    if (sh.deployment)
      figures.push_back({"deployment_" + sh.name,
                         "Deployment of shell " + sh.name + ": delta-v per satellite against days to full deployment",
                         deployment_curve_svg(sh)});
  figures.push_back({"beta_angle", "Beta angle of each plane over the year from the epoch", beta_angle_svg(beta_eclipse)});
  figures.push_back({"eclipse_minutes", "Eclipse minutes per orbit of each plane over the year (cylindrical shadow)",
                     eclipse_minutes_svg(beta_eclipse)});
  figures.push_back({"ground_tracks", "One orbit of one satellite per plane, and every satellite's footprint at the epoch",
                     ground_track_svg(design, rep.coverage.min_elevation_deg, rep.coverage.nadir_half_angle_deg, maps)});

  std::vector<std::string> warnings = rep.budget.warnings;
  if (spread) {
    warnings.push_back("Monte Carlo budget: " + std::string(budget_spread_caution));
    for (const auto& w : spread->warnings) warnings.push_back("Monte Carlo: " + w);
  }

  if (!options.record.design_text.empty()) sink("design.yaml", options.record.design_text);
  const ReportAnswer answer = report_answer(rep.coverage, rep.budget);
  sink("summary.md", summary_markdown(design, tables, figures, warnings, answer));
  sink("index.html", html_page(design, tables, figures, warnings, answer));
  for (const auto& t : tables) {
    sink("tables/" + t.file + ".csv", render_csv(t.table));
    nlohmann::ordered_json j;
    j["title"] = t.table.title;
    j["rows"] = rows_to_json(t.table);
    sink("tables/" + t.file + ".json", j.dump(2) + "\n");
  }
  for (const auto& f : figures) sink("plots/" + f.file + ".svg", f.svg);

  if (has_cells) {
    std::vector<GeoCell> cells;
    for (const auto& p : rep.coverage.points) {
      nlohmann::ordered_json props;
      props["lat_deg"] = p.point.lat_deg;
      props["lon_deg"] = p.point.lon_deg;
      props["area_weight"] = p.point.area_weight;
      props["percent_covered_by_fold"] = p.percent_by_fold;
      props["max_gap_s"] = p.max_gap_s;
      props["mean_gap_s"] = p.mean_gap_s;
      props["p95_gap_s"] = p.p95_gap_s;
      props["gap_count"] = p.gap_count;
      props["mean_response_time_s"] = p.mean_response_time_s;
      props["mean_in_view"] = p.mean_in_view;
      props["max_in_view"] = p.max_in_view;
      cells.push_back({p.point.cell->lon_min_deg, p.point.cell->lon_max_deg, p.point.cell->lat_min_deg,
                       p.point.cell->lat_max_deg, std::move(props)});
    }
    sink("exports/coverage_cells.geojson", render_geojson(cells));
  }
  for (const auto& sat : sats) {
    OemMessage m;
    m.creation_date = options.creation_date;
    m.originator = options.originator;
    m.comments = {"Design: " + design.name, std::string(caution_text)};
    m.segments.push_back(sample_oem_segment(design.earth, make_secular_orbit(design.earth, sat.elements), design.epoch,
                                            options.ephemeris_span_s, options.ephemeris_step_s, sat.id, sat.id));
    sink("exports/oem/" + sat.id + ".oem", render_oem(m));  // one at a time: never all in memory
  }
  return rep;
}

}  // namespace skein
