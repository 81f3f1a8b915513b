#include "skein/export/oem.hpp"

#include <algorithm>
#include <cmath>
#include <string_view>
#include <sstream>

#include <fmt/format.h>

#include "skein/error.hpp"

namespace skein {

namespace {
// A KVN value or comment must stay on its line (CCSDS 502.0-B-2, KVN: one keyword = value per line): a line
// break or any other control character (C0, DEL, C1) in it cannot be kept, so it is refused, never written.
const std::string& one_line(const std::string& value, std::string_view keyword) {
  for (size_t i = 0; i < value.size(); ++i) {
    const auto c = static_cast<unsigned char>(value[i]);
    const bool c1 = c == 0xC2 && i + 1 < value.size() && static_cast<unsigned char>(value[i + 1]) >= 0x80 &&
                    static_cast<unsigned char>(value[i + 1]) <= 0x9F;
    if (c < 0x20 || c == 0x7F || c1)
      throw InputError(fmt::format("the OEM {} value \"{}...\" holds a control character (byte {} is 0x{:02X}) and "
                                   "cannot be kept on one KVN line; expected printable text",
                                   keyword, value.substr(0, std::min<size_t>(i, 20)), i, c));
  }
  return value;
}
}  // namespace

std::string render_oem(const OemMessage& m) {
  std::string out = "CCSDS_OEM_VERS = 2.0\n";
  for (const auto& c : m.comments) out += "COMMENT " + one_line(c, "COMMENT") + "\n";
  out += "CREATION_DATE = " + one_line(m.creation_date, "CREATION_DATE") + "\n";
  out += "ORIGINATOR = " + one_line(m.originator, "ORIGINATOR") + "\n";
  for (const auto& seg : m.segments) {
    out += "\nMETA_START\n";
    for (const auto& c : seg.comments) out += "COMMENT " + one_line(c, "COMMENT") + "\n";
    out += "OBJECT_NAME = " + one_line(seg.object_name, "OBJECT_NAME") + "\n";
    out += "OBJECT_ID = " + one_line(seg.object_id, "OBJECT_ID") + "\n";
    out += "CENTER_NAME = " + one_line(seg.center_name, "CENTER_NAME") + "\n";
    out += "REF_FRAME = " + one_line(seg.ref_frame, "REF_FRAME") + "\n";
    out += "TIME_SYSTEM = " + one_line(seg.time_system, "TIME_SYSTEM") + "\n";
    out += "START_TIME = " + format_utc_iso8601(seg.samples.front().epoch, 3).substr(0, 23) + "\n";
    out += "STOP_TIME = " + format_utc_iso8601(seg.samples.back().epoch, 3).substr(0, 23) + "\n";
    out += "META_STOP\n\n";
    for (const auto& s : seg.samples)
      out += fmt::format("{} {:.6f} {:.6f} {:.6f} {:.9f} {:.9f} {:.9f}\n", format_utc_iso8601(s.epoch, 3).substr(0, 23),
                         s.state.r_km.x(), s.state.r_km.y(), s.state.r_km.z(), s.state.v_km_s.x(), s.state.v_km_s.y(),
                         s.state.v_km_s.z());
  }
  return out;
}

namespace {
std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t\r");
  if (b == std::string::npos) return "";
  return s.substr(b, s.find_last_not_of(" \t\r") - b + 1);
}
}  // namespace

OemMessage parse_oem(const std::string& text, const std::string& name) {
  OemMessage m;
  std::istringstream in(text);
  std::string line;
  int no = 0;
  OemSegment* seg = nullptr;
  bool in_meta = false, have_version = false;
  auto fail = [&](const std::string& what) { throw InputError(fmt::format("{}:{}: {}", name, no, what)); };
  while (std::getline(in, line)) {
    ++no;
    line = trim(line);
    if (line.empty()) continue;
    if (line.starts_with("COMMENT")) {
      const std::string c = trim(line.substr(7));
      if (seg && in_meta) seg->comments.push_back(c);
      else if (!seg) m.comments.push_back(c);
      continue;
    }
    if (line == "META_START") {
      m.segments.emplace_back();
      seg = &m.segments.back();
      in_meta = true;
      continue;
    }
    if (line == "META_STOP") {
      if (!in_meta) fail("META_STOP without META_START");
      in_meta = false;
      continue;
    }
    const auto eq = line.find('=');
    if (eq != std::string::npos && (in_meta || !seg)) {
      const std::string key = trim(line.substr(0, eq)), value = trim(line.substr(eq + 1));
      if (!seg) {
        if (key == "CCSDS_OEM_VERS") { have_version = true; if (value != "2.0" && value != "1.0") fail("unsupported OEM version " + value); }
        else if (key == "CREATION_DATE") m.creation_date = value;
        else if (key == "ORIGINATOR") m.originator = value;
        else fail("unknown header keyword " + key);
      } else {
        if (key == "OBJECT_NAME") seg->object_name = value;
        else if (key == "OBJECT_ID") seg->object_id = value;
        else if (key == "CENTER_NAME") seg->center_name = value;
        else if (key == "REF_FRAME") seg->ref_frame = value;
        else if (key == "TIME_SYSTEM") seg->time_system = value;
        else if (key == "START_TIME" || key == "STOP_TIME" || key == "USEABLE_START_TIME" || key == "USEABLE_STOP_TIME" ||
                 key == "INTERPOLATION" || key == "INTERPOLATION_DEGREE" || key == "REF_FRAME_EPOCH") {}
        else fail("unknown metadata keyword " + key);
      }
      continue;
    }
    if (!seg || in_meta) fail("expected a keyword line, got \"" + line + "\"");
    std::istringstream fields(line);
    std::string epoch_text;
    OemSample s;
    fields >> epoch_text >> s.state.r_km.x() >> s.state.r_km.y() >> s.state.r_km.z() >> s.state.v_km_s.x() >>
        s.state.v_km_s.y() >> s.state.v_km_s.z();
    if (!fields) fail("expected an epoch and six numbers");
    const auto e = parse_utc_iso8601(epoch_text + (epoch_text.ends_with("Z") ? "" : "Z"));
    if (!e) fail("bad epoch " + epoch_text);
    s.epoch = *e;
    seg->samples.push_back(s);
  }
  if (!have_version) throw InputError(name + ": not an OEM (no CCSDS_OEM_VERS line)");
  return m;
}

OemSegment sample_oem_segment(const EarthModel& earth, const SecularOrbit& orbit, const UtcEpoch& epoch, double span_s,
                              double step_s, std::string object_name, std::string object_id) {
  OemSegment seg;
  seg.object_name = std::move(object_name);
  seg.object_id = std::move(object_id);
  seg.comments = {"Mean-element J2 secular model (skein); frame: true equator and equinox of the epoch, precession",
                  "and nutation over the span neglected. Preliminary design ephemeris, not for operations."};
  const long n = static_cast<long>(std::floor(span_s / step_s + 1e-9));
  for (long k = 0; k <= n; ++k) {
    const double t = static_cast<double>(k) * step_s;
    seg.samples.push_back({add_seconds(epoch, t), state_at(earth, orbit, t)});
  }
  return seg;
}

}  // namespace skein
