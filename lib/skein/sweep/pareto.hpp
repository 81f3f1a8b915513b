#pragma once
// The Pareto (non-dominated) set of points with objectives that are all minimised.
#include <cstddef>
#include <vector>

namespace skein {

// Indices (ascending) of the points no other point dominates. Point a dominates b when a is no worse on every
// objective and strictly better on at least one (V. Pareto's optimality, as used in multi-objective design:
// K. Deb, "Multi-Objective Optimization using Evolutionary Algorithms", Wiley 2001, definition 2.5).
// Points with equal objectives do not dominate each other, so both are kept. Every point has the same number
// of objectives. O(n^2 m); n is at most a sweep's layout count.
std::vector<size_t> pareto_front(const std::vector<std::vector<double>>& objectives);

}  // namespace skein
