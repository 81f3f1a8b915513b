#include "skein/report/deployment_plot.hpp"

#include <algorithm>
#include <limits>

#include <fmt/format.h>

#include "skein/report/svg_plot.hpp"

namespace skein {

std::string deployment_curve_svg(const ShellBudget& shell) {
  const DeploymentResult& d = *shell.deployment;
  std::vector<Series> series;
  Series curve{"trade curve", {}, {}, SeriesStyle::line};
  double y_max = 0.0, x_max = 0.0;
  for (const auto& p : d.curve) {
    curve.x.push_back(p.days);
    curve.y.push_back(p.dv_m_s);
    y_max = std::max(y_max, p.dv_m_s);
    x_max = std::max(x_max, p.days);
  }
  series.push_back(curve);
  if (!d.planes.empty()) {
    Series planes{"planes alone", {}, {}, SeriesStyle::points};
    for (const auto& p : d.planes) {
      planes.x.push_back(p.days);
      planes.y.push_back(p.dv_m_s);
    }
    series.push_back(planes);
  }
  if (d.deadline_days) {
    x_max = std::max(x_max, *d.deadline_days);
    series.push_back({fmt::format("deadline {} d", *d.deadline_days), {*d.deadline_days, *d.deadline_days},
                      {0.0, y_max > 0.0 ? y_max : 1.0}, SeriesStyle::line});
  }
  // The chosen point as a cross (two strokes, a NaN between them), larger than the plot's point marks.
  if (d.chosen) {
    const double x = d.chosen->days, y = d.chosen->dv_m_s;
    const double dx = 0.025 * (x_max > 0.0 ? x_max : 1.0), dy = 0.04 * (y_max > 0.0 ? y_max : 1.0);
    const double nan = std::numeric_limits<double>::quiet_NaN();
    series.push_back({fmt::format("chosen {:.0f} d", x), {x - dx, x + dx, x, x, x}, {y, y, nan, y - dy, y + dy},
                      SeriesStyle::line});
  }
  PlotAxes axes{"Deployment of shell " + shell.name + ": delta-v against time (differential J2 drift)",
                "days to full deployment", "delta-v per satellite, transfers (m/s)"};
  axes.x_min = 0.0;
  axes.y_min = 0.0;
  axes.x_max = x_max > 0.0 ? x_max * 1.05 : 1.0;
  axes.y_max = y_max > 0.0 ? y_max * 1.1 : 1.0;
  return line_plot_svg(axes, series);
}

}  // namespace skein
