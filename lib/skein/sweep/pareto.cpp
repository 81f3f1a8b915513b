#include "skein/sweep/pareto.hpp"

#include <algorithm>
#include <cassert>
#include <numeric>

namespace skein {
namespace {

bool dominates(const std::vector<double>& a, const std::vector<double>& b) {
  bool strictly = false;
  for (size_t k = 0; k < a.size(); ++k) {
    if (a[k] > b[k]) return false;
    if (a[k] < b[k]) strictly = true;
  }
  return strictly;
}

}  // namespace

std::vector<size_t> pareto_front(const std::vector<std::vector<double>>& objectives) {
  const size_t n = objectives.size();
  // Sorted by the objectives lexicographically, a point can only be dominated by one before it.
  std::vector<size_t> order(n);
  std::iota(order.begin(), order.end(), size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](size_t a, size_t b) { return objectives[a] < objectives[b]; });
  std::vector<size_t> front;  // indices, in sorted order
  for (size_t i : order) {
    assert(objectives[i].size() == objectives[order[0]].size());
    const bool dominated = std::any_of(front.begin(), front.end(), [&](size_t j) { return dominates(objectives[j], objectives[i]); });
    if (!dominated) front.push_back(i);
  }
  std::sort(front.begin(), front.end());
  return front;
}

}  // namespace skein
