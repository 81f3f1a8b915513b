#include "skein/report/colour_ramp.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "skein/constants.hpp"

namespace skein {
namespace {

// CIE 15:2004: L*a*b* to XYZ with the D65 white point (X, Y, Z) = (0.95047, 1, 1.08883).
double lab_f_inverse(double t) {
  constexpr double delta = 6.0 / 29.0;
  return t > delta ? t * t * t : 3.0 * delta * delta * (t - 4.0 / 29.0);
}

// IEC 61966-2-1: linear light to the sRGB transfer function, then to 0..255.
int srgb_channel(double linear) {
  linear = std::clamp(linear, 0.0, 1.0);
  const double v = linear <= 0.0031308 ? 12.92 * linear : 1.055 * std::pow(linear, 1.0 / 2.4) - 0.055;
  return static_cast<int>(std::lround(255.0 * v));
}

template <size_t N>
Rgb along(const std::array<std::array<double, 3>, N>& stops, double f) {
  f = std::clamp(std::isfinite(f) ? f : 0.0, 0.0, 1.0) * static_cast<double>(N - 1);
  const size_t k = std::min(N - 2, static_cast<size_t>(f));
  const double t = f - static_cast<double>(k);
  const auto& a = stops[k];
  const auto& b = stops[k + 1];
  // Hue interpolated along the shorter way round the circle.
  double dh = b[2] - a[2];
  if (dh > 180.0) dh -= 360.0;
  if (dh < -180.0) dh += 360.0;
  return lch_to_srgb(a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * dh);
}

}  // namespace

std::string to_hex(const Rgb& c) { return fmt::format("#{:02x}{:02x}{:02x}", c.r, c.g, c.b); }

Rgb lch_to_srgb(double lightness, double chroma, double hue_deg) {
  const double h = hue_deg * pi / 180.0;
  const double a = chroma * std::cos(h), b = chroma * std::sin(h);
  const double fy = (lightness + 16.0) / 116.0, fx = fy + a / 500.0, fz = fy - b / 200.0;
  const double x = 0.95047 * lab_f_inverse(fx), y = lab_f_inverse(fy), z = 1.08883 * lab_f_inverse(fz);
  // XYZ to linear sRGB (IEC 61966-2-1 matrix).
  const double rl = 3.2406 * x - 1.5372 * y - 0.4986 * z;
  const double gl = -0.9689 * x + 1.8758 * y + 0.0415 * z;
  const double bl = 0.0557 * x - 0.2040 * y + 1.0570 * z;
  return {srgb_channel(rl), srgb_channel(gl), srgb_channel(bl)};
}

Rgb sequential_colour(double goodness) { return along(sequential_stops, goodness); }

Rgb diverging_colour(double s) {
  s = std::clamp(std::isfinite(s) ? s : 0.0, -1.0, 1.0);
  return s >= 0.0 ? along(diverging_meet_stops, s) : along(diverging_fail_stops, -s);
}

}  // namespace skein
