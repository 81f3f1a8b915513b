#pragma once
// Every pass of every satellite over every point of a cell grid, handed to a callback as it is found; no list
// of passes is kept. Used by the age of the data (data_age.hpp), where the one-point-at-a-time search of the
// sites (pass_search.hpp over each point) would cost points x satellites x samples.
//
// Per satellite, its Earth-fixed positions at the pass search's sample instants (0, step, ..., the span's end;
// step = min(coverage step, 60 s), as for contacts). Between two samples a < b, a point can be in view only if
// its geocentric angle from the satellite's direction stays within lambda_max somewhere in [a, b], with
//   lambda_max = acos(R_min cos e' / r_apogee) - e' + 0.5 deg,
// the largest geocentric angle from which a satellite at the apogee radius is seen at geocentric elevation e'
// from a point at the grid's smallest radius R_min (spherical triangle; larger for a lower point or a higher
// satellite), e' = mask - 0.25 deg (the geodetic vertical leans from the geocentric one by under 0.2 deg on the
// ellipsoid; the 0.5 deg is margin, common practice). The satellite's direction turns at most
// w = v_max / r_perigee rad/s (v_max the search's speed bound, pass_search.cpp), so between samples:
//   - a latitude row is skipped when (|dlat(a)| + |dlat(b)| - w (b - a)) / 2 > lambda_max;
//   - else only its points within lambda_max + w (b - a) of the satellite at a are searched, a longitude window
//     from the spherical law of cosines.
// The skipped pairs are out of view over the whole of [a, b] (both bounds err on the large side). So are pairs
// whose angle at b exceeds lambda_max + w (b - a); and a point whose pass is open and whose angle at a is within
// lambda_min - w (b - a) stays in view to b (lambda_min = acos(R_max cos e'' / r_perigee) - e'' - 0.5 deg,
// e'' = mask + 0.25 deg: seen from the highest point by the lowest satellite), so nothing is searched for it.
// Each remaining pair is searched between the two samples like the pass search (pass_search.hpp), with three
// changes for speed (the one-point-at-a-time search costs 17 s against the grid's 0.85 s on the bench case):
//   - the satellite between samples is on the cubic Hermite curve through its positions and velocities there
//     (error h^4/384 times the 4th derivative of r: about 0.3 m at h = 60 s in low orbit, 0.05 ms of
//     along-track time);
//   - besides the pass search's rate bound |dm/dt| <= L = v_max / d_low, the margin's second derivative is
//     bounded, |m''| <= M2 = 2 A / d_low + 3 v_max^2 / d_low^2 (A the curve's largest acceleration; from the
//     second derivative of the unit line of sight), so an interval whose end rates dm/dt have one sign and sum
//     above M2 (b - a) is monotonic: it holds no crossing (same sign of m at both ends) or exactly one;
//   - a single crossing, or a sign change bracketed within 2 s, is solved by the Illinois method to 1 ms
//     instead of halved further.
// So every pass longer than 1 ms is found, however much shorter than the step, except that a pass or gap under
// 2 s lying within 2 s of another crossing may be merged with its neighbour (rise-set-rise in one bracket);
// rises and sets are placed within 0.5 ms of the Hermite path's. Passes cut by the span's start or end count,
// with the part inside the span.
//
// Work: one task per latitude row (in parallel); per row, for each satellite, each step: one row test, then the
// points in the window. Memory: the satellites' samples (position, velocity, direction: 88 bytes per sample:
// 3.0 MB for 24 satellites over a day at 60 s) and, per row task, an open-pass state (16 bytes) per row point.
#include <cstddef>
#include <functional>

#include "skein/coverage/grid.hpp"
#include "skein/design/design.hpp"

namespace skein {

struct GridPassOptions {
  double span_s = 86400.0;
  double sample_step_s = 60.0;
  double min_elevation_deg = 0.0;  // the mask; no payload cone
};

// on_pass(point index, satellite index (expansion order), rise_s, set_s). Called from several threads, but for
// any one point always from the same thread, satellite after satellite, each satellite's passes in time order.
using GridPassSink = std::function<void(std::size_t, std::size_t, double, double)>;

void for_each_grid_pass(const Design& design, const Grid& grid, const GridPassOptions& options,
                        const GridPassSink& on_pass);

}  // namespace skein
