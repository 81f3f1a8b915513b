#include "skein/report/svg_plot.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include <fmt/format.h>

#include "skein/report/table.hpp"
#include "skein/report/text_extent.hpp"

namespace skein {
namespace {

constexpr double plot_w = 500, plot_h = 336;   // the plot area; margins are added round it
constexpr double font = 12, title_font = 15, pad = 10;
const std::array<const char*, 8> palette = {"#2f6690", "#d1495b", "#3a9e8f", "#edae49",
                                            "#6a4c93", "#00798c", "#8c6d46", "#5c5c5c"};

// SVG text is XML: the HTML escaping of the table renderer serves.
std::string esc(const std::string& s) { return html_escape(s); }

struct Scale {
  double lo, hi, p0, p1;  // data range to pixel range
  double operator()(double v) const { return p0 + (v - lo) / (hi - lo) * (p1 - p0); }
};

// "Nice" tick positions covering [lo, hi] (Heckbert's labelling idea, common practice); whole numbers only
// when `integer` (a count has no 22.5th satellite).
std::vector<double> ticks(double lo, double hi, bool integer = false, int target = 6) {
  const double span = hi - lo;
  const double raw = span / target;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  double step = mag;
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (m * mag >= raw && !(integer && std::abs(m * mag - std::round(m * mag)) > 1e-9)) {
      step = m * mag;
      break;
    }
  if (integer) step = std::max(1.0, std::round(step));
  std::vector<double> t;
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) t.push_back(std::abs(v) < step * 1e-9 ? 0.0 : v);
  return t;
}

std::string tick_label(double v) { return fmt::format("{:.6g}", v); }

void pad_range(double& lo, double& hi) {
  if (!(hi > lo)) {
    const double d = std::abs(lo) > 0 ? std::abs(lo) * 0.1 : 1.0;
    lo -= d;
    hi += d;
  }
}

// The data's extent on both axes (points with a non-finite coordinate skipped), and from it the plot's ranges.
struct Extent {
  double xlo = INFINITY, xhi = -INFINITY, ylo = INFINITY, yhi = -INFINITY;
  void take(double x, double y) {
    if (!std::isfinite(x) || !std::isfinite(y)) return;
    xlo = std::min(xlo, x); xhi = std::max(xhi, x);
    ylo = std::min(ylo, y); yhi = std::max(yhi, y);
  }
  // [0, 1] on both axes when nothing was taken; then the axes' explicit limits where set, and a degenerate
  // range widened (pad_range).
  Extent settled(const PlotAxes& a) const {
    Extent e = *this;
    if (!std::isfinite(e.xlo)) e = {0, 1, 0, 1};
    e.xlo = a.x_min.value_or(e.xlo); e.xhi = a.x_max.value_or(e.xhi);
    e.ylo = a.y_min.value_or(e.ylo); e.yhi = a.y_max.value_or(e.yhi);
    pad_range(e.xlo, e.xhi);
    pad_range(e.ylo, e.yhi);
    return e;
  }
};

// The figure's box: margins sized from the tick labels, axis labels, legend entries and title.
struct Box {
  double left = 0, right = 0, top = 0, bottom = 0;
  double width() const { return left + plot_w + right; }
  double height() const { return top + plot_h + bottom; }
  double x1() const { return left + plot_w; }
  double y1() const { return top + plot_h; }
};

Box box_for(const PlotAxes& a, const std::vector<std::string>& y_tick_labels, double legend_w) {
  Box b;
  double tw = 0;
  for (const auto& s : y_tick_labels) tw = std::max(tw, text_width_px(s, font));
  b.left = pad + font * 1.3 + 8 + tw + 6;
  b.top = pad + title_font * 1.2 + 14;
  b.bottom = 16 + 18 + 10 + pad;
  b.right = std::max(pad + 12, legend_w + 14 + pad);
  // The title starts at `pad`; the x label is centred under the plot; the y label runs along the plot's height.
  b.right = std::max(b.right, pad + text_width_px(a.title, title_font, true) + pad - b.left - plot_w);
  b.right = std::max(b.right, text_width_px(a.x_label, font) / 2 - plot_w / 2 + pad);
  return b;
}

std::string header(const PlotAxes& a, const Box& b) {
  return fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0:g}\" height=\"{1:g}\" viewBox=\"0 0 {0:g} {1:g}\" "
      "font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"{4:g}\">\n"
      "<rect width=\"{0:g}\" height=\"{1:g}\" fill=\"#ffffff\"/>\n"
      "<text x=\"{2:g}\" y=\"{5:g}\" font-size=\"{6:g}\" font-weight=\"bold\">{3}</text>\n",
      std::ceil(b.width()), std::ceil(b.height()), pad, esc(a.title), font, pad + title_font, title_font);
}

