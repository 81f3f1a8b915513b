#pragma once
// Beta angle and eclipses of every plane over a span from the epoch (one year by default), with the J2 node
// (and perigee) drift and the Sun's motion: part of `skein drift` and the report.
//
// Shadow model: cylindrical. The Sun's rays are parallel (direction from the Earth's centre to the Sun), the
// Earth is a sphere of the design Earth model's equatorial radius, and a satellite at r is in shadow when
// r . s < 0 and its distance from the Earth-Sun line, |r - (r . s) s|, is below that radius. No penumbra, no
// atmosphere, no oblateness. Source of the model: D.A. Vallado, "Fundamentals of Astrodynamics and
// Applications", 4th ed. (2013), sec. 5.3 (the cylindrical shadow test; MEMORY, not re-read).
//
// Circular orbits (e = 0) use the closed form below. Eccentric orbits (e > 0) are sampled: the shadow
// condition is evaluated at evenly spaced true anomalies over one orbit (with that day's node and argument of
// perigee) and every change of state is refined by bisection, so the result is the cylinder test itself on the
// Kepler ellipse; an eclipse shorter than one sample spacing can be missed (see BetaEclipseOptions).
#include <Eigen/Core>
#include <string>
#include <vector>

#include "skein/design/design.hpp"
#include "skein/orbit/elements.hpp"

namespace skein {

struct BetaEclipseOptions {
  double span_days = 365.0;     // from the epoch; samples at 0, step, 2 step, ... <= span
  double step_days = 1.0;       // sample spacing
  int orbit_samples = 720;      // e > 0 only: shadow samples per orbit before refinement (0.5 deg of true anomaly)
};

struct BetaEclipseSample {
  double day = 0.0;                   // days from the epoch
  double beta_deg = 0.0;              // Sun elevation above the orbit plane, [-90, 90], positive on the orbit normal's side
  double eclipse_fraction = 0.0;      // share of one orbit in shadow, [0, 1)
  double eclipse_min_per_orbit = 0.0; // eclipse_fraction x the orbit period used (see ShellBetaEclipse::period_s)
  double longest_eclipse_min = 0.0;   // the longest single shadow arc of that orbit (equal to the above when
                                      // the orbit has one arc, always so for circular orbits)
};

struct PlaneBetaEclipse {
  int plane = 0;                       // 0-based plane within the shell
  double raan0_deg = 0.0;              // node at epoch
  std::vector<BetaEclipseSample> samples;
  double beta_min_deg = 0.0, beta_max_deg = 0.0;
  double longest_eclipse_min = 0.0;    // over all samples; 0 when never eclipsed
  double longest_eclipse_day = 0.0;    // the first sample day where it occurs (0 when never eclipsed)
  double max_eclipse_fraction = 0.0;
  double eclipse_free_days = 0.0;      // samples with no shadow, times step_days
};

struct ShellBetaEclipse {
  std::string name;
  bool circular = true;                // closed form (e = 0) or sampled (e > 0)
  double period_s = 0.0;               // nodal period (circular) or anomalistic period (eccentric), see the .cpp
  double beta_limit_deg = 0.0;         // circular: asin(Re / a), no eclipse at |beta| >= this; eccentric: 0 (none)
  double max_eclipse_min = 0.0;        // circular: the closed form at beta = 0; eccentric: 0 (none)
  std::vector<PlaneBetaEclipse> planes;
};

struct BetaEclipseResult {
  double span_days = 0.0, step_days = 0.0;
  std::vector<ShellBetaEclipse> shells;  // in design order
};

// Every plane of every shell, sampled from the epoch over options.span_days. Throws InputError when the options
// are not finite and positive, or the sample count exceeds 100000 per plane.
BetaEclipseResult compute_beta_eclipse(const Design& design, const BetaEclipseOptions& options = {});

// Beta angle (rad, [-pi/2, pi/2]) of a plane of inclination i_rad and node raan_rad (inertial, equator and
// equinox of the Sun direction's frame) for the unit Sun direction sun_unit: sin beta = h . s with the orbit
// normal h = (sin i sin Omega, -sin i cos Omega, cos i), i.e.
//   sin beta = cos(dec) sin i sin(Omega - RA) + sin(dec) cos i.
// Source: Vallado (2013) sec. 5.3; SMAD (Wertz and Larson 1999) ch. 5 (FOUND, shared/references.md 9.1).
double beta_angle_rad(double i_rad, double raan_rad, const Eigen::Vector3d& sun_unit);

// Share of a circular orbit of radius r_km (> earth_radius_km) in the cylindrical shadow at beta angle beta_rad:
//   f = (1/pi) acos( sqrt(r^2 - R^2) / (r cos beta) )  for |beta| < beta* = asin(R / r), else 0.
// Derivation (in the orbit plane, u the angle from the anti-Sun projection): r . s = -r cos(beta) cos(u) and the
// squared distance from the Sun line is r^2 (1 - cos^2(beta) cos^2(u)); shadow needs cos u > sqrt(r^2 - R^2) /
// (r cos beta), an arc of half-width acos of that. Published in this form in Vallado (2013) sec. 5.3 and in
// thermal-design primers on the beta angle (MEMORY for the citation; the derivation above is the check).
double circular_eclipse_fraction(double r_km, double earth_radius_km, double beta_rad);

// The cylindrical shadow (radius earth.radius_km) over one orbit of the Kepler ellipse el (its node and perigee
// as given, el.mean_anomaly_rad ignored), sampled at `samples` evenly spaced true anomalies and refined by
// bisection to 1e-10 rad of true anomaly at every change; the changes are turned into mean anomalies (time).
// Returns the shares of one orbit (in mean anomaly, hence in time) in shadow in total and in the longest single
// arc. Works for e = 0 too (used by the tests against the closed form).
struct ShadowShares {
  double total = 0.0;
  double longest_arc = 0.0;
};
ShadowShares sampled_shadow_shares(const EarthModel& earth, const MeanElements& el, const Eigen::Vector3d& sun_unit,
                                   int samples);

}  // namespace skein
