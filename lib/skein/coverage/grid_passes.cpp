#include "skein/coverage/grid_passes.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <map>

#include <tbb/parallel_for.h>

#include "skein/angles.hpp"
#include "skein/coverage/pass_search.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
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
  double turn_rad_s = 0.0;      // w
  std::vector<Eigen::Vector3d> r_km, v_km_s;
  std::vector<double> lat_rad, lon_rad;  // geocentric, of the satellite's direction
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
};

struct Sample {
  double margin, range_km;
};

Sample sample_at(const ViewPoint& p, const Eigen::Vector3d& r_sat) {
  const Eigen::Vector3d d = r_sat - p.r_km;
  const double range = d.norm();
  return {d.dot(p.up) / range - p.sin_mask, range};
}

// The pass search's rate-bounded refinement (pass_search.hpp: an interval with the same sign at both ends is
// dropped when |m(a)| + |m(b)| > (v_max / d_low) (b - a), else halved; a sign change is closed to 1 ms), on the
// segment's path. Appends the rises and sets strictly inside (a, b).
void scan(const Segment& seg, const ViewPoint& p, double v_max, double floor_km, double a, const Sample& sa,
          double b, const Sample& sb, std::vector<double>& events) {
  const bool in_a = sa.margin >= 0.0, in_b = sb.margin >= 0.0;
  const double w = b - a;
  if (in_a == in_b) {
    const double d_low = std::max(floor_km, 0.5 * (sa.range_km + sb.range_km - v_max * w));
    if (std::abs(sa.margin) + std::abs(sb.margin) > v_max / d_low * w) return;
    if (w <= event_resolution_s) return;
  } else if (w <= bracket_s) {
    // Illinois (regula falsi with the stale end's value halved) until the bracket is under 1 ms.
    double x0 = a, f0 = sa.margin, x1 = b, f1 = sb.margin;
    int side = 0;
    while (x1 - x0 > event_resolution_s) {
      double x = (x0 * f1 - x1 * f0) / (f1 - f0);
      // Keep the new point inside, at least a quarter of the resolution from either end.
      x = std::clamp(x, x0 + 0.25 * event_resolution_s, x1 - 0.25 * event_resolution_s);
      const double f = sample_at(p, seg.at(x)).margin;
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
    return;
  }
  const double m = 0.5 * (a + b);
  const Sample sm = sample_at(p, seg.at(m));
  scan(seg, p, v_max, floor_km, a, sa, m, sm, events);
  scan(seg, p, v_max, floor_km, m, sm, b, sb, events);
}

}  // namespace

void for_each_grid_pass(const Design& design, const Grid& grid, const GridPassOptions& options,
                        const GridPassSink& on_pass) {
  const std::vector<Row> rows = rows_of(grid);
  const PassSearchSpan span{options.span_s, options.sample_step_s, std::nullopt};
  const std::vector<double> times = pass_search_times(span);
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));
  const double sin_mask = std::sin(options.min_elevation_deg * rad_per_deg);
  double r_min = 0.0;
  for (const GridPoint& g : grid.points) r_min = r_min == 0.0 ? g.r_km.norm() : std::min(r_min, g.r_km.norm());
  const double e_low = options.min_elevation_deg * rad_per_deg - vertical_lean_rad;

  const std::vector<Satellite> sats = expand_constellation(design);
  std::vector<Track> tracks(sats.size());
  tbb::parallel_for(std::size_t{0}, sats.size(), [&](std::size_t s) {
    Track& tr = tracks[s];
    tr.orbit = make_secular_orbit(design.earth, sats[s].elements);
    tr.v_max_km_s = view_speed_bound_km_s(design.earth, tr.orbit);
    tr.perigee_km = tr.orbit.epoch_elements.a_km * (1.0 - tr.orbit.epoch_elements.e);
    double r_max = tr.orbit.epoch_elements.a_km * (1.0 + tr.orbit.epoch_elements.e);
    for (double t : times) {
      const EarthFixedState ef =
          earth_fixed_state_at(design.earth, tr.orbit, theta0 + design.earth.rotation_rad_s * t, t);
      const Eigen::Vector3d& r = ef.r_km;
      tr.r_km.push_back(r);
      tr.v_km_s.push_back(ef.v_km_s);
      tr.lat_rad.push_back(std::asin(std::clamp(r.z() / r.norm(), -1.0, 1.0)));
      tr.lon_rad.push_back(std::atan2(r.y(), r.x()));
      r_max = std::max(r_max, r.norm());
    }
    tr.reach_rad = std::acos(std::min(1.0, r_min * std::cos(e_low) / r_max)) - e_low + reach_margin_rad;
    tr.turn_rad_s = tr.v_max_km_s / tr.perigee_km;
  });

  tbb::parallel_for(std::size_t{0}, rows.size(), [&](std::size_t i) {
    const Row& row = rows[i];
    const std::size_t n = row.points.size();
    std::vector<ViewPoint> view(n);
    std::vector<double> floor_km(n);
    for (std::size_t k = 0; k < n; ++k) {
      const GridPoint& g = grid.points[row.points[k]];
      view[k] = {g.r_km, g.up, sin_mask};
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
        for_each_in_window(row, tr.lon_rad[j], half_width, [&](std::size_t k) {
          events.clear();
          const Sample sa = sample_at(view[k], seg.r0);
          scan(seg, view[k], tr.v_max_km_s, floor_km[k], a, sa, b, sample_at(view[k], seg.r1), events);
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
