// Evidence for the map colour ramps (lib/skein/report/colour_ramp.hpp): order carried by lightness. The check
// converts the written sRGB colours back to CIE L* on its own (sRGB transfer function and luminance row of
// IEC 61966-2-1; L* of CIE 15:2004), independently of the forward conversion in the library, and requires
// L* to fall strictly from the worse end to the better end of the sequential ramp and away from the threshold
// on both arms of the diverging one. Lightness is the channel the common colour-vision deficiencies keep and
// greyscale printing keeps (Kovesi 2015, FROM MEMORY), so a strictly monotonic L* keeps the order readable.
// Tolerance: steps of at least 1 L* unit between samples 1/20 apart (a just-noticeable difference is about 1
// unit, common practice); the round trip through 8-bit channels moves L* by under 0.5.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "skein/report/colour_ramp.hpp"

using namespace skein;

namespace {

double lightness(const Rgb& c) {
  auto lin = [](int v) {
    const double s = v / 255.0;
    return s <= 0.04045 ? s / 12.92 : std::pow((s + 0.055) / 1.055, 2.4);
  };
  const double y = 0.2126 * lin(c.r) + 0.7152 * lin(c.g) + 0.0722 * lin(c.b);
  return y > 216.0 / 24389.0 ? 116.0 * std::cbrt(y) - 16.0 : y * 24389.0 / 27.0;
}

}  // namespace

TEST_CASE("colour ramp: the sequential ramp darkens strictly from worse to better, ending in dark blue") {
  double last = 101.0;
  for (int k = 0; k <= 20; ++k) {
    const double l = lightness(sequential_colour(k / 20.0));
    INFO("sample " << k << ": L* " << l);
    CHECK(l < last - 1.0);
    last = l;
  }
  CHECK(lightness(sequential_colour(0.0)) > 90.0);
  CHECK(lightness(sequential_colour(1.0)) < 30.0);
  const Rgb best = sequential_colour(1.0);
  CHECK(best.b > best.r);  // blue
  CHECK(best.b > best.g);
  CHECK(to_hex(Rgb{255, 0, 16}) == "#ff0010");
}

TEST_CASE("colour ramp: the diverging ramp is palest at the threshold and darkens on both sides, and blue means meeting") {
  double last_meet = 101.0, last_fail = 101.0;
  for (int k = 0; k <= 20; ++k) {
    const double lm = lightness(diverging_colour(k / 20.0)), lf = lightness(diverging_colour(-k / 20.0));
    CHECK(lm < last_meet - 1.0);
    CHECK(lf < last_fail - 1.0);
    last_meet = lm;
    last_fail = lf;
  }
  const Rgb meet = diverging_colour(1.0), fail = diverging_colour(-1.0);
  CHECK(meet.b > meet.r);  // blue on the meeting side
  CHECK(fail.r > fail.b);  // orange-brown on the failing side
  // The two ends differ in the blue-yellow direction (b channel against r), which red-green deficiencies keep.
  CHECK(std::abs((meet.b - meet.r) - (fail.b - fail.r)) > 100);
}
