#include "skein/input/requirement_block.hpp"

#include <fmt/format.h>

#include "skein/constants.hpp"
#include "skein/input/yaml_reader.hpp"

namespace skein {

Requirement read_requirement_block(const yaml::MapReader& parent, const std::string& key,
                                   const RequirementReadOptions& options) {
  std::vector<std::string_view> allowed = {"fold", "min_percent_covered", "min_worst_instant_percent",
                                           "min_worst_point_percent", "max_gap_s", "max_p95_gap_s",
                                           "max_mean_response_time_s", "max_p95_data_age_s", "figure",
                                           "every_site"};
  if (options.allow_within_tank) allowed.push_back("within_tank");
  const yaml::MapReader m = parent.map(key, allowed);
  Requirement r;
  r.fold = static_cast<int>(
      m.optional_integer("fold", 1, max_fold_limit, fmt::format("a coverage fold k from 1 to {}", max_fold_limit)).value_or(1));
  if (options.fold_problem)
    if (const auto problem = options.fold_problem(r.fold)) {
      if (m.has("fold")) m.fail_key("fold", *problem);
      m.fail(m.self(), m.path(), *problem);
    }
  struct Key {
    const char* key;
    RequirementFigure figure;
    double max;
    const char* what;
  };
  const Key keys[] = {
      {"min_percent_covered", RequirementFigure::percent_covered, 100.0, "a percent of time covered (0 to 100)"},
      {"min_worst_instant_percent", RequirementFigure::worst_instant_percent, 100.0, "a percent of the grid (0 to 100)"},
      {"min_worst_point_percent", RequirementFigure::worst_point_percent, 100.0,
       "a percent of time covered at the least-covered point (0 to 100)"},
      {"max_gap_s", RequirementFigure::max_gap_s, 1e9, "a revisit gap in s"},
      {"max_p95_gap_s", RequirementFigure::p95_gap_s, 1e9, "a revisit gap in s"},
      {"max_mean_response_time_s", RequirementFigure::mean_response_time_s, 1e9, "a response time in s"},
      {"max_p95_data_age_s", RequirementFigure::p95_data_age_s, 1e9, "an age of the data in s"},
  };
  // Data age needs somewhere to take the data (ground stations) and passes found by the elevation mask alone;
  // checked here, at the key, before any work. Any grid kind.
  if (m.has("max_p95_data_age_s")) {
    if (!options.has_ground_stations)
      m.fail_key("max_p95_data_age_s", "a data-age threshold needs ground stations to take the data down; expected "
                                       "a ground_stations list in the design (name, lat_deg, lon_deg)");
    if (options.has_payload_cone)
      m.fail_key("max_p95_data_age_s", "data age finds passes by the elevation mask only; expected no "
                                       "coverage.nadir_half_angle_deg with a data-age threshold");
  }
  for (const Key& k : keys)
    if (m.has(k.key)) r.thresholds.push_back({k.figure, m.number(k.key, 0.0, k.max, k.what)});
  if (r.thresholds.empty())
    m.fail(m.self(), m.path(),
           "the requirement sets no threshold; expected at least one of min_percent_covered, min_worst_instant_percent, "
           "min_worst_point_percent, max_gap_s, max_p95_gap_s, max_mean_response_time_s, max_p95_data_age_s");
  if (m.has("figure")) {
    std::vector<std::string_view> names;
    for (RequirementFigure f : all_requirement_figures()) names.push_back(to_string(f));
    r.figure = *requirement_figure_from_string(m.choice("figure", names));
    if (r.figure == RequirementFigure::p95_data_age_s && (!options.has_ground_stations || options.has_payload_cone))
      m.fail_key("figure", "p95_data_age_s needs ground stations and no payload cone");
  } else {
    r.figure = r.thresholds.front().figure;
  }
  if (m.has("every_site")) {
    r.every_site = m.boolean("every_site");
    if (r.every_site && !options.sites_grid)
      m.fail_key("every_site", "every_site applies to a grid of kind sites; this grid has no named sites "
                               "(for the least-covered cell of a grid, use min_worst_point_percent)");
  }
  if (m.has("within_tank")) {
    r.within_tank = m.boolean("within_tank");
    if (r.within_tank && !options.has_tank)
      m.fail_key("within_tank", "within_tank needs spacecraft.isp_s and spacecraft.propellant_capacity_kg in the base design");
  }
  return r;
}

}  // namespace skein
