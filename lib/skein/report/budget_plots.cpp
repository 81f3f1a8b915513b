#include "skein/report/budget_plots.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/constants.hpp"
#include "skein/report/svg_plot.hpp"

namespace skein {

std::string total_dv_histogram_svg(const BudgetSpreadResult& r) {
  double lo = INFINITY, hi = -INFINITY;
  for (const auto& sh : r.shells)
    if (const SpreadFigure* f = sh.find("total_dv"))
      for (double v : f->values) {
        lo = std::min(lo, v);
        hi = std::max(hi, v);
      }
  std::vector<Series> series;
  if (std::isfinite(lo)) {
    if (!(hi > lo)) hi = lo + std::max(1e-6 * std::abs(lo), 1e-6);  // every sample equal: one visible bin
    const double width = (hi - lo) / histogram_bins;
    for (const auto& sh : r.shells) {
      const SpreadFigure* f = sh.find("total_dv");
      std::vector<double> count(histogram_bins, 0.0);
      for (double v : f->values)
        count[static_cast<size_t>(std::clamp(static_cast<int>((v - lo) / width), 0, histogram_bins - 1))] += 1.0;
      Series s{fmt::format("shell {} (stated case {:.1f} m/s)", sh.name, f->deterministic), {lo}, {0.0},
               SeriesStyle::step};
      for (int k = 0; k < histogram_bins; ++k) {
        s.x.push_back(lo + k * width);
        s.y.push_back(100.0 * count[static_cast<size_t>(k)] / static_cast<double>(f->values.size()));
      }
      s.x.push_back(hi);
      s.y.push_back(0.0);
      series.push_back(std::move(s));
    }
  }
  PlotAxes a{fmt::format("Total delta-v per satellite over {} samples", r.samples), "total delta-v (m/s)",
             "share of samples (%)"};
  a.y_min = 0.0;
  return line_plot_svg(a, series);
}

std::string lifetime_distribution_svg(const BudgetSpreadResult& r) {
  std::vector<Series> series;
  for (const auto& sh : r.shells) {
    const SpreadFigure* f = sh.find("natural_lifetime");
    std::vector<double> years = f->values;
    for (double& y : years) y /= days_per_julian_year;
    std::sort(years.begin(), years.end());
    const size_t n = years.size();
    Series s{fmt::format("shell {}{}", sh.name, sh.lifetime_lower_bounds > 0 ? " (some still in orbit at the horizon)" : ""),
             {years.front()}, {0.0}, SeriesStyle::step};
    const size_t stride = std::max<size_t>(1, n / cdf_points);
    for (size_t k = 0; k < n; k += stride) {
      s.x.push_back(years[k]);
      s.y.push_back(100.0 * static_cast<double>(k + 1) / static_cast<double>(n));
    }
    if (s.x.back() != years.back() || s.y.back() != 100.0) {
      s.x.push_back(years.back());
      s.y.push_back(100.0);
    }
    series.push_back(std::move(s));
  }
  PlotAxes a{fmt::format("Natural lifetime over {} samples", r.samples), "natural lifetime (years)",
             "samples at or below (%)"};
  a.y_min = 0.0;
  a.y_max = 100.0;
  return line_plot_svg(a, series);
}

}  // namespace skein
