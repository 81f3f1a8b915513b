// Evidence for the pieces of the coverage engine (lib/skein/coverage/engine/), reachable since the split:
// the fast crossing root against the safeguarded one, the row index across the antimeridian, and the point
// timeline's integrals on a hand-made event list.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

#include "skein/coverage/engine/crossings.hpp"
#include "skein/coverage/engine/metrics.hpp"
#include "skein/coverage/engine/row_index.hpp"
#include "skein/coverage/engine/timeline.hpp"

using namespace skein;
using namespace skein::coverage_engine;

TEST_CASE("crossings: the fast root and the safeguarded root agree with a bisection of the same cubic") {
  // Random rises over a 1 s interval: the margin goes from below to above zero with positive rates at both
  // ends (a crossing as the evaluator meets it; the rates span 0.05x to 3x the mean slope, so the cubic bends
  // strongly). The reference is a 200-step bisection of the same Hermite cubic. Where the branch-free path is
  // accepted (second Newton step under 1e-3 of the interval) its error is of the order of the square of that
  // step: at most 1e-5 of the interval here (measured below). Elsewhere the safeguarded iteration stops after
  // a Newton step under 1e-4 of the interval, which leaves about 1e-8 (crossings.cpp); 1e-7 allowed.
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  int accepted = 0;
  double worst_fast = 0.0, worst_safe = 0.0;
  for (int k = 0; k < 20000; ++k) {
    const double f0 = -(u(rng) + 1e-3), f1 = u(rng) + 1e-3;
    const double slope = f1 - f0;
    const double d0 = slope * (0.05 + 2.95 * u(rng)), d1 = slope * (0.05 + 2.95 * u(rng));
    const HermiteCubic c(f0, d0, f1, d1, 1.0);
    double lo = 0.0, hi = 1.0;
    for (int it = 0; it < 200; ++it) {
      const double mid = 0.5 * (lo + hi);
      (c.value(mid) < 0.0 ? lo : hi) = mid;
    }
    // Only brackets whose cubic has a single root (monotone), so the reference is unambiguous.
    bool monotone = true;
    for (int i = 0; i <= 100 && monotone; ++i) monotone = c.slope(i / 100.0) > 0.0;
    if (!monotone) continue;
    double step = 0.0;
    const double x = newton_from_secant(f0, d0, f1, d1, 1.0, step);
    const double t = hermite_root(f0, d0, f1, d1, 0.0, 1.0);
    if (fast_root_accepted(f0, f1, x, step)) {
      ++accepted;
      CHECK(t == x);  // hermite_root keeps the accepted fast root (t0 = 0, h = 1)
      worst_fast = std::max(worst_fast, std::abs(x - lo));
      CHECK(std::abs(x - lo) <= 1e-5);
    } else {
      worst_safe = std::max(worst_safe, std::abs(t - lo));
      CHECK(std::abs(t - lo) <= 1e-7);
    }
  }
  MESSAGE("fast root accepted on ", accepted, " monotone brackets; worst error ", worst_fast,
          " of the interval; safeguarded worst error ", worst_safe);
  CHECK(accepted > 1000);
}

TEST_CASE("row index: an arc across the antimeridian visits every point on it once and no other") {
  // A periodic row of 360 points at 1 deg spacing, centred on the cells (-179.5 .. 179.5 deg).
  Row row;
  row.periodic = true;
  const int n = 360;
  for (int k = 0; k < n; ++k) {
    row.lon.push_back((-179.5 + k) * rad_per_deg);
    row.point.push_back(k);
  }
  row.lon0 = row.lon.front();
  row.per_rad = n / two_pi;
  row.guess_scale = (n - 1) / (row.lon.back() - row.lon.front());
  for (double centre_deg : {179.0, 180.0, -180.0, 540.0, -179.9}) {
    for (double half_deg : {0.2, 3.3, 10.0}) {
      CAPTURE(centre_deg);
      CAPTURE(half_deg);
      std::vector<int> visits(n, 0);
      const double a = (centre_deg - half_deg) * rad_per_deg, b = (centre_deg + half_deg) * rad_per_deg;
      for_arc(row, a, b, false, false, [&](long i) { ++visits[static_cast<size_t>(i)]; });
      for (int k = 0; k < n; ++k) {
        // Angular distance of point k from the centre, wrapped.
        double d = std::remainder(row.lon[static_cast<size_t>(k)] - centre_deg * rad_per_deg, two_pi);
        const bool inside = std::abs(d) <= half_deg * rad_per_deg + 1e-9;
        CHECK(visits[static_cast<size_t>(k)] <= 1);            // never twice
        if (inside) CHECK(visits[static_cast<size_t>(k)] == 1);  // never missed (the span is a superset)
        // The superset is widened by 1e-6 of a spacing only: a point a whole spacing outside is not visited.
        if (std::abs(d) > (half_deg + 1.0) * rad_per_deg) CHECK(visits[static_cast<size_t>(k)] == 0);
      }
    }
  }
  // Two arcs meeting across the antimeridian: merged, so no point is visited twice.
  std::vector<int> visits(n, 0);
  for_two_arcs(row, 170.0 * rad_per_deg, 178.0 * rad_per_deg, 178.0 * rad_per_deg, 190.0 * rad_per_deg,
               [&](long i) { ++visits[static_cast<size_t>(i)]; });
  for (int v : visits) CHECK(v <= 1);
}

