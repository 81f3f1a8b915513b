#include "skein/report/map_plot.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/report/table.hpp"
#include "skein/report/text_extent.hpp"

namespace skein {
namespace {

constexpr double font = 12.0, title_font = 15.0, small_font = 11.0;
constexpr double max_plot_w = 720.0, max_plot_h = 400.0;  // a world map: 720 x 360 px, 2 px per degree
constexpr double pad = 10.0;

std::string esc(const std::string& s) { return html_escape(s); }

// Longitude label in [-180, 180): the unwrapped longitudes of a view crossing the antimeridian print as usual.
std::string lon_label(double lon) {
  double l = std::fmod(lon + 180.0, 360.0);
  if (l < 0) l += 360.0;
  l -= 180.0;
  if (std::abs(l + 180.0) < 1e-9 && lon > 0) l = 180.0;
  return fmt::format("{:g}", std::abs(l) < 1e-9 ? 0.0 : l);
}

struct Frame {
  double x0, y0, w, h;  // plot rectangle (px)
  MapView v;
  double x(double lon) const { return x0 + (lon - v.lon_min_deg) / (v.lon_max_deg - v.lon_min_deg) * w; }
  double y(double lat) const { return y0 + (v.lat_max_deg - lat) / (v.lat_max_deg - v.lat_min_deg) * h; }
  // The copy of a longitude (shifted by a whole turn) nearest the middle of the view.
  double shift_into(double lon) const {
    const double mid = 0.5 * (v.lon_min_deg + v.lon_max_deg);
    while (lon - mid > 180.0) lon -= 360.0;
    while (lon - mid < -180.0) lon += 360.0;
    return lon;
  }
};

std::vector<double> ticks_of(double lo, double hi, double step) {
  std::vector<double> t;
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + 1e-9; v += step) t.push_back(v);
  return t;
}

// Value ticks for the colour bar: 1, 2 or 5 times a power of ten, about five of them.
std::vector<double> value_ticks(double lo, double hi) {
  const double raw = (hi - lo) / 5.0;
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

std::string text(double x, double y, const std::string& s, const char* anchor = "start", double size = font,
                  bool bold = false) {
  return fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\"{}{}{}>{}</text>\n", x, y,
                     std::string_view(anchor) == "start" ? "" : fmt::format(" text-anchor=\"{}\"", anchor),
                     size == font ? "" : fmt::format(" font-size=\"{:g}\"", size), bold ? " font-weight=\"bold\"" : "",
                     esc(s));
}

// A path of a ring (fillable: unwrapped, pole rings closed), shifted by `shift` degrees, with points closer
// than 0.4 px to the last one kept dropped (the 110m outlines carry more points than a figure can show).
void ring_path(std::string& d, const Frame& f, const Ring& ring, double shift) {
  double lx = 0, ly = 0;
  bool first = true;
  for (const LonLat& p : ring) {
    const double px = f.x(p.lon_deg + shift), py = f.y(p.lat_deg);
    if (first) {
      d += fmt::format("M{:.1f} {:.1f}", px, py);
      first = false;
    } else if (std::abs(px - lx) + std::abs(py - ly) >= 0.4) {
      d += fmt::format("L{:.1f} {:.1f}", px, py);
    } else {
      continue;
    }
    lx = px;
    ly = py;
  }
  d += "Z";
}

// The shifts (multiples of 360) of an unwrapped ring that overlap the view.
std::vector<double> shifts_for(const Frame& f, const Ring& ring) {
  double lo = INFINITY, hi = -INFINITY;
  for (const LonLat& p : ring) {
    lo = std::min(lo, p.lon_deg);
    hi = std::max(hi, p.lon_deg);
  }
  std::vector<double> out;
  for (double s : {-720.0, -360.0, 0.0, 360.0, 720.0})
    if (hi + s >= f.v.lon_min_deg && lo + s <= f.v.lon_max_deg) out.push_back(s);
  return out;
}

// The land drawn once as a path in <defs> (id unique within the page) and used up to three times: the fill
// (maps without cells), then the outline as a white halo under a dark line, readable over pale and dark cells.
std::string land_layer(const Frame& f, const LandOutlines& land, bool filled, const std::string& id) {
  std::string d;
  for (const LandPolygon& p : land.polygons)
    for (const Ring& r : p.rings) {
      const Ring u = fillable_ring(r);
      for (double s : shifts_for(f, u)) ring_path(d, f, u, s);
    }
  std::string s = fmt::format("<defs><path id=\"{}\" d=\"{}\"/></defs>\n", id, d);
  if (filled) s += fmt::format("<use href=\"#{}\" fill=\"#e4e1d8\" fill-rule=\"evenodd\" stroke=\"none\"/>\n", id);
  s += fmt::format("<use href=\"#{}\" fill=\"none\" stroke=\"#ffffff\" stroke-width=\"1.8\" stroke-opacity=\"0.8\" "
                   "stroke-linejoin=\"round\"/>\n", id);
  s += fmt::format("<use href=\"#{}\" fill=\"none\" stroke=\"#333333\" stroke-width=\"0.7\" stroke-linejoin=\"round\"/>\n", id);
  return s;
}

std::string trace_path(const Frame& f, const std::vector<LonLat>& pts) {
  std::string d;
  bool pen = false;
  double prev = 0;
  for (const LonLat& p : pts) {
    const double lon = f.shift_into(p.lon_deg);
    if (pen && std::abs(lon - prev) > 180.0) pen = false;
    d += fmt::format("{}{:.1f} {:.1f}", pen ? "L" : "M", f.x(lon), f.y(p.lat_deg));
    pen = true;
    prev = lon;
  }
  return d;
}

}  // namespace

