#include "skein/report/report_pages.hpp"

#include <cmath>
#include <set>

#include <fmt/format.h>

#include "skein/caution.hpp"
#include "skein/constants.hpp"
#include "skein/coverage/requirement_check.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

// A duration in the unit that reads best: seconds under 2 minutes, minutes under 2 hours, else hours.
std::string duration(double s) {
  if (s < 120.0) return fmt::format("{:.0f} s", s);
  if (s < 7200.0) return fmt::format("{:.1f} min", s / 60.0);
  return fmt::format("{:.1f} h", s / 3600.0);
}

std::string hh_mm(double h) {
  const double wrapped = std::fmod(std::fmod(h, 24.0) + 24.0, 24.0);
  long total = std::lround(wrapped * 60.0) % (24 * 60);
  return fmt::format("{:02d}:{:02d}", total / 60, total % 60);
}

// A point's name for the answer: its site name, or the cell centre.
std::string place(const GridPoint& p) {
  return !p.name.empty() ? p.name : fmt::format("lat {:.1f} lon {:.1f}", p.lat_deg, p.lon_deg);
}

// Where each item of the plan is: tables and figures by stem; a trailing '*' matches a prefix.
bool stem_matches(const std::string& pattern, const std::string& stem) {
  if (!pattern.empty() && pattern.back() == '*') return stem.starts_with(pattern.substr(0, pattern.size() - 1));
  return stem == pattern;
}

// The items of the plan resolved against what the report made, section by section, in the plan's order; what
// the plan does not name is gathered in a last section.
struct ResolvedItem {
  const NamedTable* table = nullptr;
  const Figure* figure = nullptr;
};
struct ResolvedSection {
  const PageSection* plan = nullptr;
  std::vector<ResolvedItem> items;
  std::string title;  // the plan's title; "Lit coverage" when the coverage tables count lit coverage only
};

std::vector<ResolvedSection> resolve(const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                                     std::vector<ResolvedItem>& unplaced) {
  std::set<const void*> placed;
  std::vector<ResolvedSection> out;
  for (const PageSection& s : page_plan()) {
    ResolvedSection r{&s, {}, s.title};
    for (const std::string& item : s.items) {
      const bool is_table = item.starts_with("table:");
      const std::string pattern = item.substr(is_table ? 6 : 7);
      if (is_table) {
        for (const NamedTable& t : tables)
          if (stem_matches(pattern, t.file) && placed.insert(&t).second) r.items.push_back({&t, nullptr});
      } else {
        for (const Figure& f : figures)
          if (stem_matches(pattern, f.file) && placed.insert(&f).second) r.items.push_back({nullptr, &f});
      }
    }
    // A lit-coverage run (daylight mask) says so in the section heading too.
    if (s.id == "coverage")
      for (const ResolvedItem& it : r.items)
        if (it.table && it.table->table.title.starts_with("Lit ")) r.title = "Lit coverage";
    out.push_back(std::move(r));
  }
  for (const NamedTable& t : tables)
    if (!placed.count(&t)) unplaced.push_back({&t, nullptr});
  for (const Figure& f : figures)
    if (!placed.count(&f)) unplaced.push_back({nullptr, &f});
  return out;
}

const char* exports_text_html =
    "<p><code>exports/coverage_cells.geojson</code> (grids with cells): per-cell coverage metrics (RFC 7946). "
    "<code>exports/oem/</code>: one CCSDS Orbit Ephemeris Message (KVN) per satellite. Every table, including the "
    "per-satellite, per-point and per-pass ones, is in <code>tables/</code> as CSV and JSON; every figure is in "
    "<code>plots/</code> as SVG.</p>\n";
const char* exports_text_md =
    "`exports/coverage_cells.geojson` (grids with cells): per-cell coverage metrics (RFC 7946). `exports/oem/`: one "
    "CCSDS Orbit Ephemeris Message (KVN) per satellite. Every table, including the per-satellite, per-point and "
    "per-pass ones, is in `tables/` as CSV and JSON; every figure is in `plots/` as SVG; `index.html` shows "
    "everything on one page.\n\n";

// Passes shown per site in the page (the page stays readable; the table files hold them all).
constexpr size_t max_page_passes_per_site = 200;

// The pass list folded per site: rows grouped by the first column (the site), one <details> each.
std::string folded_by_first_column(const Table& t) {
  std::string h;
  size_t i = 0;
  while (i < t.rows.size()) {
    const std::string site = std::get<std::string>(t.rows[i].front());
    Table part{t.title + ": " + site, t.columns, {}};
    size_t count = 0;
    for (; i < t.rows.size() && std::get<std::string>(t.rows[i].front()) == site; ++i, ++count)
      if (part.rows.size() < max_page_passes_per_site) part.rows.push_back(t.rows[i]);
    const std::string more = count > part.rows.size()
        ? fmt::format("<p>The first {} of {} passes; all in <code>tables/site_passes.csv</code>.</p>\n", part.rows.size(), count)
        : "";
    h += fmt::format("<details><summary>{}: {} pass{}</summary>\n{}<div class=\"table-box\">\n{}</div>\n</details>\n",
                     html_escape(site), count, count == 1 ? "" : "es", more, render_html(part));
  }
  return h;
}

