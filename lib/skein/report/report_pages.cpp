#include "skein/report/report_pages.hpp"

#include <fmt/format.h>

#include "skein/caution.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

std::string html_page(const Design& d, const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                      const std::vector<std::string>& warnings, const std::string& requirement_line) {
  std::string h = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  h += "<title>" + html_escape(d.name) + " - skein report</title>\n";
  h += "<style>\nbody{font-family:'DejaVu Sans',Arial,sans-serif;margin:2em auto;max-width:1100px;color:#1b2a49}\n"
       "table{border-collapse:collapse;margin:1em 0;font-size:13px}caption{text-align:left;font-weight:bold;padding:4px 0}\n"
       "th,td{border:1px solid #c8ccd4;padding:3px 8px}th{background:#eef1f5}td.num{text-align:right}\n"
       ".caution{border-left:4px solid #d1495b;background:#fbeff1;padding:8px 12px}\n"
       "figure{margin:1.5em 0}figcaption{font-size:13px;color:#444}\n</style>\n</head>\n<body>\n";
  h += "<h1>" + html_escape(d.name) + "</h1>\n";
  h += fmt::format("<p>Design file {}, epoch {}, Earth model {}.</p>\n", html_escape(d.file),
                   format_utc_iso8601(d.epoch, 0), d.earth.name);
  h += "<p class=\"caution\">" + html_escape(std::string(caution_text)) + "</p>\n";
  for (const auto& w : warnings) h += "<p class=\"caution\">Warning: " + html_escape(w) + "</p>\n";
  if (!requirement_line.empty()) h += "<p><strong>" + html_escape(requirement_line) + "</strong></p>\n";
  h += "<h2>Tables</h2>\n";
  for (const auto& t : tables) {
    const bool long_table = t.file == "satellites" || t.file == "coverage_points" || t.file == "gap_distribution" ||
                            t.file == "contacts" || t.file == "contact_gaps" || t.file.starts_with("decay_");
    if (long_table) continue;  // in tables/ as CSV and JSON only
    h += render_html(t.table);
  }
  h += "<p>Every table, including the per-satellite and per-point ones, is in <code>tables/</code> as CSV and JSON.</p>\n";
  h += "<h2>Figures</h2>\n";
  for (const auto& f : figures)
    h += "<figure>\n" + f.svg + "<figcaption>" + html_escape(f.caption) + " (plots/" + f.file + ".svg)</figcaption>\n</figure>\n";
  h += "<h2>Exports</h2>\n<p><code>exports/coverage_cells.geojson</code>: per-cell coverage metrics (RFC 7946). "
       "<code>exports/oem/</code>: one CCSDS Orbit Ephemeris Message (KVN) per satellite.</p>\n";
  return h + "</body>\n</html>\n";
}

std::string summary_markdown(const Design& d, const std::vector<NamedTable>& tables, const std::vector<std::string>& warnings,
                             const std::string& requirement_line) {
  std::string m = "# " + markdown_escape(d.name) + "\n\n";
  m += fmt::format("Design file {}, epoch {}, Earth model {} ({}).\n\n", markdown_escape(d.file), format_utc_iso8601(d.epoch, 0),
                   d.earth.name, d.earth.source);
  m += "> **Caution.** " + std::string(caution_text) + "\n\n";
  for (const auto& w : warnings) m += "> **Warning.** " + markdown_escape(w) + "\n\n";
  if (!requirement_line.empty()) m += "**" + markdown_escape(requirement_line) + "**\n\n";
  const char* sections[][2] = {{"coverage_requirement", "Coverage requirement"},
                               {"shells", "Layout"},
                               {"planes", ""},
                               {"drift", "J2 drift"},
                               {"differential_drift", ""},
                               {"beta_eclipse", ""},
                               {"coverage_overview", "Coverage"},
                               {"coverage_folds", ""},
                               {"coverage_sites", ""},
                               {"coverage_bands", ""},
                               {"station_load", "Ground contacts"},
                               {"budget_shells", "Lifetime and delta-v budget"},
                               {"budget_lines", ""},
                               {"lifetime_by_level", ""},
                               {"budget_spread", ""},
                               {"budget_spread_inputs", ""},
                               {"run_record", "How this report was made"}};
  for (const auto& s : sections)
    for (const auto& t : tables)
      if (t.file == s[0]) {
        if (*s[1]) m += std::string("## ") + s[1] + "\n\n";
        m += render_markdown(t.table) + "\n";
      }
  m += "Figures are in `plots/`, all tables as CSV and JSON in `tables/`, exports in `exports/`; open `index.html` "
       "in a browser for everything on one page.\n";
  return m;
}

}  // namespace skein
