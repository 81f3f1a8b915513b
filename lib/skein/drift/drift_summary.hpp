#pragma once
// Per-shell J2 drift figures, the content of `skein drift`.
#include <optional>
#include <string>
#include <vector>

#include "skein/design/design.hpp"

namespace skein {

struct ShellDrift {
  std::string name;
  double altitude_km = 0.0;           // a - Re
  double a_km = 0.0;
  double e = 0.0;
  double inclination_deg = 0.0;
  double raan_rate_deg_per_day = 0.0;
  double argp_rate_deg_per_day = 0.0;
  double mean_anomaly_correction_deg_per_day = 0.0;  // dM/dt - n
  double kepler_period_s = 0.0;
  double anomalistic_period_s = 0.0;
  double nodal_period_s = 0.0;
  std::optional<double> sun_synchronous_inclination_deg;  // at this a and e; none above ~12350 km
  std::optional<double> ltan_h;                           // first plane's local time of node at epoch (SSO shells)
  double ltan_drift_min_per_year = 0.0;                   // node motion relative to the mean Sun
  double raan_rate_per_km_deg_per_day = 0.0;              // sensitivity to a
  double raan_rate_per_deg_deg_per_day = 0.0;             // sensitivity to i
  double raan_rate_per_0p001_e_deg_per_day = 0.0;         // sensitivity to e, per 0.001 of eccentricity
  double critical_inclination_deg = 0.0;                  // 63.4349 (prograde)
  std::optional<double> repeat_altitude_km;               // for the requested repeat ratio, when asked
};

struct DifferentialDrift {
  std::string shell_a, shell_b;
  double relative_raan_rate_deg_per_day = 0.0;  // dOmega_a/dt - dOmega_b/dt
  std::optional<double> days_per_full_turn;      // 360 deg / |relative rate|; none when the rates are equal
};

struct DriftOptions {
  std::optional<std::pair<int, int>> repeat;  // revolutions, days: also solve the repeat-track altitude
};

struct DriftResult {
  std::vector<ShellDrift> shells;
  std::vector<DifferentialDrift> pairs;  // every pair of shells, in design order
};

DriftResult compute_drift(const Design& design, const DriftOptions& options = {});

}  // namespace skein
