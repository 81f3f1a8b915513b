#pragma once
// The colour ramps of skein's maps and scatter plots, defined here from published design principles rather than
// taken from any product: lightness (CIE L*) changes monotonically along a sequential ramp and away from the
// centre of a diverging one, so the order of values survives greyscale printing and the common colour-vision
// deficiencies (which mostly lose the red-green axis, not lightness); the hues avoid a red-green contrast
// (P. Kovesi, "Good colour maps: how to design them", arXiv:1509.03700, 2015, sections 2-3; C. Ware,
// "Information Visualization", 2004, ch. 4; both FROM MEMORY). The stops are points in CIE LCh(ab) (D65),
// converted to sRGB with the CIE 1976 L*a*b* formulas (CIE 15:2004) and the sRGB transfer function
// (IEC 61966-2-1); a stop outside the sRGB gamut is clipped per channel.
//
// Direction: on every map the "better" end is dark blue. A sequential ramp runs from pale yellow (worse) through
// green and teal to dark blue (better). A diverging ramp, used where a requirement gives a threshold, is pale
// grey at the threshold, dark blue on the side that meets it and dark orange-brown on the side that fails it.
#include <array>
#include <string>

namespace skein {

// sRGB colour, channels 0..255.
struct Rgb {
  int r = 0, g = 0, b = 0;
};
std::string to_hex(const Rgb& c);  // "#rrggbb"

// A CIE LCh(ab) colour (D65 white) to sRGB, clipped to the gamut.
Rgb lch_to_srgb(double lightness, double chroma, double hue_deg);

// Sequential ramp: `goodness` 0 = worst (pale), 1 = best (dark blue); values outside [0, 1] are clamped.
Rgb sequential_colour(double goodness);
// Diverging ramp: `signed_goodness` -1 = far on the failing side, 0 = at the threshold, +1 = far on the
// meeting side; clamped to [-1, 1].
Rgb diverging_colour(double signed_goodness);

// The stops (L*, C*, h in deg) each ramp interpolates between, for the tests and the documentation.
inline constexpr std::array<std::array<double, 3>, 5> sequential_stops = {{
    {95.0, 28.0, 100.0},  // pale yellow (worst)
    {80.0, 45.0, 125.0},  // yellow-green
    {63.0, 40.0, 165.0},  // green-teal
    {45.0, 35.0, 220.0},  // teal-blue
    {26.0, 40.0, 275.0},  // dark blue (best)
}};
inline constexpr std::array<std::array<double, 3>, 3> diverging_fail_stops = {{
    {96.0, 0.0, 60.0},   // at the threshold: pale grey
    {70.0, 45.0, 60.0},  // orange
    {38.0, 45.0, 50.0},  // dark orange-brown (far on the failing side)
}};
inline constexpr std::array<std::array<double, 3>, 3> diverging_meet_stops = {{
    {96.0, 0.0, 250.0},   // at the threshold: pale grey
    {68.0, 35.0, 245.0},  // mid blue
    {30.0, 42.0, 265.0},  // dark blue (far on the meeting side)
}};

}  // namespace skein
