#pragma once
// Percentiles of a set of Monte Carlo samples and the standard error of a percentile.
#include <vector>

namespace skein {

// The p-quantile (0 <= p <= 1) of sorted values by linear interpolation between order statistics at rank
// (n - 1) p (Hyndman & Fan 1996, definition 7; numpy's default "linear" method). Asserts a non-empty input.
double percentile_of_sorted(const std::vector<double>& sorted, double p);

// The standard error of the sample p-quantile, distribution-free, from the order-statistic interval: the number of
// samples below the true quantile is binomial (n, p), so [x_(l), x_(u)] with l, u = n p -+ 1.96 sqrt(n p (1 - p))
// (rounded outward, 1-based, clamped to 1..n) covers it with about 95 % probability (W.J. Conover, "Practical
// Nonparametric Statistics", 3rd ed. 1999, sec. 3.2, the large-sample quantile interval; recalled from memory).
// The standard error is that interval's width over 2 x 1.96; for a smooth density f it tends to the asymptotic
// sqrt(p (1 - p) / n) / f(x_p) (R.J. Serfling, "Approximation Theorems of Mathematical Statistics", 1980,
// sec. 2.3; from memory).
struct QuantileInterval {
  double low = 0.0;   // x_(l)
  double high = 0.0;  // x_(u)
  double standard_error = 0.0;
};
QuantileInterval quantile_interval_of_sorted(const std::vector<double>& sorted, double p);

// What a Monte Carlo budget reports for one figure.
struct SampleSummary {
  double mean = 0.0;  // summed in sample-index order
  double p5 = 0.0;
  double p50 = 0.0;
  double p95 = 0.0;
  QuantileInterval p95_interval;
};
// Summarise the values in sample-index order (the mean is summed in that order; the percentiles sort a copy).
SampleSummary summarise_samples(const std::vector<double>& values_by_index);

}  // namespace skein
