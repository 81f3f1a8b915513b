#pragma once
// skein::parallel_items: the one way skein runs an outer loop of independent items (layouts, shells,
// satellites, planes, samples) on TBB threads.
//
// Why not tbb::parallel_for directly: an exception that leaves a TBB body cancels the loop's task group, and
// with it every parallel algorithm nested in the bodies still running (the coverage engine's row sweep, its
// metrics, the position buffer). Those return early with part of their work undone and no exception of their
// own, so the body that called them goes on with half-filled results: wrong figures or a crash before the first
// exception reaches the caller. parallel_items lets no exception into TBB:
//  - each body runs whole, or throws;
//  - after a body throws at index i, no item above the lowest failing index is started; items below it still
//    run, so the exception rethrown is always the one of the lowest index that fails, whatever the thread count;
//  - the exception is rethrown here, after every running body has finished.
// Results must go to per-index slots (or be serialised by the body): the order of the items is not fixed.
#include <atomic>
#include <cstddef>
#include <exception>
#include <mutex>
#include <stdexcept>
#include <string>

#include <tbb/blocked_range.h>
#include <tbb/parallel_for.h>
#include <tbb/task_group.h>

namespace skein {

template <class Body>
void parallel_items(std::size_t count, const Body& body) {
  std::atomic<std::size_t> lowest_failed{count};
  std::mutex failure_mutex;
  std::exception_ptr failure;
  tbb::parallel_for(tbb::blocked_range<std::size_t>(0, count, 1), [&](const tbb::blocked_range<std::size_t>& range) {
    for (std::size_t i = range.begin(); i != range.end(); ++i) {
      if (i > lowest_failed.load(std::memory_order_relaxed)) return;
      try {
        body(i);
      } catch (...) {
        const std::lock_guard<std::mutex> lock(failure_mutex);
        if (i < lowest_failed.load(std::memory_order_relaxed)) {
          lowest_failed.store(i, std::memory_order_relaxed);
          failure = std::current_exception();
        }
        return;
      }
    }
  });
  if (failure) std::rethrow_exception(failure);
}

// For code whose own nested loops a caller's cancelled task group could cut short (a caller that used a plain
// tbb::parallel_for and let an exception out): call before reading what those loops made. It throws when the
// task group this thread runs in is being cancelled, so half-made results are never read; the caller's own
// exception is the one that reaches the top.
inline void stop_if_cancelled(const char* where) {
  if (tbb::is_current_task_group_canceling())
    throw std::runtime_error(std::string(where) + ": stopped, the enclosing parallel work was cancelled");
}

}  // namespace skein
