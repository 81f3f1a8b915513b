#include "skein/report/svg_plot.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include <fmt/format.h>

#include "skein/report/table.hpp"

namespace skein {
namespace {

constexpr double width = 760, height = 440;
constexpr double left = 78, right = 180, top = 42, bottom = 62;  // plot margins; legend on the right
const std::array<const char*, 8> palette = {"#2f6690", "#d1495b", "#3a9e8f", "#edae49",
                                            "#6a4c93", "#00798c", "#8c6d46", "#5c5c5c"};

// SVG text is XML: the HTML escaping of the table renderer serves.
std::string esc(const std::string& s) { return html_escape(s); }

struct Scale {
  double lo, hi, p0, p1;  // data range to pixel range
  double operator()(double v) const { return p0 + (v - lo) / (hi - lo) * (p1 - p0); }
};

// "Nice" tick positions covering [lo, hi] (Heckbert's labelling idea, common practice).
std::vector<double> ticks(double lo, double hi, int target = 6) {
  const double span = hi - lo;
  const double raw = span / target;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  double step = mag;
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (m * mag >= raw) {
      step = m * mag;
      break;
    }
  std::vector<double> t;
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) t.push_back(std::abs(v) < step * 1e-9 ? 0.0 : v);
  return t;
}

std::string tick_label(double v) {
  std::string s = fmt::format("{:.6g}", v);
  return s;
}

void pad_range(double& lo, double& hi) {
  if (!(hi > lo)) {
    const double d = std::abs(lo) > 0 ? std::abs(lo) * 0.1 : 1.0;
    lo -= d;
    hi += d;
  }
}

std::string header(const PlotAxes& a) {
  std::string s = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0}\" height=\"{1}\" viewBox=\"0 0 {0} {1}\" "
      "font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"12\">\n"
      "<rect width=\"{0}\" height=\"{1}\" fill=\"#ffffff\"/>\n"
      "<text x=\"{2}\" y=\"24\" font-size=\"15\" font-weight=\"bold\">{3}</text>\n",
      width, height, left, esc(a.title));
  return s;
}

std::string frame(const PlotAxes& a, const Scale& sx, const Scale& sy, bool x_ticks = true) {
  std::string s;
  s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#333\"/>\n", left, top,
                   width - left - right, height - top - bottom);
  if (x_ticks)
    for (double t : ticks(sx.lo, sx.hi)) {
      const double px = sx(t);
      s += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1}\" x2=\"{0:.1f}\" y2=\"{2}\" stroke=\"#ddd\"/>\n", px, top, height - bottom);
      s += fmt::format("<text x=\"{:.1f}\" y=\"{}\" text-anchor=\"middle\">{}</text>\n", px, height - bottom + 16, tick_label(t));
    }
  for (double t : ticks(sy.lo, sy.hi)) {
    const double py = sy(t);
    s += fmt::format("<line x1=\"{0}\" y1=\"{1:.1f}\" x2=\"{2}\" y2=\"{1:.1f}\" stroke=\"#ddd\"/>\n", left, py, width - right);
    s += fmt::format("<text x=\"{}\" y=\"{:.1f}\" text-anchor=\"end\">{}</text>\n", left - 6, py + 4, tick_label(t));
  }
  s += fmt::format("<text x=\"{:.1f}\" y=\"{}\" text-anchor=\"middle\">{}</text>\n", left + (width - left - right) / 2,
                   height - 18, esc(a.x_label));
  s += fmt::format("<text transform=\"translate(18 {:.1f}) rotate(-90)\" text-anchor=\"middle\">{}</text>\n",
                   top + (height - top - bottom) / 2, esc(a.y_label));
  return s;
}

