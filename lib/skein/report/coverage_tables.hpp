#pragma once
#include <string>
#include <string_view>
// Tables of coverage results, shared by `skein coverage` and the report folder.
#include "skein/coverage/result.hpp"
#include "skein/coverage/site_passes.hpp"
#include "skein/time/epoch.hpp"
#include "skein/report/table.hpp"

namespace skein {

// A title for lit coverage (the daylight mask): "Lit " and the title with its first letter lowered, as every
// coverage table and plot title reads with the mask. The title must not be empty.
std::string lit_title_text(const std::string& title);

// One row: grid points and the area-weighted whole-grid figures.
Table coverage_overview_table(const CoverageResult& r);
// One row per fold k = 1..K: percent of time covered, worst instantaneous covered area, the least-covered
// point, revisit gaps at fold k (fewer than k in view), mean response and required radius.
Table coverage_fold_table(const CoverageResult& r);
// One row per threshold of the design's coverage requirement (no rows without one): the value judged, whether
// it is met, and with every_site the sites that fail.
Table coverage_requirement_table(const CoverageResult& r);
// "Requirement at fold k: met (...)" or "... NOT met; <failed checks>"; empty without a requirement.
std::string coverage_requirement_line(const CoverageResult& r);
// One row per latitude band holding points.
Table coverage_band_table(const CoverageResult& r);
// One row per grid point, with its cell bounds (for maps and GeoJSON cells).
// The first columns of the per-point CSV (`coverage --points FILE`): how skein recognises a points file it
// wrote before and may replace.
inline constexpr std::string_view point_table_csv_signature = "name,lat_deg,lon_deg,height_km,area_weight,cell_lat_min_deg,";
Table coverage_point_table(const CoverageResult& r);
// One row per site (site grids): percent covered at each fold, max and mean gap, mean response, passes per day
// and mean pass length (the in-view time summed over satellites, over the passes; passes cut by the span's
// ends count, so the mean is a slight underestimate for short spans).
Table coverage_site_table(const CoverageResult& r);
// One row per pass of a site grid (find_site_passes), by site then rise: the site, the satellite, rise and set
// (UTC and seconds from the epoch), duration and maximum elevation with its time.
Table site_pass_table(const CoverageResult& r, const std::vector<SitePass>& passes, const UtcEpoch& epoch);
// The time- and area-weighted distribution of the number of satellites in view.
Table in_view_distribution_table(const CoverageResult& r);
// Quantiles 0..100 % of the pooled, area-weighted revisit-gap distribution (a CDF).
Table gap_distribution_table(const CoverageResult& r);

// The whole coverage result as the JSON `skein coverage --format json` prints (keys in a fixed order).
nlohmann::ordered_json coverage_json(const CoverageResult& result);
// Age of the data (designs with ground stations; no rows otherwise): passes (lit passes with the daylight mask),
// censored ones, mean, p95 and max age (coverage/data_age.hpp). Sites: one row per site, then the weighted
// total. Cells: the area-weighted total, then the data_age_worst_cells cells of largest p95 (where the data waits
// longest; every cell is on the report's data-age map).
constexpr size_t data_age_worst_cells = 20;
Table data_age_table(const CoverageResult& r);
// A figure caption or section heading about coverage, marked "Lit coverage (...)" when the daylight mask is set
// (coverage.min_sun_elevation_deg); unchanged otherwise.
std::string lit_caption(const CoverageResult& r, const std::string& caption);

// One line on the passes found between sample instants and the path error bound behind them.
std::string coverage_between_instants_note(const CoverageResult& result);

}  // namespace skein