std::string frame(const PlotAxes& a, const Box& b, const Scale& sx, const Scale& sy, bool x_ticks = true) {
  std::string s;
  s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{}\" height=\"{}\" fill=\"none\" stroke=\"#333\"/>\n", b.left, b.top,
                   plot_w, plot_h);
  if (x_ticks)
    for (double t : ticks(sx.lo, sx.hi, a.x_integer)) {
      const double px = sx(t);
      s += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{0:.1f}\" y2=\"{2:.1f}\" stroke=\"#ddd\"/>\n", px, b.top, b.y1());
      s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" text-anchor=\"middle\">{}</text>\n", px, b.y1() + 16, tick_label(t));
    }
  for (double t : ticks(sy.lo, sy.hi, a.y_integer)) {
    const double py = sy(t);
    s += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{2:.1f}\" y2=\"{1:.1f}\" stroke=\"#ddd\"/>\n", b.left, py, b.x1());
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" text-anchor=\"end\">{}</text>\n", b.left - 6, py + 4, tick_label(t));
  }
  s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" text-anchor=\"middle\">{}</text>\n", b.left + plot_w / 2, b.y1() + 34,
                   esc(a.x_label));
  s += fmt::format("<text x=\"{0:.1f}\" y=\"{1:.1f}\" text-anchor=\"middle\" transform=\"rotate(-90 {0:.1f} {1:.1f})\">{2}</text>\n",
                   pad + font, b.top + plot_h / 2, esc(a.y_label));
  return s;
}

std::vector<std::string> y_tick_labels(double lo, double hi, bool integer) {
  std::vector<std::string> out;
  for (double t : ticks(lo, hi, integer)) out.push_back(tick_label(t));
  return out;
}

double legend_width(const std::vector<std::string>& labels) {
  double w = 0;
  for (const auto& l : labels) w = std::max(w, 24 + text_width_px(l, font));
  return w;
}

std::string legend(const Box& b, const std::vector<std::string>& labels, bool boxes) {
  std::string s;
  const double x = b.x1() + 14;
  for (size_t k = 0; k < labels.size(); ++k) {
    const double y = b.top + 10 + 20.0 * static_cast<double>(k);
    const char* c = palette[k % palette.size()];
    if (boxes)
      s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"14\" height=\"10\" fill=\"{}\"/>\n", x, y - 9, c);
    else
      s += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" stroke=\"{}\" stroke-width=\"2.5\"/>\n", x,
                       y - 4, x + 18, y - 4, c);
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\">{}</text>\n", x + 24, y, esc(labels[k]));
  }
  return s;
}

std::string marker(MarkerShape shape, double x, double y, const std::string& fill, double r = 4.5) {
  switch (shape) {
    case MarkerShape::circle:
      return fmt::format("<circle cx=\"{:.1f}\" cy=\"{:.1f}\" r=\"{:g}\" fill=\"{}\" stroke=\"#000\" stroke-width=\"0.8\"/>\n", x, y, r, fill);
    case MarkerShape::square:
      return fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:g}\" height=\"{:g}\" fill=\"{}\" stroke=\"#000\" stroke-width=\"0.8\"/>\n",
                         x - r, y - r, 2 * r, 2 * r, fill);
    case MarkerShape::diamond:
      return fmt::format("<path d=\"M{:.1f} {:.1f}l{:g} {:g}l{:g} {:g}l{:g} {:g}z\" fill=\"{}\" stroke=\"#000\" stroke-width=\"0.8\"/>\n",
                         x, y - r * 1.3, r * 1.3, r * 1.3, -r * 1.3, r * 1.3, -r * 1.3, -r * 1.3, fill);
    case MarkerShape::cross:
      return fmt::format("<path d=\"M{0:.1f} {1:.1f}l{2:g} {2:g}M{0:.1f} {3:.1f}l{2:g} {4:g}\" stroke=\"{5}\" stroke-width=\"2.2\"/>\n",
                         x - r, y - r, 2 * r, y + r, -2 * r, fill);
  }
  return "";
}

}  // namespace

std::string series_colour(size_t k) { return palette[k % palette.size()]; }

