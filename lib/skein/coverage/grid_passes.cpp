#include "skein/coverage/grid_passes.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <map>

#include "skein/angles.hpp"
#include "skein/coverage/pass_search.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

constexpr double vertical_lean_rad = 0.25 * rad_per_deg;  // above the ellipsoid's largest geodetic/geocentric lean
constexpr double reach_margin_rad = 0.5 * rad_per_deg;    // common practice

// One latitude row: its points in longitude order.
struct Row {
  double lat_rad = 0.0;                // geocentric
  std::vector<std::size_t> points;     // grid indices, by longitude
  std::vector<double> lon_rad;         // their longitudes
};

std::vector<Row> rows_of(const Grid& grid) {
  std::map<double, Row> by_lat;
  for (std::size_t p = 0; p < grid.points.size(); ++p) {
    const GridPoint& g = grid.points[p];
    Row& row = by_lat[g.lat_deg];
    row.lat_rad = std::asin(std::clamp(g.r_km.z() / g.r_km.norm(), -1.0, 1.0));
    row.points.push_back(p);
  }
  std::vector<Row> rows;
  for (auto& [lat, row] : by_lat) {
    std::sort(row.points.begin(), row.points.end(), [&](std::size_t a, std::size_t b) {
      return grid.points[a].lon_deg < grid.points[b].lon_deg;
    });
    for (std::size_t p : row.points) row.lon_rad.push_back(grid.points[p].lon_deg * rad_per_deg);
    rows.push_back(std::move(row));
  }
  return rows;
}

// One satellite's samples.
struct Track {
  SecularOrbit orbit;
  double v_max_km_s = 0.0, perigee_km = 0.0;
  double reach_rad = 0.0;       // lambda_max (grid_passes.hpp)
  double sure_rad = 0.0;        // lambda_min: within it the point is in view (grid_passes.hpp)
  double turn_rad_s = 0.0;      // w
  std::vector<Eigen::Vector3d> r_km, v_km_s;
  std::vector<double> lat_rad, lon_rad;  // geocentric, of the satellite's direction
  std::vector<Eigen::Vector3d> u;        // that direction
};

// Calls f(k) for the row's points k whose longitude is within half_width of lon (wrapping at +-180 deg).
template <class F>
void for_each_in_window(const Row& row, double lon, double half_width, F&& f) {
  const std::size_t n = row.lon_rad.size();
  if (half_width >= pi) {
    for (std::size_t k = 0; k < n; ++k) f(k);
    return;
  }
  const auto span = [&](double lo, double hi) {
    auto it = std::lower_bound(row.lon_rad.begin(), row.lon_rad.end(), lo);
    for (; it != row.lon_rad.end() && *it <= hi; ++it) f(static_cast<std::size_t>(it - row.lon_rad.begin()));
  };
  double lo = lon - half_width, hi = lon + half_width;
  if (lo < -pi) {
    span(lo + 2.0 * pi, pi);
    span(-pi, hi);
  } else if (hi > pi) {
    span(lo, pi);
    span(-pi, hi - 2.0 * pi);
  } else {
    span(lo, hi);
  }
}

constexpr double event_resolution_s = 1e-3;  // as pass_search.cpp
constexpr double bracket_s = 2.0;            // a sign change this short is solved, not halved further

// The satellite between two samples on the cubic Hermite curve through their positions and velocities.
struct Segment {
  double a, h;
  Eigen::Vector3d r0, v0, r1, v1;
  Eigen::Vector3d at(double t) const {
    const double s = (t - a) / h, s2 = s * s, s3 = s2 * s;
    return (2 * s3 - 3 * s2 + 1) * r0 + (s3 - 2 * s2 + s) * h * v0 + (-2 * s3 + 3 * s2) * r1 + (s3 - s2) * h * v1;
  }
  Eigen::Vector3d velocity(double t) const {
    const double s = (t - a) / h, s2 = s * s;
    return ((6 * s2 - 6 * s) * r0 + (6 * s2 - 6 * s) * -r1) / h + (3 * s2 - 4 * s + 1) * v0 + (3 * s2 - 2 * s) * v1;
  }
  // The largest acceleration on the curve: it is linear in time, so the larger of its two ends.
  double acceleration_bound() const {
    const Eigen::Vector3d k = 6.0 * (r1 - r0) / (h * h);
    return std::max((k - (4.0 * v0 + 2.0 * v1) / h).norm(), (-k + (2.0 * v0 + 4.0 * v1) / h).norm());
  }
};

struct Sample {
  double margin, range_km, rate;  // m, |d|, dm/dt
};

Sample sample_at(const ViewPoint& p, const Eigen::Vector3d& r_sat, const Eigen::Vector3d& v_sat) {
  const Eigen::Vector3d d = r_sat - p.r_km;
  const double range = d.norm();
  const double sin_e = d.dot(p.up) / range;
  // dm/dt = v . (up - sin(e) d/|d|) / |d|
  return {sin_e - p.sin_mask, range, (v_sat.dot(p.up) - sin_e * v_sat.dot(d) / range) / range};
}

