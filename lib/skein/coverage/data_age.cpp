#include "skein/coverage/data_age.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "skein/coverage/contacts.hpp"
#include "skein/coverage/engine/daylight.hpp"
#include "skein/coverage/grid_passes.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

DataAgeBins DataAgeBins::log_spaced(double span_s) {
  const double first = cell_data_age_first_bin_s;
  const double ratio = span_s > first ? std::pow(span_s / first, 1.0 / (cell_data_age_bins - 1)) : 1.0 + 1e-9;
  return {cell_data_age_bins, first, ratio};
}

int DataAgeBins::bin_of(double age_s) const {
  double b = 0.0;
  if (ratio == 1.0)
    b = std::floor(age_s / width_s);
  else if (age_s >= width_s)
    b = std::floor(std::log(age_s / width_s) / std::log(ratio)) + 1.0;
  b = std::clamp(b, 0.0, static_cast<double>(count - 1));
  int k = static_cast<int>(b);
  // The logarithm may round across an edge: keep age < upper edge (and >= the edge below) exactly.
  while (k + 1 < count && age_s >= upper_edge_s(k)) ++k;
  while (k > 0 && age_s < upper_edge_s(k - 1)) --k;
  return k;
}

double DataAgeBins::upper_edge_s(int bin) const {
  if (ratio == 1.0) return static_cast<double>(bin + 1) * width_s;
  return width_s * std::pow(ratio, bin);
}

double DataAgeBins::error_bound_s(double p95_s) const {
  return ratio == 1.0 ? width_s : std::max(width_s, (ratio - 1.0) * p95_s);
}

void DataAgeAccumulator::add(double age_s) {
  ++observations_;
  sum_ += age_s;
  max_ = std::max(max_, age_s);
  ++counts_[static_cast<size_t>(bins_.bin_of(age_s))];
}

DataAgeFigures DataAgeAccumulator::weighted(const std::vector<DataAgeAccumulator>& acc, const std::vector<double>& weight) {
  assert(acc.size() == weight.size());
  DataAgeFigures f;
  if (acc.empty()) return f;
  const DataAgeBins& bins = acc.front().bins_;
  std::vector<double> hist(static_cast<size_t>(bins.count), 0.0);
  double w_sum = 0.0, w_total = 0.0;
  for (size_t p = 0; p < acc.size(); ++p) {
    const DataAgeAccumulator& a = acc[p];
    f.observations += a.observations_;
    f.censored += a.censored_;
    f.max_s = std::max(f.max_s, a.max_);
    const long n = a.observations_ - a.censored_;
    w_sum += weight[p] * a.sum_;
    w_total += weight[p] * static_cast<double>(n);
    for (size_t b = 0; b < hist.size(); ++b) hist[b] += weight[p] * a.counts_[b];
  }
  if (!(w_total > 0.0)) return f;
  f.mean_s = w_sum / w_total;
  // Nearest rank on the weighted histogram: the first bin where the cumulative weight reaches 95 %; its upper
  // edge, capped at the largest age (so never below the true percentile, and above it by less than a bin).
  const double target = 0.95 * w_total * (1.0 - 1e-12);
  double cum = 0.0;
  for (size_t b = 0; b < hist.size(); ++b) {
    cum += hist[b];
    if (cum >= target && hist[b] > 0.0) {
      f.p95_s = std::min(f.max_s, bins.upper_edge_s(static_cast<int>(b)));
      break;
    }
  }
  return f;
}

DataAgeFigures DataAgeAccumulator::figures() const { return weighted({*this}, {1.0}); }

std::optional<double> age_to_next_contact(const std::vector<ContactSpan>& contacts, double t) {
  // The first contact that ends after t: in contact at t if it has begun, else the wait to its start.
  const auto it = std::upper_bound(contacts.begin(), contacts.end(), t,
                                   [](double x, const ContactSpan& c) { return x < c.end_s; });
  if (it == contacts.end()) return std::nullopt;
  return std::max(0.0, it->start_s - t);
}

bool data_age_applies(const Design& design) {
  return !design.ground_stations.empty() && !design.coverage.nadir_half_angle_deg.has_value();
}

namespace {

// Sorted disjoint union of intervals.
std::vector<ContactSpan> merged(std::vector<ContactSpan> v) {
  std::sort(v.begin(), v.end(), [](const ContactSpan& a, const ContactSpan& b) { return a.start_s < b.start_s; });
  std::vector<ContactSpan> out;
  for (const ContactSpan& c : v) {
    if (!out.empty() && c.start_s <= out.back().end_s)
      out.back().end_s = std::max(out.back().end_s, c.end_s);
    else
      out.push_back(c);
  }
  return out;
}

}  // namespace

