// Evidence that every figure's text fits inside the figure (issue: clipped legends such as "area-weighte").
// Each <text> element of the SVG skein writes is measured with the estimate of text_extent.hpp (an upper
// bound on DejaVu Sans advance widths, read from the font's metrics) and its anchor, font size and rotation,
// and its box must lie inside the root <svg>'s width and height. The figures checked are those of whole
// reports: the global-grid example (designs/small.yaml), the sites example (designs/harbour-watch.yaml, with a
// requirement: diverging key and its threshold label), the region example with data age and daylight
// (designs/fathom-relay.yaml: the data-age map, lit titles) and a region design, with and without land outlines,
// and scatter plots with long labels. The parser is checked to fail on a label past the edge.
#include <doctest/doctest.h>

#include <filesystem>
#include <regex>
#include <string>

#include "skein/input/design_file.hpp"
#include "skein/report/map_plot.hpp"
#include "skein/report/report.hpp"
#include "skein/report/svg_plot.hpp"
#include "skein/report/text_extent.hpp"

using namespace skein;

namespace {

std::string attr(const std::string& tag, const std::string& name) {
  const std::regex re("\\s" + name + "=\"([^\"]*)\"");
  std::smatch m;
  return std::regex_search(tag, m, re) ? m[1].str() : std::string();
}

std::string unescape(std::string s) {
  for (auto [from, to] : {std::pair{"&lt;", "<"}, {"&gt;", ">"}, {"&quot;", "\""}, {"&#39;", "'"}, {"&amp;", "&"}}) {
    size_t p = 0;
    while ((p = s.find(from, p)) != std::string::npos) {
      s.replace(p, std::string(from).size(), to);
      p += std::string(to).size();
    }
  }
  return s;
}

// The labels whose estimated box crosses the figure's edge ("" when none).
std::string labels_outside(const std::string& svg) {
  std::smatch root;
  REQUIRE(std::regex_search(svg, root, std::regex("<svg[^>]*>")));
  const double width = std::stod(attr(root[0].str(), "width")), height = std::stod(attr(root[0].str(), "height"));
  const std::string fs_root = attr(root[0].str(), "font-size");
  const double root_font = fs_root.empty() ? 16.0 : std::stod(fs_root);
  std::string bad;
  const std::regex text_re("<text([^>]*)>([^<]*)</text>");
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), text_re); it != std::sregex_iterator(); ++it) {
    const std::string tag = (*it)[1].str(), content = unescape((*it)[2].str());
    const double x = std::stod(attr(tag, "x")), y = std::stod(attr(tag, "y"));
    const std::string fs = attr(tag, "font-size"), anchor = attr(tag, "text-anchor");
    const double font = fs.empty() ? root_font : std::stod(fs);
    const double w = text_width_px(content, font, attr(tag, "font-weight") == "bold");
    double x0 = anchor == "middle" ? x - w / 2 : anchor == "end" ? x - w : x, x1 = x0 + w;
    double y0 = y - text_ascent_em * font, y1 = y + text_descent_em * font;
    const std::string tr = attr(tag, "transform");
    if (!tr.empty()) {
      // Only rotate(-90 cx cy) is written: (dx, dy) about the centre becomes (dy, -dx).
      std::smatch m;
      REQUIRE(std::regex_match(tr, m, std::regex("rotate\\(-90 ([-0-9.]+) ([-0-9.]+)\\)")));
      const double cx = std::stod(m[1].str()), cy = std::stod(m[2].str());
      const double nx0 = cx + (y0 - cy), nx1 = cx + (y1 - cy), ny0 = cy - (x1 - cx), ny1 = cy - (x0 - cx);
      x0 = nx0; x1 = nx1; y0 = ny0; y1 = ny1;
    }
    if (x0 < 0 || y0 < 0 || x1 > width || y1 > height)
      bad += "'" + content + "' [" + std::to_string(x0) + ", " + std::to_string(x1) + "] x [" + std::to_string(y0) + ", " +
             std::to_string(y1) + "] in " + std::to_string(width) + " x " + std::to_string(height) + "\n";
  }
  return bad;
}

void check_report_figures(const Design& d, const ReportOptions& o) {
  const Report r = build_report(d, o);
  int figures = 0;
  for (const auto& f : r.files)
    if (f.relative_path.size() > 4 && f.relative_path.substr(f.relative_path.size() - 4) == ".svg") {
      ++figures;
      INFO(d.name << ": " << f.relative_path);
      CHECK(labels_outside(f.content) == "");
    }
  CHECK(figures >= 5);
}

std::string land_path() {
  return std::string(SKEIN_SOURCE_DIR) + "/third_party/world-atlas/node_modules/world-atlas/land-110m.json";
}

}  // namespace

