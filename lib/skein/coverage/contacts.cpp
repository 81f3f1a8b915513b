#include "skein/coverage/contacts.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>
#include <tbb/parallel_for.h>

#include "skein/angles.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

namespace skein {
namespace {

constexpr double event_resolution_s = 1e-3;  // brackets of rises and sets are closed to 1 ms
constexpr double max_sample_step_s = 60.0;

struct StationPoint {
  Eigen::Vector3d r_km;
  Eigen::Vector3d up;
  double sin_mask = 0.0;
  double radius_km = 0.0;
};

// The margin m = sin(elevation) - sin(mask) and the range |d| at one instant.
struct Sample {
  double margin = 0.0;
  double range_km = 0.0;
};

Sample sample_at(const StationPoint& st, const Eigen::Vector3d& r_sat) {
  const Eigen::Vector3d d = r_sat - st.r_km;
  const double range = d.norm();
  return {d.dot(st.up) / range - st.sin_mask, range};
}

// Upper bound of the Earth-fixed speed (km/s) of the J2 secular-model motion of one satellite. The model's
// velocity (propagate.hpp) is v_kep (dM/dt)/n + (domega/dt) h x r + (dOmega/dt) z x r in inertial axes, turned
// into the Earth-fixed frame and less w_E z x r; so |v| <= v_p |dM/dt| / n + (|domega/dt| + |dOmega/dt| + w_E) r_a,
// with the Kepler speed at most its perigee value v_p = sqrt(mu (1 + e) / (a (1 - e))) (vis-viva, Vallado 2013
// eq. 2-8) and r at most the apogee radius r_a = a (1 + e). A 1 % margin covers rounding.
double speed_bound_km_s(const EarthModel& earth, const SecularOrbit& orbit) {
  const MeanElements& el = orbit.epoch_elements;
  const double vp = std::sqrt(earth.mu_km3_s2 * (1.0 + el.e) / (el.a_km * (1.0 - el.e)));
  const double ra = el.a_km * (1.0 + el.e);
  const SecularRates& r = orbit.rates;
  const double v = vp * std::abs(r.mean_anomaly_rad_s) / r.mean_motion_rad_s +
                   (std::abs(r.argp_rad_s) + std::abs(r.raan_rad_s) + earth.rotation_rad_s) * ra;
  return 1.01 * v;
}

// One satellite's search over all stations.
class PairSearch {
 public:
  PairSearch(const EarthModel& earth, const SecularOrbit& orbit, double theta0, const StationPoint& station,
             double v_max, double floor_km)
      : earth_(earth), orbit_(orbit), theta0_(theta0), st_(station), v_max_(v_max), floor_km_(floor_km) {}

  Sample at(double t) const {
    const EarthFixedState ef = earth_fixed_state_at(earth_, orbit_, theta0_ + earth_.rotation_rad_s * t, t);
    return sample_at(st_, ef.r_km);
  }

  // Appends to `events` the rises and sets strictly inside (a, b), in time order.
  void scan(double a, const Sample& sa, double b, const Sample& sb, std::vector<double>& events) const {
    const bool in_a = sa.margin >= 0.0, in_b = sb.margin >= 0.0;
    const double w = b - a;
    if (in_a == in_b) {
      const double d_low = std::max(floor_km_, 0.5 * (sa.range_km + sb.range_km - v_max_ * w));
      const double rate = v_max_ / d_low;
      if (std::abs(sa.margin) + std::abs(sb.margin) > rate * w) return;  // no crossing can fit
      if (w <= event_resolution_s) return;  // a pass or gap under 1 ms is not counted
    } else if (w <= event_resolution_s) {
      events.push_back(0.5 * (a + b));
      return;
    }
    const double m = 0.5 * (a + b);
    const Sample sm = at(m);
    scan(a, sa, m, sm, events);
    scan(m, sm, b, sb, events);
  }

 private:
  const EarthModel& earth_;
  const SecularOrbit& orbit_;
  double theta0_;
  const StationPoint& st_;
  double v_max_;
  double floor_km_;
};

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
  const long steps = sample_count(options) - 1;
  const auto sats = expand_constellation(design);

  std::vector<StationPoint> stations;
  for (const GroundStation& g : design.ground_stations) {
    StationPoint p;
    const double lat = g.lat_deg * rad_per_deg, lon = g.lon_deg * rad_per_deg;
    p.r_km = geodetic_to_earth_fixed(design.earth, lat, lon, g.height_km);
    p.up = geodetic_up(lat, lon);
    p.sin_mask = std::sin(g.min_elevation_deg * rad_per_deg);
    p.radius_km = p.r_km.norm();
    stations.push_back(p);
  }
  const double theta0 = greenwich_mean_sidereal_angle_rad(julian_date(design.epoch));
  std::vector<double> times(static_cast<size_t>(steps) + 1);
  for (long j = 0; j <= steps; ++j) times[static_cast<size_t>(j)] = std::min(res.span_s, static_cast<double>(j) * res.sample_step_s);

  res.satellites.resize(sats.size());
  tbb::parallel_for(size_t{0}, sats.size(), [&](size_t s) {
    const SecularOrbit orbit = make_secular_orbit(design.earth, sats[s].elements);
    const double v_max = speed_bound_km_s(design.earth, orbit);
    const double perigee_km = orbit.epoch_elements.a_km * (1.0 - orbit.epoch_elements.e);
    std::vector<Eigen::Vector3d> r(times.size());
    for (size_t j = 0; j < times.size(); ++j)
      r[j] = earth_fixed_state_at(design.earth, orbit, theta0 + design.earth.rotation_rad_s * times[j], times[j]).r_km;
    SatelliteContacts& out = res.satellites[s];
    out.id = sats[s].id;
    std::vector<ContactInterval> all;
    for (const StationPoint& st : stations) {
      // The range never falls below the perigee radius less the station's radius; floored at 1 km for a satellite
      // whose perigee passes below a high station (then the bound is loose, never wrong where it holds).
      const double floor_km = std::max(1.0, perigee_km - st.radius_km);
      const PairSearch search(design.earth, orbit, theta0, st, v_max, floor_km);
      std::vector<double> events;
      Sample prev = sample_at(st, r[0]);
      const bool in_at_start = prev.margin >= 0.0;
      for (size_t j = 1; j < times.size(); ++j) {
        const Sample cur = sample_at(st, r[j]);
        search.scan(times[j - 1], prev, times[j], cur, events);
        prev = cur;
      }
      PairContacts pair;
      bool in = in_at_start;
      double rise = 0.0;
      for (double e : events) {
        if (in) pair.intervals.push_back({rise, e});
        else rise = e;
        in = !in;
      }
      if (in) pair.intervals.push_back({rise, res.span_s});
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
