#pragma once
// Grid rows for footprint culling and the index arithmetic that turns longitude windows into point spans.
#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>
#include <optional>
#include <vector>

#include "skein/constants.hpp"
#include "skein/coverage/engine/geometry.hpp"
#include "skein/coverage/footprint.hpp"

namespace skein::coverage_engine {

// Grid rows for footprint culling: points of one geocentric latitude, sorted by longitude.
struct Row {
  double psi = 0.0, sin_psi = 0.0, cos_psi = 0.0;
  std::vector<double> lon;  // rad, ascending, in [-pi, pi)
  std::vector<int> point;
  FootprintRow bounds;
  double guess_scale = 0.0;  // (n - 1) / (last - first longitude): index per radian of the linear guess
  // Evenly spaced round the whole circle (global and band grids): longitude k is lon0 + k / per_rad within
  // 1e-9 rad, and n / per_rad is 2 pi within 1e-9 rad.
  bool periodic = false;
  double lon0 = 0.0, per_rad = 0.0;
};

std::vector<Row> build_rows(const std::vector<PointGeo>& geo, double min_elevation_rad,
                            std::optional<double> nadir_half_angle_rad);

// std::lower_bound / std::upper_bound on a row's ascending longitudes, started from the linear guess (exact
// for the evenly spaced rows of global, band and region grids) and corrected by stepping, so the result is the
// same as the binary search for any row.
inline long row_guess(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  if (n < 2) return 0;
  const double f = (x - row.lon.front()) * row.guess_scale;
  if (!(f > 0.0)) return 0;
  if (f >= static_cast<double>(n)) return n;
  return static_cast<long>(f);
}
inline long row_lower_bound(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  long k = row_guess(row, x);
  while (k > 0 && row.lon[static_cast<size_t>(k - 1)] >= x) --k;
  while (k < n && row.lon[static_cast<size_t>(k)] < x) ++k;
  return k;
}
inline long row_upper_bound(const Row& row, double x) {
  const long n = static_cast<long>(row.lon.size());
  long k = row_guess(row, x);
  while (k > 0 && row.lon[static_cast<size_t>(k - 1)] > x) --k;
  while (k < n && row.lon[static_cast<size_t>(k)] <= x) ++k;
  return k;
}

// The visits below are made in ranges: g(k0, k1) for the indices k0 <= k < k1 (0 <= k0 < k1 <= n), and the
// for_ functions call f(k) for each k of each range in turn. A caller that needs only some points of a row
// (for_marked) reads them per range instead of stepping over the rest.
template <class F>
void for_row(const Row& row, F&& f) {
  for (long k = 0, n = static_cast<long>(row.lon.size()); k < n; ++k) f(k);
}
template <class F>
auto each_index(F& f) {
  return [&f](long k0, long k1) {
    for (long k = k0; k < k1; ++k) f(k);
  };
}

// On a periodic row, points are counted round the circle without end: index k stands for point k mod n.
// The indices [first, last) of the points on the arc from a to b (any reals, a <= b), widened by 1e-6 of a
// spacing at each end, which covers the 1e-9 rad the points may be off the even spacing. The callers need
// only a superset of the points (a point visited needlessly costs one exact test and changes no result), but
// never a point twice.
struct IndexSpan {
  long first, last;
};
// Floor and ceiling of x for |x| < 2^62 (truncation toward zero, then one step), without a library call.
inline long floor_long(double x) {
  const long t = static_cast<long>(x);
  return t - (static_cast<double>(t) > x);
}
inline long ceil_long(double x) {
  const long t = static_cast<long>(x);
  return t + (static_cast<double>(t) < x);
}
inline IndexSpan periodic_span(const Row& row, double a, double b) {
  return {ceil_long((a - row.lon0) * row.per_rad - 1e-6), floor_long((b - row.lon0) * row.per_rad + 1e-6) + 1};
}
// The ranges of the points of the span, each point once (the whole row once when the span is n or longer).
template <class G>
void span_ranges(const Row& row, long first, long last, G&& g) {
  const long n = static_cast<long>(row.lon.size());
  if (n == 0 || last <= first) return;
  if (last - first >= n) return g(0, n);
  long k0 = first % n;
  if (k0 < 0) k0 += n;
  const long end = k0 + (last - first);
  g(k0, std::min(n, end));
  if (end > n) g(0, end - n);
}

// Call f(i) for the row points whose longitude lies on the arc from a to b (rad, b - a < 2 pi, any real a),
// with each end open or closed (on a periodic row, a superset: the span of both ends closed and widened).
// Each point is visited at most once.
template <class G>
void arc_ranges(const Row& row, double a, double b, bool open_a, bool open_b, G&& g) {
  if (row.periodic) {
    const IndexSpan sp = periodic_span(row, a, b);
    return span_ranges(row, sp.first, sp.last, g);
  }
  const double shift = two_pi * std::floor((a + pi) * (1.0 / two_pi));
  a -= shift;  // now in [-pi, pi)
  b -= shift;
  const auto lo = [&](double x) { return open_a ? row_upper_bound(row, x) : row_lower_bound(row, x); };
  const auto hi = [&](double x) { return open_b ? row_lower_bound(row, x) : row_upper_bound(row, x); };
  const long n = static_cast<long>(row.lon.size());
  if (b < pi) {
    const long k0 = lo(a), e = hi(b);
    if (k0 < e) g(k0, e);
  } else {
    const long k0 = lo(a), e = hi(b - two_pi);
    if (k0 < n) g(k0, n);
    if (0 < e) g(0, e);
  }
}
template <class F>
void for_arc(const Row& row, double a, double b, bool open_a, bool open_b, F&& f) {
  arc_ranges(row, a, b, open_a, open_b, each_index(f));
}

// Call f(i) for the points on the arcs [a1, b1) and (a2, b2], with a1 <= b1 <= a2 <= b2 and b2 - a1 < 2 pi
// (on a periodic row, a superset), each point at most once.
template <class F>
void for_two_arcs(const Row& row, double a1, double b1, double a2, double b2, F&& f) {
  const auto g = each_index(f);
  if (!row.periodic) {
    arc_ranges(row, a1, b1, false, true, g);
    arc_ranges(row, a2, b2, true, false, g);
    return;
  }
  const long n = static_cast<long>(row.lon.size());
  const IndexSpan s1 = periodic_span(row, a1, b1);
  IndexSpan s2 = periodic_span(row, a2, b2);
  if (s1.last - s1.first >= n) return for_row(row, f);
  if (s1.last >= s2.first) return span_ranges(row, s1.first, std::max(s1.last, s2.last), g);  // the widened spans meet
  s2.last = std::min(s2.last, s1.first + n);  // nor may the second come round onto the first
  span_ranges(row, s1.first, s1.last, g);
  span_ranges(row, s2.first, s2.last, g);
}

// Call f(i) for the row points within half-width h (rad, >= 0; >= pi: the whole row) of longitude lon.
template <class G>
void window_ranges(const Row& row, double lon, double h, G&& g) {
  if (h >= pi) {
    if (!row.lon.empty()) g(0, static_cast<long>(row.lon.size()));
  } else {
    arc_ranges(row, lon - h, lon + h, false, false, g);
  }
}
template <class F>
void for_window(const Row& row, double lon, double h, F&& f) {
  window_ranges(row, lon, h, each_index(f));
}

// Call f(i) for the marked points within half-width h of longitude lon: the same points as for_window
// restricted to the marked ones. `marked` is a bit set of the row's indices (bit k % 64 of word k / 64), so each
// range is read a word of 64 points at a time and only the marked points are visited.
template <class F>
void for_marked(const Row& row, const std::vector<std::uint64_t>& marked, double lon, double h, F&& f) {
  window_ranges(row, lon, h, [&](long k0, long k1) {
    const size_t w0 = static_cast<size_t>(k0) >> 6, w1 = static_cast<size_t>(k1 - 1) >> 6;
    for (size_t w = w0; w <= w1; ++w) {
      std::uint64_t bits = marked[w];
      if (w == w0) bits &= ~std::uint64_t{0} << (static_cast<unsigned>(k0) & 63u);
      if (w == w1) bits &= ~std::uint64_t{0} >> (63u - (static_cast<unsigned>(k1 - 1) & 63u));
      while (bits != 0) {
        f(static_cast<long>(w * 64 + static_cast<size_t>(std::countr_zero(bits))));
        bits &= bits - 1;
      }
    }
  });
}


}  // namespace skein::coverage_engine
