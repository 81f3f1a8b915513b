#pragma once
// The reader of a `requirement` block, shared by a design's coverage block and a sweep file, at the input edge.
// Throws InputError naming file:line:column, the YAML path and what was expected.
#include <functional>
#include <optional>
#include <string>

#include "skein/design/requirement.hpp"

namespace skein::yaml {
class MapReader;
}

namespace skein {

struct RequirementReadOptions {
  bool allow_within_tank = false;  // sweeps only (a budget condition)
  bool has_tank = false;           // spacecraft.isp_s and propellant_capacity_kg are given
  bool sites_grid = false;         // the grid is a list of sites (every_site allowed)
  bool has_ground_stations = false;  // the design lists ground stations (data-age thresholds allowed)
  bool has_payload_cone = false;     // the coverage block sets nadir_half_angle_deg (no data age)
  // A problem with the fold (e.g. above every layout's satellite count), said at the fold's position; nullopt
  // when the fold is fine.
  std::function<std::optional<std::string>(int fold)> fold_problem;
};

// The map `parent`.`key` as a requirement: fold, the thresholds min_percent_covered,
// min_worst_instant_percent, min_worst_point_percent, max_gap_s, max_p95_gap_s, max_mean_response_time_s,
// max_p95_data_age_s (at least one), figure, every_site and (when allowed) within_tank.
Requirement read_requirement_block(const yaml::MapReader& parent, const std::string& key,
                                   const RequirementReadOptions& options);

}  // namespace skein
