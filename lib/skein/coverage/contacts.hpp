#pragma once
// Ground contacts: when each satellite is above each ground station's elevation mask over the design's span,
// and the figures operators plan with (contacts and contact minutes per day, mean and longest contact, the
// longest time a satellite goes without any contact, how busy each station is and how many antennas it needs).
//
// Model: J2 secular mean elements (earth_fixed_state_at), the station on the ellipsoid with its geodetic vertical
// (ground_geometry.hpp). A pair is in contact while m(t) = sin(elevation) - sin(mask) >= 0.
//
// Search: the rate-bounded search of pass_search.hpp (every pass or gap longer than 1 ms is found, whatever the
// step), sampled every sample_step_s = min(step_s, 60 s).
// Contacts cut by the span's start or end count, with the part inside the span.
#include <string>
#include <vector>

#include "skein/coverage/pass_search.hpp"
#include "skein/design/design.hpp"

namespace skein {

struct ContactOptions {
  double span_s = 86400.0;  // from the design epoch
  double step_s = 60.0;     // sampling step (the search refines below it; see above)
};
// The design's coverage span and step.
ContactOptions contact_options_for(const Design& design);

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
