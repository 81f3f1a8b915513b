#pragma once
// The `budget` block of a design: mission life, atmosphere, solar activity and the allowances of every
// station-keeping line. Every field has a stated default, used when the block or the key is absent.
#include <optional>
#include <string_view>
#include <vector>

#include "skein/atmosphere/atmosphere.hpp"
#include "skein/atmosphere/solar_activity.hpp"

namespace skein {

// End-of-life disposal.
enum class DisposalMode {
  natural_decay,  // lower the perigee just enough to re-enter naturally within rule_years
  direct,         // lower the perigee to perigee_km for a prompt re-entry
  none            // no disposal manoeuvre budgeted
};
std::string_view to_string(DisposalMode mode);
std::optional<DisposalMode> disposal_mode_from_string(std::string_view text);

// Control of the differential node drift that injection dispersions cause.
enum class NodeControl {
  correct,  // remove the altitude and inclination dispersion after injection (budgeted at sigma_multiple)
  none      // accept the drift (reported, not budgeted)
};
std::string_view to_string(NodeControl control);
std::optional<NodeControl> node_control_from_string(std::string_view text);

// How the spacecraft get from the injection orbit to their shell (budget.injection.propulsion).
enum class RaisingPropulsion {
  chemical,  // two impulses (Hohmann from a circular injection orbit), plane change combined with one of them
  electric   // Edelbaum's low-thrust circle-to-circle transfer with plane change, at constant thrust
};
std::string_view to_string(RaisingPropulsion propulsion);

// The orbit the launcher leaves every satellite in (one for the whole design, as on a shared launch), and the
// propulsion that takes each satellite from there to its shell.
struct InjectionSpec {
  double perigee_km = 0.0;                 // altitude_km, or perigee_altitude_km
  double apogee_km = 0.0;                  // altitude_km, or apogee_altitude_km
  std::optional<double> inclination_deg;   // inclination_deg; default: each shell's own (no plane change)
  RaisingPropulsion propulsion = RaisingPropulsion::chemical;  // propulsion
  std::optional<double> thrust_n;          // thrust_n (electric only, required there)
  std::optional<double> isp_s;             // isp_s of the raising engine; default spacecraft.isp_s
};

// Plane deployment by differential J2 drift (budget.deployment; needs budget.injection for its propulsion).
struct DeploymentSpec {
  double deadline_days = 0.0;                 // deadline_days: the plan chosen is the least delta-v one within it
  std::vector<double> plane_offsets_km = {25, 50, 75, 100, 150, 200};  // plane_offsets_km: drift offsets traded
  std::vector<double> phasing_offsets_km = {1, 2, 5, 10, 20};          // phasing_offsets_km: in-plane spreading
};

// The input spreads a Monte Carlo budget draws from (budget.spread), with the basis of each default. Each relative
// spread r draws a factor 1 + r z with z standard normal truncated at +-3 (so r <= 0.3 keeps the factor >= 0.1).
struct BudgetSpread {
  // solar_minimum_years: the date of the cycle minimum (so the phase at the epoch) is drawn uniformly within +- this
  // many years of the stated one. Default 1 year: common practice; cycle lengths run from about 9 to 14 years
  // (D.H. Hathaway, "The Solar Cycle", Living Rev. Solar Phys. 12, 4 (2015), recalled from memory).
  double solar_minimum_years = 1.0;
  // solar_amplitude: relative 1-sigma of the activity swing above the low level (SolarActivity::amplitude).
  // Default 0.25: common practice; cycle maxima of the last century differ by about a factor of two (Hathaway 2015,
  // from memory).
  double solar_amplitude = 0.25;
  // drag_coefficient and drag_area: relative 1-sigma of Cd and of the mean projected area. Default 0.1 each:
  // common practice (a Cd of 2.2 for a compact body is a convention, not a measurement; the area varies with attitude).
  double drag_coefficient = 0.10;
  double drag_area = 0.10;
};

// Monte Carlo budget settings of the design file (budget.samples, budget.seed); the CLI's --samples/--seed override.
inline constexpr long monte_carlo_min_samples = 100;       // fewer leave under 5 samples beyond P95
inline constexpr long monte_carlo_max_samples = 1000000;   // about 10 minutes on 2 cores at ~1 ms a sample
inline constexpr double monte_carlo_max_seed = 9007199254740992.0;  // 2^53: every seed exact in YAML and JSON

struct BudgetSpec {
  bool present = false;                          // the design has a budget block
  double mission_life_years = 5.0;               // mission_life_years
  AtmosphereKind atmosphere = AtmosphereKind::harris_priester;  // atmosphere
  std::optional<double> harris_priester_exponent;               // harris_priester_exponent (2..6); default by inclination
  SolarLevel solar = SolarLevel::mean;           // solar_activity
  std::optional<double> solar_cycle_phase;       // solar_cycle_phase at the epoch, 0 = minimum; default from the epoch
  std::optional<double> solar_minimum_jd;        // solar_minimum_date: a cycle minimum (UTC), instead of the phase
  double reentry_altitude_km = 120.0;            // reentry_altitude_km
  double deadband_km = 1.0;                      // deadband_km: drag make-up lets the altitude fall this far
  // injection (1-sigma) and node_control
  double injection_sigma_altitude_km = 3.0;      // injection_sigma.altitude_km
  double injection_sigma_inclination_deg = 0.03; // injection_sigma.inclination_deg
  double sigma_multiple = 3.0;                   // injection_sigma.multiple: budget at k sigma
  NodeControl node_control = NodeControl::correct;
  bool sso_inclination_control = true;           // sso_inclination_control
  // slot_keeping
  double slot_shift_deg = 1.0;                   // slot_keeping.shift_deg
  double slot_shift_days = 10.0;                 // slot_keeping.shift_days
  double slot_shifts_per_year = 4.0;             // slot_keeping.shifts_per_year
  // collision_avoidance
  double avoidance_per_year = 2.0;               // collision_avoidance.manoeuvres_per_year
  double avoidance_dv_m_s = 0.5;                 // collision_avoidance.dv_per_manoeuvre_m_s
  // disposal
  DisposalMode disposal = DisposalMode::natural_decay;  // disposal.mode
  double disposal_perigee_km = 50.0;             // disposal.perigee_km (direct)
  double disposal_rule_years = 5.0;              // disposal.rule_years (natural-decay)
  double margin_percent = 10.0;                  // margin_percent
  std::optional<InjectionSpec> injection;        // injection: none means no raising line
  std::optional<DeploymentSpec> deployment;      // deployment: none means no deployment line
  BudgetSpread spread;                           // spread: the Monte Carlo input spreads
  std::optional<long> samples;                   // samples: run the Monte Carlo budget with this many samples
  std::optional<unsigned long long> seed;        // seed (default 1)
};


}  // namespace skein
