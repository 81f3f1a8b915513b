#pragma once
// The K nearest satellites of a ground point (required coverage radius).
#include <utility>

#include "skein/coverage/engine/geometry.hpp"
#include "skein/coverage/engine/position_buffer.hpp"

namespace skein::coverage_engine {

// Insert the cosine c into the descending top-K list (K >= 1); the list's values do not depend on the order
// in which the cosines arrive.
inline void insert_top(double* top, int K, double c) {
  if (!(c > top[K - 1])) return;
  int k = K - 1;
  while (k > 0 && top[k - 1] < c) {
    top[k] = top[k - 1];
    --k;
  }
  top[k] = c;
}

// The same, keeping the satellite of each value alongside.
inline void insert_top_sat(double* top, int* sat, int K, double c, int s) {
  if (!(c > top[K - 1])) return;
  int k = K - 1;
  while (k > 0 && top[k - 1] < c) {
    top[k] = top[k - 1];
    sat[k] = sat[k - 1];
    --k;
  }
  top[k] = c;
  sat[k] = s;
}

// The K nearest satellites of a point, exactly, by a latitude-ordered scan (nearest.cpp). Returns the number of
// satellites looked at.
long nearest_by_latitude(const PointGeo& pg, const PositionBuffer& buf, long step, int K, double* tp, int* ts, int mid);
// Range [lo, hi) of the latitude-sorted satellites at one instant with geocentric latitude within `half` (rad)
// of psi.
std::pair<int, int> latitude_range(const PositionBuffer& buf, long step, double psi, double half);

}  // namespace skein::coverage_engine
