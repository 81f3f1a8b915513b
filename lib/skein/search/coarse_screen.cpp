#include "skein/search/coarse_screen.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include <fmt/format.h>

#include "skein/coverage/requirement_check.hpp"
#include "skein/error.hpp"

namespace skein {

double prefix_span_s(double span_s, double step_s, double share, double at_least_s) {
  if (!(share > 0.0) || !(step_s > 0.0)) return 0.0;
  const double steps = std::floor(std::max(share * span_s, at_least_s) / step_s + 1e-9);
  const double prefix = steps * step_s;
  return steps >= 1.0 && prefix < span_s - 1e-9 ? prefix : 0.0;
}

Grid sub_grid(const Grid& grid, double spacing_deg, double first_row_lat_deg, int stride) {
  if (stride <= 1 || grid.kind == GridKind::sites || !(spacing_deg > 0.0) || grid.points.empty()) return grid;
  const long m = stride, half = stride / 2;
  std::vector<char> keep(grid.points.size(), 0);
  // The grid's extreme points, which the evaluator's grid-wide choices read (coverage/evaluate.cpp: the
  // smallest and largest radius and the largest deflection of the vertical decide the outer footprint row
  // and so the crossing-time method); kept so those choices, and each kept point's figures, are the grid's.
  size_t lowest = 0, highest = 0, deflected = 0;
  double r_lo = 1e300, r_hi = -1.0, defl = -1.0;
  for (size_t i = 0; i < grid.points.size(); ++i) {
    const GridPoint& p = grid.points[i];
    const double len = p.r_km.norm();
    const double d = std::acos(std::clamp(p.up.dot(p.r_km.normalized()), -1.0, 1.0));
    if (len < r_lo) r_lo = len, lowest = i;
    if (len > r_hi) r_hi = len, highest = i;
    if (d > defl) defl = d, deflected = i;
    if (!p.cell) continue;
    const long row = std::lround((p.cell->lat_min_deg - first_row_lat_deg) / spacing_deg);
    const long col = std::lround((p.cell->lon_min_deg + 180.0) / spacing_deg);
    keep[i] = row % m == half && col % m == half;
  }
  keep[lowest] = keep[highest] = keep[deflected] = 1;
  Grid out;
  out.kind = grid.kind;
  out.spacing_deg = grid.spacing_deg;
  for (size_t i = 0; i < grid.points.size(); ++i)
    if (keep[i]) out.points.push_back(grid.points[i]);
  return out;
}

namespace {

struct CoarseRun {
  CoverageResult result;
  size_t grid_points = 0;  // the whole grid's
  bool prefix = false, subset = false;
};

CoarseRun run_coarse(const Design& design, const CoverageOptions& base, std::optional<double> span_s, int stride) {
  CoverageOptions o = base;
  if (span_s) o.span_s = *span_s;
  CoveragePlan plan = plan_coverage(design, o);
  CoarseRun run;
  run.grid_points = plan.grid.points.size();
  run.prefix = span_s.has_value();
  if (stride > 1) {
    const CoverageSpec& spec = plan.settings.spec;
    const double first_row = spec.grid == GridKind::band ? spec.band_lat_min_deg : -90.0;
    Grid g = sub_grid(plan.grid, spec.spacing_deg, first_row, stride);
    if (!g.points.empty() && g.points.size() < plan.grid.points.size()) {
      plan.grid = std::move(g);
      run.subset = true;
    }
  }
  run.result = evaluate_coverage(design, plan, o);
  return run;
}

bool is_cell_grid(GridKind kind) { return kind != GridKind::sites; }

}  // namespace

CoverageResult evaluate_coarse(const Design& design, const CoverageOptions& options, std::optional<double> span_s,
                               int stride) {
  return run_coarse(design, options, span_s, stride).result;
}

double screen_prefix_s(const Sweep& space, const Design& design, const ScreenSettings& s) {
  double gap = std::numeric_limits<double>::infinity();
  for (const Threshold& t : space.requirement.thresholds)
    if (t.figure == RequirementFigure::max_gap_s) gap = std::min(gap, t.value);
  return prefix_span_s(design.coverage.span_s, design.coverage.step_s, s.span_share,
                       std::isfinite(gap) ? 2.0 * gap : 0.0);
}

bool screen_applies(const Sweep& space, const Design& design, const ScreenSettings& s) {
  if (!s.enabled || !is_cell_grid(design.coverage.grid) || space.requirement.every_site) return false;
  const bool prefix = screen_prefix_s(space, design, s) > 0.0;
  const bool subset = s.grid_stride > 1;
  for (const Threshold& t : space.requirement.thresholds) {
    if (t.figure == RequirementFigure::max_gap_s && (prefix || subset)) return true;
    if (t.figure == RequirementFigure::worst_instant_percent && prefix && !design.coverage.min_sun_elevation_deg)
      return true;
    if (t.figure == RequirementFigure::worst_point_percent && subset) return true;
  }
  return false;
}

namespace {

// The first threshold a coarse run proves failed, as the bound's text ("" when none), its figure and value.
std::string proven_failure(const Sweep& space, const CoarseRun& run, ScreenOutcome& out) {
  const int fold = space.requirement.fold;
  const CoverageResult& r = run.result;
  const std::string where =
      run.prefix && run.subset
          ? fmt::format("over the prefix span 0-{:.0f} s and the sub-grid ({} of {} points)", r.span_s, r.points.size(),
                        run.grid_points)
      : run.prefix ? fmt::format("over the prefix span 0-{:.0f} s", r.span_s)
                   : fmt::format("over the sub-grid ({} of {} points)", r.points.size(), run.grid_points);
  for (const Threshold& t : space.requirement.thresholds) {
    const double x = grid_figure(r, t.figure, fold);
    out.figure = std::string(to_string(t.figure));
    out.coarse_value = x;
    if (t.figure == RequirementFigure::max_gap_s && (run.prefix || run.subset) &&
        x > t.value + screen_gap_allowance_s)
      return fmt::format("{}, max_gap_s at fold {} is {:.1f} s > {:g} s + {:g} s allowance; the full figure is at "
                         "least this ({})",
                         where, fold, x, t.value, screen_gap_allowance_s,
                         run.prefix && run.subset ? "a prefix's gaps lie inside the span's, and the sub-grid's "
                                                    "worst point is one of the grid's points"
                         : run.prefix             ? "a prefix's gaps lie inside the span's"
                                                  : "the sub-grid's worst point is one of the grid's points");
    // Not with a daylight mask: the prefix's search for a change of daylight stops at its end, so a change
    // may be placed up to 1e-4 s differently (engine/daylight.hpp), which could flip a point at an instant.
    if (t.figure == RequirementFigure::worst_instant_percent && run.prefix && !run.subset &&
        !r.min_sun_elevation_deg && x < t.value - screen_percent_allowance)
      return fmt::format("{}, worst_instant_percent at fold {} is {:.4f} % < {:g} % - {:g} allowance; the full "
                         "figure is at most this (the prefix's instants are some of the span's)",
                         where, fold, x, t.value, screen_percent_allowance);
    if (t.figure == RequirementFigure::worst_point_percent && run.subset && !run.prefix &&
        x < t.value - screen_percent_allowance)
      return fmt::format("{}, worst_point_percent at fold {} is {:.4f} % < {:g} % - {:g} allowance; the full "
                         "figure is at most this (the sub-grid's points are some of the grid's)",
                         where, fold, x, t.value, screen_percent_allowance);
  }
  return "";
}

}  // namespace

ScreenOutcome screen_layout(const Sweep& space, const Layout& layout, const ScreenSettings& s,
                            const LayoutEvaluationOptions& evaluation) {
  ScreenOutcome out;
  const Design design = layout_design(space, layout);
  if (!screen_applies(space, design, s)) return out;
  const double prefix = screen_prefix_s(space, design, s);
  bool gap = false, instant = false, point = false;
  for (const Threshold& t : space.requirement.thresholds) {
    gap = gap || t.figure == RequirementFigure::max_gap_s;
    instant = instant || t.figure == RequirementFigure::worst_instant_percent;
    point = point || t.figure == RequirementFigure::worst_point_percent;
  }
  const std::optional<double> span = prefix > 0.0 ? std::optional<double>(prefix) : std::nullopt;
  const int stride = s.grid_stride;
  // The cheapest first; each run checks every threshold it bounds.
  std::vector<std::pair<std::optional<double>, int>> runs;
  if (gap) runs.push_back({span, stride});
  if (point && stride > 1 && !(gap && !span)) runs.push_back({std::nullopt, stride});
  if (instant && span && !design.coverage.min_sun_elevation_deg && !(gap && stride <= 1)) runs.push_back({span, 1});
  const CoverageOptions options = sweep_coverage_options(space, evaluation);
  for (const auto& [run_span, run_stride] : runs) {
    if (!run_span && run_stride <= 1) continue;  // the full evaluation itself
    CoarseRun run;
    try {
      run = run_coarse(design, options, run_span, run_stride);
    } catch (const InputError&) {
      return out;  // the full evaluation reports it
    }
    ++out.coarse_runs;
    if (!run.prefix && !run.subset) continue;
    const std::string bound = proven_failure(space, run, out);
    if (!bound.empty()) {
      out.rules_out = true;
      out.reason = run.prefix && run.subset ? "prefix span and sub-grid" : run.prefix ? "prefix span" : "sub-grid";
      out.bound = bound;
      return out;
    }
  }
  return out;
}

}  // namespace skein