std::string html_item(const ResolvedItem& it) {
  if (it.figure) {
    const Figure& f = *it.figure;
    return "<figure id=\"figure-" + html_escape(f.file) + "\">\n" + f.svg + "<figcaption>" + html_escape(f.caption) +
           " (plots/" + html_escape(f.file) + ".svg)</figcaption>\n</figure>\n";
  }
  const NamedTable& t = *it.table;
  if (t.file == "site_passes")
    return t.table.rows.empty() ? ""
                                : "<p>Passes over each site (open a site to see its list; all of them in "
                                  "<code>tables/site_passes.csv</code> and <code>.json</code>):</p>\n" +
                                      folded_by_first_column(t.table);
  if (long_table(t.file)) return "";
  return "<div class=\"table-box\" id=\"table-" + html_escape(t.file) + "\">\n" + render_html(t.table) + "</div>\n";
}

std::string markdown_item(const ResolvedItem& it) {
  if (it.figure) return "Figure: " + markdown_escape(it.figure->caption) + " (`plots/" + it.figure->file + ".svg`).\n\n";
  if (long_table(it.table->file)) return "";
  return render_markdown(it.table->table) + "\n";
}

}  // namespace

std::vector<std::string> design_lines(const Design& d) {
  std::vector<std::string> out;
  for (const Shell& s : d.shells) {
    std::string line = s.name + ": ";
    if (s.pattern == PatternKind::explicit_planes)
      line += fmt::format("{} satellites in {} planes (explicit planes)", s.satellites, s.planes);
    else
      line += fmt::format("{} satellites in {} planes, phasing {} ({} {}/{}/{})", s.satellites, s.planes, s.phasing,
                          to_string(s.pattern), s.satellites, s.planes, s.phasing);
    const double alt = s.a_km - d.earth.radius_km;
    if (s.e > 0.0)
      line += fmt::format(", perigee {:.0f} km, apogee {:.0f} km", s.a_km * (1.0 - s.e) - d.earth.radius_km,
                          s.a_km * (1.0 + s.e) - d.earth.radius_km);
    else
      line += fmt::format(", {:.0f} km circular", alt);
    line += fmt::format(", inclination {:.3f} deg", s.inclination_deg);
    if (s.sun_synchronous) line += ", sun-synchronous";
    if (s.ltan_h) line += ", first plane's node at " + hh_mm(*s.ltan_h) + " local time";
    out.push_back(std::move(line));
  }
  return out;
}

