#include "skein/coverage/engine/metrics.hpp"

#include <algorithm>

namespace skein::coverage_engine {

double weighted_quantile(std::vector<std::pair<float, double>>& sample, double q) {
  // sample sorted by value; smallest value whose cumulative weight reaches q of the total.
  double total = 0.0;
  for (const auto& v : sample) total += v.second;
  double cum = 0.0;
  for (const auto& v : sample) {
    cum += v.second;
    if (cum >= q * total * (1.0 - 1e-12)) return v.first;
  }
  return sample.back().first;
}

CoverageAggregate aggregate(const std::vector<PointCoverage>& pts, const std::vector<size_t>& members,
                            const std::vector<PointState>& state, int K, double total_weight) {
  CoverageAggregate a;
  a.percent_by_fold.assign(static_cast<size_t>(K), 0.0);
  double w = 0.0, gap_sum = 0.0, gap_weight = 0.0;
  std::vector<std::pair<float, double>> pooled;
  for (size_t i : members) {
    const PointCoverage& p = pts[i];
    const double pw = p.point.area_weight;
    w += pw;
    for (int k = 0; k < K; ++k) a.percent_by_fold[static_cast<size_t>(k)] += pw * p.percent_by_fold[static_cast<size_t>(k)];
    a.max_gap_s = std::max(a.max_gap_s, p.max_gap_s);
    a.gap_count += p.gap_count;
    a.mean_response_time_s += pw * p.mean_response_time_s;
    a.mean_in_view += pw * p.mean_in_view;
    a.max_in_view = std::max(a.max_in_view, p.max_in_view);
    for (float g : state[i].gaps) {
      gap_sum += pw * g;
      gap_weight += pw;
      pooled.emplace_back(g, pw);
    }
  }
  a.points = static_cast<long>(members.size());
  a.area_weight = w / total_weight;
  if (w > 0.0) {
    for (double& v : a.percent_by_fold) v /= w;
    a.mean_response_time_s /= w;
    a.mean_in_view /= w;
  }
  if (gap_weight > 0.0) {
    a.mean_gap_s = gap_sum / gap_weight;
    std::stable_sort(pooled.begin(), pooled.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
    a.p95_gap_s = weighted_quantile(pooled, 0.95);
  }
  return a;
}


}  // namespace skein::coverage_engine
