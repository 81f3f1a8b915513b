#pragma once
// The coarse-to-fine screen of a search: before a candidate's coverage is run on the requirement's own grid and
// span, it is run on a shorter span with the same start (the prefix) and on a subset of the grid's points (the
// sub-grid), and the candidate is skipped only when a coarse figure proves that the full figure fails a
// threshold. The bounds are exact and one-sided (their error is zero in the direction used):
//
//   Prefix span [0, P] of the span [0, S], P a whole number of steps, P < S. The sample instants of the prefix
//   are the first ones of the span's (t_j = j step), and the coverage of a point is computed from the same
//   satellite positions at those instants, so its timeline on [0, P] is the span's timeline cut at P.
//   - max_gap_s: a gap of the prefix (an interval with fewer than k in view; one open at 0 or at P counts, and a
//     point never covered has the one gap [0, P]) lies inside a gap of the span (the same interval, or longer if
//     it was open at P). So every point's longest gap over the prefix is at most its longest over the span, and
//     max over points of the prefix's <= the span's: a prefix max gap above the threshold fails the span.
//   - worst_instant_percent: the prefix's instants are a subset of the span's, so the least covered share over
//     them is at least the span's least: a prefix worst instant below the threshold fails the span. Not used
//     with a daylight mask (min_sun_elevation_deg): the search for a change of daylight stops at the prefix's
//     end, so the prefix may place a change up to its 1e-4 s tolerance apart from the full run, which moves a
//     gap by that much (under the gap allowance) but could flip a point at an instant.
//   Not bounded by a prefix: time averages (percent_covered, worst_point_percent, p95_gap_s, mean response).
//
//   Sub-grid: the cells in every m-th row and column (m odd; the cells whose row and column index are m/2
//   modulo m, the centres of a grid of spacing m s when m s divides the extent), plus the grid's extreme points
//   (smallest and largest radius, largest deflection of the vertical), which decide the evaluator's grid-wide
//   choices (the outer footprint row and with it the crossing-time method). Each point's timeline depends
//   only on that point, the satellites and those choices, so its figures on the sub-grid are its figures on
//   the grid.
//   - max_gap_s (the worst point's longest gap): the max over a subset is at most the max over the grid.
//   - worst_point_percent (the least-covered point's percent): the min over a subset is at least the grid's.
//   Not bounded by a sub-grid: area-weighted figures (percent_covered, worst_instant_percent, p95_gap_s, mean
//   response), which change with the weights. A requirement on those alone is never screened; the screen does
//   not use coarse figures to reorder candidates either (the cost order is the search's).
//
// Both together (prefix span over the sub-grid) bound max_gap_s the same way. A skip still needs the coarse
// figure past the threshold by a stated allowance (screen_gap_allowance_s, screen_percent_allowance), a margin
// for what the argument above does not cover to the last bit (gaps are stored as floats; the culling of
// candidate pairs, conservative by construction, differs between the runs); measured in
// tests/search/coarse_screen_test.cpp, the same point's figures agree exactly.
#include <optional>
#include <string>

#include "skein/coverage/evaluate.hpp"
#include "skein/search/search_spec.hpp"
#include "skein/sweep/evaluate_layout.hpp"
#include "skein/sweep/layouts.hpp"

namespace skein {

constexpr double screen_gap_allowance_s = 1.0;     // a coarse max gap must exceed the threshold by more than this
constexpr double screen_percent_allowance = 0.01;  // a coarse percent must fall short by more than this (points)

// The prefix span: max(share span, at_least_s) rounded down to whole steps, or 0 when that is no step or not
// shorter than the span. The screen passes twice the smallest max_gap_s threshold as at_least_s: a prefix no
// longer than the threshold can never show a longer gap.
double prefix_span_s(double span_s, double step_s, double share, double at_least_s = 0.0);

// The sub-grid of a cell grid (global, band, region): the cells whose row and column index (counted from the
// grid's first row, and from -180 deg) are stride / 2 modulo stride, and the grid's extreme points (above), in
// grid order. Sites grids and stride 1: the grid itself.
Grid sub_grid(const Grid& grid, double spacing_deg, double first_row_lat_deg, int stride);

// The coverage of `design` (the sweep's coverage options) over the prefix span `span_s` (none: the design's)
// and the sub-grid of stride `stride` (1: the whole grid). Throws as evaluate_coverage.
CoverageResult evaluate_coarse(const Design& design, const CoverageOptions& options, std::optional<double> span_s,
                               int stride);

struct ScreenOutcome {
  bool rules_out = false;
  std::string reason;  // "prefix span", "sub-grid" or "prefix span and sub-grid"
  std::string bound;   // the coarse figure, the threshold and the inequality cited
  std::string figure;  // the figure the coarse run proved failed
  double coarse_value = 0.0;  // its coarse value
  int coarse_runs = 0; // coarse coverage runs made
};

// The prefix the screen uses for this requirement and design (0: none).
double screen_prefix_s(const Sweep& space, const Design& design, const ScreenSettings& settings);

// Whether the screen can rule anything out for this requirement and grid (a threshold on max_gap_s,
// worst_instant_percent or worst_point_percent, a cell grid, and a prefix or a sub-grid to use).
bool screen_applies(const Sweep& space, const Design& design, const ScreenSettings& settings);

// The screen of one layout: the cheapest coarse run first (prefix span and sub-grid, then the sub-grid over
// the span, then the prefix over the grid), stopping at the first that rules the layout out. A coarse run the
// evaluator refuses (InputError) rules nothing out: the full evaluation reports it.
ScreenOutcome screen_layout(const Sweep& space, const Layout& layout, const ScreenSettings& settings,
                            const LayoutEvaluationOptions& evaluation);

}  // namespace skein