ReportAnswer report_answer(const CoverageResult& c, const BudgetResult& b) {
  ReportAnswer a;
  if (!c.points.empty() && !c.total.percent_by_fold.empty()) {
    std::string grid = fmt::format("{} grid of {} point{}, mask {} deg", to_string(c.grid), c.points.size(),
                                   c.points.size() == 1 ? "" : "s", c.min_elevation_deg);
    if (c.nadir_half_angle_deg) grid += fmt::format(", payload cone {} deg", *c.nadir_half_angle_deg);
    grid += fmt::format(", {:.4g} h at {:.4g} s", c.span_s / 3600.0, c.step_s);
    a.headline.push_back(fmt::format(
        "Coverage ({}): {:.1f} % of the time with at least one satellite in view ({}); longest revisit gap {}; "
        "mean response {}.",
        grid, c.total.percent_by_fold[0], c.grid == GridKind::sites ? "mean over the sites" : "area-weighted",
        duration(c.total.max_gap_s), duration(c.total.mean_response_time_s)));
    // The fold the requirement is judged at, else fold 2 when reported.
    const int k = c.requirement ? c.requirement->fold : (c.max_fold >= 2 ? 2 : 1);
    if (k >= 2 && static_cast<size_t>(k) <= c.total.percent_by_fold.size()) {
      const size_t i = static_cast<size_t>(k - 1);
      a.headline.push_back(fmt::format("At fold {} (at least {} in view): {:.1f} % of the time; longest gap {}.", k, k,
                                       c.total.percent_by_fold[i], duration(c.total.gaps_by_fold[i].max_gap_s)));
    }
    if (c.points.size() > 1 && !c.worst_point_by_fold.empty()) {
      const size_t i = static_cast<size_t>(k - 1) < c.worst_point_by_fold.size() ? static_cast<size_t>(k - 1) : 0;
      const WorstPoint& w = c.worst_point_by_fold[i];
      a.headline.push_back(fmt::format("Least-covered {} at fold {}: {}, {:.1f} % of the time, longest gap {}.",
                                       c.grid == GridKind::sites ? "site" : "point", i + 1,
                                       place(c.points[w.point].point), w.percent_covered, duration(w.max_gap_s)));
    }
  }
  for (const ShellBudget& s : b.shells) {
    std::string line = fmt::format("Budget of shell {} ({} satellites, {:.3g} yr): {:.1f} m/s per satellite", s.name,
                                   s.satellites, b.mission_life_years, s.total_dv_m_s);
    if (s.propellant_kg) line += fmt::format(", {:.2f} kg of propellant", *s.propellant_kg);
    else if (!s.propellant_missing.empty()) line += " (no propellant figure: " + s.propellant_missing + ")";
    if (s.exceeds_tank) line += ", more than the tank holds";
    line += fmt::format("; natural life {}{:.1f} yr", s.lifetime_lower_bound ? "at least " : "",
                        s.lifetime_natural_days / 365.25);
    if (!s.flyable()) {
      line += "; cannot be flown:";
      for (const std::string& why : s.cannot_fly) line += " " + why + ";";
      line.pop_back();
    }
    a.headline.push_back(line + ".");
  }
  if (b.shells.size() > 1) {
    std::string line = fmt::format("Fleet: {:.1f} m/s of delta-v", b.fleet_dv_m_s);
    if (b.fleet_propellant_kg) line += fmt::format(" and {:.2f} kg of propellant", *b.fleet_propellant_kg);
    a.headline.push_back(line + " over the mission life.");
  }
  if (c.requirement) {
    const RequirementVerdict& v = *c.requirement;
    a.verdict_met = v.met;
    a.verdict = v.met ? fmt::format("Requirement at fold {}: met ({} condition{})", v.fold, v.checks.size(),
                                    v.checks.size() == 1 ? "" : "s")
                      : fmt::format("Requirement at fold {}: NOT met", v.fold);
    a.failing_checks = failed_check_texts(v);
  }
  return a;
}

const std::vector<PageSection>& page_plan() {
  static const std::vector<PageSection> plan = {
      {"layout", "Layout and drift",
       {"table:shells", "table:planes", "figure:ground_tracks", "table:satellites", "table:drift",
        "table:differential_drift", "table:beta_eclipse", "figure:beta_angle", "figure:eclipse_minutes"}},
      {"coverage", "Coverage",
       {"table:coverage_requirement", "table:coverage_overview", "table:coverage_folds", "figure:coverage_map",
        "figure:max_gap_map", "figure:*map", "table:coverage_sites", "figure:site*", "table:site_passes", "table:data_age",
        "table:coverage_bands", "figure:coverage_by_latitude", "table:coverage_points", "table:in_view_distribution",
        "figure:in_view_histogram", "table:gap_distribution", "figure:gap_cdf"}},
      {"contacts", "Ground contacts",
       {"table:station_load", "table:station_in_view", "figure:station*", "figure:contact*", "table:contact_gaps",
        "table:contacts"}},
      {"budget", "Lifetime and delta-v budget",
       {"table:budget_shells", "table:budget_lines", "figure:dv_budget", "table:lifetime_by_level", "figure:decay_*",
        "table:decay_*", "table:deployment_plans_*", "table:deployment_curve_*", "figure:deployment_*",
        "table:budget_spread", "table:budget_spread_inputs", "figure:total_dv_histogram", "figure:lifetime_distribution"}},
      {"exports", "Exports", {}},
      {"record", "How this report was made", {"table:run_record"}},
  };
  return plan;
}

bool long_table(const std::string& t) {
  return t == "satellites" || t == "coverage_points" || t == "gap_distribution" || t == "contacts" ||
         t == "contact_gaps" || t == "site_passes" || t.starts_with("decay_");
}