MapView world_view() { return {}; }

MapView zoomed_view(const std::vector<LonLat>& points, double margin_share, double min_margin_deg) {
  MapView v;
  if (points.empty()) return v;
  Ring r(points.begin(), points.end());
  r = unwrap_longitudes(r);
  double lo = INFINITY, hi = -INFINITY, la = INFINITY, lb = -INFINITY;
  for (const LonLat& p : r) {
    lo = std::min(lo, p.lon_deg);
    hi = std::max(hi, p.lon_deg);
    la = std::min(la, p.lat_deg);
    lb = std::max(lb, p.lat_deg);
  }
  // Unwrapping may have carried the set a whole turn away: bring its middle back into (-180, 180].
  const double shift = 360.0 * std::ceil((0.5 * (lo + hi) - 180.0) / 360.0);
  lo -= shift;
  hi -= shift;
  const double mx = std::max(min_margin_deg, margin_share * (hi - lo)), my = std::max(min_margin_deg, margin_share * (lb - la));
  v.lon_min_deg = lo - mx;
  v.lon_max_deg = hi + mx;
  if (v.lon_max_deg - v.lon_min_deg >= 360.0) return world_view();
  v.lat_min_deg = std::max(-90.0, la - my);
  v.lat_max_deg = std::min(90.0, lb + my);
  const double wider = std::max(v.lon_max_deg - v.lon_min_deg, v.lat_max_deg - v.lat_min_deg);
  v.tick_deg = 30.0;
  for (double s : {1.0, 2.0, 5.0, 10.0, 15.0, 30.0})
    if (wider / s <= 8.0) {
      v.tick_deg = s;
      break;
    }
  return v;
}

Rgb key_colour(const ColourKey& k, double value) {
  if (k.threshold) {
    // Distance from the threshold as a share of its own side of the key's range (each arm spans its side), signed
    // so that meeting is positive: values bunched on one side of the threshold still use the whole arm.
    const double t = *k.threshold;
    const double side = value >= t ? std::max(k.max - t, 1e-12) : std::max(t - k.min, 1e-12);
    const double s = (value - t) / side;
    return diverging_colour(k.higher_is_better ? s : -s);
  }
  const double span = k.max > k.min ? k.max - k.min : 1.0;
  const double f = (value - k.min) / span;
  return sequential_colour(k.higher_is_better ? f : 1.0 - f);
}

