// Plane deployment by differential J2 drift (deployment.hpp): the relative rates against the J2 formula written
// out here and against a numerical integration of point mass + J2, one plan worked by hand, the trade curve's
// monotonicity, the deadline choice against a brute force over every combination, and the budget line.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "skein/budget/budget.hpp"
#include "skein/budget/deployment.hpp"
#include "skein/budget/impulses.hpp"
#include "skein/budget/transfer.hpp"
#include "skein/constants.hpp"
#include "skein/error.hpp"
#include "skein/input/design_file.hpp"

using namespace skein;

namespace {
constexpr double deg_day = deg_per_rad * seconds_per_day;  // rad/s to deg/day

// Vallado (2013) eq. 9-41 for a circular orbit, written out independently of orbit/secular.cpp:
// dOmega/dt = -3/2 n J2 (Re/a)^2 cos i, n = sqrt(mu / a^3).
double node_rate_rad_s(double a_km, double i_rad) {
  const double n = std::sqrt(wgs84.mu_km3_s2 / (a_km * a_km * a_km));
  return -1.5 * n * wgs84.j2 * std::pow(wgs84.radius_km / a_km, 2) * std::cos(i_rad);
}

// The argument-of-latitude rate of the same source for a circular orbit: du/dt = dM/dt + domega/dt
// = n [1 + 3/4 J2 (Re/a)^2 (3 cos^2 i - 1) + 3/4 J2 (Re/a)^2 (5 cos^2 i - 1)].
double slot_rate_rad_s(double a_km, double i_rad) {
  const double n = std::sqrt(wgs84.mu_km3_s2 / (a_km * a_km * a_km));
  const double k = 0.75 * wgs84.j2 * std::pow(wgs84.radius_km / a_km, 2);
  const double c2 = std::cos(i_rad) * std::cos(i_rad);
  return n * (1.0 + k * (3.0 * c2 - 1.0) + k * (5.0 * c2 - 1.0));
}

double secular_node_deg_day(double a_km, double i_rad) { return node_rate_rad_s(a_km, i_rad) * deg_day; }

DeploymentOptions three_planes(double alt_km = 550.0) {
  DeploymentOptions o;
  o.shell_a_km = wgs84.radius_km + alt_km;
  o.inclination_rad = 53.0 * rad_per_deg;
  o.node_shares_deg = {0.0, 120.0, 240.0};
  o.slot_shares_deg = {{0.0, 90.0, 180.0, 270.0}, {0.0, 90.0, 180.0, 270.0}, {0.0, 90.0, 180.0, 270.0}};
  return o;
}

DeploymentOptions electric(DeploymentOptions o) {
  o.propulsion = RaisingPropulsion::electric;
  o.thrust_n = 0.02;
  o.isp_s = 1400.0;
  o.mass_kg = 150.0;
  return o;
}

std::string design_text(const std::string& injection, const std::string& deployment) {
  return "name: Kestrel deployment test\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 150\n"
         "  drag_area_m2: 1.0\n  drag_coefficient: 2.2\n  isp_s: 220\n"
         "shells:\n  - name: low\n    pattern: walker-delta\n    satellites: 12\n    planes: 3\n    phasing: 1\n"
         "    altitude_km: 550\n    inclination_deg: 53\nbudget:\n  mission_life_years: 2\n" +
         injection + deployment;
}

BudgetOptions quick() {
  BudgetOptions o;
  o.level_curves = false;
  return o;
}
}  // namespace

TEST_CASE("deployment: the node-rate difference between two altitudes is the J2 formula's") {
  const double i = 53.0 * rad_per_deg, a0 = wgs84.radius_km + 550.0;
  for (double h : {-200.0, -50.0, 10.0, 100.0, 300.0}) {
    const double expected = node_rate_rad_s(a0 + h, i) - node_rate_rad_s(a0, i);
    // Same formula, different code: agreement to rounding (1e-12 relative).
    CHECK(relative_node_rate_rad_s(wgs84, a0 + h, a0, i) == doctest::Approx(expected).epsilon(1e-12));
  }
  // ../shared/references.md sec. 2.4 (COMPUTED from Vallado eq. 9-41): at 550 km, 53 deg, d(dOmega/dt)/da =
  // +0.00227 deg/day per km. A central difference over +-1 km must give it to the 3 digits quoted (0.3 %).
  const double per_km = (relative_node_rate_rad_s(wgs84, a0 + 1.0, a0, i) -
                         relative_node_rate_rad_s(wgs84, a0 - 1.0, a0, i)) / 2.0 * deg_day;
  CHECK(per_km == doctest::Approx(0.00227).epsilon(0.003));
  // The slot rate: dM/dt + domega/dt of the same source.
  for (double h : {-20.0, 5.0}) {
    const double expected = slot_rate_rad_s(a0 + h, i) - slot_rate_rad_s(a0, i);
    CHECK(relative_slot_rate_rad_s(wgs84, a0 + h, a0, i) == doctest::Approx(expected).epsilon(1e-10));
  }
}

