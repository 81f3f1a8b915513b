#pragma once
// The report's figures of a Monte Carlo budget (budget/monte_carlo.hpp), as SVG text.
#include <string>

#include "skein/budget/monte_carlo.hpp"

namespace skein {

// Histogram of the total delta-v per satellite over the samples: share of samples per bin, one series per shell,
// on bins shared by every shell (histogram_bins between the smallest and largest sample).
inline constexpr int histogram_bins = 30;
std::string total_dv_histogram_svg(const BudgetSpreadResult& r);

// Distribution of the natural lifetime (years): the share of samples at or below each lifetime, one series per shell
// (at most cdf_points points per series, at evenly spaced ranks).
inline constexpr size_t cdf_points = 400;
std::string lifetime_distribution_svg(const BudgetSpreadResult& r);

}  // namespace skein
