#pragma once
// Plane deployment by differential J2 drift: from one injection (all planes of a shell share one node and all
// satellites of a plane one slot), groups drift at an offset altitude until the node (or, within a plane, the
// argument of latitude) has moved by its share relative to those that stay, then return to the shell. Every
// drift offset gives one plan: days to full deployment against delta-v. Distances km, angles deg in the result,
// speeds m/s, times days, thrust N, masses kg.
#include <optional>
#include <string>
#include <vector>

#include "skein/constants.hpp"
#include "skein/design/budget_spec.hpp"
#include "skein/design/design.hpp"

namespace skein {

struct DeploymentOptions {
  EarthModel earth = wgs84;
  double shell_a_km = 0.0;         // circular shell radius (mean semi-major axis)
  double inclination_rad = 0.0;
  std::vector<double> node_shares_deg;          // each plane's node minus the reference plane's, [0, 360); one entry
                                                // per plane, the reference's own 0 included
  std::vector<std::vector<double>> slot_shares_deg;  // per plane: each slot's argument of latitude minus the
                                                     // plane's first slot's, [0, 360), the first slot's 0 included
  std::vector<double> plane_offsets_km = {25, 50, 75, 100, 150, 200};  // drift offsets |dh| traded for the planes
  std::vector<double> phasing_offsets_km = {1, 2, 5, 10, 20};          // and for the in-plane phasing
  RaisingPropulsion propulsion = RaisingPropulsion::chemical;  // Hohmann pairs, or Edelbaum legs at constant thrust
  double thrust_n = 0.0;           // electric only (> 0)
  double isp_s = 0.0;              // electric only (> 0): the burn time's mass flow
  double mass_kg = 0.0;            // electric only (> 0): spacecraft mass during the legs
  double floor_altitude_km = 120.0;  // a lower drift orbit must stay at or above this altitude
  std::optional<double> deadline_days;  // the choice: least delta-v plan done within this many days
};

// One drift offset for one mechanism (planes or phasing).
struct DriftPlan {
  double offset_km = 0.0;       // |dh|; the lower drift orbit is at shell - offset, the higher at shell + offset
  double days = 0.0;            // until the last group is back at the shell
  double dv_m_s = 0.0;          // per moving satellite, the worst (there and back)
  double fleet_dv_m_s = 0.0;    // all satellites of the shell
  double lower_rate_deg_day = 0.0;  // drift rate relative to the shell at shell - offset (0 when not allowed)
  double higher_rate_deg_day = 0.0; // at shell + offset
  int lower_groups = 0;         // planes (or slots) that drift low / high
  int higher_groups = 0;
  double leg_days = 0.0;        // one transfer (shell to drift orbit), the longer side's
};

// A plane plan followed by a phasing plan: one point of the trade curve.
struct DeploymentPoint {
  int plane_plan = -1;          // index into DeploymentResult::planes (-1: nothing to spread)
  int phasing_plan = -1;        // index into DeploymentResult::phasing (-1: nothing to spread)
  double days = 0.0;            // plane days + phasing days (in sequence)
  double dv_m_s = 0.0;          // worst satellite: plane dv + phasing dv (an upper bound)
  double fleet_dv_m_s = 0.0;
};

struct DeploymentResult {
  std::vector<DriftPlan> planes;   // one per feasible plane offset (empty with one plane)
  std::vector<DriftPlan> phasing;  // one per feasible phasing offset (empty with one satellite per plane)
  std::vector<std::string> skipped;  // offsets that gave no plan, and why
  std::vector<DeploymentPoint> curve;  // the non-dominated combinations, fewest days first (delta-v falling)
  double fastest_days = 0.0;       // the shortest achievable deployment over all combinations
  std::optional<double> deadline_days;    // copied from the options
  std::optional<DeploymentPoint> chosen;  // with a deadline: the least delta-v point within it
};

// Relative drift rate (rad/s) of a circular orbit at a_km against the shell's a0_km, same inclination:
// node:  dOmega/dt(a) - dOmega/dt(a0);  slot: du/dt(a) - du/dt(a0) with u = omega + M, du/dt = dM/dt + domega/dt.
// Source: the secular J2 rates of Vallado (2013) eq. 9-41 (orbit/secular.hpp). Domain: a, a0 > Re, e = 0.
double relative_node_rate_rad_s(const EarthModel& earth, double a_km, double a0_km, double i_rad);
double relative_slot_rate_rad_s(const EarthModel& earth, double a_km, double a0_km, double i_rad);

// The plan. Every plane other than the reference (share 0) drifts, all departing at once, at shell - offset or
// shell + offset, whichever reaches its share first, and returns when its node has moved by it (the node of a
// prograde shell regresses faster below, so a low group moves back and a high group forward). Then, plane by
// plane in parallel, the slots spread by the same rule with the argument-of-latitude rate. Transfers: chemical, a
// Hohmann pair (Vallado 2013 sec. 6.3) each way, taking half the transfer orbit's period; electric, Edelbaum's
// coplanar |v0 - v1| (Edelbaum 1961) each way at constant thrust (burn time from the rocket equation), the speed
// taken as linear in time and the relative angle gained during a leg integrated (Simpson, 64 intervals).
// An offset is skipped when neither side can deploy every group (the legs alone overshoot a share, or no rate).
// Throws InputError for non-positive thrust, isp or mass with electric propulsion, a non-positive offset, or a
// shell with planes or slots to spread for which no offset gives a plan (naming the offsets and the cause).
DeploymentResult plan_deployment(const DeploymentOptions& options);

// The options for one shell of a design (budget.deployment and budget.injection): shares from the plane nodes
// and slots, mass dry + propellant capacity (conservative for the burn times), isp from the injection or the
// spacecraft. Requires design.budget.deployment and design.budget.injection.
DeploymentOptions deployment_options(const Design& design, const Shell& shell);

}  // namespace skein
