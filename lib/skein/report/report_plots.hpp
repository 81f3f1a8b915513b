#pragma once
// The report's figures, each built from result structs into SVG text.
#include <string>

#include "skein/budget/budget.hpp"
#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"
#include "skein/drift/beta_eclipse.hpp"

namespace skein {

// Percent of time covered (fold 1) per grid cell, on a longitude/latitude map. Requires cell bounds.
std::string coverage_map_svg(const CoverageResult& r);
// Longest revisit gap per grid cell, minutes.
std::string max_gap_map_svg(const CoverageResult& r);
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
// Sub-satellite tracks of the first plane of the first shell over one day.
std::string ground_track_svg(const Design& d);
// Beta angle (deg) and eclipse minutes per orbit against days from the epoch, one series per plane (at most
// max_beta_eclipse_series planes, evenly chosen, when there are more: the legend's room).
inline constexpr size_t max_beta_eclipse_series = 8;
std::string beta_angle_svg(const BetaEclipseResult& r);
std::string eclipse_minutes_svg(const BetaEclipseResult& r);

}  // namespace skein
