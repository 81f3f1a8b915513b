#pragma once
// The station-keeping delta-v budget and natural lifetime of every shell of a design: the content of
// `skein budget`, reused by the report and by sweeps.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/atmosphere/atmosphere.hpp"
#include "skein/atmosphere/solar_activity.hpp"
#include "skein/budget/deployment.hpp"
#include "skein/design/design.hpp"
#include "skein/lifetime/decay.hpp"

#include "skein/caution.hpp"

namespace skein {


struct BudgetOptions {
  std::optional<SolarLevel> solar;        // overrides the design's budget.solar_activity (CLI --solar)
  double lifetime_horizon_years = 200.0;  // natural decay is followed at most this long (then a lower bound)
  bool level_curves = true;               // also decay every shell under low, mean and high activity
  double curve_gap_days = 0.0;            // decay-curve row spacing; 0: lifetime / 150
  double curve_drop_km = 5.0;             // and a row at least every this many km of mean altitude
  bool keep_curves = true;                // keep the decay curves (Monte Carlo samples do not)
};

// One Monte Carlo draw's departures from the design (budget/monte_carlo.hpp). The default is the design itself:
// shell_budget_drawn with a default draw gives exactly compute_budget's shell.
struct BudgetDraw {
  double phase_shift_cycles = 0.0;          // added to the solar-cycle phase at the epoch (used under cycle)
  double solar_amplitude = 1.0;             // SolarActivity::amplitude
  double drag_coefficient_factor = 1.0;     // Cd x this
  double drag_area_factor = 1.0;            // area x this
  // The injection errors of this draw (signed); when absent the node line is budgeted at k sigma as stated.
  std::optional<double> injection_altitude_error_km;
  std::optional<double> injection_inclination_error_deg;
  // The shell's Harris-Priester bulge weight when already known (ShellBudget::bulge_weight of the deterministic
  // budget): it does not depend on the draw, and averaging it costs more than a sample's decay runs.
  std::optional<double> bulge_weight;
};

// One budget line, per satellite, over the mission life.
struct DvLine {
  std::string name;    // raising (with budget.injection), deployment (with budget.deployment), drag_makeup, node_drift_control, sso_inclination,
                       // slot_keeping, collision_avoidance, disposal, margin
  double dv_m_s = 0.0;
  std::string basis;   // how it was computed, for tables and the report
};

// The natural decay from the design orbit at epoch under one solar level.
struct LevelDecay {
  SolarLevel level = SolarLevel::mean;
  double lifetime_days = 0.0;
  bool lower_bound = false;  // still in orbit at the horizon: lifetime_days is the horizon
  std::vector<DecayPoint> curve;  // thinned, from epoch to re-entry (or the horizon)
};

// The raise from the design's injection orbit (budget.injection) to the shell, per satellite.
struct RaisingFigures {
  RaisingPropulsion propulsion = RaisingPropulsion::chemical;
  double dv_m_s = 0.0;                  // the raising line (no margin)
  double plane_change_deg = 0.0;        // |injection inclination - shell inclination|
  double isp_s = 0.0;                   // of the raising engine; 0 when none is known (chemical without isp_s)
  std::optional<double> propellant_kg;  // burnt by the raise (its margin share included); none without an isp
  std::optional<double> transfer_days;  // electric: thrusting time (t = (m0 c / F)(1 - exp(-dv/c)))
};

struct ShellBudget {
  std::string name;
  int satellites = 0;
  int planes = 0;
  double altitude_km = 0.0;   // mean a - Re
  double perigee_km = 0.0;
  double apogee_km = 0.0;
  double inclination_deg = 0.0;
  bool sun_synchronous = false;
  double ballistic_coefficient_m2_kg = 0.0;
  std::optional<double> bulge_weight;   // Harris-Priester orbit-averaged cos^n(psi/2)
  // natural lifetime under the selected activity
  double lifetime_natural_days = 0.0;
  bool lifetime_lower_bound = false;
  std::vector<LevelDecay> decay;        // low, mean, high (when level_curves), plus the selected level if cycle
  // (a) drag make-up
  double drag_makeup_dv_m_s_per_year = 0.0;
  long drag_makeup_manoeuvres = 0;      // altitude raises over the life
  double drag_makeup_interval_days = 0.0;  // mean time between raises; 0 when there is none
  // (b) node drift control
  double node_spread_uncontrolled_deg = 0.0;  // k-sigma relative node drift between two planes over the life
  // (c) sun-synchronous inclination drift, worst plane (signed), 0 for other shells
  double sso_inclination_drift_deg_per_year = 0.0;
  std::vector<DvLine> dv_lines;
  double total_dv_m_s = 0.0;            // per satellite, margin included
  double fleet_dv_m_s = 0.0;            // total_dv_m_s x satellites
  std::optional<double> propellant_kg;  // per satellite; none without isp_s (then propellant_missing says so)
  std::optional<double> fleet_propellant_kg;
  std::string propellant_missing;       // why propellant_kg is absent ("no isp_s"); empty when computed
  bool exceeds_tank = false;            // propellant_kg above spacecraft.propellant_capacity_kg
  std::optional<RaisingFigures> raising;  // when the design has budget.injection
  std::optional<DeploymentResult> deployment;  // when the design has budget.deployment (its chosen point is set)
  std::optional<double> deployment_propellant_kg;  // burnt by the deployment (its margin share included)
  // (f) disposal
  double disposal_perigee_km = 0.0;     // perigee altitude after the disposal burn
  std::optional<double> disposal_lifetime_days;  // natural lifetime after disposal (natural-decay mode)
  bool disposal_burn = false;           // false: no burn needed (or none budgeted)
  std::vector<std::string> cannot_fly;  // why this budget cannot be flown (plausibility.hpp); empty: flyable
  std::vector<std::string> warnings;
  bool flyable() const { return cannot_fly.empty(); }
};

struct BudgetResult {
  std::string design;
  double mission_life_years = 0.0;
  AtmosphereKind atmosphere = AtmosphereKind::harris_priester;
  SolarLevel solar = SolarLevel::mean;
  double solar_cycle_phase_at_epoch = 0.0;
  double reentry_altitude_km = 120.0;
  std::vector<ShellBudget> shells;
  double fleet_dv_m_s = 0.0;
  std::optional<double> fleet_propellant_kg;  // none when any shell has none
  std::vector<std::string> warnings;          // every shell's warnings, "shell NAME: ..."
};

// Compute the budget. Throws InputError for a non-positive or non-finite ballistic coefficient, a mission
// life out of (0, 100] years, a deadband that reaches the re-entry altitude, a decay integration that
// fails, or any figure that is not finite (naming the shell, the figure and the cause). Never returns NaN
// or infinity. Budgets that cannot be flown are returned, with ShellBudget::cannot_fly and warnings.
BudgetResult compute_budget(const Design& design, const BudgetOptions& options = {});

// One shell's budget under one draw, at the solar level and phase compute_budget settled (BudgetResult::solar and
// solar_cycle_phase_at_epoch). InputErrors name neither the file nor the shell (the caller adds both).
ShellBudget shell_budget_drawn(const Design& design, const Shell& shell, SolarLevel level, double phase_at_epoch,
                               const BudgetOptions& options, const BudgetDraw& draw);

// Natural lifetime of a mean orbit (a, e) for ballistic coefficient b_m2_kg under `atmosphere`, starting t0_days
// after the epoch: the days to re-entry, or the days to horizon_days with lower_bound set when it outlives the
// horizon. Throws InputError when the decay integration fails (DecayStop::failed).
struct NaturalLifetime {
  double days = 0.0;
  bool lower_bound = false;  // still in orbit at the horizon: days is a lower bound
};
NaturalLifetime natural_lifetime(const EarthModel& earth, const OrbitAtmosphere& atmosphere, double b_m2_kg, double a_km,
                                 double e, double t0_days, double reentry_altitude_km, double horizon_days);

// The perigee altitude (km) to which a burn at apogee of the orbit (a, e) must lower the perigee so that
// the orbit re-enters within rule_days (found by bisection to 0.05 km with the decay model); nullopt when
// the orbit already re-enters within rule_days.
std::optional<double> disposal_perigee_for_rule_km(const EarthModel& earth, const OrbitAtmosphere& atmosphere,
                                                   double b_m2_kg, double a_km, double e, double t0_days,
                                                   double reentry_altitude_km, double rule_days);

}  // namespace skein
