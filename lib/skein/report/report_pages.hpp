#pragma once
// The two pages of a report folder that gather its tables: summary.md (Markdown) and index.html (with the
// figures). Pure text builders; build_report (report.hpp) hands them its tables, and the fuzz target
// (fuzz/design_fuzz.cpp) runs them on the layout, drift and budget tables of every design it accepts.
#include <string>
#include <vector>

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

// summary.md: the design line, the caution and every warning (escaped), the coverage requirement's verdict line
// (when not empty), then the requirement, layout, drift, coverage and budget tables among `tables` (by file
// stem) as Markdown tables. Tables it does not know are left out.
std::string summary_markdown(const Design& design, const std::vector<NamedTable>& tables,
                             const std::vector<std::string>& warnings, const std::string& requirement_line = {});

// index.html: the same, with every short table as HTML and every figure inline; names and warnings escaped.
std::string html_page(const Design& design, const std::vector<NamedTable>& tables, const std::vector<Figure>& figures,
                      const std::vector<std::string>& warnings, const std::string& requirement_line = {});

}  // namespace skein