TEST_CASE("deployment: the relative node and slot drift against a numerical integration of point mass + J2") {
  // tests/budget/deployment_reference.py integrates two orbits (osculating circular 550 and 450 km at 53 deg)
  // under point mass + J2 with RK4 (numpy, 20 s steps, 20 days) and printed (run with /usr/bin/python3):
  //   orbit 550 km: mean a 6922.0685 km, node slope -4.507980 deg/day, u slope 5430.2719 deg/day
  //   orbit 450 km: mean a 6821.9772 km, node slope -4.743899 deg/day, u slope 5550.3170 deg/day
  // (short-period amplitude of the osculating node 0.024 deg; a least-squares slope over 20 days and about 300
  // of its cycles is not moved by it at the precision used here). The secular formula is evaluated at the mean
  // semi-major axes (time averages of the osculating a: to first order in J2 the mean a, since the short-period
  // terms of a average to zero over the mean anomaly).
  const double a_hi = 6922.0685, a_lo = 6821.9772, i = 53.0 * rad_per_deg, days = 20.0;
  // Each orbit alone: the first-order formula misses O(J2^2) terms, about J2 = 0.1 % of the rate; allow 0.3 %.
  CHECK(secular_node_deg_day(a_hi, i) == doctest::Approx(-4.507980).epsilon(0.003));
  CHECK(secular_node_deg_day(a_lo, i) == doctest::Approx(-4.743899).epsilon(0.003));
  const double node_numeric_deg = (-4.743899 - -4.507980) * days;  // relative node drift of the low orbit: -4.72 deg
  const double u_numeric_deg = (5550.3170 - 5430.2719) * days;     // +2401 deg
  const double node_formula_deg = relative_node_rate_rad_s(wgs84, a_lo, a_hi, i) * deg_day * days;
  const double u_formula_deg = relative_slot_rate_rad_s(wgs84, a_lo, a_hi, i) * deg_day * days;
  // The difference: the O(J2^2) error of each orbit's node (0.1 % of 90 deg, 0.1 deg over 20 days) is nearly
  // common to both and cancels but for its change with altitude; 0.03 deg (0.6 % of the 4.7 deg drift, about six
  // times J2 relative) bounds what is left with room for the mean-a estimate.
  CHECK(std::abs(node_formula_deg - node_numeric_deg) < 0.03);
  // The argument of latitude advances at n (5430 deg/day): a 1e-6 relative second-order error is 0.1 deg per
  // orbit over 20 days, again mostly common; 0.2 deg (0.008 % of the 2401 deg relative drift) bounds the rest.
  CHECK(std::abs(u_formula_deg - u_numeric_deg) < 0.2);
}

