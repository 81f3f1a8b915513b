#pragma once
// A result table: named, typed columns with units, rendered as aligned text, CSV or JSON rows.
// Every command's table output and the report's CSV/JSON files go through this one type.
#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include <nlohmann/json.hpp>

namespace skein {

enum class OutputFormat { table, csv, json };
std::string_view to_string(OutputFormat f);
std::optional<OutputFormat> output_format_from_string(std::string_view text);

struct Column {
  std::string key;      // JSON key and CSV header, e.g. "raan_rate_deg_per_day"
  std::string heading;  // text-table heading, e.g. "node rate"
  std::string unit;     // e.g. "deg/day"; "" for none
  int decimals = 3;     // digits after the point in text and CSV
};

// A cell: a number, a whole number, text, or empty (JSON null; "-" in text; empty in CSV).
using Cell = std::variant<std::monostate, double, long, std::string>;

struct Table {
  std::string title;
  std::vector<Column> columns;
  std::vector<std::vector<Cell>> rows;
  void add_row(std::vector<Cell> row);  // asserts the row has one cell per column
};

// Aligned text with a title line, headings and units.
std::string render_text(const Table& t);
// RFC 4180 CSV with the column keys as header.
std::string render_csv(const Table& t);
// An array of objects keyed by column key; numbers at full double precision.
nlohmann::ordered_json rows_to_json(const Table& t);
// A Markdown (pipe) table with a bold title line; headings carry their units.
std::string render_markdown(const Table& t);
// An HTML <table> with a caption (text escaped).
std::string render_html(const Table& t);
// Escape text for HTML.
std::string html_escape(const std::string& s);
// Text for Markdown, placed after other text on its line (a table cell, a heading, a quoted warning): the
// characters inline Markdown or HTML give a meaning (\ ` * _ [ ] | ~ with a backslash; < > & as entities)
// are made literal, so a name such as "<script>" or "*x*" stays text in summary.md. Line-start markers
// (# - + digits) need no escape there, and names never hold line breaks (the reader refuses them).
std::string markdown_escape(const std::string& s);
// A CSV text cell that starts with = + - @ (or a tab or carriage return) would run as a formula in a
// spreadsheet: such cells get a leading single quote (the OWASP "CSV injection" advice). Numbers are not
// text cells and keep their sign.
std::string csv_neutralise(const std::string& s);
// Render in the given format; JSON is {"title": ..., "rows": [...]}.
std::string render(const Table& t, OutputFormat f);

// Format a number with fixed decimals; "-" for a non-finite value is never produced: non-finite asserts.
std::string format_fixed(double v, int decimals);

}  // namespace skein
