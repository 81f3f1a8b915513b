#include "skein/report/table.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

namespace skein {

std::string_view to_string(OutputFormat f) {
  switch (f) {
    case OutputFormat::table: return "table";
    case OutputFormat::csv: return "csv";
    case OutputFormat::json: return "json";
  }
  return "table";
}

std::optional<OutputFormat> output_format_from_string(std::string_view text) {
  for (auto f : {OutputFormat::table, OutputFormat::csv, OutputFormat::json})
    if (to_string(f) == text) return f;
  return std::nullopt;
}

void Table::add_row(std::vector<Cell> row) {
  assert(row.size() == columns.size());
  rows.push_back(std::move(row));
}

std::string format_fixed(double v, int decimals) {
  assert(std::isfinite(v));
  std::string s = fmt::format("{:.{}f}", v, decimals);
  if (s.starts_with("-") && s.find_first_not_of("-0.") == std::string::npos) s.erase(0, 1);  // no "-0.000"
  return s;
}

namespace {

std::string cell_text(const Cell& c, const Column& col, bool csv) {
  if (std::holds_alternative<std::monostate>(c)) return csv ? "" : "-";
  if (const double* d = std::get_if<double>(&c)) return format_fixed(*d, col.decimals);
  if (const long* l = std::get_if<long>(&c)) return std::to_string(*l);
  return std::get<std::string>(c);
}

std::string csv_escape(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char ch : s) {
    if (ch == '"') out += '"';
    out += ch;
  }
  return out + "\"";
}

}  // namespace

std::string render_text(const Table& t) {
  const size_t n = t.columns.size();
  std::vector<std::string> head(n), unit(n);
  std::vector<size_t> width(n);
  std::vector<bool> numeric(n, false);
  for (size_t j = 0; j < n; ++j) {
    head[j] = t.columns[j].heading;
    unit[j] = t.columns[j].unit.empty() ? "" : "(" + t.columns[j].unit + ")";
    width[j] = std::max(head[j].size(), unit[j].size());
  }
  std::vector<std::vector<std::string>> cells;
  for (const auto& row : t.rows) {
    std::vector<std::string> r(n);
    for (size_t j = 0; j < n; ++j) {
      r[j] = cell_text(row[j], t.columns[j], false);
      width[j] = std::max(width[j], r[j].size());
      if (!std::holds_alternative<std::string>(row[j])) numeric[j] = true;
    }
    cells.push_back(std::move(r));
  }
  auto line = [&](const std::vector<std::string>& r) {
    std::string out;
    for (size_t j = 0; j < n; ++j) {
      if (j) out += "  ";
      out += numeric[j] ? fmt::format("{:>{}}", r[j], width[j]) : fmt::format("{:<{}}", r[j], width[j]);
    }
    while (!out.empty() && out.back() == ' ') out.pop_back();
    return out + "\n";
  };
  std::string out;
  if (!t.title.empty()) out += t.title + "\n";
  out += line(head);
  bool any_unit = std::any_of(unit.begin(), unit.end(), [](const std::string& u) { return !u.empty(); });
  if (any_unit) out += line(unit);
  size_t total = 0;
  for (size_t j = 0; j < n; ++j) total += width[j] + (j ? 2 : 0);
  out += std::string(total, '-') + "\n";
  for (const auto& r : cells) out += line(r);
  return out;
}

std::string render_csv(const Table& t) {
  std::string out;
  for (size_t j = 0; j < t.columns.size(); ++j) out += (j ? "," : "") + csv_escape(t.columns[j].key);
  out += "\n";
  for (const auto& row : t.rows) {
    for (size_t j = 0; j < row.size(); ++j) {
      const std::string text = cell_text(row[j], t.columns[j], true);
      out += (j ? "," : "") + csv_escape(std::holds_alternative<std::string>(row[j]) ? csv_neutralise(text) : text);
    }
    out += "\n";
  }
  return out;
}

