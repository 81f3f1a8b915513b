#pragma once
// The report's figures, each built from result structs into SVG text.
#include <optional>
#include <string>

#include "skein/budget/budget.hpp"
#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"
#include "skein/drift/beta_eclipse.hpp"
#include "skein/report/land_outlines.hpp"

namespace skein {

// What every map needs besides its data: the land outlines, or why they are missing.
struct MapContext {
  const LandOutlines* land = nullptr;
  std::string land_note;  // used when land is null
};

// Maps (map_plot.hpp): world maps for global and band grids, a view zoomed to the region (with its outline) for
// region grids. Values and units as in the tables. With a coverage requirement that holds a threshold on the
// mapped figure, the map shows that figure at the requirement's fold on a diverging ramp centred on the
// threshold; otherwise fold 1 on the sequential ramp (the better end dark blue on every map).
// Percent of time covered per grid cell. Requires cell bounds.
std::string coverage_map_svg(const Design& d, const CoverageResult& r, const MapContext& m);
// Longest revisit gap per grid cell (s).
std::string max_gap_map_svg(const Design& d, const CoverageResult& r, const MapContext& m);
// The p95 age of the data per grid cell (s), cells without a downlinked observation blank. Requires data age.
std::string data_age_map_svg(const Design& d, const CoverageResult& r, const MapContext& m);
// Site grids: every site marked and named, coloured by its percent of time covered.
std::string sites_map_svg(const Design& d, const CoverageResult& r, const MapContext& m);
// Percent covered against latitude (band aggregates), one series per fold.
std::string coverage_by_latitude_svg(const CoverageResult& r);
// Share of time and area with n satellites in view.
std::string in_view_histogram_svg(const CoverageResult& r);
// Cumulative distribution of revisit gap durations, minutes.
std::string gap_cdf_svg(const CoverageResult& r);
// Delta-v per satellite, by budget line, one group per shell.
std::string dv_budget_svg(const BudgetResult& b);
// Mean altitude of one shell against time under each solar level (one series per level).
std::string decay_curves_svg(const ShellBudget& shell, double earth_radius_km);
// The layout on a world map: one orbit of the first satellite of every plane (one colour per plane, at most
// max_track_planes planes, evenly chosen) and, at the epoch, the footprint circle of every satellite (central
// angle from the coverage's elevation mask and payload cone, coverage/ground_geometry.hpp).
inline constexpr size_t max_track_planes = 12;
std::string ground_track_svg(const Design& d, double min_elevation_deg, std::optional<double> nadir_half_angle_deg,
                             const MapContext& m);
// Beta angle (deg) and eclipse minutes per orbit against days from the epoch, one series per plane (at most
// max_beta_eclipse_series planes, evenly chosen, when there are more: the legend's room).
inline constexpr size_t max_beta_eclipse_series = 8;
std::string beta_angle_svg(const BetaEclipseResult& r);
std::string eclipse_minutes_svg(const BetaEclipseResult& r);

}  // namespace skein