TEST_CASE("deployment: one chemical plan worked by hand (three planes at 550 km, 53 deg, 100 km offset)") {
  DeploymentOptions o = three_planes();
  o.plane_offsets_km = {100.0};
  o.slot_shares_deg = {{0.0}, {0.0}, {0.0}};  // one satellite per plane: no phasing
  const DeploymentResult r = plan_deployment(o);
  REQUIRE(r.planes.size() == 1);
  CHECK(r.phasing.empty());
  const double a0 = o.shell_a_km, i = o.inclination_rad, mu = wgs84.mu_km3_s2;
  // Higher orbit: the node regresses more slowly, so it gains on the shell (positive); lower: it falls back.
  const double up = node_rate_rad_s(a0 + 100.0, i) - node_rate_rad_s(a0, i);
  const double down = node_rate_rad_s(a0 - 100.0, i) - node_rate_rad_s(a0, i);
  REQUIRE(up > 0.0);
  REQUIRE(down < 0.0);
  // Each leg is half a Hohmann ellipse, gaining the relative rate at the ellipse's a for that time.
  auto leg_s = [&](double a1) { const double at = 0.5 * (a0 + a1); return pi * std::sqrt(at * at * at / mu); };
  auto leg_angle = [&](double a1) {
    const double at = 0.5 * (a0 + a1);
    return std::abs(node_rate_rad_s(at, i) - node_rate_rad_s(a0, i)) * leg_s(a1);
  };
  // Plane at 120 deg: up needs +120 deg, down needs -240 deg: up is faster. Plane at 240: down, -120 deg.
  const double t120 = 2 * leg_s(a0 + 100) + (120 * rad_per_deg - 2 * leg_angle(a0 + 100)) / up;
  const double t240 = 2 * leg_s(a0 - 100) + (120 * rad_per_deg - 2 * leg_angle(a0 - 100)) / -down;
  const DriftPlan& p = r.planes.front();
  CHECK(p.higher_groups == 1);
  CHECK(p.lower_groups == 1);
  CHECK(p.days == doctest::Approx(std::max(t120, t240) / seconds_per_day).epsilon(1e-9));
  const double dv_up = 2 * hohmann_dv_m_s(mu, a0, a0 + 100), dv_down = 2 * hohmann_dv_m_s(mu, a0, a0 - 100);
  CHECK(p.dv_m_s == doctest::Approx(std::max(dv_up, dv_down)).epsilon(1e-12));
  CHECK(p.fleet_dv_m_s == doctest::Approx(dv_up + dv_down).epsilon(1e-12));
  // Order of magnitude from ../shared/references.md sec. 9.3 (COMPUTED): 0.227 deg/day per 100 km at 550 km
  // (the linear sensitivity), so 120 deg in about 529 days. The rate falls as a^(-7/2), so the higher side gains
  // less than the linear estimate (by about (9/4)(100/6928) = 3 %) and sets the time: a little over 529 days.
  CHECK(p.days > 529.0);
  CHECK(p.days < 529.0 * 1.05);
}

TEST_CASE("deployment: in-plane phasing spreads the slots by the argument-of-latitude rate") {
  DeploymentOptions o = three_planes();
  o.node_shares_deg = {0.0};
  o.slot_shares_deg = {{0.0, 90.0, 180.0, 270.0}};
  o.phasing_offsets_km = {5.0};
  const DeploymentResult r = plan_deployment(o);
  REQUIRE(r.phasing.size() == 1);
  CHECK(r.planes.empty());
  const DriftPlan& p = r.phasing.front();
  // A lower orbit runs ahead (positive), a higher one falls behind: the 90 deg slot goes down (+90), the 270 deg
  // one up (-90), and 180 deg either way: the lower side wins (the rate difference grows faster below).
  CHECK(p.lower_groups == 2);
  CHECK(p.higher_groups == 1);
  const double rate_down = slot_rate_rad_s(o.shell_a_km - 5.0, o.inclination_rad) - slot_rate_rad_s(o.shell_a_km, o.inclination_rad);
  // The 180 deg slot sets the time: about pi / rate plus the two half-orbit legs (which count part of the drift).
  CHECK(p.days == doctest::Approx(pi / rate_down / seconds_per_day).epsilon(0.01));
  // The Hohmann rule of thumb dv = v dh / (2 a) per leg (impulses.hpp): 2 legs of 5 km at 550 km, about 5.4 m/s.
  CHECK(p.dv_m_s == doctest::Approx(2 * circular_speed_m_s(wgs84.mu_km3_s2, o.shell_a_km) * 5.0 / (2 * o.shell_a_km)).epsilon(0.01));
}

