#include "skein/budget/sample_stats.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace skein {

double percentile_of_sorted(const std::vector<double>& sorted, double p) {
  assert(!sorted.empty() && p >= 0.0 && p <= 1.0);
  const double rank = static_cast<double>(sorted.size() - 1) * p;
  const size_t lo = static_cast<size_t>(std::floor(rank));
  const size_t hi = std::min(lo + 1, sorted.size() - 1);
  const double f = rank - static_cast<double>(lo);
  return f == 0.0 ? sorted[lo] : sorted[lo] + f * (sorted[hi] - sorted[lo]);
}

QuantileInterval quantile_interval_of_sorted(const std::vector<double>& sorted, double p) {
  assert(!sorted.empty() && p > 0.0 && p < 1.0);
  constexpr double z95 = 1.959963984540054;  // the two-sided 95 % normal deviate
  const double n = static_cast<double>(sorted.size());
  const double half = z95 * std::sqrt(n * p * (1.0 - p));
  const double l = std::clamp(std::floor(n * p - half), 1.0, n), u = std::clamp(std::ceil(n * p + half), 1.0, n);
  QuantileInterval q;
  q.low = sorted[static_cast<size_t>(l) - 1];
  q.high = sorted[static_cast<size_t>(u) - 1];
  q.standard_error = (q.high - q.low) / (2.0 * z95);
  return q;
}

SampleSummary summarise_samples(const std::vector<double>& values) {
  assert(!values.empty());
  SampleSummary s;
  double sum = 0.0;
  for (double v : values) sum += v;
  s.mean = sum / static_cast<double>(values.size());
  std::vector<double> sorted = values;
  std::sort(sorted.begin(), sorted.end());
  s.p5 = percentile_of_sorted(sorted, 0.05);
  s.p50 = percentile_of_sorted(sorted, 0.50);
  s.p95 = percentile_of_sorted(sorted, 0.95);
  s.p95_interval = quantile_interval_of_sorted(sorted, 0.95);
  return s;
}

}  // namespace skein