TEST_CASE("row index: for_marked visits the marked points for_window visits, each once, and no other") {
  // Brute force: for_window on every point, filtered by membership of the list, against for_marked's walk
  // over the bit set's words, on a periodic row and on an uneven (non-periodic) one, windows across the antimeridian
  // and wider than the row.
  for (const bool periodic : {true, false}) {
    Row row;
    row.periodic = periodic;
    const int n = 180;
    for (int k = 0; k < n; ++k) {
      const double lon_deg = periodic ? -179.0 + 2.0 * k : -179.0 + 2.0 * k + 0.7 * std::sin(k);  // uneven
      row.lon.push_back(lon_deg * rad_per_deg);
      row.point.push_back(k);
    }
    row.lon0 = row.lon.front();
    row.per_rad = n / two_pi;
    row.guess_scale = (n - 1) / (row.lon.back() - row.lon.front());
    std::vector<std::uint32_t> listed;
    for (int k = 0; k < n; k += 1 + (k % 7)) listed.push_back(static_cast<std::uint32_t>(k));  // ascending
    std::vector<std::uint64_t> bits((n + 63) / 64, 0);
    for (const std::uint32_t k : listed) bits[k / 64] |= std::uint64_t{1} << (k % 64);
    for (double centre_deg : {0.0, 179.0, -179.5, 181.0, 540.0}) {
      for (double half_deg : {0.5, 7.0, 95.0, 200.0}) {
        CAPTURE(periodic);
        CAPTURE(centre_deg);
        CAPTURE(half_deg);
        std::vector<int> expect(n, 0), got(n, 0);
        const double lon = centre_deg * rad_per_deg, h = half_deg * rad_per_deg;
        for_window(row, lon, h, [&](long i) {
          if (std::binary_search(listed.begin(), listed.end(), static_cast<std::uint32_t>(i))) ++expect[static_cast<size_t>(i)];
        });
        for_marked(row, bits, lon, h, [&](long i) { ++got[static_cast<size_t>(i)]; });
        CHECK(got == expect);
        for (int v : got) CHECK(v <= 1);
      }
    }
  }
}

TEST_CASE("timeline: integrals and gaps of a hand-made event list") {
  // One point, span 0..100 s, out of view at the start. Events: rise at 10, rise at 20, set at 30, set at 45,
  // rise at 70, set at 70.5. In view: 0 on [0,10), 1 on [10,20), 2 on [20,30), 1 on [30,45), 0 on [45,70),
  // 1 on [70,70.5), 0 on [70.5,100]. Gaps: [0,10] = 10 s (open at the start), [45,70] = 25 s, and the final
  // [70.5,100] = 29.5 s, closed by the caller at the end of the span.
  std::vector<double> hist(33, 0.0);
  std::vector<double> fold_start(2, -1.0);  // folds 2 and 3
  PointState ps;
  const PointSums sums{hist.data(), fold_start.data(), 3};
  start_timeline(ps, sums, 0);
  std::vector<Event> e = {{10.0, +1, 0}, {20.0, +1, 0}, {30.0, -1, 0}};
  apply_events(ps, sums, e.data(), e.data() + e.size(), 0.0, 30.0);
  std::vector<Event> e2 = {{70.5, -1, 0}, {45.0, -1, 0}, {70.0, +1, 0}};
  sort_short(e2.data(), e2.data() + e2.size());
  CHECK(e2[0].t == 45.0);
  apply_events(ps, sums, e2.data(), e2.data() + e2.size(), 30.0, 100.0);
  integrate(ps, sums, 100.0);
  CHECK(hist[0] == doctest::Approx(10.0 + 25.0 + 29.5));
  CHECK(hist[1] == doctest::Approx(10.0 + 15.0 + 0.5));
  CHECK(hist[2] == doctest::Approx(10.0));
  CHECK(ps.count_time == doctest::Approx(10.0 + 2 * 10.0 + 15.0 + 0.5));
  CHECK(ps.max_in_view == 2);
  REQUIRE(ps.gaps.size() == 2);  // the last gap is still open
  CHECK(ps.gaps[0] == doctest::Approx(10.0));
  CHECK(ps.gaps[1] == doctest::Approx(25.0));
  CHECK(ps.in_gap);
  CHECK(ps.gap_start == doctest::Approx(70.5));
  // Fold 2 (fewer than 2 in view): [0,20] = 20 s, closed at the rise to 2; [30,100] = 70 s, open at the end.
  // Fold 3 (fewer than 3): the whole span, 100 s, never closed before the end.
  REQUIRE(ps.fold_gaps.size() == 1);
  CHECK(ps.fold_gaps[0].fold == 2);
  CHECK(ps.fold_gaps[0].length_s == doctest::Approx(20.0));
  close_gaps(ps, sums, 100.0);
  CHECK_FALSE(ps.in_gap);
  REQUIRE(ps.gaps.size() == 3);
  CHECK(ps.gaps[2] == doctest::Approx(29.5));
  REQUIRE(ps.fold_gaps.size() == 3);
  // close_gaps adds fold 2 then fold 3, in fold order.
  CHECK(ps.fold_gaps[1].fold == 2);
  CHECK(ps.fold_gaps[1].length_s == doctest::Approx(70.0));
  CHECK(ps.fold_gaps[2].fold == 3);
  CHECK(ps.fold_gaps[2].length_s == doctest::Approx(100.0));
}

