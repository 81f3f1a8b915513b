#pragma once
// The timeline of one ground point: count in view, integrals and gaps, advanced event by event.
#include <algorithm>
#include <vector>

#include "skein/coverage/engine/crossings.hpp"
#include "skein/coverage/engine/settings.hpp"

namespace skein::coverage_engine {

// The timeline of one ground point: satellites in view now, and the integrals and gaps so far.
struct PointState {
  std::vector<int> vis;  // exhaustive mode: the satellites in view at the last instant, ascending
  std::vector<float> gaps;
  double last_t = 0.0;   // the integrals below are taken up to this time
  double gap_start = 0.0;
  bool in_gap = false;
  int count = 0;
  int max_in_view = 0;
  double count_time = 0.0;
};

// Per-point integrals: time with n in view (the time with at least k in view, k = 1..K, is summed from it at
// the end; K is at most 16, under the last bin).
struct PointSums {
  double* hist;
};

inline void integrate(PointState& ps, const PointSums& sums, double t) {
  const double dt = t - ps.last_t;
  if (dt <= 0.0) return;
  ps.count_time += ps.count * dt;
  sums.hist[std::min(ps.count, in_view_bins - 1)] += dt;
  ps.last_t = t;
}

inline void start_timeline(PointState& ps, int count) {
  ps.count = count;
  ps.max_in_view = count;
  ps.last_t = 0.0;
  if (count == 0) {
    ps.in_gap = true;
    ps.gap_start = 0.0;
  }
}

// Apply the events of one step (t0, t1], sorted by event_before. Event times are clamped into the step and
// kept in order.
inline void apply_events(PointState& ps, const PointSums& sums, const Event* begin, const Event* end, double t0,
                         double t1) {
  double cur = t0;
  for (const Event* e = begin; e != end; ++e) {
    const double te = std::clamp(e->t, cur, t1);
    integrate(ps, sums, te);
    cur = te;
    const int before = ps.count;
    ps.count += e->delta;
    ps.max_in_view = std::max(ps.max_in_view, ps.count);
    if (before == 0 && ps.count == 1 && ps.in_gap) {
      if (te - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(te - ps.gap_start));
      ps.in_gap = false;
    } else if (before == 1 && ps.count == 0) {
      ps.in_gap = true;
      ps.gap_start = te;
    }
  }
}

// Sort a short run of events (a point's events in one step; usually one to three) by insertion.
inline void sort_short(Event* begin, Event* end) {
  for (Event* i = begin + 1; i < end; ++i) {
    const Event v = *i;
    Event* j = i;
    while (j > begin && event_before(v, *(j - 1))) {
      *j = *(j - 1);
      --j;
    }
    *j = v;
  }
}


}  // namespace skein::coverage_engine