std::string legend(const std::vector<std::string>& labels, bool boxes) {
  std::string s;
  const double x = width - right + 14;
  for (size_t k = 0; k < labels.size(); ++k) {
    const double y = top + 10 + 20.0 * static_cast<double>(k);
    const char* c = palette[k % palette.size()];
    if (boxes)
      s += fmt::format("<rect x=\"{}\" y=\"{:.1f}\" width=\"14\" height=\"10\" fill=\"{}\"/>\n", x, y - 9, c);
    else
      s += fmt::format("<line x1=\"{}\" y1=\"{:.1f}\" x2=\"{}\" y2=\"{:.1f}\" stroke=\"{}\" stroke-width=\"2.5\"/>\n", x,
                       y - 4, x + 18, y - 4, c);
    s += fmt::format("<text x=\"{}\" y=\"{:.1f}\">{}</text>\n", x + 24, y, esc(labels[k]));
  }
  return s;
}

}  // namespace

std::string ramp_colour(double f) {
  static constexpr std::array<std::array<double, 3>, 5> stops = {
      {{27, 42, 73}, {47, 102, 144}, {58, 158, 143}, {155, 197, 61}, {244, 211, 94}}};
  if (!std::isfinite(f)) f = 0.0;
  f = std::clamp(f, 0.0, 1.0) * 4.0;
  const size_t k = std::min<size_t>(3, static_cast<size_t>(f));
  const double t = f - static_cast<double>(k);
  auto mix = [&](size_t c) { return static_cast<int>(std::lround(stops[k][c] + t * (stops[k + 1][c] - stops[k][c]))); };
  return fmt::format("#{:02x}{:02x}{:02x}", mix(0), mix(1), mix(2));
}

std::string line_plot_svg(const PlotAxes& a, const std::vector<Series>& series) {
  double xlo = INFINITY, xhi = -INFINITY, ylo = INFINITY, yhi = -INFINITY;
  for (const auto& s : series)
    for (size_t k = 0; k < s.x.size(); ++k) {
      if (!std::isfinite(s.x[k]) || !std::isfinite(s.y[k])) continue;
      xlo = std::min(xlo, s.x[k]); xhi = std::max(xhi, s.x[k]);
      ylo = std::min(ylo, s.y[k]); yhi = std::max(yhi, s.y[k]);
    }
  if (!std::isfinite(xlo)) { xlo = 0; xhi = 1; ylo = 0; yhi = 1; }
  xlo = a.x_min.value_or(xlo); xhi = a.x_max.value_or(xhi);
  ylo = a.y_min.value_or(ylo); yhi = a.y_max.value_or(yhi);
  pad_range(xlo, xhi);
  pad_range(ylo, yhi);
  const Scale sx{xlo, xhi, left, width - right}, sy{ylo, yhi, height - bottom, top};
  std::string s = header(a) + frame(a, sx, sy);
  std::vector<std::string> labels;
  for (size_t j = 0; j < series.size(); ++j) {
    const Series& se = series[j];
    const char* c = palette[j % palette.size()];
    labels.push_back(se.label);
    if (se.style == SeriesStyle::points) {
      for (size_t k = 0; k < se.x.size(); ++k)
        if (std::isfinite(se.x[k]) && std::isfinite(se.y[k]))
          s += fmt::format("<circle cx=\"{:.1f}\" cy=\"{:.1f}\" r=\"1.6\" fill=\"{}\"/>\n", sx(se.x[k]), sy(se.y[k]), c);
      continue;
    }
    std::string d;
    bool pen = false;
    for (size_t k = 0; k < se.x.size(); ++k) {
      if (!std::isfinite(se.x[k]) || !std::isfinite(se.y[k])) { pen = false; continue; }
      const double px = sx(std::clamp(se.x[k], xlo, xhi)), py = sy(std::clamp(se.y[k], ylo, yhi));
      if (!pen) d += fmt::format("M{:.1f},{:.1f}", px, py);
      else if (se.style == SeriesStyle::step) d += fmt::format("H{:.1f}V{:.1f}", px, py);
      else d += fmt::format("L{:.1f},{:.1f}", px, py);
      pen = true;
    }
    s += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.8\"/>\n", d, c);
  }
  s += legend(labels, false);
  return s + "</svg>\n";
}

