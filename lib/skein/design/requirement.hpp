#pragma once
// A coverage requirement as analysts state it: thresholds on coverage figures at a fold k, for the grid as a
// whole or for every site of a site list. Read from a design's coverage block (judged by `skein coverage` and
// the report) and from a sweep file (judged for every layout).
#include <optional>
#include <string_view>
#include <vector>

namespace skein {

// The coverage figure a layout is judged on (and that a sweep's front trades against cost). Every figure is
// taken at the requirement's fold k: covered means at least k satellites in view, and a gap is an interval
// with fewer than k in view.
enum class RequirementFigure {
  percent_covered,        // area-weighted percent of time covered (higher is better)
  worst_instant_percent,  // lowest share of the grid covered at any sample instant (higher is better)
  worst_point_percent,    // percent of time covered at the least-covered point (higher is better)
  max_gap_s,              // the worst point's longest revisit gap (lower is better)
  p95_gap_s,              // 95th percentile of the pooled, area-weighted gap distribution (lower is better)
  mean_response_time_s,   // area-weighted mean wait until the next coverage (lower is better)
  p95_data_age_s          // 95th percentile of the age of the data at downlink (coverage/data_age.hpp; needs
                          // ground stations, any grid; the same at every fold; lower is better)
};
std::string_view to_string(RequirementFigure figure);
std::optional<RequirementFigure> requirement_figure_from_string(std::string_view text);
bool higher_is_better(RequirementFigure figure);
// Every figure, in the order above (for messages and readers).
const std::vector<RequirementFigure>& all_requirement_figures();

// A threshold on one figure: "at least" for higher-is-better figures, "at most" for the others.
struct Threshold {
  RequirementFigure figure = RequirementFigure::percent_covered;
  double value = 0.0;
};

struct Requirement {
  int fold = 1;                       // k (default 1)
  std::vector<Threshold> thresholds;  // all must hold; at least one
  RequirementFigure figure = RequirementFigure::percent_covered;  // a sweep front's performance axis
  // Site grids only: every site must meet each threshold that has a per-site value (percent covered, worst
  // point, max gap, p95 gap, mean response); the worst-instant share stays a whole-grid figure.
  bool every_site = false;
  bool within_tank = false;           // sweeps: also require the propellant to fit spacecraft.propellant_capacity_kg
};

// Whether the requirement judges or trades the age of the data (a threshold or the figure).
bool uses_data_age(const Requirement& r);

}  // namespace skein
