#pragma once
// The cap-area bound of a layout, made safe for a discrete grid, used by the search to skip layouts that cannot
// meet a covered-share threshold at fold k.
//
// At one instant a satellite sees the ground points inside one cap of Earth-central angle lambda. The grid's
// weights sum to 1, so with c(t) the weight of the points seen by at least k satellites,
//   k c(t) <= sum over points of w_p n_p(t) = sum over satellites of W(cap_s),
// where W(cap) is the weight of the grid points inside a cap. Then every instant's covered share, its time
// average (percent_covered, the area-weighted mean of the points' percents), its minimum (worst instant) and
// the least-covered point's percent (at most the mean) are all at most sum_s W(cap_s) / k. A layout whose
// caps cannot hold k X / 100 of the grid's weight cannot meet a threshold of X % on any of these figures.
//
// W(cap) for a global grid of spacing s (cells s by s in latitude and longitude, weight = the cell's share of
// the ellipsoid's area): a point inside the cap has its whole cell within lambda + s of the cap's centre (a
// cell's points are within s/2 in latitude and s/2 of longitude of its centre), so
//   W(cap) <= (1 + area_allowance) cap_area_fraction(lambda + s + angle_allowance).
// lambda is the spherical footprint (coverage/cap_bound.hpp: the equatorial radius, the shell's apogee); the two
// allowances cover the ellipsoid (geodetic vertical and a shorter polar radius move the edge of visibility by a
// few tenths of a degree in central angle; zone areas on the ellipsoid differ from the sphere's by under 1 %).
// They are stated here and checked against the coverage geometry on the real grid in
// tests/search/cap_screen_test.cpp. Applied to global grids only: band, region and site grids are not screened.
#include <optional>
#include <string>

#include "skein/design/design.hpp"
#include "skein/design/requirement.hpp"

namespace skein {

constexpr double cap_screen_angle_allowance_deg = 1.5;  // ellipsoid allowance on the footprint's central angle
constexpr double cap_screen_area_allowance = 0.02;      // ellipsoid allowance on a cap's share of the area

// The most weight of a global grid of spacing `spacing_deg` inside one satellite's cap of central angle
// `central_angle_rad`: the bound above.
double cap_weight_bound(double central_angle_rad, double spacing_deg);

struct CapScreen {
  double need = 0.0;    // k X / 100: the weight the caps must hold at least
  double supply = 0.0;  // sum over the design's satellites of cap_weight_bound
  double threshold_percent = 0.0;  // X, the largest covered-share threshold
  bool rules_out() const { return supply < need; }
};

// The screen of a layout's design against the requirement: nullopt when it does not apply (the grid is not
// global, or the requirement has no threshold on percent_covered, worst_instant_percent or worst_point_percent).
std::optional<CapScreen> cap_screen(const Design& design, const Requirement& requirement);

}  // namespace skein