std::string map_figure_svg(const MapFigure& m) {
  const MapView& v = m.view;
  const double lon_span = v.lon_max_deg - v.lon_min_deg, lat_span = v.lat_max_deg - v.lat_min_deg;
  const double scale = std::min(max_plot_w / lon_span, max_plot_h / lat_span);  // px per degree, both axes
  const double pw = lon_span * scale, ph = lat_span * scale;

  // Left: the rotated axis label, then the widest latitude tick label.
  const auto lat_ticks = ticks_of(v.lat_min_deg, v.lat_max_deg, v.tick_deg);
  const auto lon_ticks = ticks_of(v.lon_min_deg, v.lon_max_deg, v.tick_deg);
  double tick_w = 0;
  for (double t : lat_ticks) tick_w = std::max(tick_w, text_width_px(fmt::format("{:g}", t), font));
  const double left = pad + font * 1.3 + 8 + tick_w + 6;
  const bool has_note = m.land == nullptr && !m.land_note.empty();
  const double top = pad + title_font * 1.2 + 10;
  const double x0 = left, y0 = top;
  Frame f{x0, y0, pw, ph, v};

  // Everything under the plot is laid out first, to know the figure's height and width.
  std::string below;
  double y = y0 + ph + 16;  // tick labels' baseline
  double need_w = x0 + pw + pad;
  for (double t : lon_ticks) {
    const double px = f.x(t);
    below += text(px, y, lon_label(t), "middle");
    need_w = std::max(need_w, px + text_width_px(lon_label(t), font) / 2 + pad);
  }
  y += 18;
  below += text(x0 + pw / 2, y, "longitude (deg)", "middle");
  if (m.key) {
    const ColourKey& k = *m.key;
    y += 24;
    below += text(x0, y, k.label);
    need_w = std::max(need_w, x0 + text_width_px(k.label, font) + pad);
    y += 8;
    // The bar, its ends named "better" and "worse", ticks under it.
    const std::string lo_word = k.higher_is_better ? "worse" : "better", hi_word = k.higher_is_better ? "better" : "worse";
    const double bx = x0 + text_width_px(lo_word, font) + 8;
    const double bw = std::min(pw - (bx - x0) - text_width_px(hi_word, font) - 8, 420.0);
    const double bh = 12;
    const double hi = k.max > k.min ? k.max : k.min + 1.0;
    for (int s = 0; s < 60; ++s) {
      const double a = k.min + (hi - k.min) * (s + 0.5) / 60.0;
      below += fmt::format("<rect x=\"{:.2f}\" y=\"{:.1f}\" width=\"{:.2f}\" height=\"{}\" fill=\"{}\"/>\n",
                           bx + bw * s / 60.0, y, bw / 60.0 + 0.3, bh, to_hex(key_colour(k, a)));
    }
    below += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{}\" fill=\"none\" stroke=\"#333\"/>\n", bx, y, bw, bh);
    below += text(bx - 6, y + 10, lo_word, "end");
    below += text(bx + bw + 6, y + 10, hi_word);
    auto bar_x = [&](double a) { return bx + (a - k.min) / (hi - k.min) * bw; };
    for (double t : value_ticks(k.min, hi)) {
      below += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{0:.1f}\" y2=\"{2:.1f}\" stroke=\"#333\"/>\n", bar_x(t), y + bh, y + bh + 3);
      below += text(bar_x(t), y + bh + 15, fmt::format("{:g}", t), "middle", small_font);
    }
    if (k.threshold && *k.threshold >= k.min && *k.threshold <= hi) {
      const double tx = bar_x(*k.threshold);
      below += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{0:.1f}\" y2=\"{2:.1f}\" stroke=\"#000\" stroke-width=\"2\"/>\n",
                           tx, y - 3, y + bh + 3);
      // The threshold's label on the line under the ticks, kept inside the bar's span.
      const double tw = text_width_px(k.threshold_label, small_font);
      const double lx = std::clamp(tx - tw / 2, x0, std::max(x0, x0 + pw - tw));
      below += text(lx, y + bh + 30, k.threshold_label, "start", small_font);
      need_w = std::max(need_w, lx + tw + pad);
      y += 15;
    }
    y += bh + 15;
  }
  if (!m.trace_legend.empty() || !m.thin_trace_legend.empty()) {
    y += 22;
    double x = x0;
    auto entry = [&](const std::string& label, const std::string& colour, bool thin) {
      const double w = 26 + text_width_px(label, font) + 16;
      if (x > x0 && x + w > x0 + pw) {
        x = x0;
        y += 18;
      }
      below += fmt::format("<line x1=\"{:.1f}\" y1=\"{:.1f}\" x2=\"{:.1f}\" y2=\"{:.1f}\" stroke=\"{}\" stroke-width=\"{}\"{}/>\n",
                           x, y - 4, x + 20, y - 4, colour, thin ? 1.2 : 2.2, thin ? " stroke-dasharray=\"3 2\"" : "");
      below += text(x + 26, y, label);
      need_w = std::max(need_w, x + w - 16 + pad);
      x += w;
    };
    for (size_t k = 0; k < m.trace_legend.size(); ++k) entry(m.trace_legend[k], series_colour(k), false);
    if (!m.thin_trace_legend.empty()) entry(m.thin_trace_legend, "#555555", true);
  }
  {
    y += 20;
    const std::string note = has_note ? m.land_note : (m.land ? std::string(land_credit) : std::string());
    if (!note.empty()) {
      below += text(x0, y, note, "start", small_font);
      need_w = std::max(need_w, x0 + text_width_px(note, small_font) + pad);
    }
  }
  const double height = y + pad;
  const double width = std::ceil(std::max(need_w, pad + text_width_px(m.title, title_font, true) + pad));

  std::string s = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{0:g}\" height=\"{1:g}\" viewBox=\"0 0 {0:g} {1:g}\" "
      "font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"{2:g}\">\n"
      "<rect width=\"{0:g}\" height=\"{1:g}\" fill=\"#ffffff\"/>\n",
      width, std::ceil(height), font);
  s += text(pad, pad + title_font, m.title, "start", title_font, true);
  const std::string clip = "skein-clip-" + m.id;
  s += fmt::format("<clipPath id=\"{}\"><rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\"/></clipPath>\n",
                   clip, x0, y0, pw, ph);
  s += fmt::format("<g clip-path=\"url(#{})\">\n", clip);
  s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\" fill=\"{}\"/>\n", x0, y0, pw, ph,
                   m.cells.empty() ? "#f4f8fb" : "#ffffff");
  if (m.land && m.cells.empty()) s += land_layer(f, *m.land, true, "skein-land-" + m.id);
  if (m.key)
    for (const MapCell& c : m.cells) {
      const double mid = f.shift_into(0.5 * (c.lon_min_deg + c.lon_max_deg));
      const double d = mid - 0.5 * (c.lon_min_deg + c.lon_max_deg);
      const double cx0 = f.x(c.lon_min_deg + d), cx1 = f.x(c.lon_max_deg + d), cy0 = f.y(c.lat_max_deg), cy1 = f.y(c.lat_min_deg);
      // Cells overlap by a quarter pixel so that no hairline gaps show between them.
      s += fmt::format("<rect x=\"{:.2f}\" y=\"{:.2f}\" width=\"{:.2f}\" height=\"{:.2f}\" fill=\"{}\"/>\n", cx0, cy0,
                       cx1 - cx0 + 0.25, cy1 - cy0 + 0.25, to_hex(key_colour(*m.key, c.value)));
    }
  if (m.land && !m.cells.empty()) s += land_layer(f, *m.land, false, "skein-land-" + m.id);
  for (const Ring& r : m.outlines) {
    std::string d;
    const Ring u = unwrap_longitudes(r);
    for (double sh : shifts_for(f, u)) ring_path(d, f, u, sh);
    s += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"#ffffff\" stroke-width=\"4\"/>\n"
                     "<path d=\"{}\" fill=\"none\" stroke=\"#000000\" stroke-width=\"2\" stroke-dasharray=\"6 3\"/>\n", d, d);
  }
  for (const MapTrace& t : m.traces)
    s += fmt::format("<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{}\"{}/>\n", trace_path(f, t.points),
                     t.colour < m.trace_legend.size() ? series_colour(t.colour) : std::string("#777777"), t.thin ? 1.1 : 2.0, t.thin ? " stroke-dasharray=\"3 2\"" : "");
  s += "</g>\n";
  // Grid lines and the frame.
  for (double t : lon_ticks)
    s += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{0:.1f}\" y2=\"{2:.1f}\" stroke=\"#888\" stroke-opacity=\"0.35\"/>\n", f.x(t), y0, y0 + ph);
  for (double t : lat_ticks) {
    s += fmt::format("<line x1=\"{0:.1f}\" y1=\"{1:.1f}\" x2=\"{2:.1f}\" y2=\"{1:.1f}\" stroke=\"#888\" stroke-opacity=\"0.35\"/>\n", x0, f.y(t), x0 + pw);
    s += text(x0 - 6, f.y(t) + 4, fmt::format("{:g}", t), "end");
  }
  s += fmt::format("<rect x=\"{:.1f}\" y=\"{:.1f}\" width=\"{:.1f}\" height=\"{:.1f}\" fill=\"none\" stroke=\"#333\"/>\n", x0, y0, pw, ph);
  s += fmt::format("<text x=\"{0:.1f}\" y=\"{1:.1f}\" text-anchor=\"middle\" transform=\"rotate(-90 {0:.1f} {1:.1f})\">{2}</text>\n",
                   pad + font, y0 + ph / 2, "geodetic latitude (deg)");
  // Sites: a marker coloured by the key (white without a value) and the name beside it, on the side with room.
  for (const MapSite& site : m.sites) {
    const double px = f.x(f.shift_into(site.at.lon_deg)), py = f.y(site.at.lat_deg);
    const std::string fill = site.value && m.key ? to_hex(key_colour(*m.key, *site.value)) : std::string("#ffffff");
    s += fmt::format("<circle cx=\"{:.1f}\" cy=\"{:.1f}\" r=\"5.5\" fill=\"{}\" stroke=\"#000\" stroke-width=\"1.5\"/>\n", px, py, fill);
    const double tw = text_width_px(site.name, font, true);
    const bool right_side = px + 9 + tw <= x0 + pw;
    const double ty = std::clamp(py + 4, y0 + font, y0 + ph - 4);
    const double tx = right_side ? px + 9 : std::max(x0 + 2 + tw, px - 9);
    // White halo behind the name (paint-order draws the stroke under the fill).
    s += fmt::format("<text x=\"{:.1f}\" y=\"{:.1f}\"{} font-weight=\"bold\" stroke=\"#ffffff\" stroke-width=\"3\" "
                     "paint-order=\"stroke\">{}</text>\n", tx, ty, right_side ? "" : " text-anchor=\"end\"", esc(site.name));
  }
  s += below;
  return s + "</svg>\n";
}

}  // namespace skein
