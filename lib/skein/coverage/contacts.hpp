#pragma once
// Ground contacts: when each satellite is above each ground station's elevation mask over the design's span,
// and the figures operators plan with (contacts and contact minutes per day, mean and longest contact, the
// longest time a satellite goes without any contact, how busy each station is and how many antennas it needs).
//
// Model: J2 secular mean elements (earth_fixed_state_at), the station on the ellipsoid with its geodetic vertical
// (ground_geometry.hpp). A pair is in contact while m(t) = sin(elevation) - sin(mask) >= 0.
//
// Search: m is sampled every sample_step_s = min(step_s, 60 s) from the epoch to the end of the span (the last
// sample at the span's end). Each interval between two samples is examined by `scan`: when m has the same sign at
// both ends, the interval is dropped if no crossing is possible with the rate bound
//   |dm/dt| <= |v| / |d|,   d = r_sat - r_station, v the satellite's Earth-fixed velocity
// (the derivative of d.up/|d| is the component of v across the line of sight over |d|), i.e. when
// |m(a)| + |m(b)| > L (b - a) with L = v_max / d_low; otherwise it is halved and both halves examined. A sign change
// is followed down to a bracket of 1 ms and the event placed at the bracket's middle (time within 0.5 ms). So
// every pass or gap longer than 1 ms is found, whatever the step: a pass shorter than the step (a low, grazing
// pass) cannot hide between two samples, since the bound makes both samples close to zero there and the interval
// is split until the pass is caught. v_max bounds the secular-model velocity from the elements (see contacts.cpp);
// d_low = max(perigee radius - station radius, (|d(a)| + |d(b)| - v_max (b - a)) / 2).
// Contacts cut by the span's start or end count, with the part inside the span.
#include <string>
#include <vector>

#include "skein/design/design.hpp"

namespace skein {

struct ContactOptions {
  double span_s = 86400.0;  // from the design epoch
  double step_s = 60.0;     // sampling step (the search refines below it; see above)
};
// The design's coverage span and step.
ContactOptions contact_options_for(const Design& design);

struct ContactInterval {
  double rise_s = 0.0;  // from the epoch; 0 when in contact at the start
  double set_s = 0.0;   // the span's end when in contact at the end
};

// One satellite over one station.
struct PairContacts {
  std::vector<ContactInterval> intervals;  // in time order, disjoint
  double contacts_per_day = 0.0;
  double minutes_per_day = 0.0;
  double mean_contact_min = 0.0;           // 0 when there is no contact
  double longest_contact_min = 0.0;
};

struct SatelliteContacts {
  std::string id;
  std::vector<PairContacts> stations;      // one per design station, in design order
  double longest_gap_min = 0.0;            // longest time with no station in contact, span edges included
};

struct StationLoad {
  std::string name;
  double busy_share = 0.0;                 // share of the span with at least one satellite in contact
  int max_in_view = 0;                     // most satellites in contact at once: the antennas needed
  std::vector<double> share_by_count;      // share of the span with exactly n satellites in contact, n = 0..max
};

struct ContactResult {
  double span_s = 0.0;
  double sample_step_s = 0.0;              // min(step_s, 60 s)
  std::vector<SatelliteContacts> satellites;  // in expansion order (shell, plane, slot)
  std::vector<StationLoad> stations;          // in design order
};

// Throws InputError when the design has no ground stations, or the work would exceed the guard.
ContactResult compute_contacts(const Design& design, const ContactOptions& options);
inline ContactResult compute_contacts(const Design& design) {
  return compute_contacts(design, contact_options_for(design));
}

// The guard: samples of the search (satellites x stations x samples) above which the work is refused.
constexpr double max_contact_samples = 2e9;
// Throws InputError when the design has no ground stations or the work would exceed the guard; run by
// compute_contacts first, and by the report before any of its work.
void check_contact_work(const Design& design, const ContactOptions& options);

}  // namespace skein
