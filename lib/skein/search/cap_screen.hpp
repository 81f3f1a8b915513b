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
// tests/search/cap_screen_test.cpp.
//
// Band and region grids (weights normalised over the grid's own cells, of total share A_g of the ellipsoid):
// the points a cap holds have their cells inside the widened cap, so W(cap) <= min(1, (1 + area_allowance)
// cap_area_fraction(lambda + s + angle_allowance) / A_g). That bounds every instant (worst_instant_percent)
// but is weak once a cap can hold the whole region. For time averages it is sharpened by when a satellite can
// see the grid at all: a point at geocentric latitude phi_p within central angle lambda' of the sub-satellite
// point has |phi_p - phi_s| <= lambda' (the central angle is at least the latitude difference), so a satellite
// sees nothing of the grid while its sub-satellite latitude phi_s is outside [phi_min - m, phi_max + m], with
// phi_min, phi_max the points' latitudes and m = lambda + angle_allowance + geocentric_allowance (geodetic and
// geocentric latitude differ by under 0.2 deg on the WGS-84 ellipsoid). On a circular orbit (e = 0) under the
// secular J2 model the argument of latitude u advances at the constant rate du/dt = domega/dt + dM/dt and the
// inclination stays fixed, so sin phi_s = sin i sin u (the position's z over r, spherical trigonometry of the
// orbit plane) with u uniform in time. The share of one revolution with phi_s in [a, b]: sin u <= y holds on a
// measure pi + 2 asin(y) of u in [0, 2 pi), so with y = clamp(sin phi / sin i, -1, 1),
//   f(a, b) = (asin(y_b) - asin(y_a)) / pi.
// Over a span S that is not a whole number N of revolutions of period P (S = N P + r, 0 <= r < P) the time in
// the band is at most N P f + min(r, P f), whatever the phase. So the time average of the covered share, the
// area-weighted percent_covered, is at most sum_s W_s F_s / k with F_s that bound over S; the least-covered
// point's percent is at most that mean, so worst_point_percent too. Eccentric orbits get F_s = 1.
// Site grids are not screened.
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

constexpr double cap_screen_geocentric_allowance_deg = 0.2;  // geodetic - geocentric latitude, WGS-84: < 0.193 deg

// The most weight of a band or region grid (cells of spacing `spacing_deg`, of total share `grid_area_fraction`
// of the Earth's area) inside one cap: the bound above, at most 1.
double region_cap_weight_bound(double central_angle_rad, double spacing_deg, double grid_area_fraction);

// The share of a span `span_s` a circular orbit of inclination `inclination_rad` and argument-of-latitude period
// `period_s` spends with its sub-satellite latitude in [lat_lo_rad, lat_hi_rad]: at most (N P f + min(r, P f)) / S
// (above).
double latitude_time_fraction_bound(double inclination_rad, double lat_lo_rad, double lat_hi_rad, double period_s,
                                    double span_s);

struct CapScreen {
  double need = 0.0;    // k X / 100: the weight the caps must hold at least
  double supply = 0.0;  // sum over the design's satellites of cap_weight_bound (time-averaged: times F_s)
  double threshold_percent = 0.0;  // X, the largest covered-share threshold of the figures bounded
  bool time_average = false;       // the bound on time averages (band and region grids) rather than every instant
  bool rules_out() const { return supply < need; }
};

// The screen of a layout's design against the requirement: nullopt when it does not apply (a site grid, or no
// threshold on percent_covered, worst_instant_percent or worst_point_percent). For band and region grids, the
// time-averaged bound (percent_covered, worst_point_percent) and the instantaneous one (worst_instant_percent)
// are both tried: the one returned rules the layout out when either does.
std::optional<CapScreen> cap_screen(const Design& design, const Requirement& requirement);

}  // namespace skein