TEST_CASE("figure text: the check finds a label past the figure's edge, and a rotated one past the top") {
  const std::string svg = "<svg width=\"100\" height=\"50\" font-size=\"12\">"
                          "<text x=\"60\" y=\"20\">long label here</text><text x=\"10\" y=\"30\">ok</text></svg>";
  CHECK(labels_outside(svg).find("long label here") != std::string::npos);
  CHECK(labels_outside(svg).find("ok") == std::string::npos);
  const std::string rotated = "<svg width=\"100\" height=\"50\" font-size=\"12\"><text x=\"20\" y=\"25\" "
                              "text-anchor=\"middle\" transform=\"rotate(-90 20 25)\">a rotated label</text></svg>";
  CHECK(labels_outside(rotated) != "");
}

TEST_CASE("figure text: every label of every report figure fits its figure, with and without land outlines") {
  ReportOptions with_land, without;
  with_land.creation_date = without.creation_date = "2027-01-01T00:00:00.000";
  if (std::filesystem::exists(land_path())) {
    LandOutlineLoad l = load_land_outlines(land_path());
    with_land.land = std::move(l.outlines);
    with_land.land_note = l.note;
  }
  without.land_note = load_land_outlines("/nonexistent/land-110m.json").note;
  // fathom-relay: a region with stations and daylight, so the data-age map (threshold key) and lit titles.
  for (const char* name : {"small", "harbour-watch", "fathom-relay"}) {
    const Design d = read_design_file(std::string(SKEIN_SOURCE_DIR) + "/designs/" + name + ".yaml");
    check_report_figures(d, with_land);
    check_report_figures(d, without);
  }
  // A region (invented: a sea area of the "Cinder Strait" patrol) with a long design name and a requirement
  // on the longest gap, so the gap map's key carries a threshold.
  const Design region = read_design_text(
      "name: Cinder Strait patrol, a deliberately long design name for titles\nepoch: 2027-03-01T00:00:00Z\n"
      "spacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n  drag_coefficient: 2.2\n"
      "shells:\n  - name: a\n    pattern: walker-delta\n    satellites: 6\n    planes: 3\n    phasing: 1\n"
      "    altitude_km: 700\n    inclination_deg: 60\n"
      "coverage:\n  grid:\n    kind: region\n    spacing_deg: 1\n    vertices:\n      - [10, 50]\n      - [24, 52]\n"
      "      - [30, 60]\n      - [18, 66]\n  span_h: 6\n  requirement:\n    max_gap_s: 3600\n",
      "region.yaml");
  check_report_figures(region, with_land);
}

TEST_CASE("figure text: maps say when the land outlines are missing, and credit them when drawn") {
  MapFigure m;
  m.id = "t";
  m.title = "t";
  m.land_note = "land outlines missing: no file at /x";
  CHECK(map_figure_svg(m).find("land outlines missing: no file at /x") != std::string::npos);
  if (!std::filesystem::exists(land_path())) return;
  const LandOutlineLoad l = load_land_outlines(land_path());
  m.land = &*l.outlines;
  const std::string svg = map_figure_svg(m);
  CHECK(svg.find(land_credit) != std::string::npos);
  CHECK(svg.find("land outlines missing") == std::string::npos);
  // A world map: plot area 720 x 360 px (2:1), ticks every 30 deg: 13 longitudes and 7 latitudes labelled.
  CHECK(svg.find("width=\"720.0\" height=\"360.0\"") != std::string::npos);
  for (const char* t : {">-180<", ">-150<", ">150<", ">180<", ">-90<", ">60<", ">90<"}) CHECK(svg.find(t) != std::string::npos);
  CHECK(labels_outside(svg) == "");
}

TEST_CASE("figure text: scatter plots size their legend column from the text, and count axes get whole-number ticks") {
  ScatterPlot p;
  p.axes = {"A title that is long enough to need more than the plot's width of five hundred pixels, surely",
            "satellites in the design", "time covered, fold 2 (%)"};
  p.axes.x_integer = true;
  for (int k = 0; k < 5; ++k)
    p.points.push_back({18.0 + k * 3.0, 40.0 + k, k % 2 ? MarkerShape::cross : MarkerShape::circle, "#2f6690",
                        "T/P/F 24/4/1 at 550 km, a long label"});
  p.legend = {{"meets the requirement, a long legend entry", MarkerShape::circle, "#2f6690"}};
  p.references = {{42.0, "requirement: at least 42 %"}};
  p.colour_key = ScatterColourKey{"fleet delta-v, a long key label (m/s)", 0.0, 100.0, {"#ffffff", "#000000"}};
  const std::string svg = scatter_svg(p);
  CHECK(labels_outside(svg) == "");
  // x ticks: 18 to 30 satellites, six ticks wanted: a step of 2.5 would give 22.5; whole numbers only.
  const std::regex tick("text-anchor=\"middle\">([0-9.]+)</text>");
  int ticks = 0;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), tick); it != std::sregex_iterator(); ++it, ++ticks)
    CHECK((*it)[1].str().find('.') == std::string::npos);
  CHECK(ticks >= 3);
}
