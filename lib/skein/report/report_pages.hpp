#pragma once
// The two pages of a report folder that gather its tables: summary.md (Markdown) and index.html (with the
// figures). Pure text builders; build_report (report.hpp) hands them its tables, and the fuzz target
// (fuzz/design_fuzz.cpp) runs them on the layout, drift and budget tables of every design it accepts.
//
// Reading order (both pages): the answer first (the design in one line per shell, the headline coverage and
// budget figures, the requirement's verdict with its failing checks), then the warnings and the caution, then
// one section per concern (layout and drift, coverage, ground contacts when the design has stations, lifetime
// and budget, exports, how the report was made), each figure right after the table it illustrates.
#include <string>
#include <vector>

#include "skein/budget/budget.hpp"
#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"
#include "skein/report/table.hpp"

namespace skein {

struct NamedTable {
  std::string file;  // stem under tables/
  Table table;
};

struct Figure {
  std::string file;  // stem under plots/
  std::string caption;
  std::string svg;
};

// The opening of both pages, as plain text lines (escaped by the page builders).
struct ReportAnswer {
  std::vector<std::string> headline;       // coverage and budget figures, one line each
  std::string verdict;                     // "Requirement at fold k: met (...)" / "... NOT met"; empty: none
  bool verdict_met = false;
  std::vector<std::string> failing_checks; // one line per failed threshold (with the failing sites)
};

// One line per shell: name, pattern with T/P/F, altitude (perigee and apogee when eccentric), inclination,
// and sun-synchronous with the first plane's LTAN.
std::vector<std::string> design_lines(const Design& design);
// The headline figures and the verdict of one coverage result and one budget.
ReportAnswer report_answer(const CoverageResult& coverage, const BudgetResult& budget);

// A section of the pages: a title and, in reading order, the stems of the tables (under tables/) and figures
// (under plots/) it holds; a stem ending in '*' takes every stem with that prefix, in the order given.
struct PageSection {
  std::string id;     // HTML anchor
  std::string title;
  std::vector<std::string> items;  // "table:STEM" or "figure:STEM"
};
// The report's sections. Tables and figures the plan does not name go to a last "Other tables and figures"
// section of the page (so nothing made is lost from it).
const std::vector<PageSection>& page_plan();

// Tables kept out of index.html (one row per satellite, point, contact, decay sample or gap quantile): in
// tables/ as CSV and JSON only, or shown folded (site passes).
bool long_table(const std::string& stem);

// summary.md: the title, the answer, the warnings and caution (escaped), then each section's tables as Markdown
// tables with a line naming each figure's file where it belongs.
std::string summary_markdown(const Design& design, const std::vector<NamedTable>& tables,
                             const std::vector<Figure>& figures, const std::vector<std::string>& warnings,
                             const ReportAnswer& answer = {});

// index.html: the same with every short table as HTML in its own horizontally scrolling box and every figure
// inline right after its table; names and warnings escaped. No script, no network.
std::string html_page(const Design& design, const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                      const std::vector<std::string>& warnings, const ReportAnswer& answer = {});

}  // namespace skein
