#include "skein/coverage/engine/metrics.hpp"

#include <algorithm>
#include <bit>
#include <cassert>
#include <cstdint>
#include <cmath>
#include <numeric>

#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/parallel_for.h>
#include <tbb/parallel_invoke.h>

#include "skein/parallel_items.hpp"

namespace skein::coverage_engine {

double weighted_quantile(std::vector<std::pair<float, double>>& sample, double q) {
  // The smallest value v whose weight at or below v reaches q of the total (the first value where the
  // cumulative weight of the sorted sample reaches it), found by a three-way quickselect on the value instead
  // of a sort: expected O(n). Deterministic (median-of-three pivots), so equal inputs give equal results.
  if (sample.empty()) return 0.0;
  double total = 0.0;
  for (const auto& v : sample) total += v.second;
  const double threshold = q * total * (1.0 - 1e-12);
  size_t lo = 0, hi = sample.size();
  double below = 0.0;  // weight of the values known to lie below [lo, hi)
  while (hi - lo > 1) {
    const float a = sample[lo].first, b = sample[lo + (hi - lo) / 2].first, c = sample[hi - 1].first;
    const float pivot = std::max(std::min(a, b), std::min(std::max(a, b), c));
    // [lo, lt) < pivot, [lt, gt) == pivot, [gt, hi) > pivot (Dijkstra's three-way partition).
    size_t lt = lo, i = lo, gt = hi;
    double w_less = 0.0, w_equal = 0.0;
    while (i < gt) {
      if (sample[i].first < pivot) {
        w_less += sample[i].second;
        std::swap(sample[lt++], sample[i++]);
      } else if (sample[i].first > pivot) {
        std::swap(sample[i], sample[--gt]);
      } else {
        w_equal += sample[i++].second;
      }
    }
    if (below + w_less >= threshold && lt > lo) {
      hi = lt;
    } else if (below + w_less + w_equal >= threshold || gt == hi) {
      return pivot;
    } else {
      below += w_less + w_equal;
      lo = gt;
    }
  }
  return sample[lo].first;
}

namespace {

// Calls f(length_s) for each gap of one point at fold k (1-based), in the order they closed; no copy.
template <class F>
void for_each_gap(const PointState& ps, int k, F&& f) {
  if (k == 1) {
    for (float g : ps.gaps) f(g);
    return;
  }
  for (const FoldGap& g : ps.fold_gaps)
    if (g.fold == k) f(g.length_s);
}

// The figures of one point's gaps over a span of `span_s` (sorts `gaps`).
GapFigures point_gap_figures(std::vector<float>& gaps, double span_s) {
  GapFigures f;
  f.gap_count = static_cast<long>(gaps.size());
  if (gaps.empty()) return f;
  // Sums in ascending order, as the sorted gaps were summed before (so the figures keep their last bits).
  std::sort(gaps.begin(), gaps.end());
  double sum = 0.0, sq = 0.0;
  for (float g : gaps) {
    sum += g;
    sq += static_cast<double>(g) * g;
  }
  f.max_gap_s = gaps.back();
  f.mean_gap_s = sum / static_cast<double>(gaps.size());
  // Nearest-rank percentile: the ceil(0.95 n)-th smallest (common practice).
  const size_t rank = static_cast<size_t>(std::ceil(0.95 * static_cast<double>(gaps.size())));
  f.p95_gap_s = gaps[std::max<size_t>(rank, 1) - 1];
  // Mean response time: a request at a time inside a gap of length g waits on average g/2, so the time
  // average over the span is sum(g^2) / (2 span) (SMAD 3rd ed. sec. 7.2, "mean response time").
  f.mean_response_time_s = sq / (2.0 * span_s);
  return f;
}

// The plain (fold-1) gap fields of a point or an aggregate, from its fold-1 figures.
template <class Target>
void set_fold1_figures(Target& t, const GapFigures& f1) {
  t.max_gap_s = f1.max_gap_s;
  t.mean_gap_s = f1.mean_gap_s;
  t.p95_gap_s = f1.p95_gap_s;
  t.gap_count = f1.gap_count;
  t.mean_response_time_s = f1.mean_response_time_s;
}

// The figures of one point: percent by fold from its in-view time bins `hist` (in_view_bins entries), required
// radius from its worst k-th nearest cosines `worst_cos` (K entries), gaps, satellites in view and passes, over
// a span of `span_s`. `gaps` is scratch for one fold's gaps.
PointCoverage point_coverage(const GridPoint& point, const PointState& ps, const double* hist, const double* worst_cos,
                             int K, double span_s, std::vector<float>& gaps) {
  PointCoverage pc;
  pc.point = point;
  // Time with at least k in view: the bins above k - 1, summed from the top.
  double at_least[max_fold_limit];
  double above = 0.0;
  for (int n = in_view_bins - 1; n >= 1; --n) {
    above += hist[n];
    if (n <= K) at_least[n - 1] = above;
  }
  for (int k = 0; k < K; ++k) {
    pc.percent_by_fold.push_back(100.0 * at_least[k] / span_s);
    pc.radius_deg_by_fold.push_back(std::acos(std::clamp(worst_cos[k], -1.0, 1.0)) * deg_per_rad);
    gaps.clear();
    for_each_gap(ps, k + 1, [&](float g) { gaps.push_back(g); });
    pc.gaps_by_fold.push_back(point_gap_figures(gaps, span_s));
  }
  set_fold1_figures(pc, pc.gaps_by_fold.front());
  pc.mean_in_view = ps.count_time / span_s;
  pc.max_in_view = ps.max_in_view;
  pc.passes = ps.passes;
  // The time integral of the count in view is the sum of the passes' durations (within the span).
  pc.mean_pass_s = ps.passes > 0 ? ps.count_time / static_cast<double>(ps.passes) : 0.0;
  return pc;
}

}  // namespace

std::vector<PooledGaps> pooled_gaps(const Grid& grid, const std::vector<size_t>& members,
                                    const std::vector<PointState>& state, int K,
                                    std::vector<std::pair<float, double>>& pooled, const std::vector<double>* fold1_cdf) {
  std::vector<PooledGaps> out(static_cast<size_t>(K));
  for (int k = 1; k <= K; ++k) {
    PooledGaps& f = out[static_cast<size_t>(k - 1)];
    const bool pool = k > 1 || fold1_cdf == nullptr;
    double gap_sum = 0.0, gap_weight = 0.0;
    pooled.clear();
    for (size_t i : members) {
      const double pw = grid.points[i].area_weight;
      for_each_gap(state[i], k, [&](float g) {
        gap_sum += pw * g;
        gap_weight += pw;
        if (pool) pooled.emplace_back(g, pw);
      });
    }
    if (gap_weight > 0.0) {
      f.mean_gap_s = gap_sum / gap_weight;
      f.p95_gap_s = pool ? weighted_quantile(pooled, 0.95) : (*fold1_cdf)[95];
    }
  }
  return out;
}

CoverageAggregate aggregate(const std::vector<PointCoverage>& pts, const std::vector<size_t>& members,
                            const std::vector<PooledGaps>& pooled, int K) {
  CoverageAggregate a;
  a.percent_by_fold.assign(static_cast<size_t>(K), 0.0);
  a.gaps_by_fold.assign(static_cast<size_t>(K), GapFigures{});
  double w = 0.0;
  for (size_t i : members) {
    const PointCoverage& p = pts[i];
    const double pw = p.point.area_weight;
    w += pw;
    for (int k = 0; k < K; ++k) a.percent_by_fold[static_cast<size_t>(k)] += pw * p.percent_by_fold[static_cast<size_t>(k)];
    a.mean_in_view += pw * p.mean_in_view;
    a.max_in_view = std::max(a.max_in_view, p.max_in_view);
  }
  a.points = static_cast<long>(members.size());
  a.area_weight = w;  // the grid's weights sum to 1
  if (w > 0.0) {
    for (double& v : a.percent_by_fold) v /= w;
    a.mean_in_view /= w;
  }
  for (int k = 1; k <= K; ++k) {
    GapFigures& f = a.gaps_by_fold[static_cast<size_t>(k - 1)];
    for (size_t i : members) {
      const PointCoverage& p = pts[i];
      const GapFigures& pf = p.gaps_by_fold[static_cast<size_t>(k - 1)];
      f.max_gap_s = std::max(f.max_gap_s, pf.max_gap_s);
      f.gap_count += pf.gap_count;
      f.mean_response_time_s += p.point.area_weight * pf.mean_response_time_s;
    }
    if (w > 0.0) f.mean_response_time_s /= w;
    f.mean_gap_s = pooled[static_cast<size_t>(k - 1)].mean_gap_s;
    f.p95_gap_s = pooled[static_cast<size_t>(k - 1)].p95_gap_s;
  }
  set_fold1_figures(a, a.gaps_by_fold.front());
  return a;
}

std::vector<double> gap_cdf(const std::vector<PointState>& state, const Grid& grid) {
  // Bucket of a gap: the top bits of its float's bit pattern, which for non-negative floats grows with the
  // value; 8 mantissa bits are kept, so a bucket spans a relative width of 2^-8.
  constexpr int shift = 15;
  constexpr size_t buckets = (std::uint32_t{0x7f800000u} >> shift) + 1;
  const auto bucket_of = [](float g) {
    assert(g >= 0.0f && std::isfinite(g));
    return static_cast<size_t>(std::bit_cast<std::uint32_t>(g) >> shift);
  };
  std::vector<double> weight(buckets, 0.0);
  size_t n = 0;
  for (size_t p = 0; p < state.size(); ++p) {
    const double w = grid.points[p].area_weight;
    for (float g : state[p].gaps) weight[bucket_of(g)] += w;
    n += state[p].gaps.size();
  }
  if (n == 0) return {};
  double total = 0.0;
  size_t first = buckets, last = 0;
  for (size_t b = 0; b < buckets; ++b) {
    if (weight[b] <= 0.0) continue;
    total += weight[b];
    first = std::min(first, b);
    last = b;
  }
  // The bucket of each quantile (q = 0: the smallest gap), and the weight below it.
  constexpr int quantiles = 101;
  size_t at[quantiles];
  double below_at[quantiles];
  at[0] = first;
  below_at[0] = 0.0;
  {
    size_t b = first;
    double below = 0.0;
    for (int q = 1; q < quantiles; ++q) {
      const double target = q / 100.0 * total * (1.0 - 1e-12);
      while (b < last && below + weight[b] < target) below += weight[b++];
      at[q] = b;
      below_at[q] = below;
    }
  }
  // Gather the gaps of those buckets only, and order each by value.
  std::vector<std::int32_t> slot(buckets, -1);
  std::vector<std::vector<std::pair<float, double>>> gathered;
  for (size_t b : at)
    if (slot[b] < 0) {
      slot[b] = static_cast<std::int32_t>(gathered.size());
      gathered.emplace_back();
    }
  for (size_t p = 0; p < state.size(); ++p) {
    const double w = grid.points[p].area_weight;
    for (float g : state[p].gaps)
      if (const std::int32_t s = slot[bucket_of(g)]; s >= 0) gathered[static_cast<size_t>(s)].emplace_back(g, w);
  }
  for (auto& v : gathered)
    std::stable_sort(v.begin(), v.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
  std::vector<double> out;
  out.push_back(gathered[static_cast<size_t>(slot[at[0]])].front().first);
  for (int q = 1; q < quantiles; ++q) {
    const double target = q / 100.0 * total * (1.0 - 1e-12);
    const auto& v = gathered[static_cast<size_t>(slot[at[q]])];
    double cum = below_at[q];
    size_t i = 0;
    while (i + 1 < v.size() && cum + v[i].second < target) cum += v[i++].second;
    out.push_back(v[i].first);
  }
  return out;
}

void collect_metrics(CoverageResult& res, const Grid& grid, const std::vector<PointState>& state, const std::vector<double>& hist,
                     const std::vector<double>& worst_cos, const std::vector<std::int64_t>& worst_q, std::int64_t total_q,
                     const Sampling& smp, double band_width_deg) {
  const size_t P = grid.points.size();
  const int K = res.max_fold;
  res.points.resize(P);
  res.required_radius_deg.assign(static_cast<size_t>(K), 0.0);
  res.in_view_fraction.assign(in_view_bins, 0.0);
  // Each point's figures depend on that point alone, and the pooled gap figures of the grid and of each
  // latitude band, and the grid's gap quantiles, on the gaps alone: all made side by side (each pool of
  // (gap, weight) its own thread's; the pooled figures take no lock and wait on nothing, so a thread runs one at
  // a time). The sums over points below run in point order, as before, so the totals keep their bits whatever
  // the threads.
  const int nbands = static_cast<int>(std::lround(180.0 / band_width_deg));
  std::vector<std::vector<size_t>> members(static_cast<size_t>(nbands));
  for (size_t p = 0; p < P; ++p) {
    const int b = std::clamp(static_cast<int>(std::floor((grid.points[p].lat_deg + 90.0) / band_width_deg)), 0, nbands - 1);
    members[static_cast<size_t>(b)].push_back(p);
  }
  std::vector<size_t> all(P);
  std::iota(all.begin(), all.end(), 0);
  tbb::enumerable_thread_specific<std::vector<std::pair<float, double>>> pools;
  std::vector<PooledGaps> total_pooled;
  std::vector<std::vector<PooledGaps>> band_pooled(static_cast<size_t>(nbands));
  tbb::parallel_invoke(
      [&] {
        tbb::parallel_for(tbb::blocked_range<size_t>(0, P, 256), [&](const tbb::blocked_range<size_t>& range) {
          std::vector<float> gaps;  // scratch, reused over the range
          for (size_t p = range.begin(); p < range.end(); ++p)
            res.points[p] = point_coverage(grid.points[p], state[p], &hist[p * in_view_bins],
                                           &worst_cos[p * static_cast<size_t>(K)], K, smp.span, gaps);
        });
      },
      [&] {
        // The whole grid: its fold-1 95th percentile is the gap quantiles' (the same rule over the same
        // gaps), so its pool holds the gaps of folds 2..K only.
        res.gap_quantiles_s = gap_cdf(state, grid);
        std::vector<std::pair<float, double>>& pool = pools.local();
        size_t gaps = 0;
        for (const PointState& ps : state) gaps += ps.fold_gaps.size();
        pool.reserve(gaps);
        total_pooled = pooled_gaps(grid, all, state, K, pool, &res.gap_quantiles_s);
      },
      [&] {
        tbb::parallel_for(0, nbands, [&](int b) {
          if (!members[static_cast<size_t>(b)].empty())
            band_pooled[static_cast<size_t>(b)] =
                pooled_gaps(grid, members[static_cast<size_t>(b)], state, K, pools.local(), nullptr);
        });
      });
  stop_if_cancelled("coverage metrics");  // before reading the points those loops filled
  for (size_t p = 0; p < P; ++p) {
    const PointCoverage& pc = res.points[p];
    for (int k = 0; k < K; ++k)
      res.required_radius_deg[static_cast<size_t>(k)] =
          std::max(res.required_radius_deg[static_cast<size_t>(k)], pc.radius_deg_by_fold[static_cast<size_t>(k)]);
    for (int n = 0; n < in_view_bins; ++n)
      res.in_view_fraction[static_cast<size_t>(n)] += pc.point.area_weight * hist[p * in_view_bins + static_cast<size_t>(n)] / smp.span;
  }
  for (int k = 0; k < K; ++k) {
    WorstPoint worst;
    for (size_t p = 0; p < P; ++p) {
      const PointCoverage& pc = res.points[p];
      const double pct = pc.percent_by_fold[static_cast<size_t>(k)];
      const double gap = pc.gaps_by_fold[static_cast<size_t>(k)].max_gap_s;
      if (p == 0 || pct < worst.percent_covered || (pct == worst.percent_covered && gap > worst.max_gap_s))
        worst = {p, pct, gap};
    }
    res.worst_point_by_fold.push_back(worst);
  }
  for (int k = 0; k < K; ++k)
    res.worst_instant_covered_percent.push_back(
        total_q > 0 ? 100.0 * static_cast<double>(worst_q[static_cast<size_t>(k)]) / static_cast<double>(total_q) : 0.0);

  res.total = aggregate(res.points, all, total_pooled, K);
  for (int b = 0; b < nbands; ++b) {
    if (members[static_cast<size_t>(b)].empty()) continue;
    LatitudeBand band;
    band.lat_min_deg = -90.0 + b * band_width_deg;
    band.lat_max_deg = band.lat_min_deg + band_width_deg;
    band.metrics = aggregate(res.points, members[static_cast<size_t>(b)], band_pooled[static_cast<size_t>(b)], K);
    res.bands.push_back(std::move(band));
  }
}

}  // namespace skein::coverage_engine
