#pragma once
// The pass list of a site grid: every pass of every satellite over every site, with its rise, set and maximum
// elevation, as the coverage evaluator counted them (the same secular orbits, mask, payload cone, span and step),
// found by the rate-bounded search of pass_search.hpp that the ground contacts use.
#include <string>
#include <vector>

#include "skein/coverage/result.hpp"
#include "skein/design/design.hpp"

namespace skein {

struct SitePass {
  size_t site = 0;               // index into CoverageResult::points
  std::string satellite;         // the satellite's id
  double rise_s = 0.0;           // from the epoch; 0 when in view at the start (a pass cut by the span's start)
  double set_s = 0.0;            // the span's end when in view at the end
  double max_elevation_deg = 0.0;
  double max_elevation_s = 0.0;  // when the maximum is reached
};

// Every pass over the sites of `coverage` (a sites grid evaluated on `design`), by site in grid order, then by
// rise time, then by satellite. Empty for other grids. The maximum elevation is sought by sampling each pass at
// least 16 times and at most every 10 s, then golden-section search around the highest sample down to 1 ms
// (elevation over a pass rises to one peak and falls; the peak is flat, so 1 ms in time is far below 1e-6 deg).
std::vector<SitePass> find_site_passes(const Design& design, const CoverageResult& coverage);

}  // namespace skein
