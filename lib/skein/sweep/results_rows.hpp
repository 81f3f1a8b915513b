#pragma once
// The sweep's results table: one row per layout, in layout order. A row is kept between runs (journal, MPI
// messages) as its cells encoded as a compact JSON array, which round-trips every number exactly.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/report/table.hpp"
#include "skein/sweep/evaluate_layout.hpp"

namespace skein {

// The columns of a results row (the final results file adds the two front columns). The leading ones say which
// layout the row is (layout_columns); the rest are its figures.
std::vector<Column> sweep_columns(const Sweep& sweep);

// The columns that name a layout, and a layout's cells in them: the index, then each varied shell's T, P, F,
// pattern (when the file varies it), altitude, inclination, SSO and LTAN (keys prefixed "SHELL." when several
// shells are varied), then the elevation mask and each design-wide axis the file gives.
std::vector<Column> layout_columns(const Sweep& sweep);
std::vector<Cell> layout_cells(const Sweep& sweep, const Layout& layout);
// True when `cells` (a decoded row) is a row of `layout`: its leading cells equal layout_cells exactly.
bool row_is_layout(const Sweep& sweep, const Layout& layout, const std::vector<Cell>& cells);

// The shorter form the front tables use: the index, "T/P/F" of each varied shell, each varied shell's altitude,
// inclination and LTAN (and pattern when varied), the elevation mask and each design-wide axis the file gives.
std::vector<Column> front_layout_columns(const Sweep& sweep);
std::vector<Cell> front_layout_cells(const Sweep& sweep, const Layout& layout);

// The cells of one layout's row.
std::vector<Cell> layout_row(const Sweep& sweep, const Layout& layout, const LayoutMetrics& metrics);

// Encode cells as a JSON array on one line (no newline); decode it back, nullopt when the text is not an array
// of `columns` cells of the allowed kinds.
std::string encode_row(const std::vector<Cell>& cells);
std::optional<std::vector<Cell>> decode_row(std::string_view text, size_t columns);

// What the front and the summary need from a row.
struct RowSummary {
  size_t layout = 0;
  bool evaluated = false;
  bool meets = false;
  double figure = 0.0;             // requirement.figure's value
  std::vector<double> costs;       // one per sweep.costs
};
RowSummary summarize_row(const Sweep& sweep, const std::vector<Cell>& cells);

// A layout's costs, one per sweep.costs, from its metrics (the count and budget figures suffice): the values
// summarize_row reads back from the layout's row (a cost with no value, a propellant without isp_s, is 0).
std::vector<double> cost_values(const Sweep& sweep, const LayoutMetrics& metrics);

}  // namespace skein
