#pragma once
// Exhaustive mode: one point, every satellite at every instant (the oracle of the culled mode).
#include <vector>

#include "skein/coverage/engine/context.hpp"
#include "skein/coverage/engine/crossings.hpp"

namespace skein::coverage_engine {

// One point over the instants [c0, c1) of the buffer (exhaustive_scan.cpp).
void scan_point(const EvaluationContext& sw, size_t p, long c0, long c1, Partial& acc, std::vector<int>& fresh,
                CrossingBatch& crossings, std::vector<double>& top, std::vector<Event>& hidden);

}  // namespace skein::coverage_engine
