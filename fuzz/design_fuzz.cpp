// libFuzzer target: the design-file reader and validator, then the satellite expansion and the J2 drift
// figures of every design it accepts. The one accepted failure is skein::InputError whose message starts with
// the file name (the "FILE:LINE:COL: PATH: message" policy of lib/skein/error.hpp). Any other exception, a
// crash, a sanitizer report, or a non-finite number in the expanded elements or drift figures aborts, so that
// libFuzzer keeps the input.
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <optional>
#include <string>

#include "skein/design/constellation.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/drift/drift_summary.hpp"

namespace {

const std::string file_name = "fuzz.yaml";

[[noreturn]] void fail(const std::string& what) {
  std::fprintf(stderr, "design_fuzz: %s\n", what.c_str());
  std::abort();
}

void finite(double v, const char* what) {
  if (!std::isfinite(v)) fail(std::string("non-finite ") + what);
}

void finite(const std::optional<double>& v, const char* what) {
  if (v) finite(*v, what);
}

void check_expansion(const skein::Design& design) {
  for (const skein::Satellite& sat : skein::expand_constellation(design)) {
    const skein::MeanElements& el = sat.elements;
    finite(el.a_km, "a_km");
    finite(el.e, "e");
    finite(el.i_rad, "i_rad");
    finite(el.raan_rad, "raan_rad");
    finite(el.argp_rad, "argp_rad");
    finite(el.mean_anomaly_rad, "mean_anomaly_rad");
    finite(sat.arg_latitude_rad, "arg_latitude_rad");
    // Invariants the validator promises (design.hpp, elements.hpp).
    if (!(el.a_km > 0.0) || !(el.e >= 0.0 && el.e < 1.0)) fail("an accepted design has a <= 0 or e outside [0, 1)");
  }
}

void check_drift(const skein::Design& design) {
  const skein::DriftResult drift = skein::compute_drift(design);
  for (const skein::ShellDrift& s : drift.shells) {
    finite(s.altitude_km, "altitude_km");
    finite(s.a_km, "a_km");
    finite(s.e, "e");
    finite(s.inclination_deg, "inclination_deg");
    finite(s.raan_rate_deg_per_day, "raan_rate_deg_per_day");
    finite(s.argp_rate_deg_per_day, "argp_rate_deg_per_day");
    finite(s.mean_anomaly_correction_deg_per_day, "mean_anomaly_correction_deg_per_day");
    finite(s.kepler_period_s, "kepler_period_s");
    finite(s.anomalistic_period_s, "anomalistic_period_s");
    finite(s.nodal_period_s, "nodal_period_s");
    finite(s.sun_synchronous_inclination_deg, "sun_synchronous_inclination_deg");
    finite(s.ltan_h, "ltan_h");
    finite(s.ltan_drift_min_per_year, "ltan_drift_min_per_year");
    finite(s.raan_rate_per_km_deg_per_day, "raan_rate_per_km_deg_per_day");
    finite(s.raan_rate_per_deg_deg_per_day, "raan_rate_per_deg_deg_per_day");
    finite(s.raan_rate_per_0p001_e_deg_per_day, "raan_rate_per_0p001_e_deg_per_day");
    finite(s.critical_inclination_deg, "critical_inclination_deg");
    finite(s.repeat_altitude_km, "repeat_altitude_km");
  }
  for (const skein::DifferentialDrift& p : drift.pairs) {
    finite(p.relative_raan_rate_deg_per_day, "relative_raan_rate_deg_per_day");
    finite(p.days_per_full_turn, "days_per_full_turn");
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const skein::Design design = skein::read_design_text(text, file_name);
    check_expansion(design);
    check_drift(design);
  } catch (const skein::InputError& e) {
    const std::string message = e.what();
    if (message.rfind(file_name, 0) != 0) fail("an InputError message does not start with the file name: " + message);
  } catch (const std::exception& e) {
    fail(std::string("unexpected exception: ") + e.what());
  } catch (...) {
    fail("unexpected exception of unknown type");
  }
  return 0;
}