nlohmann::ordered_json rows_to_json(const Table& t) {
  nlohmann::ordered_json arr = nlohmann::ordered_json::array();
  for (const auto& row : t.rows) {
    nlohmann::ordered_json o = nlohmann::ordered_json::object();
    for (size_t j = 0; j < row.size(); ++j) {
      const Cell& c = row[j];
      const std::string& k = t.columns[j].key;
      if (std::holds_alternative<std::monostate>(c)) o[k] = nullptr;
      else if (const double* d = std::get_if<double>(&c)) { assert(std::isfinite(*d)); o[k] = *d; }
      else if (const long* l = std::get_if<long>(&c)) o[k] = *l;
      else o[k] = std::get<std::string>(c);
    }
    arr.push_back(std::move(o));
  }
  return arr;
}

namespace {
std::string heading_with_unit(const Column& c) { return c.unit.empty() ? c.heading : c.heading + " (" + c.unit + ")"; }
}  // namespace

std::string html_escape(const std::string& s) {
  std::string out;
  for (char ch : s) {
    switch (ch) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += ch;
    }
  }
  return out;
}

std::string markdown_escape(const std::string& s) {
  std::string out;
  for (char ch : s) {
    switch (ch) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '\\': case '`': case '*': case '_': case '[': case ']': case '|': case '~':
        out += '\\';
        out += ch;
        break;
      default: out += ch;
    }
  }
  return out;
}

std::string csv_neutralise(const std::string& s) {
  if (!s.empty() && (s[0] == '=' || s[0] == '+' || s[0] == '-' || s[0] == '@' || s[0] == '\t' || s[0] == '\r'))
    return "'" + s;
  return s;
}

std::string render_markdown(const Table& t) {
  std::string out;
  if (!t.title.empty()) out += "**" + markdown_escape(t.title) + "**\n\n";
  out += "|";
  for (const auto& c : t.columns) out += " " + heading_with_unit(c) + " |";
  out += "\n|";
  for (size_t j = 0; j < t.columns.size(); ++j) out += std::holds_alternative<std::string>(t.rows.empty() ? Cell() : t.rows[0][j]) ? " --- |" : " ---: |";
  out += "\n";
  for (const auto& row : t.rows) {
    out += "|";
    for (size_t j = 0; j < row.size(); ++j) {
      // Numbers are written as they are; text (names from input among them) is escaped.
      const std::string cell = cell_text(row[j], t.columns[j], false);
      out += " " + (std::holds_alternative<std::string>(row[j]) ? markdown_escape(cell) : cell) + " |";
    }
    out += "\n";
  }
  return out;
}

std::string render_html(const Table& t) {
  std::string out = "<table>\n";
  if (!t.title.empty()) out += "<caption>" + html_escape(t.title) + "</caption>\n";
  out += "<thead><tr>";
  for (const auto& c : t.columns) out += "<th>" + html_escape(heading_with_unit(c)) + "</th>";
  out += "</tr></thead>\n<tbody>\n";
  for (const auto& row : t.rows) {
    out += "<tr>";
    for (size_t j = 0; j < row.size(); ++j) {
      const bool num = !std::holds_alternative<std::string>(row[j]);
      out += std::string(num ? "<td class=\"num\">" : "<td>") + html_escape(cell_text(row[j], t.columns[j], false)) + "</td>";
    }
    out += "</tr>\n";
  }
  return out + "</tbody>\n</table>\n";
}

std::string render(const Table& t, OutputFormat f) {
  switch (f) {
    case OutputFormat::table: return render_text(t);
    case OutputFormat::csv: return render_csv(t);
    case OutputFormat::json: {
      nlohmann::ordered_json j;
      j["title"] = t.title;
      j["rows"] = rows_to_json(t);
      return j.dump(2) + "\n";
    }
  }
  return {};
}

}  // namespace skein