std::string html_page(const Design& d, const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                      const std::vector<std::string>& warnings, const ReportAnswer& answer) {
  std::string h = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
                  "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  h += "<title>" + html_escape(d.name) + " - skein report</title>\n";
  // Nothing may widen the page: wide tables scroll inside their box, figures and images shrink to the column.
  h += "<style>\nbody{font-family:'DejaVu Sans',Arial,sans-serif;margin:2em auto;max-width:1100px;padding:0 1em;"
       "color:#1b2a49}\n"
       "table{border-collapse:collapse;margin:0.5em 0;font-size:13px}caption{text-align:left;font-weight:bold;"
       "padding:4px 0}\n"
       "th,td{border:1px solid #c8ccd4;padding:3px 8px}th{background:#eef1f5}td.num{text-align:right}\n"
       ".table-box{max-width:100%;overflow-x:auto;margin:1em 0}\n"
       "img,svg{max-width:100%;height:auto}\n"
       ".answer{border:2px solid #1b2a49;border-radius:4px;padding:0.5em 1.2em;background:#f6f8fb}\n"
       ".met{color:#1a6b35}.not-met{color:#a3222f}\n"
       ".caution{border-left:4px solid #d1495b;background:#fbeff1;padding:8px 12px}\n"
       "figure{margin:1em 0 2em 0;max-width:100%}figcaption{font-size:13px;color:#444}\n"
       "details{margin:0.3em 0}summary{cursor:pointer}\n"
       "nav a{margin-right:1em}\n</style>\n</head>\n<body>\n";
  h += "<h1>" + html_escape(d.name) + "</h1>\n";
  h += "<section class=\"answer\" id=\"answer\">\n<h2>In short</h2>\n";
  if (!answer.verdict.empty()) {
    h += fmt::format("<p class=\"{}\" id=\"verdict\"><strong>{}</strong></p>\n", answer.verdict_met ? "met" : "not-met",
                     html_escape(answer.verdict));
    if (!answer.failing_checks.empty()) {
      h += "<ul class=\"failing\">\n";
      for (const auto& f : answer.failing_checks) h += "<li>" + html_escape(f) + "</li>\n";
      h += "</ul>\n";
    }
  }
  h += "<p>The design:</p>\n<ul>\n";
  for (const auto& l : design_lines(d)) h += "<li>" + html_escape(l) + "</li>\n";
  h += "</ul>\n";
  if (!answer.headline.empty()) {
    h += "<ul>\n";
    for (const auto& l : answer.headline) h += "<li>" + html_escape(l) + "</li>\n";
    h += "</ul>\n";
  }
  h += fmt::format("<p>Design file {}, epoch {}, Earth model {}.</p>\n", html_escape(d.file),
                   format_utc_iso8601(d.epoch, 0), d.earth.name);
  h += "</section>\n";
  for (const auto& w : warnings) h += "<p class=\"caution\">Warning: " + html_escape(w) + "</p>\n";
  h += "<p class=\"caution\">" + html_escape(std::string(caution_text)) + "</p>\n";

  std::vector<ResolvedItem> unplaced;
  const std::vector<ResolvedSection> sections = resolve(tables, figures, unplaced);
  h += "<nav>";
  for (const auto& s : sections)
    if (!s.items.empty() || s.plan->id == "exports")
      h += "<a href=\"#" + s.plan->id + "\">" + html_escape(s.title) + "</a>";
  h += "</nav>\n";
  for (const auto& s : sections) {
    if (s.items.empty() && s.plan->id != "exports") continue;
    h += "<section id=\"" + s.plan->id + "\">\n<h2>" + html_escape(s.title) + "</h2>\n";
    if (s.plan->id == "exports") h += exports_text_html;
    for (const auto& it : s.items) h += html_item(it);
    h += "</section>\n";
  }
  if (!unplaced.empty()) {
    h += "<section id=\"other\">\n<h2>Other tables and figures</h2>\n";
    for (const auto& it : unplaced) h += html_item(it);
    h += "</section>\n";
  }
  return h + "</body>\n</html>\n";
}

std::string summary_markdown(const Design& d, const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                             const std::vector<std::string>& warnings, const ReportAnswer& answer) {
  std::string m = "# " + markdown_escape(d.name) + "\n\n";
  if (!answer.verdict.empty()) {
    m += "**" + markdown_escape(answer.verdict) + "**\n\n";
    for (const auto& f : answer.failing_checks) m += "- failed: " + markdown_escape(f) + "\n";
    if (!answer.failing_checks.empty()) m += "\n";
  }
  m += "The design:\n\n";
  for (const auto& l : design_lines(d)) m += "- " + markdown_escape(l) + "\n";
  m += "\n";
  for (const auto& l : answer.headline) m += "- " + markdown_escape(l) + "\n";
  if (!answer.headline.empty()) m += "\n";
  m += fmt::format("Design file {}, epoch {}, Earth model {} ({}).\n\n", markdown_escape(d.file),
                   format_utc_iso8601(d.epoch, 0), d.earth.name, d.earth.source);
  for (const auto& w : warnings) m += "> **Warning.** " + markdown_escape(w) + "\n\n";
  m += "> **Caution.** " + std::string(caution_text) + "\n\n";
  std::vector<ResolvedItem> unplaced;
  for (const auto& s : resolve(tables, figures, unplaced)) {
    std::string body;
    for (const auto& it : s.items) body += markdown_item(it);
    if (s.plan->id == "exports") body = exports_text_md;
    if (body.empty()) continue;
    m += "## " + s.title + "\n\n" + body;
  }
  return m;
}

}  // namespace skein
