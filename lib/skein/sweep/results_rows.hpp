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

// The columns of a results row (the final results file adds the "front" column).
std::vector<Column> sweep_columns(const Sweep& sweep);

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

}  // namespace skein
