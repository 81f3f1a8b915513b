#include "skein/drift/drift_summary.hpp"

#include <cmath>

#include "skein/orbit/repeat_track.hpp"
#include "skein/orbit/secular.hpp"
#include "skein/orbit/sun_synchronous.hpp"

namespace skein {

DriftResult compute_drift(const Design& design, const DriftOptions& options) {
  const EarthModel& earth = design.earth;
  const double per_day = deg_per_rad * seconds_per_day;
  DriftResult out;
  for (const Shell& sh : design.shells) {
    const double i = sh.inclination_deg * rad_per_deg;
    const SecularRates r = secular_rates(earth, sh.a_km, sh.e, i);
    const NodeRateSensitivity s = node_rate_sensitivity(earth, sh.a_km, sh.e, i);
    ShellDrift d;
    d.name = sh.name;
    d.altitude_km = sh.a_km - earth.radius_km;
    d.a_km = sh.a_km;
    d.e = sh.e;
    d.inclination_deg = sh.inclination_deg;
    d.raan_rate_deg_per_day = r.raan_rad_s * per_day;
    d.argp_rate_deg_per_day = r.argp_rad_s * per_day;
    d.mean_anomaly_correction_deg_per_day = (r.mean_anomaly_rad_s - r.mean_motion_rad_s) * per_day;
    d.kepler_period_s = kepler_period_s(earth, sh.a_km);
    d.anomalistic_period_s = anomalistic_period_s(earth, sh.a_km, sh.e, i);
    d.nodal_period_s = nodal_period_s(earth, sh.a_km, sh.e, i);
    if (auto sso = sun_synchronous_inclination_rad(earth, sh.a_km, sh.e)) d.sun_synchronous_inclination_deg = *sso * deg_per_rad;
    d.ltan_h = sh.ltan_h;
    d.ltan_drift_min_per_year = ltan_drift_min_per_year(r.raan_rad_s);
    d.raan_rate_per_km_deg_per_day = s.per_km * per_day;
    d.raan_rate_per_deg_deg_per_day = s.per_rad * rad_per_deg * per_day;
    d.raan_rate_per_0p001_e_deg_per_day = s.per_unit_e * 0.001 * per_day;
    d.critical_inclination_deg = critical_inclination_rad() * deg_per_rad;
    if (options.repeat) {
      if (auto a = repeat_track_semi_major_axis_km(earth, options.repeat->first, options.repeat->second, sh.e, i,
                                                   sh.sun_synchronous))
        d.repeat_altitude_km = *a - earth.radius_km;
    }
    out.shells.push_back(d);
  }
  for (size_t a = 0; a < out.shells.size(); ++a)
    for (size_t b = a + 1; b < out.shells.size(); ++b) {
      DifferentialDrift p;
      p.shell_a = out.shells[a].name;
      p.shell_b = out.shells[b].name;
      p.relative_raan_rate_deg_per_day = out.shells[a].raan_rate_deg_per_day - out.shells[b].raan_rate_deg_per_day;
      if (std::abs(p.relative_raan_rate_deg_per_day) > 1e-12) p.days_per_full_turn = 360.0 / std::abs(p.relative_raan_rate_deg_per_day);
      out.pairs.push_back(p);
    }
  return out;
}

}  // namespace skein
