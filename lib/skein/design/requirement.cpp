#include "skein/design/requirement.hpp"

namespace skein {

std::string_view to_string(RequirementFigure f) {
  switch (f) {
    case RequirementFigure::percent_covered: return "percent_covered";
    case RequirementFigure::worst_instant_percent: return "worst_instant_percent";
    case RequirementFigure::worst_point_percent: return "worst_point_percent";
    case RequirementFigure::max_gap_s: return "max_gap_s";
    case RequirementFigure::p95_gap_s: return "p95_gap_s";
    case RequirementFigure::mean_response_time_s: return "mean_response_time_s";
    case RequirementFigure::p95_data_age_s: return "p95_data_age_s";
  }
  return "?";
}

const std::vector<RequirementFigure>& all_requirement_figures() {
  static const std::vector<RequirementFigure> all = {
      RequirementFigure::percent_covered, RequirementFigure::worst_instant_percent,
      RequirementFigure::worst_point_percent, RequirementFigure::max_gap_s,
      RequirementFigure::p95_gap_s, RequirementFigure::mean_response_time_s, RequirementFigure::p95_data_age_s};
  return all;
}

std::optional<RequirementFigure> requirement_figure_from_string(std::string_view text) {
  for (RequirementFigure f : all_requirement_figures())
    if (to_string(f) == text) return f;
  return std::nullopt;
}

bool uses_data_age(const Requirement& r) {
  if (r.figure == RequirementFigure::p95_data_age_s) return true;
  for (const Threshold& t : r.thresholds)
    if (t.figure == RequirementFigure::p95_data_age_s) return true;
  return false;
}

bool higher_is_better(RequirementFigure f) {
  return f == RequirementFigure::percent_covered || f == RequirementFigure::worst_instant_percent ||
         f == RequirementFigure::worst_point_percent;
}

}  // namespace skein
