#include "skein/budget/budget.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

#include "skein/atmosphere/harris_priester.hpp"
#include "skein/budget/impulses.hpp"
#include "skein/budget/plausibility.hpp"
#include "skein/budget/solar_inclination_drift.hpp"
#include "skein/budget/transfer.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/secular.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/sun.hpp"

namespace skein {
namespace {

// Each DensityFn holds its own OrbitDensity (with its cache): one per integration, never shared by threads.
DensityFn density_of(const OrbitAtmosphere& atm) { return OrbitDensity(atm); }

// A failed decay integration is never a lifetime nor a lower bound: refuse it.
DecayResult require_decay(DecayResult r, std::string_view what) {
  if (r.stop == DecayStop::failed)
    throw InputError(fmt::format("the natural-decay integration of the {} failed (stopped at {:.6g} days, "
                                 "semi-major axis {:.6g} km, after {} steps); expected a spacecraft and orbit the orbit-averaged "
                                 "drag model can follow",
                                 what, r.end.t_days, r.end.a_km, r.steps));
  return r;
}

// Nodes (rad) of every plane of a shell.
std::vector<double> plane_nodes_rad(const Shell& shell) {
  std::vector<double> out;
  if (shell.pattern == PatternKind::explicit_planes) {
    for (const auto& p : shell.explicit_planes) out.push_back(p.raan_deg * rad_per_deg);
  } else {
    for (int p = 0; p < shell.planes; ++p) out.push_back(walker_plane_raan_rad(shell, p));
  }
  return out;
}

// Drag make-up over the mission life: let a fall by the deadband, raise it back with a Hohmann pair;
// at the end of life the remaining deficit is also counted, so the line equals the drag loss over the life.
struct Makeup {
  double dv_m_s = 0.0;
  long raises = 0;
  bool reentered = false;  // the deadband reaches below the re-entry altitude
};
Makeup drag_makeup(const EarthModel& earth, const OrbitAtmosphere& atm, double b, double a0, double e0, double life_days,
                   double deadband_km, double reentry_km) {
  Makeup m;
  const DensityFn rho = density_of(atm);
  DecayOptions opt;
  opt.reentry_altitude_km = reentry_km;
  opt.stop_below_a_km = a0 - deadband_km;
  opt.record = false;
  const bool fixed = atm.solar.level != SolarLevel::cycle;
  constexpr long max_cycles = 200000;  // a raise every few minutes for years: far beyond any real plan
  double t = 0.0;
  while (t < life_days) {
    opt.horizon_days = life_days - t;
    const DecayResult r = require_decay(integrate_decay(earth, rho, b, {t, a0, e0}, opt), "drag make-up cycle");
    if (r.stop == DecayStop::reentry) {
      m.reentered = true;
      return m;
    }
    m.dv_m_s += hohmann_dv_m_s(earth.mu_km3_s2, r.end.a_km, a0);
    if (r.stop == DecayStop::horizon) break;
    ++m.raises;
    const double cycle_days = r.end.t_days - t;
    t = r.end.t_days;
    if (fixed && m.raises == 1 && cycle_days > 0.0) {
      // Fixed activity: every cycle is the same. Count the whole cycles, then integrate the remainder.
      const double whole = std::floor((life_days - t) / cycle_days);
      m.raises += static_cast<long>(whole);
      m.dv_m_s += whole * hohmann_dv_m_s(earth.mu_km3_s2, a0 - deadband_km, a0);
      t += whole * cycle_days;
      if (t >= life_days) break;
      opt.horizon_days = life_days - t;
      const DecayResult rest = require_decay(integrate_decay(earth, rho, b, {t, a0, e0}, opt), "drag make-up cycle");
      if (rest.stop == DecayStop::target) {  // rounding left one more whole cycle
        ++m.raises;
        m.dv_m_s += hohmann_dv_m_s(earth.mu_km3_s2, rest.end.a_km, a0);
        opt.horizon_days = std::max(life_days - rest.end.t_days, 0.0);
        if (opt.horizon_days > 0.0) {
          const DecayResult tail =
              require_decay(integrate_decay(earth, rho, b, {rest.end.t_days, a0, e0}, opt), "drag make-up cycle");
          m.dv_m_s += hohmann_dv_m_s(earth.mu_km3_s2, tail.end.a_km, a0);
        }
      } else {
        m.dv_m_s += hohmann_dv_m_s(earth.mu_km3_s2, rest.end.a_km, a0);
      }
      break;
    }
    if (m.raises >= max_cycles) {
      m.dv_m_s *= life_days / t;  // scale the rate found so far to the whole life
      m.raises = static_cast<long>(std::llround(static_cast<double>(m.raises) * life_days / t));
      break;
    }
  }
  return m;
}

// Every figure of a shell's budget must be finite: refuse the budget otherwise, naming the shell, the figure
// and, where it is known, the cause.
void require_finite_figures(const ShellBudget& s, const Spacecraft& sc) {
  auto refuse = [&](std::string_view figure, double value, const std::string& cause) {
    throw InputError(fmt::format("{} is not finite ({}): {}", figure, value, cause));
  };
  const std::string model = "the drag model overflowed; expected a ballistic coefficient and orbit it can follow";
  for (const auto& d : s.decay)
    if (!std::isfinite(d.lifetime_days)) refuse("the natural lifetime", d.lifetime_days, model);
  if (!std::isfinite(s.drag_makeup_dv_m_s_per_year)) refuse("the drag make-up", s.drag_makeup_dv_m_s_per_year, model);
  for (const auto& l : s.dv_lines)
    if (!std::isfinite(l.dv_m_s)) refuse("delta-v line " + l.name, l.dv_m_s, model);
  if (!std::isfinite(s.total_dv_m_s)) refuse("the total delta-v", s.total_dv_m_s, model);
  if (!std::isfinite(s.fleet_dv_m_s)) refuse("the fleet delta-v", s.fleet_dv_m_s, model);
  if (s.disposal_lifetime_days && !std::isfinite(*s.disposal_lifetime_days))
    refuse("the lifetime after disposal", *s.disposal_lifetime_days, model);
  if (s.propellant_kg && !std::isfinite(*s.propellant_kg))
    refuse("the propellant mass", *s.propellant_kg,
           fmt::format("the total delta-v {:.6g} m/s is {:.3g} times the exhaust speed g0 x isp_s = {:.6g} m/s, so the "
                       "rocket equation's mass ratio exp(dv / (g0 isp_s)) overflows; expected a larger "
                       "spacecraft.isp_s or a smaller budget",
                       s.total_dv_m_s, s.total_dv_m_s / (standard_gravity_m_s2 * *sc.isp_s),
                       standard_gravity_m_s2 * *sc.isp_s));
  if (s.fleet_propellant_kg && !std::isfinite(*s.fleet_propellant_kg))
    refuse("the fleet propellant mass", *s.fleet_propellant_kg, "the per-satellite mass times the satellite count overflows");
}

// The formula and sources of the deployment line's transfers.
std::string inj_propulsion_basis(RaisingPropulsion propulsion) {
  return propulsion == RaisingPropulsion::chemical
             ? "; node rate dOmega/dt = -3/2 n J2 (Re/a)^2 cos i and slot rate dM/dt + domega/dt (Vallado 2013 eq. "
               "9-41), a Hohmann pair there and back (Vallado sec. 6.3); worst satellite"
             : "; node rate dOmega/dt = -3/2 n J2 (Re/a)^2 cos i and slot rate dM/dt + domega/dt (Vallado 2013 eq. "
               "9-41), Edelbaum |v0 - v1| there and back at constant thrust (Edelbaum 1961); worst satellite";
}
}  // namespace

// One shell's budget. Its InputErrors do not name the file or the shell: compute_budget adds both.
ShellBudget shell_budget_drawn(const Design& design, const Shell& shell, SolarLevel level, double phase0,
                               const BudgetOptions& options, const BudgetDraw& draw) {
  const EarthModel& earth = design.earth;
  const BudgetSpec& spec = design.budget;
  const Spacecraft& sc = design.spacecraft;
  ShellBudget out;
  out.name = shell.name;
  out.satellites = shell.satellites;
  out.planes = shell.planes;
  out.altitude_km = shell.a_km - earth.radius_km;
  out.perigee_km = shell.a_km * (1.0 - shell.e) - earth.radius_km;
  out.apogee_km = shell.a_km * (1.0 + shell.e) - earth.radius_km;
  out.inclination_deg = shell.inclination_deg;
  out.sun_synchronous = shell.sun_synchronous;
  const double b = sc.ballistic_coefficient_m2_kg() * draw.drag_coefficient_factor * draw.drag_area_factor;
  out.ballistic_coefficient_m2_kg = b;
  const double i_rad = shell.inclination_deg * rad_per_deg;
  const double life_days = spec.mission_life_years * days_per_julian_year;
  const double life_s = life_days * seconds_per_day;
  const double horizon_days = options.lifetime_horizon_years * days_per_julian_year;
  const double reentry_km = spec.reentry_altitude_km;
  const JulianDate jd = julian_date(design.epoch);
  const std::vector<double> nodes = plane_nodes_rad(shell);

  if (shell.a_km - spec.deadband_km - earth.radius_km <= reentry_km + 1.0)
    throw InputError(fmt::format("budget.deadband_km {} reaches the re-entry altitude {} km; expected a smaller deadband",
                                 spec.deadband_km, reentry_km));

  // Density model for this shell.
  OrbitAtmosphere atm;
  atm.kind = spec.atmosphere;
  if (atm.kind == AtmosphereKind::harris_priester) {
    const double n = spec.harris_priester_exponent.value_or(harris_priester_default_exponent(i_rad));
    if (draw.bulge_weight) {
      atm.bulge_weight = *draw.bulge_weight;
    } else if (shell.sun_synchronous) {  // each plane keeps its own offset from the mean Sun: average the planes
      double w = 0.0;
      for (double node : nodes) w += harris_priester_mean_weight(i_rad, true, node - mean_sun_right_ascension_rad(jd), n);
      atm.bulge_weight = w / static_cast<double>(nodes.size());
    } else {  // every plane sweeps all Sun angles: one average serves them all
      atm.bulge_weight = harris_priester_mean_weight(i_rad, false, 0.0, n);
    }
    out.bulge_weight = atm.bulge_weight;
  }
  atm.solar = {level, phase0 + draw.phase_shift_cycles, draw.solar_amplitude};
  const double top_km = atmosphere_table_top_km(atm.kind);
  if (out.apogee_km > top_km)
    out.warnings.push_back(fmt::format("altitude {:.0f} km is above the {} table ({:.0f} km): densities there are "
                                       "extrapolated with the top layer's scale height",
                                       out.apogee_km, to_string(atm.kind), top_km));

  // Natural decay under each level.
  auto decay_under = [&](SolarLevel l) {
    OrbitAtmosphere a = atm;
    a.solar.level = l;
    DecayOptions opt;
    opt.reentry_altitude_km = reentry_km;
    opt.horizon_days = horizon_days;
    opt.record = options.keep_curves;
    const DecayResult r =
        require_decay(integrate_decay(earth, density_of(a), b, {0.0, shell.a_km, shell.e}, opt), "design orbit");
    LevelDecay d;
    d.level = l;
    d.lifetime_days = r.end.t_days;
    d.lower_bound = r.stop != DecayStop::reentry;
    const double gap = options.curve_gap_days > 0.0 ? options.curve_gap_days : std::max(d.lifetime_days / 150.0, 1e-3);
    d.curve = thin_curve(r.curve, gap, options.curve_drop_km);
    return d;
  };
  if (options.level_curves)
    for (SolarLevel l : {SolarLevel::low, SolarLevel::mean, SolarLevel::high}) out.decay.push_back(decay_under(l));
  auto selected = std::find_if(out.decay.begin(), out.decay.end(), [&](const LevelDecay& d) { return d.level == level; });
  if (selected == out.decay.end()) {
    out.decay.push_back(decay_under(level));
    selected = out.decay.end() - 1;
  }
  out.lifetime_natural_days = selected->lifetime_days;
  out.lifetime_lower_bound = selected->lower_bound;
  if (out.lifetime_lower_bound)
    out.warnings.push_back(fmt::format("still in orbit after the {:.0f}-year horizon: the natural lifetime is a lower bound",
                                       options.lifetime_horizon_years));

  const double v = circular_speed_m_s(earth.mu_km3_s2, shell.a_km);
  const double k = spec.sigma_multiple;

  // (0) raising from the injection orbit (budget.injection) to the circle of the shell's semi-major axis. Its
  // basis is completed below, once the propellant (and for electric, the thrusting time) is known.
  if (spec.injection) {
    const InjectionSpec& inj = *spec.injection;
    RaisingFigures rf;
    rf.propulsion = inj.propulsion;
    rf.plane_change_deg = std::abs(inj.inclination_deg.value_or(shell.inclination_deg) - shell.inclination_deg);
    const double rp = earth.radius_km + inj.perigee_km, ra = earth.radius_km + inj.apogee_km;
    const double di = rf.plane_change_deg * rad_per_deg;
    if (inj.propulsion == RaisingPropulsion::chemical) {
      rf.dv_m_s = two_impulse_transfer(earth.mu_km3_s2, rp, ra, shell.a_km, di).dv_m_s;
    } else {
      if (rf.plane_change_deg > 90.0)
        throw InputError(fmt::format("budget.injection: the plane change to the shell is {:.6g} deg; Edelbaum's "
                                     "transfer (propulsion: electric) is used here up to 90 deg; expected an injection "
                                     "inclination within 90 deg of the shell's {} deg",
                                     rf.plane_change_deg, shell.inclination_deg));
      rf.dv_m_s = edelbaum_dv_m_s(earth.mu_km3_s2, rp, shell.a_km, di);
    }
    rf.isp_s = inj.isp_s.value_or(sc.isp_s.value_or(0.0));
    out.raising = rf;
    out.dv_lines.push_back({"raising", rf.dv_m_s, ""});
  }

  // (0b) plane deployment by differential J2 drift (budget.deployment, with the injection's propulsion): the
  // least delta-v plan within the deadline. The reader refuses a deadline no plan meets at its position; for
  // shells made elsewhere (sweep layouts) the fastest plan is budgeted and the budget cannot be flown.
  if (spec.deployment && spec.injection) {
    DeploymentResult dep = plan_deployment(deployment_options(design, shell));
    if (!dep.chosen) {  // a sweep layout: budget the fastest plan and say the deadline cannot be met
      out.cannot_fly.push_back(fmt::format("budget.deployment.deadline_days = {} days is shorter than any deployment "
                                           "of the shell's planes and slots; the shortest achievable is {:.1f} days "
                                           "(with the largest offsets)",
                                           spec.deployment->deadline_days, std::ceil(dep.fastest_days * 10.0) / 10.0));
      dep.chosen = dep.curve.front();
    }
    const DeploymentPoint& c = *dep.chosen;
    std::string basis = fmt::format("{:.1f} days to deploy (deadline {} days)", c.days, spec.deployment->deadline_days);
    double drift_drag_m_s = 0.0;
    if (c.plane_plan >= 0) {
      const DriftPlan& p = dep.planes[static_cast<size_t>(c.plane_plan)];
      basis += fmt::format("; planes drift {} km below/above the shell ({} low, {} high; node rate {:+.4f}/{:+.4f} "
                           "deg/day relative) for {:.1f} days",
                           p.offset_km, p.lower_groups, p.higher_groups, p.lower_rate_deg_day, p.higher_rate_deg_day,
                           p.days);
      // Drag on the lower drift orbit, made up like the shell's (deadband, Hohmann pairs) over the whole plane
      // drift: added to the line (the plan's choice itself does not weigh it).
      if (p.lower_groups > 0) {
        const double a_low = shell.a_km - p.offset_km;
        const Makeup low = drag_makeup(earth, atm, b, a_low, 0.0, p.days, spec.deadband_km, reentry_km);
        if (low.reentered)
          out.cannot_fly.push_back(fmt::format("the lower deployment drift orbit at {:.1f} km re-enters within one "
                                               "deadband cycle; expected smaller plane_offsets_km",
                                               a_low - earth.radius_km));
        drift_drag_m_s = low.dv_m_s;
        basis += fmt::format(", plus {:.2f} m/s of drag make-up at {:.1f} km", drift_drag_m_s, a_low - earth.radius_km);
      }
    }
    if (c.phasing_plan >= 0) {
      const DriftPlan& p = dep.phasing[static_cast<size_t>(c.phasing_plan)];
      basis += fmt::format("; then slots drift {} km off for {:.1f} days", p.offset_km, p.days);
    }
    basis += inj_propulsion_basis(spec.injection->propulsion);
    out.dv_lines.push_back({"deployment", c.dv_m_s + drift_drag_m_s, basis});
    out.deployment = std::move(dep);
  }

  // (a) drag make-up
  const Makeup mk = drag_makeup(earth, atm, b, shell.a_km, shell.e, life_days, spec.deadband_km, reentry_km);
  if (mk.reentered)
    out.cannot_fly.push_back("the orbit re-enters within one deadband cycle: drag make-up is not possible at this altitude");
  out.drag_makeup_manoeuvres = mk.raises;
  out.drag_makeup_interval_days = mk.raises > 0 ? life_days / static_cast<double>(mk.raises) : 0.0;
  out.drag_makeup_dv_m_s_per_year = mk.dv_m_s / spec.mission_life_years;
  out.dv_lines.push_back({"drag_makeup", mk.dv_m_s,
                          fmt::format("{} raises through a {} km deadband over {:.2f} yr ({}, {} activity)", mk.raises,
                                      spec.deadband_km, spec.mission_life_years, to_string(atm.kind), to_string(level))});

  // (b) node drift control
  const NodeRateSensitivity sens = node_rate_sensitivity(earth, shell.a_km, shell.e, i_rad);
  const double sig_i = spec.injection_sigma_inclination_deg * rad_per_deg;
  const double rate_sigma = std::hypot(sens.per_km * spec.injection_sigma_altitude_km, sens.per_rad * sig_i);
  out.node_spread_uncontrolled_deg = k * std::sqrt(2.0) * rate_sigma * life_s * deg_per_rad;
  double node_dv = 0.0;
  if (spec.node_control == NodeControl::correct) {
    // Budgeted at k sigma, or (a Monte Carlo draw) the drawn errors removed.
    const double dh_km = draw.injection_altitude_error_km ? std::abs(*draw.injection_altitude_error_km)
                                                          : k * spec.injection_sigma_altitude_km;
    const double di_rad = draw.injection_inclination_error_deg
                              ? std::abs(*draw.injection_inclination_error_deg) * rad_per_deg
                              : k * sig_i;
    node_dv = hohmann_dv_m_s(earth.mu_km3_s2, shell.a_km, shell.a_km + dh_km) + plane_change_dv_m_s(v, di_rad);
  }
  out.dv_lines.push_back(
      {"node_drift_control", node_dv,
       spec.node_control == NodeControl::correct
           ? fmt::format("remove {}-sigma injection errors ({} km, {} deg) once; uncontrolled they would spread the "
                         "nodes by {:.2f} deg over the life", k, k * spec.injection_sigma_altitude_km,
                         k * spec.injection_sigma_inclination_deg, out.node_spread_uncontrolled_deg)
           : fmt::format("not controlled: {}-sigma node spread {:.2f} deg over the life", k,
                         out.node_spread_uncontrolled_deg)});

  // (c) sun-synchronous inclination maintenance
  double sso_dv = 0.0;
  std::string sso_basis = "not a sun-synchronous shell";
  if (shell.sun_synchronous) {
    double worst = 0.0;
    for (double node : nodes) {
      const double ltan = local_time_of_node_h(node, jd);
      const double rate = solar_inclination_rate_rad_s(earth, shell.a_km, i_rad, ltan);
      if (std::abs(rate) > std::abs(worst)) worst = rate;
    }
    out.sso_inclination_drift_deg_per_year = worst * seconds_per_julian_year * deg_per_rad;
    const double di = std::abs(worst) * life_s;
    if (spec.sso_inclination_control) {
      sso_dv = plane_change_dv_m_s(v, di);
      sso_basis = fmt::format("remove {:.4f} deg/yr of solar-gravity drift (worst plane) over the life",
                              out.sso_inclination_drift_deg_per_year);
    } else {
      sso_basis = fmt::format("not controlled: {:.4f} deg/yr drift accepted", out.sso_inclination_drift_deg_per_year);
    }
  }
  out.dv_lines.push_back({"sso_inclination", sso_dv, sso_basis});

  // (d) slot keeping
  const double per_shift = phasing_dv_m_s(shell.a_km, spec.slot_shift_deg * rad_per_deg, spec.slot_shift_days * seconds_per_day);
  out.dv_lines.push_back({"slot_keeping", per_shift * spec.slot_shifts_per_year * spec.mission_life_years,
                          fmt::format("{} shifts/yr of {} deg in {} days", spec.slot_shifts_per_year,
                                      spec.slot_shift_deg, spec.slot_shift_days)});

  // (e) collision avoidance
  out.dv_lines.push_back({"collision_avoidance", spec.avoidance_per_year * spec.avoidance_dv_m_s * spec.mission_life_years,
                          fmt::format("{} manoeuvres/yr x {} m/s", spec.avoidance_per_year, spec.avoidance_dv_m_s)});

  // (f) disposal, from the maintained orbit at the end of the life
  const double r_apo = shell.a_km * (1.0 + shell.e);
  double disposal_dv = 0.0;
  std::string disposal_basis;
  out.disposal_perigee_km = out.perigee_km;
  OrbitAtmosphere eol = atm;  // the cycle continues from the end of the life
  switch (spec.disposal) {
    case DisposalMode::direct: {
      const double rp = earth.radius_km + spec.disposal_perigee_km;
      if (rp < shell.a_km * (1.0 - shell.e)) {
        disposal_dv = perigee_lowering_dv_m_s(earth.mu_km3_s2, r_apo, shell.a_km, rp);
        out.disposal_perigee_km = spec.disposal_perigee_km;
        out.disposal_burn = true;
      }
      disposal_basis = out.disposal_burn
                           ? fmt::format("direct re-entry: perigee to {} km", spec.disposal_perigee_km)
                           : fmt::format("no burn needed: the perigee is already at or below {} km",
                                         spec.disposal_perigee_km);
      break;
    }
    case DisposalMode::natural_decay: {
      const double rule_days = spec.disposal_rule_years * days_per_julian_year;
      const auto hp = disposal_perigee_for_rule_km(earth, eol, b, shell.a_km, shell.e, life_days, reentry_km, rule_days);
      if (hp) {
        const double rp = earth.radius_km + *hp;
        disposal_dv = perigee_lowering_dv_m_s(earth.mu_km3_s2, r_apo, shell.a_km, rp);
        out.disposal_perigee_km = *hp;
        const double a_new = 0.5 * (r_apo + rp), e_new = (r_apo - rp) / (r_apo + rp);
        out.disposal_lifetime_days =
            natural_lifetime(earth, eol, b, a_new, e_new, life_days, reentry_km, rule_days * 2.0).days;
      } else {
        out.disposal_lifetime_days =
            natural_lifetime(earth, eol, b, shell.a_km, shell.e, life_days, reentry_km, rule_days).days;
      }
      out.disposal_burn = hp.has_value();
      disposal_basis =
          hp ? fmt::format("lower the perigee to {:.1f} km to re-enter within {} yr ({} activity)",
                           out.disposal_perigee_km, spec.disposal_rule_years, to_string(level))
             : fmt::format("no burn needed: natural decay meets the {}-year rule ({} activity)", spec.disposal_rule_years,
                           to_string(level));
      break;
    }
    case DisposalMode::none:
      disposal_basis = "no disposal manoeuvre budgeted";
      out.warnings.push_back("no disposal manoeuvre is budgeted (budget.disposal.mode: none)");
      break;
  }
  out.dv_lines.push_back({"disposal", disposal_dv, disposal_basis});

  // (g) margin
  double sum = 0.0;
  for (const auto& l : out.dv_lines) sum += l.dv_m_s;
  const double margin = sum * spec.margin_percent / 100.0;
  out.dv_lines.push_back({"margin", margin, fmt::format("{}% of the lines above", spec.margin_percent)});
  out.total_dv_m_s = sum + margin;
  out.fleet_dv_m_s = out.total_dv_m_s * shell.satellites;

  // Propellant: the raise is flown first, so the station-keeping propellant (its lines and their margin, at
  // spacecraft.isp_s) is carried through it; the raise (and its margin share) burns at the raising engine's isp.
  // With one isp for both this is exactly m_dry (exp(total dv / c) - 1).
  // The deployment, flown between the raise and station keeping, burns at the raising engine's isp too.
  const double raise_total_m_s = out.raising ? out.raising->dv_m_s * (1.0 + spec.margin_percent / 100.0) : 0.0;
  double deploy_dv_m_s = 0.0;
  for (const auto& l : out.dv_lines)
    if (l.name == "deployment") deploy_dv_m_s = l.dv_m_s;
  const double deploy_total_m_s = deploy_dv_m_s * (1.0 + spec.margin_percent / 100.0);
  const double keep_total_m_s = out.total_dv_m_s - raise_total_m_s - deploy_total_m_s;
  if (out.raising) {
    RaisingFigures& rf = *out.raising;
    const InjectionSpec& inj = *spec.injection;
    if (rf.isp_s > 0.0) {
      double carried = sc.isp_s ? propellant_mass_kg(sc.dry_mass_kg, keep_total_m_s, *sc.isp_s) : 0.0;
      if (out.deployment) {
        out.deployment_propellant_kg = propellant_mass_kg(sc.dry_mass_kg + carried, deploy_total_m_s, rf.isp_s);
        carried += *out.deployment_propellant_kg;
      }
      rf.propellant_kg = propellant_mass_kg(sc.dry_mass_kg + carried, raise_total_m_s, rf.isp_s);
      if (inj.thrust_n) {
        const double m0 = sc.dry_mass_kg + carried + *rf.propellant_kg;
        rf.transfer_days = constant_thrust_burn_time_s(m0, rf.dv_m_s, *inj.thrust_n, rf.isp_s) / seconds_per_day;
      }
    }
    const std::string from = inj.perigee_km == inj.apogee_km
                                 ? fmt::format("circular {} km", inj.perigee_km)
                                 : fmt::format("{} x {} km", inj.perigee_km, inj.apogee_km);
    const std::string plane = rf.plane_change_deg > 0.0 ? fmt::format(", plane change {:.3f} deg", rf.plane_change_deg) : "";
    std::string& basis = out.dv_lines.front().basis;
    if (rf.propulsion == RaisingPropulsion::chemical) {
      basis = fmt::format("chemical from {}{}: two burns, the first at an apsis of the injection orbit, the second "
                          "circularising at the shell, plane change combined with the burn at the larger radius by "
                          "dv = sqrt(v1^2 + v2^2 - 2 v1 v2 cos di) (Hohmann; Vallado 2013 sec. 6.3-6.4)",
                          from, plane);
    } else {
      basis = fmt::format("electric from {}{}: dv = sqrt(v0^2 - 2 v0 v1 cos(pi/2 di) + v1^2) (Edelbaum 1961); {} N "
                          "at isp {} s for {} (t = (m0 c / F)(1 - exp(-dv / c)), c = g0 isp)",
                          from, plane, *inj.thrust_n, rf.isp_s,
                          rf.transfer_days ? fmt::format("{:.1f} days", *rf.transfer_days) : std::string("?"));
      if (!sc.isp_s)
        basis += "; m0 without station-keeping propellant (no spacecraft.isp_s), so the time is a lower bound";
      if (rf.transfer_days && *rf.transfer_days > life_days)
        out.warnings.push_back(fmt::format("the electric raise takes {:.0f} days, longer than the {} yr mission life",
                                           *rf.transfer_days, spec.mission_life_years));
    }
  }
  if (sc.isp_s) {
    out.propellant_kg = out.raising ? propellant_mass_kg(sc.dry_mass_kg, keep_total_m_s, *sc.isp_s) +
                                          out.deployment_propellant_kg.value_or(0.0) +
                                          out.raising->propellant_kg.value_or(0.0)
                                    : propellant_mass_kg(sc.dry_mass_kg, out.total_dv_m_s, *sc.isp_s);
    out.fleet_propellant_kg = *out.propellant_kg * shell.satellites;
    if (sc.propellant_capacity_kg && *out.propellant_kg > *sc.propellant_capacity_kg) {
      out.exceeds_tank = true;
      out.warnings.push_back(fmt::format("propellant {:.2f} kg per satellite exceeds the tank capacity {} kg",
                                         *out.propellant_kg, *sc.propellant_capacity_kg));
    }
  } else {
    out.propellant_missing = "no isp_s";
    out.warnings.push_back("no specific impulse (spacecraft.isp_s): propellant mass is not computed");
  }

  require_finite_figures(out, sc);

  PlausibilityInput pin;
  pin.mission_life_years = spec.mission_life_years;
  pin.ballistic_coefficient_m2_kg = b;
  pin.has_propulsion = sc.isp_s.has_value();
  pin.dry_mass_kg = sc.dry_mass_kg;
  pin.lifetime_natural_days = out.lifetime_natural_days;
  pin.lifetime_lower_bound = out.lifetime_lower_bound;
  pin.drag_makeup_raises = out.drag_makeup_manoeuvres;
  pin.total_dv_m_s = out.total_dv_m_s;
  pin.propellant_kg = out.propellant_kg;
  const Plausibility judged = judge_plausibility(pin);
  for (const auto& w : out.cannot_fly) out.warnings.push_back("cannot be flown: " + w);
  out.cannot_fly.insert(out.cannot_fly.end(), judged.cannot_fly.begin(), judged.cannot_fly.end());
  out.warnings.insert(out.warnings.end(), judged.warnings.begin(), judged.warnings.end());
  return out;
}

NaturalLifetime natural_lifetime(const EarthModel& earth, const OrbitAtmosphere& atm, double b, double a_km, double e,
                                 double t0_days, double reentry_km, double horizon_days) {
  DecayOptions opt;
  opt.reentry_altitude_km = reentry_km;
  opt.horizon_days = horizon_days;
  opt.record = false;
  const DecayResult r = require_decay(integrate_decay(earth, density_of(atm), b, {t0_days, a_km, e}, opt), "orbit");
  return {r.end.t_days - t0_days, r.stop != DecayStop::reentry};
}

std::optional<double> disposal_perigee_for_rule_km(const EarthModel& earth, const OrbitAtmosphere& atm, double b,
                                                   double a_km, double e, double t0_days, double reentry_km,
                                                   double rule_days) {
  if (!natural_lifetime(earth, atm, b, a_km, e, t0_days, reentry_km, rule_days).lower_bound) return std::nullopt;
  const double r_apo = a_km * (1.0 + e);
  auto outlives = [&](double hp_km) {
    const double rp = earth.radius_km + hp_km;
    return natural_lifetime(earth, atm, b, 0.5 * (r_apo + rp), (r_apo - rp) / (r_apo + rp), t0_days, reentry_km,
                            rule_days)
        .lower_bound;
  };
  double lo = reentry_km, hi = a_km * (1.0 - e) - earth.radius_km;  // lo re-enters at once, hi outlives the rule
  while (hi - lo > 0.05) {
    const double mid = 0.5 * (lo + hi);
    (outlives(mid) ? hi : lo) = mid;
  }
  return lo;  // the highest perigee found that still meets the rule
}

BudgetResult compute_budget(const Design& design, const BudgetOptions& options) {
  const BudgetSpec& spec = design.budget;
  const double b = design.spacecraft.ballistic_coefficient_m2_kg();
  if (!(b > 0.0) || !std::isfinite(b))
    throw InputError(fmt::format("{}: spacecraft: the ballistic coefficient Cd A / m = {} m^2/kg is not positive; "
                                 "expected drag_coefficient, drag_area_m2 and dry_mass_kg above zero", design.file, b));
  if (!(spec.mission_life_years > 0.0) || spec.mission_life_years > 100.0)
    throw InputError(fmt::format("{}: budget.mission_life_years {} is outside (0, 100]", design.file, spec.mission_life_years));
  if (!(options.lifetime_horizon_years > 0.0))
    throw InputError("the lifetime horizon must be positive");
  BudgetResult out;
  out.design = design.name;
  out.mission_life_years = spec.mission_life_years;
  out.atmosphere = spec.atmosphere;
  out.solar = options.solar.value_or(spec.solar);
  const double jd_epoch = julian_date(design.epoch).value();
  if (spec.solar_cycle_phase) {
    out.solar_cycle_phase_at_epoch = *spec.solar_cycle_phase;
  } else if (spec.solar_minimum_jd) {
    const double cycles = (jd_epoch - *spec.solar_minimum_jd) / (solar_cycle_years * days_per_julian_year);
    out.solar_cycle_phase_at_epoch = cycles - std::floor(cycles);
  } else {
    out.solar_cycle_phase_at_epoch = solar_cycle_phase_at(jd_epoch);
  }
  out.reentry_altitude_km = spec.reentry_altitude_km;
  out.shells.resize(design.shells.size());
  parallel_items(design.shells.size(), [&](size_t s) {
    // Every refusal of one shell's budget names the file and the shell.
    try {
      out.shells[s] =
          shell_budget_drawn(design, design.shells[s], out.solar, out.solar_cycle_phase_at_epoch, options, BudgetDraw{});
    } catch (const InputError& e) {
      throw InputError(fmt::format("{}: shell {}: {}", design.file, design.shells[s].name, e.what()));
    }
  });
  bool all_propellant = true;
  double fleet_prop = 0.0;
  for (const auto& s : out.shells) {
    out.fleet_dv_m_s += s.fleet_dv_m_s;
    if (s.fleet_propellant_kg) fleet_prop += *s.fleet_propellant_kg; else all_propellant = false;
    for (const auto& w : s.warnings) out.warnings.push_back("shell " + s.name + ": " + w);
  }
  // Each shell's fleet figures are finite (require_finite_figures), but their sum over the shells can still
  // pass the largest double (found by fuzz/design_fuzz.cpp: two shells of about 1e308 kg each).
  auto refuse_sum = [&](std::string_view figure, double value, std::string_view unit, auto shell_value) {
    std::string parts;
    for (const auto& s : out.shells) {
      const std::optional<double> v = shell_value(s);
      if (v) parts += fmt::format("{}{} {:.6g} {}", parts.empty() ? "" : ", ", s.name, *v, unit);
    }
    throw InputError(fmt::format("{}: the fleet {} over all shells is not finite ({}): the shells' fleet figures ({}) "
                                 "sum beyond the largest representable number; expected a larger spacecraft.isp_s or a "
                                 "smaller budget",
                                 design.file, figure, value, parts));
  };
  if (!std::isfinite(out.fleet_dv_m_s))
    refuse_sum("delta-v", out.fleet_dv_m_s, "m/s", [](const ShellBudget& s) { return std::optional<double>(s.fleet_dv_m_s); });
  if (all_propellant && !std::isfinite(fleet_prop))
    refuse_sum("propellant mass", fleet_prop, "kg", [](const ShellBudget& s) { return s.fleet_propellant_kg; });
  if (all_propellant) out.fleet_propellant_kg = fleet_prop;
  return out;
}

}  // namespace skein
