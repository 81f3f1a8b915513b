#pragma once
// The timeline of one ground point: count in view, integrals and gaps, advanced event by event.
#include <algorithm>
#include <cstdint>
#include <vector>

#include "skein/coverage/engine/crossings.hpp"
#include "skein/coverage/engine/daylight.hpp"
#include "skein/coverage/engine/settings.hpp"

namespace skein::coverage_engine {

// A gap at fold k >= 2 (an interval with fewer than k satellites in view): its length and k.
struct FoldGap {
  float length_s;
  std::uint8_t fold;
};

// The timeline of one ground point: satellites in view now, and the integrals and gaps so far.
struct PointState {
  std::vector<int> vis;  // exhaustive mode: the satellites in view at the last instant, ascending
  std::vector<float> gaps;  // fold 1: intervals with no satellite in view
  std::vector<FoldGap> fold_gaps;  // folds 2..K, in the order they close
  double last_t = 0.0;   // the integrals below are taken up to this time
  double gap_start = 0.0;
  bool in_gap = false;
  int count = 0;
  int max_in_view = 0;
  long passes = 0;       // passes begun: in view at the start, and every rise
  double count_time = 0.0;
  // Daylight mask (PointSums::daylight set): `count` above is the number in view while lit (0 in the dark),
  // `raw` the number in view whatever the Sun, `lit` the state since the last change of daylight, and
  // `next_daylight_s` the time of the next change (no_daylight_change: none before the span's end).
  int raw = 0;
  bool lit = true;
  double next_daylight_s = no_daylight_change;
};

// Per-point integrals: time with n in view (the time with at least k in view, k = 1..K, is summed from it at
// the end; K is at most 16, under the last bin), and the start of the open gap at each fold k = 2..K (entry
// k - 2; a gap at fold k is open while fewer than k are in view).
struct PointSums {
  double* hist;
  double* fold_gap_start;  // K - 1 entries; unused when K = 1
  int K;
  const DaylightMask* daylight = nullptr;  // set: only lit coverage counts
  const PointGeo* point = nullptr;         // the point (for the daylight mask)
  double span = 0.0;                       // end of the span (for the daylight mask)
};

inline void integrate(PointState& ps, const PointSums& sums, double t) {
  const double dt = t - ps.last_t;
  if (dt <= 0.0) return;
  ps.count_time += ps.count * dt;
  sums.hist[std::min(ps.count, in_view_bins - 1)] += dt;
  ps.last_t = t;
}

inline void start_timeline(PointState& ps, const PointSums& sums, int count) {
  if (sums.daylight) {
    ps.raw = count;
    ps.lit = sums.daylight->margin(*sums.point, 0.0) >= 0.0;
    ps.next_daylight_s = sums.daylight->next_change(*sums.point, 0.0, ps.lit, sums.span);
    if (!ps.lit) count = 0;
  }
  ps.count = count;
  ps.max_in_view = count;
  ps.passes = count;
  ps.last_t = 0.0;
  if (count == 0) {
    ps.in_gap = true;
    ps.gap_start = 0.0;
  }
  for (int k = std::max(2, count + 1); k <= sums.K; ++k) sums.fold_gap_start[k - 2] = 0.0;
}

// A change of the count by one at time t, at the folds above 1: a rise to k closes the gap at fold k, a set
// from k opens it. Each event crosses exactly one fold threshold.
inline void fold_gap_event(PointState& ps, const PointSums& sums, int before, double t) {
  if (ps.count > before) {
    const int k = ps.count;
    if (k >= 2 && k <= sums.K && t - sums.fold_gap_start[k - 2] > 0.0)
      ps.fold_gaps.push_back({static_cast<float>(t - sums.fold_gap_start[k - 2]), static_cast<std::uint8_t>(k)});
  } else {
    const int k = before;
    if (k >= 2 && k <= sums.K) sums.fold_gap_start[k - 2] = t;
  }
}

// The gaps still open at the end of the span (time `span`), at every fold.
inline void close_gaps(PointState& ps, const PointSums& sums, double span) {
  if (ps.in_gap && span - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(span - ps.gap_start));
  ps.in_gap = false;
  for (int k = std::max(2, ps.count + 1); k <= sums.K; ++k)
    if (span - sums.fold_gap_start[k - 2] > 0.0)
      ps.fold_gaps.push_back({static_cast<float>(span - sums.fold_gap_start[k - 2]), static_cast<std::uint8_t>(k)});
}

// One satellite more (+1) or fewer (-1) counted at time te (the integrals are taken up to te).
inline void count_change(PointState& ps, const PointSums& sums, int delta, double te) {
  const int before = ps.count;
  ps.count += delta;
  ps.passes += delta > 0;
  ps.max_in_view = std::max(ps.max_in_view, ps.count);
  if (before == 0 && ps.count == 1 && ps.in_gap) {
    if (te - ps.gap_start > 0.0) ps.gaps.push_back(static_cast<float>(te - ps.gap_start));
    ps.in_gap = false;
  } else if (before == 1 && ps.count == 0) {
    ps.in_gap = true;
    ps.gap_start = te;
  }
  if (sums.K > 1) fold_gap_event(ps, sums, before, te);
}

// The changes of daylight at or before time t (daylight mask only): at sunrise the satellites in view begin to
// count, one by one at that instant (each begins a lit pass); at sunset they stop counting. A point's changes
// come from DaylightMask::next_change alone, whichever mode visits it, so both modes apply the same ones.
inline void advance_daylight(PointState& ps, const PointSums& sums, double t) {
  while (ps.next_daylight_s <= t) {
    const double ts = ps.next_daylight_s;
    integrate(ps, sums, ts);
    ps.lit = !ps.lit;
    for (int k = 0; k < ps.raw; ++k) count_change(ps, sums, ps.lit ? +1 : -1, ts);
    ps.next_daylight_s = sums.daylight->next_change(*sums.point, ts, ps.lit, sums.span);
  }
}

// Apply the events of one step (t0, t1], sorted by event_before. Event times are clamped into the step and
// kept in order. With the daylight mask the changes of daylight before each event are applied first, and an
// event in the dark changes only the number in view whatever the Sun.
inline void apply_events(PointState& ps, const PointSums& sums, const Event* begin, const Event* end, double t0,
                         double t1) {
  double cur = t0;
  for (const Event* e = begin; e != end; ++e) {
    double te = std::clamp(e->t, cur, t1);
    if (sums.daylight) {
      advance_daylight(ps, sums, te);
      ps.raw += e->delta;
      if (!ps.lit) {
        cur = te;
        continue;
      }
    }
    integrate(ps, sums, te);
    cur = te;
    count_change(ps, sums, e->delta, te);
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
