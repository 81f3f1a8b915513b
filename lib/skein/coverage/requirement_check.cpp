#include "skein/coverage/requirement_check.hpp"

#include <cassert>

#include <fmt/format.h>

namespace skein {

double grid_figure(const CoverageResult& r, RequirementFigure figure, int fold) {
  assert(fold >= 1 && fold <= r.max_fold);
  const size_t k = static_cast<size_t>(fold - 1);
  switch (figure) {
    case RequirementFigure::percent_covered: return r.total.percent_by_fold.at(k);
    case RequirementFigure::worst_instant_percent: return r.worst_instant_covered_percent.at(k);
    case RequirementFigure::worst_point_percent: return r.worst_point_by_fold.at(k).percent_covered;
    case RequirementFigure::max_gap_s: return r.total.gaps_by_fold.at(k).max_gap_s;
    case RequirementFigure::p95_gap_s: return r.total.gaps_by_fold.at(k).p95_gap_s;
    case RequirementFigure::mean_response_time_s: return r.total.gaps_by_fold.at(k).mean_response_time_s;
    case RequirementFigure::p95_data_age_s: return r.data_age ? r.data_age->total.p95_s : 0.0;
  }
  return 0.0;
}

bool has_point_figure(RequirementFigure figure) {
  return figure != RequirementFigure::worst_instant_percent && figure != RequirementFigure::p95_data_age_s;
}

double point_figure(const PointCoverage& p, RequirementFigure figure, int fold) {
  const size_t k = static_cast<size_t>(fold - 1);
  switch (figure) {
    case RequirementFigure::percent_covered:
    case RequirementFigure::worst_point_percent: return p.percent_by_fold.at(k);
    case RequirementFigure::max_gap_s: return p.gaps_by_fold.at(k).max_gap_s;
    case RequirementFigure::p95_gap_s: return p.gaps_by_fold.at(k).p95_gap_s;
    case RequirementFigure::mean_response_time_s: return p.gaps_by_fold.at(k).mean_response_time_s;
    case RequirementFigure::p95_data_age_s:
    case RequirementFigure::worst_instant_percent: break;
  }
  assert(false && "no per-point value");
  return 0.0;
}

bool meets_threshold(const Threshold& t, double value) {
  return higher_is_better(t.figure) ? value >= t.value : value <= t.value;
}

RequirementVerdict judge_requirement(const Requirement& req, const CoverageResult& r) {
  assert(req.fold <= r.max_fold);
  RequirementVerdict v;
  v.fold = req.fold;
  v.every_site = req.every_site;
  std::vector<bool> site_fails(r.points.size(), false);
  for (const Threshold& t : req.thresholds) {
    ThresholdVerdict c;
    c.threshold = t;
    c.per_site = req.every_site && has_point_figure(t.figure) && !r.points.empty();
    if (c.per_site) {
      const bool higher = higher_is_better(t.figure);
      c.value = point_figure(r.points.front(), t.figure, req.fold);
      for (size_t p = 0; p < r.points.size(); ++p) {
        const double x = point_figure(r.points[p], t.figure, req.fold);
        if (higher ? x < c.value : x > c.value) c.value = x;
        if (!meets_threshold(t, x)) {
          c.failing_sites.push_back(r.points[p].point.name);
          site_fails[p] = true;
        }
      }
      c.met = c.failing_sites.empty();
    } else {
      c.value = grid_figure(r, t.figure, req.fold);
      c.met = meets_threshold(t, c.value);
    }
    v.checks.push_back(std::move(c));
  }
  for (size_t p = 0; p < r.points.size(); ++p)
    if (site_fails[p]) v.failing_sites.push_back(r.points[p].point.name);
  v.met = true;
  for (const ThresholdVerdict& c : v.checks) v.met = v.met && c.met;
  return v;
}

std::vector<std::string> failed_check_texts(const RequirementVerdict& v) {
  std::vector<std::string> out;
  for (const ThresholdVerdict& c : v.checks) {
    if (c.met) continue;
    std::string line = fmt::format("{} {:.6g} {} {:.6g}", to_string(c.threshold.figure), c.value,
                                   higher_is_better(c.threshold.figure) ? "<" : ">", c.threshold.value);
    if (c.per_site) {
      std::string names;
      for (const std::string& n : c.failing_sites) names += (names.empty() ? "" : ", ") + n;
      line += fmt::format(" at {} site{}: {}", c.failing_sites.size(), c.failing_sites.size() == 1 ? "" : "s", names);
    }
    out.push_back(std::move(line));
  }
  return out;
}

}  // namespace skein
