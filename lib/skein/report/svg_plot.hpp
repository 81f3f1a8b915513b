#pragma once
// A small SVG plot writer: line/step/point charts, grouped bar charts and longitude-latitude maps with a
// colour scale. Every plot has a title, axis labels with units and a legend. Pure: returns SVG text.
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

// A longitude/latitude map of rectangular cells coloured by value.
struct MapCell {
  double lon_min_deg, lon_max_deg, lat_min_deg, lat_max_deg;
  double value;
};
struct ColourScale {
  double min = 0.0, max = 1.0;
  std::string label;  // with unit, e.g. "time covered (%)"
};
std::string map_svg(const PlotAxes& axes, const std::vector<MapCell>& cells, const ColourScale& scale);

// The colour of a value in [0, 1] on skein's five-stop ramp (navy, steel blue, teal, green, sand), "#rrggbb".
std::string ramp_colour(double fraction);

}  // namespace skein