TEST_CASE("weighted quantile: the quickselect equals the walk over the sorted sample, ties and all") {
  // The definition: sort by value, walk the cumulative weight, return the first value where it reaches q of
  // the total (the same 1e-12 allowance for rounding). Random samples with many ties (values on a coarse
  // lattice), equal weights (site grids) and random weights (cell grids), several quantiles.
  std::mt19937_64 rng(20261202);
  for (int trial = 0; trial < 400; ++trial) {
    const size_t n = 1 + rng() % 300;
    const bool equal_weights = trial % 2 == 0;
    std::vector<std::pair<float, double>> s;
    for (size_t i = 0; i < n; ++i)
      s.emplace_back(static_cast<float>(60 * (rng() % 40)), equal_weights ? 0.25 : 1e-4 + static_cast<double>(rng() % 1000) * 1e-5);
    for (double q : {0.0, 0.05, 0.5, 0.95, 1.0}) {
      std::vector<std::pair<float, double>> sorted = s;
      std::stable_sort(sorted.begin(), sorted.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
      double total = 0.0;
      for (const auto& v : sorted) total += v.second;
      float want = sorted.back().first;
      double cum = 0.0;
      for (const auto& v : sorted) {
        cum += v.second;
        if (cum >= q * total * (1.0 - 1e-12)) {
          want = v.first;
          break;
        }
      }
      std::vector<std::pair<float, double>> work = s;
      CAPTURE(trial);
      CAPTURE(q);
      CHECK(weighted_quantile(work, q) == want);
    }
  }
  std::vector<std::pair<float, double>> empty;
  CHECK(weighted_quantile(empty, 0.95) == 0.0);
}

TEST_CASE("gap distribution: the bucketed quantiles equal the walk over every gap sorted") {
  // gap_cdf must give the 0..100 % quantiles exactly as sorting all pooled gaps and walking their cumulative
  // area weight does (the definition the report's distribution table used before), without the sort. Random
  // grids: gaps on a coarse lattice (ties, many in one bucket), spread over five decades (many buckets), and
  // clustered inside one bucket's 2^-8 width; equal and unequal weights; points with no gaps.
  std::mt19937_64 rng(20261203);
  for (int trial = 0; trial < 120; ++trial) {
    const size_t points = 1 + rng() % 60;
    Grid grid;
    std::vector<PointState> state(points);
    std::vector<std::pair<float, double>> all;
    for (size_t p = 0; p < points; ++p) {
      GridPoint g;
      g.area_weight = trial % 2 == 0 ? 1.0 / static_cast<double>(points) : 1e-4 + static_cast<double>(rng() % 1000) * 1e-5;
      grid.points.push_back(g);
      const size_t gaps = rng() % 25;
      for (size_t i = 0; i < gaps; ++i) {
        float v = 0.0f;
        switch (trial % 3) {
          case 0: v = static_cast<float>(60 * (1 + rng() % 40)); break;
          case 1: v = static_cast<float>(std::pow(10.0, 5.0 * static_cast<double>(rng() % 100000) / 1e5)); break;
          default: v = 1000.0f + static_cast<float>(rng() % 1000) * 1e-3f; break;
        }
        state[p].gaps.push_back(v);
        all.emplace_back(v, g.area_weight);
      }
    }
    const std::vector<double> got = gap_cdf(state, grid);
    if (all.empty()) {
      CHECK(got.empty());
      continue;
    }
    std::stable_sort(all.begin(), all.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
    double total = 0.0;
    for (const auto& v : all) total += v.second;
    REQUIRE(got.size() == 101);
    CHECK(got[0] == all.front().first);
    for (int q = 1; q <= 100; ++q) {
      const double target = q / 100.0 * total * (1.0 - 1e-12);
      double cum = 0.0;
      size_t i = 0;
      while (i + 1 < all.size() && cum + all[i].second < target) cum += all[i++].second;
      CAPTURE(trial);
      CAPTURE(q);
      CHECK(got[static_cast<size_t>(q)] == all[i].first);
    }
  }
}

TEST_CASE("collect_metrics: the grid's and each band's pooled gaps against a brute-force walk over every gap") {
  // The figures a user reads for the whole grid and for each latitude band: the area-weighted mean gap and the
  // 95th percentile of the pooled gaps, at folds 1 and 2. The grid's fold-1 percentile comes from the gap
  // quantiles and the others from a quickselect; all must equal the definition: sort the members' gaps, walk
  // their cumulative area weight, and take the first gap where it reaches 0.95 of the total (less 1e-12 of it).
  // Random grids over several latitudes (so several 10 deg bands), unequal weights, ties and empty points.
  std::mt19937_64 rng(20261204);
  for (int trial = 0; trial < 40; ++trial) {
    const size_t P = 5 + rng() % 80;
    const int K = 2;
    Grid grid;
    std::vector<PointState> state(P);
    for (size_t p = 0; p < P; ++p) {
      GridPoint g;
      g.lat_deg = -85.0 + static_cast<double>(rng() % 170);
      g.area_weight = 1e-4 + static_cast<double>(rng() % 1000) * 1e-5;
      grid.points.push_back(g);
      const size_t gaps = rng() % 12;
      for (size_t i = 0; i < gaps; ++i) {
        const float v = trial % 2 == 0 ? static_cast<float>(60 * (1 + rng() % 20))
                                       : static_cast<float>(1.0 + static_cast<double>(rng() % 100000) * 0.37);
        state[p].gaps.push_back(v);
        state[p].fold_gaps.push_back({v + 30.0f, 2});
      }
    }
    const double span = 86400.0;
    std::vector<double> hist(P * in_view_bins, 0.0);
    for (size_t p = 0; p < P; ++p) hist[p * in_view_bins] = span;
    const std::vector<double> worst_cos(P * K, 0.5);
    const std::vector<std::int64_t> worst_q(K, 0);
    CoverageResult res;
    res.max_fold = K;
    collect_metrics(res, grid, state, hist, worst_cos, worst_q, 1, Sampling{2, span, span}, 10.0);

    // Brute force over the members of a set of points at fold k: {mean, p95}; {0, 0} without gaps.
    const auto brute = [&](const std::vector<size_t>& members, int k) -> std::pair<double, double> {
      std::vector<std::pair<float, double>> all;
      double sum = 0.0, weight = 0.0;
      for (size_t p : members) {
        const double w = grid.points[p].area_weight;
        const auto add = [&](float g) {
          all.emplace_back(g, w);
          sum += w * g;
          weight += w;
        };
        if (k == 1)
          for (float g : state[p].gaps) add(g);
        else
          for (const FoldGap& g : state[p].fold_gaps) add(g.length_s);
      }
      if (all.empty()) return {0.0, 0.0};
      std::stable_sort(all.begin(), all.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
      double total = 0.0;
      for (const auto& v : all) total += v.second;
      double cum = 0.0;
      size_t i = 0;
      while (i + 1 < all.size() && cum + all[i].second < 0.95 * total * (1.0 - 1e-12)) cum += all[i++].second;
      return {sum / weight, all[i].first};
    };
    std::vector<size_t> everyone(P);
    for (size_t p = 0; p < P; ++p) everyone[p] = p;
    for (int k = 1; k <= K; ++k) {
      CAPTURE(trial);
      CAPTURE(k);
      const auto [mean, p95] = brute(everyone, k);
      CHECK(res.total.gaps_by_fold[static_cast<size_t>(k - 1)].p95_gap_s == p95);
      CHECK(res.total.gaps_by_fold[static_cast<size_t>(k - 1)].mean_gap_s == doctest::Approx(mean).epsilon(1e-12));
      for (const LatitudeBand& band : res.bands) {
        std::vector<size_t> members;
        for (size_t p = 0; p < P; ++p)
          if (grid.points[p].lat_deg >= band.lat_min_deg && grid.points[p].lat_deg < band.lat_max_deg) members.push_back(p);
        CAPTURE(band.lat_min_deg);
        REQUIRE(static_cast<size_t>(band.metrics.points) == members.size());
        const auto [bm, bp] = brute(members, k);
        CHECK(band.metrics.gaps_by_fold[static_cast<size_t>(k - 1)].p95_gap_s == bp);
        CHECK(band.metrics.gaps_by_fold[static_cast<size_t>(k - 1)].mean_gap_s == doctest::Approx(bm).epsilon(1e-12));
      }
    }
  }
}
