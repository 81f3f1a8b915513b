#include "skein/drift/beta_eclipse.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

#include "skein/angles.hpp"
#include "skein/constants.hpp"
#include "skein/design/plane_nodes.hpp"
#include "skein/error.hpp"
#include "skein/orbit/secular.hpp"
#include "skein/parallel_items.hpp"
#include "skein/time/sun.hpp"

namespace skein {
namespace {

constexpr double max_samples_per_plane = 100000.0;
// Shadow samples of eccentric orbits in one call (about 25 ns each with the bisections; 4e9 is about a minute
// and a half on one core of the development machine), common practice for an interactive command.
constexpr double max_eccentric_shadow_samples = 4e9;

// Signed shadow depth (km) of position r for the unit Sun direction s and Earth radius R: negative exactly when
// r is in the cylindrical shadow (r . s < 0 and distance from the Sun line below R). Continuous in r, so a change
// of sign between two samples brackets a shadow entry or exit.
double shadow_depth_km(const Eigen::Vector3d& r, const Eigen::Vector3d& s, double radius_km) {
  const double along = r.dot(s);
  const double off_line = (r - along * s).norm();
  return std::max(along, off_line - radius_km);
}

}  // namespace

double beta_angle_rad(double i_rad, double raan_rad, const Eigen::Vector3d& sun_unit) {
  const Eigen::Vector3d h(std::sin(i_rad) * std::sin(raan_rad), -std::sin(i_rad) * std::cos(raan_rad), std::cos(i_rad));
  return std::asin(std::clamp(h.dot(sun_unit), -1.0, 1.0));
}

double circular_eclipse_fraction(double r_km, double earth_radius_km, double beta_rad) {
  assert(r_km > earth_radius_km);
  const double c = std::sqrt(r_km * r_km - earth_radius_km * earth_radius_km) / (r_km * std::cos(beta_rad));
  if (!(c < 1.0)) return 0.0;  // |beta| >= beta*: the orbit clears the shadow cylinder
  return std::acos(c) / pi;
}

ShadowShares sampled_shadow_shares(const EarthModel& earth, const MeanElements& el, const Eigen::Vector3d& sun_unit,
                                   int samples) {
  assert(samples >= 8 && el.e >= 0.0 && el.e < 1.0);
  const double radius = earth.radius_km, e = el.e, p = el.a_km * (1.0 - e * e);
  // Perifocal unit vectors (to perigee, and 90 deg ahead in the orbit plane) in the inertial frame, from the
  // rotation R3(-Omega) R1(-i) R3(-omega) of Vallado (2013) Algorithm 10, as in orbit/propagate.cpp.
  const double cO = std::cos(el.raan_rad), sO = std::sin(el.raan_rad), cw = std::cos(el.argp_rad),
               sw = std::sin(el.argp_rad), ci = std::cos(el.i_rad), si = std::sin(el.i_rad);
  const Eigen::Vector3d P(cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si);
  const Eigen::Vector3d Q(-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si);
  // The shadow depth along the orbit as a function of true anomaly nu (conic r = p / (1 + e cos nu)): no Kepler
  // equation to solve while searching.
  auto depth_at = [&](double nu) {
    const double c = std::cos(nu), sn = std::sin(nu);
    const double r = p / (1.0 + e * c);
    const Eigen::Vector3d pos = r * (c * P + sn * Q);
    return shadow_depth_km(pos, sun_unit, radius);
  };
  // Mean anomaly (rad, [0, 2 pi)) of true anomaly nu: E = atan2(sqrt(1 - e^2) sin nu, e + cos nu), M = E - e sin E
  // (Vallado 2013 sec. 2.2).
  auto mean_anomaly = [&](double nu) {
    const double E = std::atan2(std::sqrt(1.0 - e * e) * std::sin(nu), e + std::cos(nu));
    return wrap_two_pi(E - e * std::sin(E));
  };
  const double dnu = two_pi / samples;
  std::vector<double> depth(static_cast<size_t>(samples));
  for (int k = 0; k < samples; ++k) depth[static_cast<size_t>(k)] = depth_at(k * dnu);
  // The true anomaly of each change of state, refined by bisection inside its sample interval.
  struct Change {
    double m;     // mean anomaly of the change
    bool enters;  // true: lit to shadow
  };
  std::vector<Change> changes;
  for (int k = 0; k < samples; ++k) {
    const double d0 = depth[static_cast<size_t>(k)], d1 = depth[static_cast<size_t>((k + 1) % samples)];
    const bool s0 = d0 < 0.0, s1 = d1 < 0.0;
    if (s0 == s1) continue;
    double lo = k * dnu, hi = lo + dnu;
    while (hi - lo > 1e-10) {
      const double mid = 0.5 * (lo + hi);
      ((depth_at(mid) < 0.0) == s0 ? lo : hi) = mid;
    }
    changes.push_back({mean_anomaly(0.5 * (lo + hi)), s1});
  }
  ShadowShares out;
  if (changes.empty()) {
    if (depth[0] < 0.0) out.total = out.longest_arc = 1.0;  // cannot happen above the Earth; kept exact
    return out;
  }
  // Changes alternate between entry and exit; pair every entry with the next exit (wrapping round the orbit).
  // Time runs with mean anomaly, so each arc's share of the orbit is its length in mean anomaly over 2 pi.
  const size_t n = changes.size();
  assert(n % 2 == 0);
  for (size_t k = 0; k < n; ++k) {
    if (!changes[k].enters) continue;
    const Change& exit = changes[(k + 1) % n];
    assert(!exit.enters);
    double arc = exit.m - changes[k].m;
    if (arc < 0.0) arc += two_pi;
    out.total += arc / two_pi;
    out.longest_arc = std::max(out.longest_arc, arc / two_pi);
  }
  return out;
}

// Per plane and sample day t (days from the epoch): the node Omega0 + dOmega/dt t and the argument of perigee
// omega0 + domega/dt t from the J2 secular rates (Vallado 2013 eq. 9-41, orbit/secular.hpp), the Sun from the
// Almanac low-precision formula (time/sun.hpp, 0.01 deg). The Sun is of date and the node in the epoch's frame:
// precession over a year is 0.014 deg, neglected (common practice for design work).
// Eclipse minutes: the shadow share times the period of the angle the shadow arc is measured in. For a circular
// orbit the arc is in argument of latitude, which turns once per nodal period (Vallado 2013 sec. 11.4); for an
// eccentric orbit it is in mean anomaly, once per anomalistic period. The two differ by about 0.1 % in LEO.
BetaEclipseResult compute_beta_eclipse(const Design& design, const BetaEclipseOptions& options) {
  if (!std::isfinite(options.span_days) || !(options.span_days > 0.0))
    throw InputError(fmt::format("beta and eclipse span = {} days: expected a positive number of days", options.span_days));
  if (!std::isfinite(options.step_days) || !(options.step_days > 0.0))
    throw InputError(fmt::format("beta and eclipse step = {} days: expected a positive number of days", options.step_days));
  const double count = std::floor(options.span_days / options.step_days + 1e-9) + 1.0;
  if (count > max_samples_per_plane)
    throw InputError(fmt::format("beta and eclipse sampling: {:.0f} samples per plane, above the limit of {:.0f}; "
                                 "expected a longer step or a shorter span",
                                 count, max_samples_per_plane));
  if (options.orbit_samples < 8 || options.orbit_samples > 100000)
    throw InputError(fmt::format("beta and eclipse orbit samples = {}: expected 8 to 100000", options.orbit_samples));
  // The eccentric planes are sampled along every orbit of every sample day: bound that work before it starts.
  double eccentric_plane_days = 0.0;
  for (const Shell& sh : design.shells)
    if (sh.e != 0.0) eccentric_plane_days += static_cast<double>(sh.planes) * count;
  if (eccentric_plane_days * options.orbit_samples > max_eccentric_shadow_samples)
    throw InputError(fmt::format(
        "beta and eclipse: {:.0f} eccentric plane-days sampled {} times per orbit, above the limit of {:.0f} shadow "
        "samples (eclipses of eccentric orbits are found along each orbit); expected fewer eccentric planes",
        eccentric_plane_days, options.orbit_samples, max_eccentric_shadow_samples));
  const EarthModel& earth = design.earth;
  const JulianDate jd0 = julian_date(design.epoch);
  const int samples = static_cast<int>(count);
  BetaEclipseResult out;
  out.span_days = options.span_days;
  out.step_days = options.step_days;
  // The Sun at each sample day, shared by every plane.
  std::vector<Eigen::Vector3d> sun(static_cast<size_t>(samples));
  for (int k = 0; k < samples; ++k) sun[static_cast<size_t>(k)] = sun_position({jd0.day, jd0.fraction + k * options.step_days}).unit_eci;
  std::vector<SecularRates> rates;
  for (const Shell& sh : design.shells) {
    const double i = sh.inclination_deg * rad_per_deg;
    rates.push_back(secular_rates(earth, sh.a_km, sh.e, i));
    ShellBetaEclipse shell;
    shell.name = sh.name;
    shell.circular = sh.e == 0.0;
    shell.period_s = shell.circular ? nodal_period_s(earth, sh.a_km, sh.e, i) : anomalistic_period_s(earth, sh.a_km, sh.e, i);
    if (shell.circular) {
      shell.beta_limit_deg = std::asin(earth.radius_km / sh.a_km) * deg_per_rad;
      shell.max_eclipse_min = circular_eclipse_fraction(sh.a_km, earth.radius_km, 0.0) * shell.period_s / 60.0;
    }
    shell.planes.resize(static_cast<size_t>(sh.planes));
    out.shells.push_back(std::move(shell));
  }
  // Planes are independent: computed in parallel, each into its own slot, so the result does not depend on the
  // thread count.
  const std::vector<PlaneNode> nodes = plane_nodes(design);
  parallel_items(nodes.size(), [&](size_t n) {
    const PlaneNode& node = nodes[n];
    const Shell& sh = design.shells[static_cast<size_t>(node.shell)];
    const ShellBetaEclipse& shell = out.shells[static_cast<size_t>(node.shell)];
    const SecularRates& rate = rates[static_cast<size_t>(node.shell)];
    const double i = sh.inclination_deg * rad_per_deg;
    PlaneBetaEclipse plane;
    plane.plane = node.plane;
    plane.raan0_deg = node.raan_deg;
    plane.beta_min_deg = 90.0;
    plane.beta_max_deg = -90.0;
    for (int k = 0; k < samples; ++k) {
      const double day = k * options.step_days;
      const double dt_s = day * seconds_per_day;
      const Eigen::Vector3d& s_hat = sun[static_cast<size_t>(k)];
      const double raan = wrap_two_pi(node.raan_deg * rad_per_deg + rate.raan_rad_s * dt_s);
      BetaEclipseSample x;
      x.day = day;
      const double beta = beta_angle_rad(i, raan, s_hat);
      x.beta_deg = beta * deg_per_rad;
      if (shell.circular) {
        x.eclipse_fraction = circular_eclipse_fraction(sh.a_km, earth.radius_km, beta);
        x.eclipse_min_per_orbit = x.longest_eclipse_min = x.eclipse_fraction * shell.period_s / 60.0;
      } else {
        const MeanElements el{sh.a_km, sh.e, i, raan, wrap_two_pi(sh.argp_deg * rad_per_deg + rate.argp_rad_s * dt_s), 0.0};
        const ShadowShares share = sampled_shadow_shares(earth, el, s_hat, options.orbit_samples);
        x.eclipse_fraction = share.total;
        x.eclipse_min_per_orbit = share.total * shell.period_s / 60.0;
        x.longest_eclipse_min = share.longest_arc * shell.period_s / 60.0;
      }
      plane.beta_min_deg = std::min(plane.beta_min_deg, x.beta_deg);
      plane.beta_max_deg = std::max(plane.beta_max_deg, x.beta_deg);
      if (x.longest_eclipse_min > plane.longest_eclipse_min) {
        plane.longest_eclipse_min = x.longest_eclipse_min;
        plane.longest_eclipse_day = day;
      }
      plane.max_eclipse_fraction = std::max(plane.max_eclipse_fraction, x.eclipse_fraction);
      if (x.eclipse_fraction == 0.0) plane.eclipse_free_days += options.step_days;
      plane.samples.push_back(x);
    }
    out.shells[static_cast<size_t>(node.shell)].planes[static_cast<size_t>(node.plane)] = std::move(plane);
  });
  return out;
}

}  // namespace skein