std::string bar_chart_svg(const PlotAxes& a, const std::vector<std::string>& labels, const std::vector<BarGroup>& groups) {
  double yhi = 0;
  for (const auto& g : groups)
    for (double v : g.values) if (std::isfinite(v)) yhi = std::max(yhi, v);
  double ylo = a.y_min.value_or(0.0);
  yhi = a.y_max.value_or(yhi * 1.08);
  pad_range(ylo, yhi);
  const Scale sy{ylo, yhi, height - bottom, top};
  const double n = static_cast<double>(std::max<size_t>(1, groups.size()));
  const Scale sx{0, n, left, width - right};
  std::string s = header(a) + frame(a, sx, sy, false);
  const double group_w = (width - left - right) / n;
  const double bar_w = group_w * 0.8 / static_cast<double>(std::max<size_t>(1, labels.size()));
  for (size_t gi = 0; gi < groups.size(); ++gi) {
    const double gx = left + group_w * static_cast<double>(gi) + group_w * 0.1;
    for (size_t k = 0; k < groups[gi].values.size(); ++k) {
      const double v = std::isfinite(groups[gi].values[k]) ? groups[gi].values[k] : 0.0;
      const double y0 = sy(std::max(ylo, 0.0)), y1 = sy(std::min(v, yhi));
      s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\" fill=\"{}\"><title>{}: {}</title></rect>\n",
                       gx + bar_w * static_cast<double>(k), std::min(y0, y1), bar_w * 0.92, std::abs(y0 - y1),
                       palette[k % palette.size()], esc(groups[gi].category), tick_label(v));
    }
    s += fmt::format("<text x=\"{:.1f}\" y=\"{}\" text-anchor=\"middle\">{}</text>\n", gx + group_w * 0.4,
                     height - bottom + 16, esc(groups[gi].category));
  }
  s += legend(labels, true);
  return s + "</svg>\n";
}

std::string map_svg(const PlotAxes& a, const std::vector<MapCell>& cells, const ColourScale& cs) {
  const double xlo = a.x_min.value_or(-180), xhi = a.x_max.value_or(180);
  const double ylo = a.y_min.value_or(-90), yhi = a.y_max.value_or(90);
  const Scale sx{xlo, xhi, left, width - right}, sy{ylo, yhi, height - bottom, top};
  std::string s = header(a);
  const double span = cs.max > cs.min ? cs.max - cs.min : 1.0;
  for (const auto& c : cells) {
    const double x0 = sx(c.lon_min_deg), x1 = sx(c.lon_max_deg), y0 = sy(c.lat_max_deg), y1 = sy(c.lat_min_deg);
    // Cells overlap by a quarter pixel so that no hairline gaps show between them.
    s += fmt::format("<rect x=\"{:.2f}\" y=\"{:.2f}\" width=\"{:.2f}\" height=\"{:.2f}\" fill=\"{}\"/>\n", x0, y0,
                     x1 - x0 + 0.25, y1 - y0 + 0.25, ramp_colour((c.value - cs.min) / span));
  }
  s += frame(a, sx, sy);
  // Colour bar.
  const double bx = width - right + 30, bw = 18, by0 = top, by1 = height - bottom;
  for (int k = 0; k < 50; ++k) {
    const double f0 = k / 50.0;
    s += fmt::format("<rect x=\"{}\" y=\"{:.2f}\" width=\"{}\" height=\"{:.2f}\" fill=\"{}\"/>\n", bx,
                     by1 - (f0 + 0.02) * (by1 - by0), bw, 0.02 * (by1 - by0) + 0.3, ramp_colour(f0 + 0.01));
  }
  const Scale sb{cs.min, cs.max > cs.min ? cs.max : cs.min + 1, by1, by0};
  for (double t : ticks(sb.lo, sb.hi, 5))
    s += fmt::format("<text x=\"{}\" y=\"{:.1f}\">{}</text>\n", bx + bw + 6, sb(t) + 4, tick_label(t));
  s += fmt::format("<text transform=\"translate({} {:.1f}) rotate(-90)\" text-anchor=\"middle\">{}</text>\n",
                   bx + bw + 58, (by0 + by1) / 2, esc(cs.label));
  return s + "</svg>\n";
}

}  // namespace skein