TEST_CASE("deployment: more delta-v buys fewer days along the trade (chemical and electric)") {
  for (bool use_electric : {false, true}) {
    DeploymentOptions o = three_planes();
    if (use_electric) o = electric(o);
    o.plane_offsets_km = {10, 25, 50, 75, 100, 150, 200, 300};
    o.phasing_offsets_km = {1, 2, 5, 10, 20};
    const DeploymentResult r = plan_deployment(o);
    INFO("electric: " << use_electric);
    REQUIRE(r.planes.size() == 8);
    REQUIRE(r.phasing.size() == 5);
    for (const auto* plans : {&r.planes, &r.phasing})
      for (size_t k = 1; k < plans->size(); ++k) {
        CHECK((*plans)[k].dv_m_s > (*plans)[k - 1].dv_m_s);
        CHECK((*plans)[k].days < (*plans)[k - 1].days);
      }
    // The curve: fewest days first, delta-v strictly falling.
    for (size_t k = 1; k < r.curve.size(); ++k) {
      CHECK(r.curve[k].days >= r.curve[k - 1].days);
      CHECK(r.curve[k].dv_m_s < r.curve[k - 1].dv_m_s);
    }
  }
}

TEST_CASE("deployment: the deadline choice is the least delta-v combination within it (brute force)") {
  for (bool use_electric : {false, true}) {
    DeploymentOptions o = three_planes();
    if (use_electric) o = electric(o);
    o.plane_offsets_km = {25, 50, 100, 200, 300};
    o.phasing_offsets_km = {1, 5, 20};
    const DeploymentResult all = plan_deployment(o);
    // Brute force over every plane plan x phasing plan.
    double fastest = std::numeric_limits<double>::infinity();
    for (const auto& a : all.planes)
      for (const auto& b : all.phasing) fastest = std::min(fastest, a.days + b.days);
    CHECK(all.fastest_days == doctest::Approx(fastest).epsilon(1e-12));
    CHECK_FALSE(all.chosen);  // no deadline
    for (double deadline : {fastest * 0.99, fastest, fastest * 1.3, 400.0, 900.0, 5000.0}) {
      o.deadline_days = deadline;
      const DeploymentResult r = plan_deployment(o);
      double best_dv = std::numeric_limits<double>::infinity(), best_days = 0.0;
      for (const auto& a : all.planes)
        for (const auto& b : all.phasing) {
          const double days = a.days + b.days, dv = a.dv_m_s + b.dv_m_s;
          if (days <= deadline && (dv < best_dv || (dv == best_dv && days < best_days))) {
            best_dv = dv;
            best_days = days;
          }
        }
      INFO("electric: " << use_electric << ", deadline " << deadline);
      if (std::isinf(best_dv)) {
        CHECK_FALSE(r.chosen);
      } else {
        REQUIRE(r.chosen);
        CHECK(r.chosen->dv_m_s == doctest::Approx(best_dv).epsilon(1e-12));
        CHECK(r.chosen->days == doctest::Approx(best_days).epsilon(1e-12));
        CHECK(r.chosen->days <= deadline);
      }
    }
  }
}

TEST_CASE("deployment: electric legs take the rocket equation's time and gain part of the drift meanwhile") {
  DeploymentOptions o = electric(three_planes());
  o.plane_offsets_km = {100.0};
  o.slot_shares_deg = {{0.0}, {0.0}, {0.0}};
  const DeploymentResult r = plan_deployment(o);
  REQUIRE(r.planes.size() == 1);
  const double mu = wgs84.mu_km3_s2, a0 = o.shell_a_km;
  const double dv_down = circular_speed_m_s(mu, a0 - 100) - circular_speed_m_s(mu, a0);  // Edelbaum coplanar |v0 - v1|
  const double dv_up = circular_speed_m_s(mu, a0) - circular_speed_m_s(mu, a0 + 100);
  CHECK(r.planes[0].dv_m_s == doctest::Approx(2 * std::max(dv_down, dv_up)).epsilon(1e-12));
  const double leg_down_s = constant_thrust_burn_time_s(150.0, dv_down, 0.02, 1400.0);
  CHECK(r.planes[0].leg_days == doctest::Approx(leg_down_s / seconds_per_day).epsilon(1e-12));
  // Bounds on the whole plan: the slowest plane's drift lies between coasting its whole share at the drift
  // orbit's rate after the legs (gaining nothing on the way: an upper bound) and coasting it from the start.
  const double i = o.inclination_rad;
  const double down = std::abs(node_rate_rad_s(a0 - 100, i) - node_rate_rad_s(a0, i));
  const double lower_s = 120 * rad_per_deg / down, upper_s = 2 * leg_down_s + lower_s;
  const double up = node_rate_rad_s(a0 + 100, i) - node_rate_rad_s(a0, i);
  const double slow_s = std::max(lower_s, 120 * rad_per_deg / up);
  CHECK(r.planes[0].days * seconds_per_day >= slow_s);
  CHECK(r.planes[0].days * seconds_per_day <= std::max(upper_s, slow_s + 2 * leg_down_s));
}