std::string line_plot_svg(const PlotAxes& a, const std::vector<Series>& series) {
  Extent data;
  for (const auto& s : series)
    for (size_t k = 0; k < s.x.size(); ++k) data.take(s.x[k], s.y[k]);
  const auto [xlo, xhi, ylo, yhi] = data.settled(a);
  std::vector<std::string> labels;
  for (const auto& se : series) labels.push_back(se.label);
  const Box b = box_for(a, y_tick_labels(ylo, yhi, a.y_integer), legend_width(labels));
  const Scale sx{xlo, xhi, b.left, b.x1()}, sy{ylo, yhi, b.y1(), b.top};
  std::string s = header(a, b) + frame(a, b, sx, sy);
  for (size_t j = 0; j < series.size(); ++j) {
    const Series& se = series[j];
    const char* c = palette[j % palette.size()];
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
  s += legend(b, labels, false);
  return s + "</svg>\n";
}

std::string bar_chart_svg(const PlotAxes& a, const std::vector<std::string>& labels, const std::vector<BarGroup>& groups) {
  double yhi = 0;
  for (const auto& g : groups)
    for (double v : g.values) if (std::isfinite(v)) yhi = std::max(yhi, v);
  double ylo = a.y_min.value_or(0.0);
  yhi = a.y_max.value_or(yhi * 1.08);
  pad_range(ylo, yhi);
  const Box b = box_for(a, y_tick_labels(ylo, yhi, a.y_integer), legend_width(labels));
  const Scale sy{ylo, yhi, b.y1(), b.top};
  const double n = static_cast<double>(std::max<size_t>(1, groups.size()));
  const Scale sx{0, n, b.left, b.x1()};
  std::string s = header(a, b) + frame(a, b, sx, sy, false);
  const double group_w = plot_w / n;
  const double bar_w = group_w * 0.8 / static_cast<double>(std::max<size_t>(1, labels.size()));
  for (size_t gi = 0; gi < groups.size(); ++gi) {
    const double gx = b.left + group_w * static_cast<double>(gi) + group_w * 0.1;
    for (size_t k = 0; k < groups[gi].values.size(); ++k) {
      const double v = std::isfinite(groups[gi].values[k]) ? groups[gi].values[k] : 0.0;
      const double y0 = sy(std::max(ylo, 0.0)), y1 = sy(std::min(v, yhi));
      s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\" fill=\"{}\"><title>{}: {}</title></rect>\n",
                       gx + bar_w * static_cast<double>(k), std::min(y0, y1), bar_w * 0.92, std::abs(y0 - y1),
                       palette[k % palette.size()], esc(groups[gi].category), tick_label(v));
    }
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" text-anchor=\"middle\">{}</text>\n", gx + group_w * 0.4,
                     b.y1() + 16, esc(groups[gi].category));
  }
  s += legend(b, labels, true);
  return s + "</svg>\n";
}

