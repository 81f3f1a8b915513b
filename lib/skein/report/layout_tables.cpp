#include "skein/report/layout_tables.hpp"

#include <fmt/format.h>

#include "skein/constants.hpp"
#include "skein/design/plane_nodes.hpp"

namespace skein {
namespace {
Cell opt(const std::optional<double>& v) { return v ? Cell(*v) : Cell(); }
}  // namespace

Table satellite_table(const Design& design, const std::vector<Satellite>& sats) {
  Table t;
  t.title = "Satellites at epoch (mean elements)";
  t.columns = {{"id", "satellite", "", 0},       {"shell", "shell", "", 0},
               {"plane", "plane", "", 0},        {"slot", "slot", "", 0},
               {"a_km", "a", "km", 3},           {"e", "e", "", 6},
               {"inclination_deg", "i", "deg", 4}, {"raan_deg", "node", "deg", 4},
               {"arg_perigee_deg", "arg perigee", "deg", 4}, {"arg_latitude_deg", "arg latitude", "deg", 4}};
  for (const auto& s : sats)
    t.add_row({s.id, design.shells[s.shell].name, static_cast<long>(s.plane + 1), static_cast<long>(s.slot + 1),
               s.elements.a_km, s.elements.e, s.elements.i_rad * deg_per_rad, s.elements.raan_rad * deg_per_rad,
               s.elements.argp_rad * deg_per_rad, s.arg_latitude_rad * deg_per_rad});
  return t;
}

Table shell_table(const Design& design) {
  Table t;
  t.title = "Shells";
  t.columns = {{"name", "shell", "", 0},          {"pattern", "pattern", "", 0},
               {"satellites", "T", "", 0},        {"planes", "P", "", 0},
               {"phasing", "F", "", 0},           {"altitude_km", "altitude", "km", 1},
               {"eccentricity", "e", "", 4},      {"inclination_deg", "i", "deg", 3},
               {"ltan", "LTAN", "h", 2}};
  for (const auto& s : design.shells)
    t.add_row({s.name, std::string(to_string(s.pattern)), static_cast<long>(s.satellites), static_cast<long>(s.planes),
               s.pattern == PatternKind::explicit_planes ? Cell() : Cell(static_cast<long>(s.phasing)),
               s.a_km - design.earth.radius_km, s.e, s.inclination_deg, opt(s.ltan_h)});
  return t;
}

Table plane_table(const Design& design) {
  Table t;
  t.title = "Planes at epoch (node and local time of the ascending node)";
  t.columns = {{"shell", "shell", "", 0}, {"plane", "plane", "", 0}, {"raan_deg", "node", "deg", 4},
               {"ltan_h", "LTAN", "h", 2}};
  for (const auto& p : plane_nodes(design))
    t.add_row({design.shells[p.shell].name, static_cast<long>(p.plane + 1), p.raan_deg, p.ltan_h});
  return t;
}

Table drift_table(const DriftResult& drift) {
  Table t;
  t.title = "J2 secular drift per shell";
  t.columns = {{"name", "shell", "", 0},
               {"altitude_km", "altitude", "km", 1},
               {"inclination_deg", "i", "deg", 3},
               {"raan_rate_deg_per_day", "node rate", "deg/day", 4},
               {"argp_rate_deg_per_day", "perigee rate", "deg/day", 4},
               {"mean_anomaly_correction_deg_per_day", "dM/dt - n", "deg/day", 4},
               {"kepler_period_s", "Kepler period", "s", 1},
               {"anomalistic_period_s", "anomalistic period", "s", 1},
               {"nodal_period_s", "nodal period", "s", 1},
               {"sun_synchronous_inclination_deg", "SSO i", "deg", 3},
               {"ltan_h", "LTAN", "h", 2},
               {"ltan_drift_min_per_year", "LTAN drift", "min/yr", 2},
               {"raan_rate_per_km_deg_per_day", "dnode/da", "deg/day/km", 5},
               {"raan_rate_per_deg_deg_per_day", "dnode/di", "deg/day/deg", 4},
               {"raan_rate_per_0p001_e_deg_per_day", "dnode/de", "deg/day/0.001", 5},
               {"critical_inclination_deg", "critical i", "deg", 4},
               {"repeat_altitude_km", "repeat altitude", "km", 3}};
  for (const auto& d : drift.shells)
    t.add_row({d.name, d.altitude_km, d.inclination_deg, d.raan_rate_deg_per_day, d.argp_rate_deg_per_day,
               d.mean_anomaly_correction_deg_per_day, d.kepler_period_s, d.anomalistic_period_s, d.nodal_period_s,
               opt(d.sun_synchronous_inclination_deg), opt(d.ltan_h), d.ltan_drift_min_per_year,
               d.raan_rate_per_km_deg_per_day, d.raan_rate_per_deg_deg_per_day, d.raan_rate_per_0p001_e_deg_per_day,
               d.critical_inclination_deg, opt(d.repeat_altitude_km)});
  return t;
}

Table differential_drift_table(const DriftResult& drift) {
  Table t;
  t.title = "Differential node drift between shells";
  t.columns = {{"shell_a", "shell A", "", 0},
               {"shell_b", "shell B", "", 0},
               {"relative_raan_rate_deg_per_day", "relative node rate", "deg/day", 4},
               {"days_per_full_turn", "days per 360 deg", "day", 1}};
  for (const auto& p : drift.pairs)
    t.add_row({p.shell_a, p.shell_b, p.relative_raan_rate_deg_per_day, opt(p.days_per_full_turn)});
  return t;
}

Table beta_eclipse_table(const BetaEclipseResult& result) {
  Table t;
  t.title = fmt::format("Beta angle and eclipses per plane, days 0 to {:g} from the epoch ({}, cylindrical shadow)",
                        result.span_days,
                        result.step_days == 1.0 ? std::string("daily samples")
                                                : fmt::format("samples every {:g} days", result.step_days));
  t.columns = {{"shell", "shell", "", 0},
               {"plane", "plane", "", 0},
               {"raan_deg", "node at epoch", "deg", 2},
               {"beta_min_deg", "beta min", "deg", 2},
               {"beta_max_deg", "beta max", "deg", 2},
               {"longest_eclipse_min", "longest eclipse", "min", 2},
               {"longest_eclipse_day", "on day", "", 0},
               {"max_eclipse_percent", "most shadow", "% of orbit", 2},
               {"eclipse_free_days", "eclipse-free", "days", 0},
               {"eclipse_method", "eclipse method", "", 0}};
  for (const auto& sh : result.shells)
    for (const auto& p : sh.planes)
      t.add_row({sh.name, static_cast<long>(p.plane + 1), p.raan0_deg, p.beta_min_deg, p.beta_max_deg,
                 p.longest_eclipse_min, p.longest_eclipse_day, 100.0 * p.max_eclipse_fraction, p.eclipse_free_days,
                 std::string(sh.circular ? "circular closed form" : "sampled ellipse")});
  return t;
}

}  // namespace skein
