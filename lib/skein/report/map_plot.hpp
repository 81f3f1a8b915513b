#pragma once
// Longitude/latitude maps for the report: equirectangular (plate carree: one degree of longitude as wide as one
// of latitude), world maps 2:1 with 30 deg ticks, or a view zoomed to a region with a margin. Layers, bottom to
// top: land (filled when no cells are drawn), value cells, land outlines, the region outline, traces (ground
// tracks and footprint circles), site markers with their names. Under the map: the colour key (a bar with
// its unit, the "better" and "worse" ends named, and the requirement's threshold when one is given), the
// traces' legend, and a line naming the land outlines' source or saying that they are missing. Every text's
// room is sized from the text (text_extent.hpp), so nothing is clipped. Pure: returns SVG text.
#include <optional>
#include <string>
#include <vector>

#include "skein/report/colour_ramp.hpp"
#include "skein/report/land_outlines.hpp"
#include "skein/report/svg_plot.hpp"

namespace skein {

struct MapView {
  double lon_min_deg = -180.0, lon_max_deg = 180.0;  // lon_max - lon_min <= 360; may run past 180 (drawn unwrapped)
  double lat_min_deg = -90.0, lat_max_deg = 90.0;
  double tick_deg = 30.0;
};
MapView world_view();
// The box round `points` (longitudes taken the short way round, so a set crossing the antimeridian stays
// together) widened on each side by `margin_share` of its span and at least `min_margin_deg`, and held inside
// the world; ticks every 1, 2, 5, 10, 15 or 30 deg, the finest giving at most 8 ticks along the wider side.
MapView zoomed_view(const std::vector<LonLat>& points, double margin_share = 0.15, double min_margin_deg = 2.0);

// How values map to colours (colour_ramp.hpp): a sequential ramp over [min, max] with the better end dark blue,
// or, with a threshold, a diverging ramp pale at the threshold, blue on its meeting side, each arm spanning its
// side of [min, max] (so the two arms may have different scales; the bar under the map shows them).
struct ColourKey {
  std::string label;        // with unit, e.g. "time covered, fold 1 (%)"
  double min = 0.0, max = 1.0;
  bool higher_is_better = true;
  std::optional<double> threshold;  // the requirement's value
  std::string threshold_label;      // e.g. "required: at least 40"
};
Rgb key_colour(const ColourKey& key, double value);

struct MapSite {
  LonLat at;
  std::string name;
  std::optional<double> value;  // coloured by the key when given
};

struct MapTrace {
  std::vector<LonLat> points;  // a polyline; broken where consecutive longitudes jump by more than 180 deg
  size_t colour = 0;           // index into the series palette
  bool thin = false;           // footprint circles: thin, dashed
};

struct MapFigure {
  std::string id;     // unique within a page (clip-path ids), letters, digits and '_'
  std::string title;
  MapView view;
  std::vector<MapCell> cells;
  std::optional<ColourKey> key;
  std::vector<Ring> outlines;  // e.g. the region's polygon
  std::vector<MapSite> sites;
  std::vector<MapTrace> traces;
  std::vector<std::string> trace_legend;  // label of palette colour k (solid line) ...
  std::string thin_trace_legend;          // ... and of the thin traces, when any
  const LandOutlines* land = nullptr;
  std::string land_note;  // shown when land is null: why the outlines are missing
};

std::string map_figure_svg(const MapFigure& figure);

// The land credit line printed under maps drawn with outlines.
inline constexpr const char* land_credit = "land: Natural Earth (public domain), 1:110m, via the world-atlas package";

}  // namespace skein
