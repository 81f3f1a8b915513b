#include "skein/coverage/contacts.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

#include "skein/angles.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

constexpr double max_sample_step_s = 60.0;

void summarise(PairContacts& p, double span_s) {
  const double days = span_s / 86400.0;
  double total = 0.0, longest = 0.0;
  for (const ContactInterval& c : p.intervals) {
    total += c.set_s - c.rise_s;
    longest = std::max(longest, c.set_s - c.rise_s);
  }
  const double n = static_cast<double>(p.intervals.size());
  p.contacts_per_day = n / days;
  p.minutes_per_day = total / 60.0 / days;
  p.mean_contact_min = p.intervals.empty() ? 0.0 : total / n / 60.0;
  p.longest_contact_min = longest / 60.0;
}

// Longest stretch of [0, span] not covered by any of the intervals.
double longest_gap_s(std::vector<ContactInterval> all, double span_s) {
  std::sort(all.begin(), all.end(), [](const ContactInterval& x, const ContactInterval& y) {
    return x.rise_s < y.rise_s || (x.rise_s == y.rise_s && x.set_s < y.set_s);
  });
  double covered_to = 0.0, gap = 0.0;
  for (const ContactInterval& c : all) {
    gap = std::max(gap, c.rise_s - covered_to);
    covered_to = std::max(covered_to, c.set_s);
  }
  return std::max(gap, span_s - covered_to);
}

StationLoad station_load(const std::string& name, const std::vector<const std::vector<ContactInterval>*>& lists,
                         double span_s) {
  // Events (time, +1 rise / -1 set); at one instant sets go first (contacts are half-open [rise, set)).
  std::vector<std::pair<double, int>> events;
  for (const auto* list : lists)
    for (const ContactInterval& c : *list) {
      events.push_back({c.rise_s, +1});
      events.push_back({c.set_s, -1});
    }
  std::sort(events.begin(), events.end());
  StationLoad load;
  load.name = name;
  std::vector<double> time_by_count(1, 0.0);
  int count = 0;
  double t = 0.0;
  for (const auto& [time, delta] : events) {
    time_by_count[static_cast<size_t>(count)] += time - t;
    t = time;
    count += delta;
    assert(count >= 0);
    if (static_cast<size_t>(count) >= time_by_count.size()) time_by_count.resize(static_cast<size_t>(count) + 1, 0.0);
    load.max_in_view = std::max(load.max_in_view, count);
  }
  assert(count == 0);
  time_by_count[0] += span_s - t;
  for (double s : time_by_count) load.share_by_count.push_back(s / span_s);
  load.busy_share = 1.0 - time_by_count[0] / span_s;
  return load;
}

double sample_step_for(const ContactOptions& options) { return std::min(options.step_s, max_sample_step_s); }

long sample_count(const ContactOptions& options) {
  return static_cast<long>(std::ceil(options.span_s / sample_step_for(options) - 1e-9)) + 1;
}

}  // namespace

ContactOptions contact_options_for(const Design& design) {
  ContactOptions o;
  o.span_s = design.coverage.span_s;
  o.step_s = design.coverage.step_s;
  return o;
}

void check_contact_work(const Design& design, const ContactOptions& options) {
  if (design.ground_stations.empty())
    throw InputError(fmt::format("{}: the design has no ground_stations; expected a list of stations, each with name, "
                                 "lat_deg, lon_deg and optionally height_km and min_elevation_deg",
                                 design.file));
  assert(options.span_s > 0.0 && options.step_s > 0.0);
  double satellites = 0.0;
  for (const Shell& sh : design.shells) satellites += sh.satellites;
  const long samples = sample_count(options);
  const double work = satellites * static_cast<double>(design.ground_stations.size()) * static_cast<double>(samples);
  if (work > max_contact_samples)
    throw InputError(fmt::format("{}: contacts of {} satellites with {} stations over {} samples would take {:.2g} "
                                 "samples, above the limit of {:.0e}; expected fewer satellites or stations, or a "
                                 "shorter coverage.span_h",
                                 design.file, satellites, design.ground_stations.size(), samples, work,
                                 max_contact_samples));
}

ContactResult compute_contacts(const Design& design, const ContactOptions& options) {
  check_contact_work(design, options);
  ContactResult res;
  res.span_s = options.span_s;
  res.sample_step_s = sample_step_for(options);
  const auto sats = expand_constellation(design);

  std::vector<ViewPoint> stations;
  for (const GroundStation& g : design.ground_stations) {
    const double lat = g.lat_deg * rad_per_deg, lon = g.lon_deg * rad_per_deg;
    stations.push_back({geodetic_to_earth_fixed(design.earth, lat, lon, g.height_km), geodetic_up(lat, lon),
                        std::sin(g.min_elevation_deg * rad_per_deg)});
  }
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));
  const PassSearchSpan span{res.span_s, res.sample_step_s, std::nullopt};

  res.satellites.resize(sats.size());
  parallel_items(sats.size(), [&](size_t s) {
    const SecularOrbit orbit = make_secular_orbit(design.earth, sats[s].elements);
    SatelliteContacts& out = res.satellites[s];
    out.id = sats[s].id;
    std::vector<ContactInterval> all;
    for (std::vector<ContactInterval>& intervals : find_view_intervals(design.earth, orbit, theta0, stations, span)) {
      PairContacts pair;
      pair.intervals = std::move(intervals);
      summarise(pair, res.span_s);
      all.insert(all.end(), pair.intervals.begin(), pair.intervals.end());
      out.stations.push_back(std::move(pair));
    }
    out.longest_gap_min = longest_gap_s(std::move(all), res.span_s) / 60.0;
  });

  for (size_t k = 0; k < stations.size(); ++k) {
    std::vector<const std::vector<ContactInterval>*> lists;
    for (const SatelliteContacts& s : res.satellites) lists.push_back(&s.stations[k].intervals);
    res.stations.push_back(station_load(design.ground_stations[k].name, lists, res.span_s));
  }
  return res;
}

}  // namespace skein