DataAgeResult compute_data_age(const Design& design, const Grid& grid) {
  assert(data_age_applies(design));
  const ContactOptions options = contact_options_for(design);
  const double span = options.span_s;
  const bool cells = grid.kind != GridKind::sites;
  const DataAgeBins bins =
      cells ? DataAgeBins::log_spaced(span) : DataAgeBins::linear(std::max(10.0, span / data_age_bins));
  DataAgeResult res;
  res.bin_s = bins.width_s;
  res.bin_ratio = bins.ratio;

  // Downlinks: every satellite's contacts with any station, merged.
  const ContactResult links = compute_contacts(design, options);
  std::vector<std::vector<ContactSpan>> downlinks;
  for (const SatelliteContacts& s : links.satellites) {
    std::vector<ContactSpan> all;
    for (const PairContacts& pc : s.stations)
      for (const ContactInterval& c : pc.intervals) all.push_back({c.rise_s, c.set_s});
    downlinks.push_back(merged(std::move(all)));
  }

  // Daylight at each point (when set), from the same search the coverage timeline uses.
  std::optional<coverage_engine::DaylightMask> mask;
  if (design.coverage.min_sun_elevation_deg) {
    coverage_engine::DaylightMask m;
    m.epoch = julian_date(design.epoch);
    m.theta0_rad = greenwich_mean_sidereal_angle_rad(m.epoch);
    m.rotation_rad_s = design.earth.rotation_rad_s;
    m.sin_min = std::sin(*design.coverage.min_sun_elevation_deg * rad_per_deg);
    mask = m;
  }
  const auto geo = [](const GridPoint& g) {
    coverage_engine::PointGeo pg{};
    pg.nx = g.up.x();
    pg.ny = g.up.y();
    pg.nz = g.up.z();
    return pg;
  };
  const auto observe = [&](DataAgeAccumulator& acc, size_t s, double t) {
    if (const auto age = age_to_next_contact(downlinks[s], t))
      acc.add(*age);
    else
      acc.add_censored();
  };

  std::vector<DataAgeAccumulator> acc(grid.points.size(), DataAgeAccumulator(bins));
  std::vector<double> weight;
  for (const GridPoint& g : grid.points) weight.push_back(g.area_weight);

  if (cells) {
    // All cells together (grid_passes.hpp); each pass's lit pieces found from its rise, so nothing is stored
    // per point but its accumulator.
    GridPassOptions po;
    po.span_s = span;
    po.sample_step_s = links.sample_step_s;
    po.min_elevation_deg = design.coverage.min_elevation_deg;
    for_each_grid_pass(design, grid, po, [&](size_t p, size_t s, double rise, double set) {
      if (!mask) {
        observe(acc[p], s, rise);
        return;
      }
      const coverage_engine::PointGeo pg = geo(grid.points[p]);
      bool on = mask->margin(pg, rise) >= 0.0;
      if (on) observe(acc[p], s, rise);
      double t = rise;
      while (true) {
        const double next = mask->next_change(pg, t, on, set);
        if (!(next < set)) break;
        on = !on;
        if (on) observe(acc[p], s, next);  // a lit piece of the pass begins
        t = next;
      }
    });
  } else {
    // Passes over a site: the same contact search with the site as the one station, at the coverage mask; one
    // site at a time, so only that site's passes are held.
    Design over_site = design;
    for (size_t p = 0; p < grid.points.size(); ++p) {
      const GridPoint& g = grid.points[p];
      std::vector<ContactSpan> lit = {{0.0, span}};
      if (mask) {
        lit.clear();
        const coverage_engine::PointGeo pg = geo(g);
        bool on = mask->margin(pg, 0.0) >= 0.0;
        double t = 0.0, start = 0.0;
        while (true) {
          const double next = mask->next_change(pg, t, on, span);
          if (next > span) break;
          if (on) lit.push_back({start, next});
          else start = next;
          on = !on;
          t = next;
        }
        if (on) lit.push_back({start, span});
      }
      over_site.ground_stations = {{g.name, g.lat_deg, g.lon_deg, g.height_km, design.coverage.min_elevation_deg}};
      const ContactResult passes = compute_contacts(over_site, options);
      for (size_t s = 0; s < passes.satellites.size(); ++s)
        for (const ContactInterval& pass : passes.satellites[s].stations[0].intervals)
          for (const ContactSpan& l : lit) {
            // Each lit piece of the pass is one opportunity, observed at its start.
            const double a = std::max(pass.rise_s, l.start_s), b = std::min(pass.set_s, l.end_s);
            if (!(b > a)) continue;
            observe(acc[p], s, a);
          }
    }
  }
  for (const DataAgeAccumulator& a : acc) res.per_point.push_back(a.figures());
  res.total = DataAgeAccumulator::weighted(acc, weight);
  return res;
}

}  // namespace skein