std::string scatter_svg(const ScatterPlot& p) {
  const PlotAxes& a = p.axes;
  Extent data;
  for (const auto& q : p.points) data.take(q.x, q.y);
  for (const auto& r : p.references) data.take(data.xlo, r.y);  // a threshold widens y only (needs a point)
  const auto [xlo, xhi, ylo, yhi] = data.settled(a);
  // Legend column: marker entries, line entries, then the colour key (bar 14 px wide with tick values).
  std::vector<std::string> labels;
  for (const auto& e : p.legend) labels.push_back(e.label);
  for (const auto& l : p.lines) labels.push_back(l.label);
  double lw = legend_width(labels);
  std::vector<double> key_ticks;
  double kmin = 0, kmax = 1;
  if (p.colour_key) {
    kmin = p.colour_key->min;
    kmax = p.colour_key->max;
    pad_range(kmin, kmax);
    key_ticks = ticks(kmin, kmax, false, 4);
    for (double t : key_ticks) lw = std::max(lw, 14 + 6 + text_width_px(tick_label(t), font));
    lw = std::max(lw, text_width_px(p.colour_key->label, font));
  }
  Box b = box_for(a, y_tick_labels(ylo, yhi, a.y_integer), lw);
  // Point labels stand right of their marker, or left of it when the plot's right edge is too near.
  const Scale sx{xlo, xhi, b.left, b.x1()}, sy{ylo, yhi, b.y1(), b.top};
  std::string s = header(a, b) + frame(a, b, sx, sy);
  // Labels placed greedily, each in the first of a list of spots round its point (right or left, then further
  // up or down) whose box meets no box placed before it (markers included); a label with no free spot is left
  // out rather than drawn over another.
  struct Rect {
    double x0, y0, x1, y1;
    bool meets(const Rect& o) const { return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1; }
  };
  std::vector<Rect> taken;
  for (const auto& q : p.points) taken.push_back({sx(q.x) - 5, sy(q.y) - 5, sx(q.x) + 5, sy(q.y) + 5});
  std::string placed;
  auto place = [&](double px, double py, const std::string& label, double size) {
    const double w = text_width_px(label, size), asc = text_ascent_em * size, desc = text_descent_em * size;
    for (double dy : {-6.0, 14.0, -20.0, 28.0, -34.0, 42.0, -48.0})
      for (bool right_side : {true, false}) {
        const double tx = right_side ? px + 8 : px - 8 - w, ty = py + dy;
        const Rect r{tx, ty - asc, tx + w, ty + desc};
        if (r.x0 < b.left || r.x1 > b.x1() || r.y0 < b.top || r.y1 > b.y1()) continue;
        if (std::any_of(taken.begin(), taken.end(), [&](const Rect& o) { return r.meets(o); })) continue;
        taken.push_back(r);
        placed += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\" font-size=\"{:g}\" stroke=\"#ffffff\" stroke-width=\"3\" "
                              "paint-order=\"stroke\">{}</text>\n", tx, ty, size, esc(label));
        return;
      }
  };
  for (const auto& r : p.references) {
    const double py = sy(r.y);
    s += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" stroke=\"#000\" stroke-width=\"1.5\" "
                     "stroke-dasharray=\"7 4\"/>\n", b.left, py, b.x1(), py);
    place(b.left - 4, py + 2, r.label, 11);  // at the left end, above or below the line
  }
  for (const auto& l : p.lines) {
    std::string d;
    for (size_t k = 0; k < l.x.size(); ++k) d += fmt::format("{}{:.1f},{:.1f}", k ? "L" : "M", sx(l.x[k]), sy(l.y[k]));
    s += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"1.6\"{}/>\n", d, l.colour,
                     l.dashed ? " stroke-dasharray=\"4 3\"" : "");
  }
  for (const auto& q : p.points) s += marker(q.shape, sx(q.x), sy(q.y), q.fill);
  std::vector<size_t> order(p.points.size());
  for (size_t k = 0; k < order.size(); ++k) order[k] = k;
  std::stable_sort(order.begin(), order.end(), [&](size_t i, size_t j) { return p.points[i].label_rank < p.points[j].label_rank; });
  for (size_t k : order)
    if (!p.points[k].label.empty()) place(sx(p.points[k].x), sy(p.points[k].y), p.points[k].label, 11);
  s += placed;
  // Legend.
  const double x = b.x1() + 14;
  double y = b.top + 10;
  for (const auto& e : p.legend) {
    s += marker(e.shape, x + 7, y - 4, e.fill);
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\">{}</text>\n", x + 24, y, esc(e.label));
    y += 20;
  }
  for (const auto& l : p.lines) {
    s += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" stroke=\"{}\" stroke-width=\"2\"{}/>\n", x,
                     y - 4, x + 18, y - 4, l.colour, l.dashed ? " stroke-dasharray=\"4 3\"" : "");
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\">{}</text>\n", x + 24, y, esc(l.label));
    y += 20;
  }
  if (p.colour_key && !p.colour_key->colours.empty()) {
    const ScatterColourKey& k = *p.colour_key;
    y += 10;
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\">{}</text>\n", x, y, esc(k.label));
    const double by0 = y + 8, by1 = std::min(b.y1(), by0 + 140), bh = by1 - by0;
    const size_t n = k.colours.size();
    for (size_t i = 0; i < n; ++i)  // min at the bottom
      s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.2f}\" width=\"14\" height=\"{:.2f}\" fill=\"{}\"/>\n", x,
                       by1 - bh * static_cast<double>(i + 1) / static_cast<double>(n), bh / static_cast<double>(n) + 0.3, k.colours[i]);
    s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"14\" height=\"{:.1f}\" fill=\"none\" stroke=\"#333\"/>\n", x, by0, bh);
    const Scale sk{kmin, kmax, by1, by0};
    for (double t : key_ticks)
      s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\">{}</text>\n", x + 20, sk(t) + 4, tick_label(t));
  }
  return s + "</svg>\n";
}

}  // namespace skein
