#pragma once
// CCSDS Orbit Ephemeris Message, KVN form.
// Source: CCSDS 502.0-B-2, "Orbit Data Messages", Blue Book issue 2 (Nov 2009): sec. 5 (OEM), header
// keywords CCSDS_OEM_VERS, CREATION_DATE, ORIGINATOR; metadata OBJECT_NAME, OBJECT_ID, CENTER_NAME,
// REF_FRAME, TIME_SYSTEM, START_TIME, STOP_TIME; data lines "epoch x y z x_dot y_dot z_dot" in km and km/s.
#include <string>
#include <vector>

#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

struct OemSample {
  UtcEpoch epoch;
  StateVector state;
};

struct OemSegment {
  std::string object_name;
  std::string object_id;
  std::string center_name = "EARTH";
  std::string ref_frame = "TOD";
  std::string time_system = "UTC";
  std::vector<std::string> comments;  // metadata comments
  std::vector<OemSample> samples;     // at least one, in time order
};

struct OemMessage {
  std::string creation_date;  // ISO 8601 UTC, as the standard requires
  std::string originator;
  std::vector<std::string> comments;  // header comments
  std::vector<OemSegment> segments;
};

// KVN text of the message (OEM version 2.0).
// Throws InputError when a value or comment holds a line break or other control character (kept on one line
// or refused, never written across lines).
std::string render_oem(const OemMessage& message);

// Parse KVN text written by render_oem (and ordinary OEM 2.0 KVN files without covariance). Throws
// InputError naming the line for anything it does not understand.
OemMessage parse_oem(const std::string& text, const std::string& name);

// Sample a satellite's secular orbit from the epoch over span_s at step_s into a segment.
OemSegment sample_oem_segment(const EarthModel& earth, const SecularOrbit& orbit, const UtcEpoch& epoch, double span_s,
                              double step_s, std::string object_name, std::string object_id);

}  // namespace skein
