#pragma once
// Culled mode: one row of the grid over a chunk of instants, with footprint windows.
#include <vector>

#include "skein/coverage/engine/context.hpp"
#include "skein/coverage/engine/crossings.hpp"
#include "skein/coverage/engine/row_index.hpp"

namespace skein::coverage_engine {

// The inner half-width of each satellite's window on one row at one instant, keyed by instant * rows + row
// (no_window when it was not needed there).
constexpr double no_window = -1e300;
struct WindowCache {
  std::vector<long> key;
  std::vector<double> in;
};

// Scratch of one worker thread in culled mode, kept across rows and chunks.
struct RowScratch {
  CrossingBatch crossings;
  std::vector<Event> sorted;  // one point's events of a step, put in time order
  // The grouping of a step's events by point: per point the last event linked (-1: none; all -1 between
  // steps), per event the previous one of its point, and the points with events in order of first appearance.
  std::vector<int> head, link;
  std::vector<std::uint32_t> touched;
  std::vector<int> count;
  std::vector<double> top;
  std::vector<int> top_sat;
  WindowCache cache;
  std::vector<Event> hidden;  // rises and sets of passes found between two instants, this step
  // The nearest search's due points (row_sweep.cpp): wake lists by step, and the points due now and next.
  std::vector<int> wake_head, wake_next;
  std::vector<std::uint32_t> due, next_due, open_list;
  std::vector<std::uint64_t> open_bits;  // the open points of a step as a bit set (for_marked; all 0 between)
};

// Culled mode: row number r of `rows_total` over the instants [c0, c1) of the buffer (row_sweep.cpp).
void sweep_row(const EvaluationContext& sw, const Row& row, long r, long rows_total, long c0, long c1, Partial& acc,
               RowScratch& scratch);

}  // namespace skein::coverage_engine
