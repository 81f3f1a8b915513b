#pragma once
// Judging a coverage result against a requirement: each threshold's figure at the requirement's fold k, and
// for site grids with every_site, the sites that fail each threshold.
#include <string>
#include <vector>

#include "skein/coverage/requirement_verdict.hpp"
#include "skein/coverage/result.hpp"

namespace skein {

// The whole-grid value of `figure` at fold k (1..result.max_fold).
double grid_figure(const CoverageResult& result, RequirementFigure figure, int fold);
// Whether `figure` has a value per point (all but the worst-instant share), and that value at fold k.
bool has_point_figure(RequirementFigure figure);
double point_figure(const PointCoverage& point, RequirementFigure figure, int fold);
// Whether `value` meets the threshold ("at least" for higher-is-better figures, "at most" otherwise).
bool meets_threshold(const Threshold& threshold, double value);

// The verdict of `result` against `requirement`. The result must reach the fold (result.max_fold >= fold).
RequirementVerdict judge_requirement(const Requirement& requirement, const CoverageResult& result);

// One line per failed threshold, e.g. "max_gap_s 4120 > 3600" or "max_gap_s 4120 > 3600 at 2 sites: north, east".
std::vector<std::string> failed_check_texts(const RequirementVerdict& verdict);

}  // namespace skein
