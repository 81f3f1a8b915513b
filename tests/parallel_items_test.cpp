// Evidence for lib/skein/parallel_items.hpp: the outer loop that lets no exception into TBB.
//
// The failure it prevents was seen in CI (sweep_driver_test, "a rank that fails ..."): a row that could not be
// sent threw out of a tbb::parallel_for body; TBB cancelled the loop's task group and with it the coverage
// engine's nested loops in the other layouts still running, which returned with their points half filled, and
// the metrics read past the end of an empty vector (SIGSEGV) before the exception reached the caller. The cases
// below build that situation directly: one item throws while another item's nested parallel loop is running.
#include <doctest/doctest.h>

#include <atomic>
#include <chrono>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include "skein/parallel_items.hpp"

using namespace skein;

TEST_CASE("parallel_items: an item that throws leaves the nested parallel loops of the items already running whole") {
  constexpr std::size_t items = 16, failing = 5, inner = 400;
  std::vector<std::atomic<int>> done(items);
  std::vector<std::atomic<bool>> started(items);
  std::atomic<int> running{0};
  std::string caught;
  try {
    parallel_items(items, [&](std::size_t i) {
      if (i == failing) {
        // Throw while another item's nested loop is in flight (or after 5 s, if no other thread ever runs one).
        const auto until = std::chrono::steady_clock::now() + std::chrono::seconds(5);
        while (running.load() == 0 && std::chrono::steady_clock::now() < until) std::this_thread::yield();
        std::this_thread::sleep_for(std::chrono::milliseconds(2));  // into that loop's 40 ms
        throw std::runtime_error("item 5 failed");
      }
      started[i] = true;
      ++running;
      tbb::parallel_for(std::size_t{0}, inner, [&](std::size_t) {
        std::this_thread::sleep_for(std::chrono::microseconds(100));
        ++done[i];
      });
      --running;
    });
  } catch (const std::runtime_error& e) {
    caught = e.what();
  }
  CHECK(caught == "item 5 failed");
  // Every nested loop that began ran all its iterations: none was cut short by the failure of item 5. (With a
  // plain tbb::parallel_for as the outer loop this fails: the loop running when item 5 throws stops early.)
  int began = 0;
  for (std::size_t i = 0; i < items; ++i) {
    if (!started[i]) continue;
    ++began;
    INFO("item " << i);
    CHECK(done[i].load() == static_cast<int>(inner));
  }
  // Items below the failing one always run (the rule that makes the rethrown failure the lowest one).
  for (std::size_t i = 0; i < failing; ++i) CHECK(started[i].load());
  CHECK(began >= static_cast<int>(failing));
}

TEST_CASE("parallel_items: the failure rethrown is the lowest failing index, on 1, 2 and 4 threads") {
  constexpr std::size_t items = 1000;
  for (int threads : {1, 2, 4}) {
    INFO(threads << " threads");
    std::vector<std::atomic<int>> ran(items);
    std::string caught;
    tbb::task_arena arena(threads);
    arena.execute([&] {
      try {
        parallel_items(items, [&](std::size_t i) {
          ++ran[i];
          if (i == 137 || i == 512 || i == 900) throw std::runtime_error(std::to_string(i));
        });
      } catch (const std::runtime_error& e) {
        caught = e.what();
      }
    });
    CHECK(caught == "137");
    for (std::size_t i = 0; i <= 137; ++i) CHECK(ran[i].load() == 1);
    for (std::size_t i = 138; i < items; ++i) CHECK(ran[i].load() <= 1);
  }
}

TEST_CASE("parallel_items: with no failure every item runs exactly once") {
  constexpr std::size_t items = 10007;
  std::vector<std::atomic<int>> ran(items);
  parallel_items(items, [&](std::size_t i) { ++ran[i]; });
  for (std::size_t i = 0; i < items; ++i) REQUIRE(ran[i].load() == 1);
  parallel_items(0, [&](std::size_t) { FAIL("no item"); });
}
