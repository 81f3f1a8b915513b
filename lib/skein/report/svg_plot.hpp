#pragma once
// A small SVG plot writer: line/step/point charts, grouped bar charts and scatter plots. Every plot has a title,
// axis labels with units and a legend; margins and the legend column are sized from their text
// (text_extent.hpp), so no label is clipped. Maps are in map_plot.hpp. Pure: returns SVG text.
#include <optional>
#include <string>
#include <vector>

namespace skein {

enum class SeriesStyle { line, step, points };

struct Series {
  std::string label{};        // legend entry
  std::vector<double> x{}, y{};  // same length; a NaN in y breaks a line (used for antimeridian crossings)
  SeriesStyle style = SeriesStyle::line;
};

struct PlotAxes {
  std::string title;
  std::string x_label;  // with unit, e.g. "latitude (deg)"
  std::string y_label;
  std::optional<double> x_min{}, x_max{}, y_min{}, y_max{};  // fixed ranges; otherwise from the data
  bool x_integer = false, y_integer = false;  // counts: ticks at whole numbers only
};

// A chart of one or more series.
std::string line_plot_svg(const PlotAxes& axes, const std::vector<Series>& series);

// Grouped bars: one group per category, one bar per series value in it.
struct BarGroup {
  std::string category;
  std::vector<double> values;  // one per series label
};
std::string bar_chart_svg(const PlotAxes& axes, const std::vector<std::string>& series_labels,
                          const std::vector<BarGroup>& groups);

// A rectangular longitude/latitude cell coloured by value (drawn by map_plot.hpp).
struct MapCell {
  double lon_min_deg, lon_max_deg, lat_min_deg, lat_max_deg;
  double value;
};

// The colour of series k of a plot's legend, "#rrggbb" (eight colours, then repeated).
std::string series_colour(size_t k);

// A scatter plot of marked points: each point has a marker shape, a fill (given), an optional label drawn beside
// it, and belongs to a legend class; optional horizontal reference lines (e.g. a requirement threshold) and
// polylines through chosen points (e.g. a Pareto front).
enum class MarkerShape { circle, cross, square, diamond };
struct ScatterPoint {
  double x = 0.0, y = 0.0;
  MarkerShape shape = MarkerShape::circle;
  std::string fill;   // "#rrggbb"
  std::string label;  // "" for none
  size_t label_rank = 0;  // labels are placed lowest rank first (a crowded label may be left out)
};
struct ScatterLegendEntry {
  std::string label;
  MarkerShape shape = MarkerShape::circle;
  std::string fill;
};
struct ReferenceLine {
  double y = 0.0;
  std::string label;  // drawn above the line, at the right end
};
struct ScatterPolyline {
  std::string label;  // legend entry
  std::vector<double> x, y;
  std::string colour;
  bool dashed = false;
};
// A continuous colour key of the points' fills (e.g. a second cost), drawn as a vertical bar in the legend.
struct ScatterColourKey {
  std::string label;  // with unit
  double min = 0.0, max = 1.0;
  std::vector<std::string> colours;  // fills from min to max, evenly spaced
};
struct ScatterPlot {
  PlotAxes axes;
  std::vector<ScatterPoint> points;
  std::vector<ScatterLegendEntry> legend;
  std::vector<ReferenceLine> references;
  std::vector<ScatterPolyline> lines;
  std::optional<ScatterColourKey> colour_key;
};
std::string scatter_svg(const ScatterPlot& plot);

}  // namespace skein