// Where the satellite is on the segment: the margin changes at most L = v_max / d_low (the pass search's bound,
// pass_search.hpp) and its rate at most M2 = 2 A / d_low + 3 v_max^2 / d_low^2 (A the segment's largest
// acceleration; from d^2/dt^2 of the unit line of sight), d_low bounding the range over [a, b] from below.
// [a, b] holds no crossing when both ends have the same sign and either |m(a)| + |m(b)| > L (b - a) or m is
// monotonic (its rates at both ends of that sign, sum above M2 (b - a)); exactly one when the signs differ and m
// is monotonic, which is then solved at once. Else halved, down to 2 s, then solved (Illinois, to 1 ms).
// Appends the rises and sets strictly inside (a, b).
struct Scanner {
  const Segment& seg;
  const ViewPoint& p;
  double v_max, floor_km, acc;
  std::vector<double>& events;

  void solve(double x0, double f0, double x1, double f1) const {
    int side = 0;
    while (x1 - x0 > event_resolution_s) {
      double x = (x0 * f1 - x1 * f0) / (f1 - f0);
      // Keep the new point inside, at least a quarter of the resolution from either end.
      x = std::clamp(x, x0 + 0.25 * event_resolution_s, x1 - 0.25 * event_resolution_s);
      const double f = sample(x).margin;
      if ((f >= 0.0) == (f0 >= 0.0)) {
        x0 = x;
        f0 = f;
        if (side == -1) f1 *= 0.5;
        side = -1;
      } else {
        x1 = x;
        f1 = f;
        if (side == 1) f0 *= 0.5;
        side = 1;
      }
    }
    events.push_back(0.5 * (x0 + x1));
  }

  Sample sample(double t) const { return sample_at(p, seg.at(t), seg.velocity(t)); }

  void scan(double a, const Sample& sa, double b, const Sample& sb) const {
    const bool in_a = sa.margin >= 0.0, in_b = sb.margin >= 0.0;
    const double w = b - a;
    const double d_low = std::max(floor_km, 0.5 * (sa.range_km + sb.range_km - v_max * w));
    const double m2 = 2.0 * acc / d_low + 3.0 * v_max * v_max / (d_low * d_low);
    const bool monotonic = (sa.rate > 0.0 && sb.rate > 0.0 && sa.rate + sb.rate > m2 * w) ||
                           (sa.rate < 0.0 && sb.rate < 0.0 && -(sa.rate + sb.rate) > m2 * w);
    if (in_a == in_b) {
      if (monotonic) return;
      if (std::abs(sa.margin) + std::abs(sb.margin) > v_max / d_low * w) return;
      if (w <= event_resolution_s) return;
    } else if (monotonic || w <= bracket_s) {
      solve(a, sa.margin, b, sb.margin);
      return;
    }
    const double m = 0.5 * (a + b);
    const Sample sm = sample(m);
    scan(a, sa, m, sm);
    scan(m, sm, b, sb);
  }
};

}  // namespace

