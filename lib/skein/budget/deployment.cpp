#include "skein/budget/deployment.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "skein/angles.hpp"
#include "skein/budget/impulses.hpp"
#include "skein/budget/transfer.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/secular.hpp"

namespace skein {

double relative_node_rate_rad_s(const EarthModel& earth, double a_km, double a0_km, double i_rad) {
  return secular_rates(earth, a_km, 0.0, i_rad).raan_rad_s - secular_rates(earth, a0_km, 0.0, i_rad).raan_rad_s;
}

double relative_slot_rate_rad_s(const EarthModel& earth, double a_km, double a0_km, double i_rad) {
  const SecularRates r = secular_rates(earth, a_km, 0.0, i_rad);
  const SecularRates r0 = secular_rates(earth, a0_km, 0.0, i_rad);
  return (r.mean_anomaly_rad_s + r.argp_rad_s) - (r0.mean_anomaly_rad_s + r0.argp_rad_s);
}

namespace {

using RateFn = double (*)(const EarthModel&, double, double, double);

// One transfer between the shell and a drift orbit of radius a1_km: its delta-v, duration and the angle gained
// relative to the shell meanwhile (the same each way, since both legs pass the same radii).
struct Leg {
  double dv_m_s = 0.0;
  double seconds = 0.0;
  double angle_rad = 0.0;
};

Leg transfer_leg(const DeploymentOptions& o, double a1_km, RateFn rate) {
  const double mu = o.earth.mu_km3_s2, a0 = o.shell_a_km;
  Leg leg;
  if (o.propulsion == RaisingPropulsion::chemical) {
    leg.dv_m_s = hohmann_dv_m_s(mu, a0, a1_km);
    const double at = 0.5 * (a0 + a1_km);
    leg.seconds = pi * std::sqrt(at * at * at / mu);
    leg.angle_rad = rate(o.earth, at, a0, o.inclination_rad) * leg.seconds;
    return leg;
  }
  const double v0 = circular_speed_m_s(mu, a0), v1 = circular_speed_m_s(mu, a1_km);
  leg.dv_m_s = std::abs(v0 - v1);
  leg.seconds = constant_thrust_burn_time_s(o.mass_kg, leg.dv_m_s, o.thrust_n, o.isp_s);
  constexpr int n = 64;  // Simpson intervals (even)
  const double h = leg.seconds / n;
  double sum = 0.0;
  for (int k = 0; k <= n; ++k) {
    const double v_km_s = (v0 + (v1 - v0) * k / n) / 1000.0;
    const double f = rate(o.earth, mu / (v_km_s * v_km_s), a0, o.inclination_rad);
    sum += f * (k == 0 || k == n ? 1.0 : (k % 2 == 1 ? 4.0 : 2.0));
  }
  leg.angle_rad = sum * h / 3.0;
  return leg;
}

struct Entry {
  double share_deg = 0.0;  // [0, 360)
  int satellites = 0;      // moved together
};

std::optional<DriftPlan> drift_plan(const DeploymentOptions& o, double offset_km, const std::vector<Entry>& entries,
                                    RateFn rate, std::string& why) {
  struct Side {
    bool allowed = false;
    Leg leg;
    double rate_rad_s = 0.0;
  };
  Side sides[2];  // 0: lower, 1: higher
  const double radii[2] = {o.shell_a_km - offset_km, o.shell_a_km + offset_km};
  sides[0].allowed = radii[0] - o.earth.radius_km >= o.floor_altitude_km;
  sides[1].allowed = true;
  for (int s = 0; s < 2; ++s)
    if (sides[s].allowed) {
      sides[s].leg = transfer_leg(o, radii[s], rate);
      sides[s].rate_rad_s = rate(o.earth, radii[s], o.shell_a_km, o.inclination_rad);
    }
  DriftPlan p;
  p.offset_km = offset_km;
  const double per_day = deg_per_rad * seconds_per_day;
  p.lower_rate_deg_day = sides[0].rate_rad_s * per_day;
  p.higher_rate_deg_day = sides[1].rate_rad_s * per_day;
  for (const Entry& e : entries) {
    if (e.share_deg <= 0.0) continue;
    double best_s = std::numeric_limits<double>::infinity();
    int best = -1;
    bool overshoot = false;
    for (int s = 0; s < 2; ++s) {
      const Side& side = sides[s];
      if (!side.allowed || std::abs(side.rate_rad_s) < 1e-16) continue;
      const double needed_rad = (side.rate_rad_s > 0.0 ? e.share_deg : 360.0 - e.share_deg) * rad_per_deg;
      const double coast_s = (needed_rad - 2.0 * std::abs(side.leg.angle_rad)) / std::abs(side.rate_rad_s);
      if (coast_s < 0.0) {
        overshoot = true;
        continue;
      }
      const double t = 2.0 * side.leg.seconds + coast_s;
      if (t < best_s || (t == best_s && best >= 0 && side.leg.dv_m_s < sides[best].leg.dv_m_s)) {
        best_s = t;
        best = s;
      }
    }
    if (best < 0) {
      why = overshoot ? fmt::format("the transfers alone carry a group past its share of {:.6g} deg", e.share_deg)
                      : std::string("the drift rate does not change with altitude at this inclination");
      return std::nullopt;
    }
    const Side& side = sides[best];
    p.days = std::max(p.days, best_s / seconds_per_day);
    p.dv_m_s = std::max(p.dv_m_s, 2.0 * side.leg.dv_m_s);
    p.fleet_dv_m_s += e.satellites * 2.0 * side.leg.dv_m_s;
    p.leg_days = std::max(p.leg_days, side.leg.seconds / seconds_per_day);
    (best == 0 ? p.lower_groups : p.higher_groups) += 1;
  }
  return p;
}

double wrap_deg(double deg) { return wrap_two_pi(deg * rad_per_deg) * deg_per_rad; }

}  // namespace

DeploymentResult plan_deployment(const DeploymentOptions& o) {
  if (o.propulsion == RaisingPropulsion::electric) {
    if (!(o.thrust_n > 0.0) || !std::isfinite(o.thrust_n))
      throw InputError(fmt::format("budget.injection.thrust_n = {} N: expected a thrust above 0 for the deployment's "
                                   "electric transfers", o.thrust_n));
    if (!(o.isp_s > 0.0) || !std::isfinite(o.isp_s))
      throw InputError(fmt::format("budget.injection.isp_s = {} s: expected a specific impulse above 0 for the "
                                   "deployment's electric transfers", o.isp_s));
    if (!(o.mass_kg > 0.0) || !std::isfinite(o.mass_kg))
      throw InputError(fmt::format("spacecraft.dry_mass_kg = {} kg: expected a mass above 0", o.mass_kg));
  }
  for (double h : o.plane_offsets_km)
    if (!(h > 0.0) || !std::isfinite(h))
      throw InputError(fmt::format("budget.deployment.plane_offsets_km: {} km; expected offsets above 0", h));
  for (double h : o.phasing_offsets_km)
    if (!(h > 0.0) || !std::isfinite(h))
      throw InputError(fmt::format("budget.deployment.phasing_offsets_km: {} km; expected offsets above 0", h));

  std::vector<Entry> plane_entries, slot_entries;
  for (size_t j = 0; j < o.node_shares_deg.size(); ++j) {
    const int sats = j < o.slot_shares_deg.size() ? static_cast<int>(o.slot_shares_deg[j].size()) : 1;
    plane_entries.push_back({wrap_deg(o.node_shares_deg[j]), std::max(sats, 1)});
  }
  for (const auto& plane : o.slot_shares_deg)
    for (double s : plane) slot_entries.push_back({wrap_deg(s), 1});
  auto moves = [](const std::vector<Entry>& v) {
    return std::any_of(v.begin(), v.end(), [](const Entry& e) { return e.share_deg > 0.0; });
  };

  DeploymentResult r;
  auto trade = [&](const std::vector<double>& offsets, const std::vector<Entry>& entries, RateFn rate,
                   std::vector<DriftPlan>& out, std::string_view what, std::string_view key) {
    if (!moves(entries)) return;
    std::vector<std::pair<std::string, std::string>> why_all;  // reason, the offsets (km) that gave it
    for (double h : offsets) {
      std::string why;
      if (auto p = drift_plan(o, h, entries, rate, why)) {
        out.push_back(*p);
      } else {
        r.skipped.push_back(fmt::format("{} offset {} km: {}", what, h, why));
        auto same = std::find_if(why_all.begin(), why_all.end(), [&](const auto& w) { return w.first == why; });
        if (same == why_all.end()) why_all.push_back({why, fmt::format("{}", h)});
        else same->second += fmt::format(", {}", h);
      }
    }
    if (out.empty()) {
      std::string joined;
      for (const auto& w : why_all) joined += (joined.empty() ? "" : "; ") + w.second + " km: " + w.first;
      throw InputError(fmt::format("budget.deployment.{}: no offset spreads the {} ({}); expected offsets for which "
                                   "every group can drift to its share",
                                   key, what == "plane" ? "planes" : "slots", joined));
    }
  };
  trade(o.plane_offsets_km, plane_entries, relative_node_rate_rad_s, r.planes, "plane", "plane_offsets_km");
  trade(o.phasing_offsets_km, slot_entries, relative_slot_rate_rad_s, r.phasing, "phasing", "phasing_offsets_km");

  std::vector<int> pi_idx, ph_idx;
  for (int k = 0; k < static_cast<int>(r.planes.size()); ++k) pi_idx.push_back(k);
  for (int k = 0; k < static_cast<int>(r.phasing.size()); ++k) ph_idx.push_back(k);
  if (pi_idx.empty()) pi_idx.push_back(-1);
  if (ph_idx.empty()) ph_idx.push_back(-1);
  std::vector<DeploymentPoint> all;
  for (int a : pi_idx)
    for (int b : ph_idx) {
      DeploymentPoint pt;
      pt.plane_plan = a;
      pt.phasing_plan = b;
      for (const DriftPlan* p : {a >= 0 ? &r.planes[a] : nullptr, b >= 0 ? &r.phasing[b] : nullptr})
        if (p) {
          pt.days += p->days;
          pt.dv_m_s += p->dv_m_s;
          pt.fleet_dv_m_s += p->fleet_dv_m_s;
        }
      all.push_back(pt);
    }
  std::sort(all.begin(), all.end(), [](const DeploymentPoint& x, const DeploymentPoint& y) {
    return x.days != y.days ? x.days < y.days : x.dv_m_s < y.dv_m_s;
  });
  r.fastest_days = all.front().days;
  // Non-dominated: fewest days first, keep a point only when it needs less delta-v than every faster one.
  double best_dv = std::numeric_limits<double>::infinity();
  for (const auto& pt : all)
    if (pt.dv_m_s < best_dv) {
      r.curve.push_back(pt);
      best_dv = pt.dv_m_s;
    }
  r.deadline_days = o.deadline_days;
  if (o.deadline_days)
    for (const auto& pt : all)
      if (pt.days <= *o.deadline_days &&
          (!r.chosen || pt.dv_m_s < r.chosen->dv_m_s || (pt.dv_m_s == r.chosen->dv_m_s && pt.days < r.chosen->days)))
        r.chosen = pt;
  return r;
}

DeploymentOptions deployment_options(const Design& design, const Shell& shell) {
  const BudgetSpec& spec = design.budget;
  DeploymentOptions o;
  o.earth = design.earth;
  o.shell_a_km = shell.a_km;
  o.inclination_rad = shell.inclination_deg * rad_per_deg;
  if (shell.pattern == PatternKind::explicit_planes) {
    const double node0 = shell.explicit_planes.empty() ? 0.0 : shell.explicit_planes.front().raan_deg;
    for (const auto& p : shell.explicit_planes) {
      o.node_shares_deg.push_back(wrap_deg(p.raan_deg - node0));
      std::vector<double> slots;
      for (double s : p.slots_deg) slots.push_back(wrap_deg(s - p.slots_deg.front()));
      o.slot_shares_deg.push_back(slots);
    }
  } else {
    const int per_plane = shell.planes > 0 ? shell.satellites / shell.planes : 0;
    const double node0 = walker_plane_raan_rad(shell, 0);
    for (int p = 0; p < shell.planes; ++p) {
      o.node_shares_deg.push_back(wrap_two_pi(walker_plane_raan_rad(shell, p) - node0) * deg_per_rad);
      std::vector<double> slots;
      for (int k = 0; k < per_plane; ++k) slots.push_back(k * 360.0 / per_plane);
      o.slot_shares_deg.push_back(slots);
    }
  }
  if (spec.deployment) {
    o.plane_offsets_km = spec.deployment->plane_offsets_km;
    o.phasing_offsets_km = spec.deployment->phasing_offsets_km;
    o.deadline_days = spec.deployment->deadline_days;
  }
  if (spec.injection) {
    o.propulsion = spec.injection->propulsion;
    o.thrust_n = spec.injection->thrust_n.value_or(0.0);
    o.isp_s = spec.injection->isp_s.value_or(design.spacecraft.isp_s.value_or(0.0));
  }
  o.mass_kg = design.spacecraft.dry_mass_kg + design.spacecraft.propellant_capacity_kg.value_or(0.0);
  o.floor_altitude_km = std::max(minimum_perigee_altitude_km, spec.reentry_altitude_km);
  return o;
}

}  // namespace skein