TEST_CASE("deployment: refusals (no offset can work, bad electric figures)") {
  DeploymentOptions polar = three_planes();
  polar.inclination_rad = pi / 2.0;  // cos i = 0: the node rate is zero at every altitude
  CHECK_THROWS_WITH_AS(plan_deployment(polar), doctest::Contains("no offset spreads the planes"), InputError);
  DeploymentOptions e = electric(three_planes());
  e.thrust_n = 0.0;
  CHECK_THROWS_WITH_AS(plan_deployment(e), doctest::Contains("expected a thrust above 0"), InputError);
  DeploymentOptions neg = three_planes();
  neg.plane_offsets_km = {-5.0};
  CHECK_THROWS_AS(plan_deployment(neg), InputError);
  // A lower orbit below the floor is not used: the higher side alone must then carry every plane.
  DeploymentOptions low = three_planes(250.0);
  low.plane_offsets_km = {200.0};
  const DeploymentResult r = plan_deployment(low);
  REQUIRE(r.planes.size() == 1);
  CHECK(r.planes[0].lower_groups == 0);
  CHECK(r.planes[0].higher_groups == 2);
  CHECK(r.planes[0].lower_rate_deg_day == 0.0);
}

TEST_CASE("deployment line in the budget: the chosen plan, its propellant at the raising engine's isp") {
  const Design d = read_design_text(
      design_text("  injection:\n    altitude_km: 400\n",
                  "  deployment:\n    deadline_days: 500\n    plane_offsets_km: [50, 100, 150, 200]\n"),
      "t.yaml");
  const BudgetResult b = compute_budget(d, quick());
  const ShellBudget& s = b.shells.front();
  REQUIRE(s.deployment);
  REQUIRE(s.deployment->chosen);
  const auto line = std::find_if(s.dv_lines.begin(), s.dv_lines.end(), [](const DvLine& l) { return l.name == "deployment"; });
  REQUIRE(line != s.dv_lines.end());
  // The line is the chosen plan's transfers plus the drag make-up on the lower drift orbit over the plane drift.
  const DriftPlan& planes = s.deployment->planes[static_cast<size_t>(s.deployment->chosen->plane_plan)];
  REQUIRE(planes.lower_groups > 0);
  CHECK(line->dv_m_s > s.deployment->chosen->dv_m_s);
  CHECK(line->basis.find("of drag make-up at") != std::string::npos);
  CHECK(s.deployment->chosen->days <= 500.0);
  CHECK(line->basis.find("Vallado 2013 eq. 9-41") != std::string::npos);
  // One isp for everything: the propellant is exactly m_dry (exp(total / c) - 1) (Tsiolkovsky).
  REQUIRE(s.propellant_kg);
  CHECK(*s.propellant_kg == doctest::Approx(propellant_mass_kg(150.0, s.total_dv_m_s, 220.0)).epsilon(1e-9));
  // A shell made elsewhere (a sweep layout) whose deadline no plan meets: the fastest plan is budgeted and the
  // budget cannot be flown, saying why.
  Design late = d;
  late.budget.deployment->deadline_days = 1.0;
  const BudgetResult late_budget = compute_budget(late, quick());
  const ShellBudget& ls = late_budget.shells.front();
  REQUIRE(ls.deployment);
  CHECK_FALSE(ls.flyable());
  REQUIRE_FALSE(ls.cannot_fly.empty());
  CHECK(ls.cannot_fly.front().find("shorter than any deployment") != std::string::npos);
  CHECK(ls.deployment->chosen->days == doctest::Approx(ls.deployment->fastest_days));
  // A deadline below the fastest plan is refused at its position, naming the shortest achievable time.
  CHECK_THROWS_WITH_AS(
      read_design_text(design_text("  injection:\n    altitude_km: 400\n", "  deployment:\n    deadline_days: 20\n"), "t.yaml"),
      doctest::Contains("t.yaml:21:20: budget.deployment.deadline_days: deadline 20 days is shorter than any deployment "
                        "of shell low: the shortest achievable is"),
      InputError);
}