void for_each_grid_pass(const Design& design, const Grid& grid, const GridPassOptions& options,
                        const GridPassSink& on_pass) {
  const std::vector<Row> rows = rows_of(grid);
  const PassSearchSpan span{options.span_s, options.sample_step_s, std::nullopt};
  const std::vector<double> times = pass_search_times(span);
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));
  const double sin_mask = std::sin(options.min_elevation_deg * rad_per_deg);
  double r_min = 0.0, r_top = 0.0;
  for (const GridPoint& g : grid.points) {
    r_min = r_min == 0.0 ? g.r_km.norm() : std::min(r_min, g.r_km.norm());
    r_top = std::max(r_top, g.r_km.norm());
  }
  const double e_low = options.min_elevation_deg * rad_per_deg - vertical_lean_rad;
  const double e_high = options.min_elevation_deg * rad_per_deg + vertical_lean_rad;

  const std::vector<Satellite> sats = expand_constellation(design);
  std::vector<Track> tracks(sats.size());
  parallel_items(sats.size(), [&](std::size_t s) {
    Track& tr = tracks[s];
    tr.orbit = make_secular_orbit(design.earth, sats[s].elements);
    tr.v_max_km_s = view_speed_bound_km_s(design.earth, tr.orbit);
    tr.perigee_km = tr.orbit.epoch_elements.a_km * (1.0 - tr.orbit.epoch_elements.e);
    double r_max = tr.orbit.epoch_elements.a_km * (1.0 + tr.orbit.epoch_elements.e);
    double r_low = tr.orbit.epoch_elements.a_km * (1.0 - tr.orbit.epoch_elements.e);
    for (double t : times) {
      const EarthFixedState ef =
          earth_fixed_state_at(design.earth, tr.orbit, theta0 + design.earth.rotation_rad_s * t, t);
      const Eigen::Vector3d& r = ef.r_km;
      tr.r_km.push_back(r);
      tr.v_km_s.push_back(ef.v_km_s);
      tr.lat_rad.push_back(std::asin(std::clamp(r.z() / r.norm(), -1.0, 1.0)));
      tr.lon_rad.push_back(std::atan2(r.y(), r.x()));
      tr.u.push_back(r.normalized());
      r_max = std::max(r_max, r.norm());
      r_low = std::min(r_low, r.norm());
    }
    tr.reach_rad = std::acos(std::min(1.0, r_min * std::cos(e_low) / r_max)) - e_low + reach_margin_rad;
    tr.turn_rad_s = tr.v_max_km_s / tr.perigee_km;
    // The other way round: seen at geocentric elevation e'' = mask + 0.25 deg or more from the highest point by a
    // satellite at its lowest radius, less the margin; none when the orbit is below that point's horizon.
    const double c = r_top * std::cos(e_high) / r_low;
    tr.sure_rad = c < 1.0 ? std::acos(c) - e_high - reach_margin_rad : -1.0;
  });

  parallel_items(rows.size(), [&](std::size_t i) {
    const Row& row = rows[i];
    const std::size_t n = row.points.size();
    std::vector<ViewPoint> view(n);
    std::vector<Eigen::Vector3d> u(n);
    std::vector<double> floor_km(n);
    for (std::size_t k = 0; k < n; ++k) {
      const GridPoint& g = grid.points[row.points[k]];
      view[k] = {g.r_km, g.up, sin_mask};
      u[k] = g.r_km.normalized();
    }
    const double sin_row = std::sin(row.lat_rad), cos_row = std::cos(row.lat_rad);
    std::vector<char> open(n);
    std::vector<double> rise(n);
    std::vector<double> events;
    for (std::size_t s = 0; s < tracks.size(); ++s) {
      const Track& tr = tracks[s];
      std::fill(open.begin(), open.end(), 0);
      for (std::size_t k = 0; k < n; ++k) floor_km[k] = std::max(1.0, tr.perigee_km - view[k].r_km.norm());
      for (std::size_t j = 0; j + 1 < times.size(); ++j) {
        const double a = times[j], b = times[j + 1];
        const double turn = tr.turn_rad_s * (b - a);
        const double dlat_low =
            0.5 * (std::abs(tr.lat_rad[j] - row.lat_rad) + std::abs(tr.lat_rad[j + 1] - row.lat_rad) - turn);
        if (dlat_low > tr.reach_rad) continue;
        // Points within reach + turn of the satellite's direction at a: cos(dlon) >= (cos(reach) - sin sin) /
        // (cos cos), spherical law of cosines.
        const double reach = tr.reach_rad + turn;
        double half_width = pi;
        if (reach < pi) {
          const double den = cos_row * std::cos(tr.lat_rad[j]);
          if (den > 1e-12) {
            const double c = (std::cos(reach) - sin_row * std::sin(tr.lat_rad[j])) / den;
            if (c > 1.0) continue;
            if (c > -1.0) half_width = std::acos(c) + 1e-9;
          }
        }
        const Segment seg{a, b - a, tr.r_km[j], tr.v_km_s[j], tr.r_km[j + 1], tr.v_km_s[j + 1]};
        const double acc = 1.01 * seg.acceleration_bound();
        // Per point, two cheap tests on the angles to the satellite at a and b: out of reach at b (as at a, by
        // the window), or so deep inside at a that it stays in view to b (then, when its pass is open, nothing
        // happens in [a, b]).
        const double cos_reach = reach < pi ? std::cos(reach) : -1.0;
        const double sure = tr.sure_rad - turn;
        const double cos_sure = sure > 0.0 ? std::cos(sure) : 2.0;
        for_each_in_window(row, tr.lon_rad[j], half_width, [&](std::size_t k) {
          const double cos_a = u[k].dot(tr.u[j]);
          if (open[k] && cos_a >= cos_sure) return;
          if (u[k].dot(tr.u[j + 1]) < cos_reach) return;
          events.clear();
          const Sample sa = sample_at(view[k], seg.r0, seg.v0);
          const Sample sb = sample_at(view[k], seg.r1, seg.v1);
          const Scanner scanner{seg, view[k], tr.v_max_km_s, floor_km[k], acc, events};
          scanner.scan(a, sa, b, sb);
          const bool in_a = sa.margin >= 0.0;
          // A point out of every window before a is out of view there (see the header), so its state at a is
          // the one carried over; the reconciliation only meets the span's start.
          if (in_a != static_cast<bool>(open[k])) {
            if (in_a) rise[k] = a;
            else on_pass(row.points[k], s, rise[k], a);
            open[k] = in_a;
          }
          for (double e : events) {
            if (open[k]) on_pass(row.points[k], s, rise[k], e);
            else rise[k] = e;
            open[k] = !open[k];
          }
          // The state at b: a pass open at b stays open until the next window's events (or the span's end).
        });
      }
      for (std::size_t k = 0; k < n; ++k)
        if (open[k]) {
          // Still in view at the last searched sample. Its set is at the span's end when that sample is the last;
          // otherwise the point left every window while in view, which the bounds exclude.
          on_pass(row.points[k], s, rise[k], options.span_s);
        }
    }
  });
}

}  // namespace skein
