#pragma once
// First-order J2 secular theory on mean elements.
#include "skein/constants.hpp"
#include "skein/orbit/elements.hpp"

namespace skein {

// Secular rates of the mean elements, rad/s.
struct SecularRates {
  double raan_rad_s = 0.0;          // node regression dOmega/dt
  double argp_rad_s = 0.0;          // apsidal rotation domega/dt
  double mean_anomaly_rad_s = 0.0;  // dM/dt = n + J2 correction
  double mean_motion_rad_s = 0.0;   // unperturbed Kepler n = sqrt(mu/a^3)
};

// Secular J2 rates for mean elements a (km), e (0 <= e < 1), i (rad); all rates rad/s.
// Source: D.A. Vallado, "Fundamentals of Astrodynamics and Applications", 4th ed. (2013), eq. 9-41:
//   dOmega/dt = -3/2 n J2 (Re/p)^2 cos i
//   domega/dt =  3/4 n J2 (Re/p)^2 (5 cos^2 i - 1)
//   dM/dt     =  n + 3/4 n J2 (Re/p)^2 sqrt(1 - e^2) (3 cos^2 i - 1),   p = a (1 - e^2).
SecularRates secular_rates(const EarthModel& earth, double a_km, double e, double i_rad);

// Anomalistic period (perigee to perigee), s: 2 pi / (dM/dt). Same source.
double anomalistic_period_s(const EarthModel& earth, double a_km, double e, double i_rad);

// Nodal (draconitic) period, node to node, s: 2 pi / (dM/dt + domega/dt).
// Source: Vallado (2013) sec. 11.4 (nodal period with J2).
double nodal_period_s(const EarthModel& earth, double a_km, double e, double i_rad);

// Kepler period 2 pi sqrt(a^3/mu), s.
double kepler_period_s(const EarthModel& earth, double a_km);

// Critical inclinations, where domega/dt = 0: sin^2 i = 4/5, i = 63.4349 deg and 116.5651 deg.
// Source: Vallado (2013) sec. 9.6; follows from eq. 9-41.
double critical_inclination_rad();

// Sensitivities of the node rate (rad/s per unit) to a (per km), i (per rad) and e, for injection
// dispersions. From differentiating Vallado eq. 9-41: dOmega/dt is proportional to a^(-7/2) (1-e^2)^(-2) cos i.
struct NodeRateSensitivity {
  double per_km = 0.0;    // d(dOmega/dt)/da = -7/2 (dOmega/dt) / a
  double per_rad = 0.0;   // d(dOmega/dt)/di = -(dOmega/dt) tan i  (written as +3/2 n J2 (Re/p)^2 sin i)
  double per_unit_e = 0.0;// d(dOmega/dt)/de = 4 e / (1 - e^2) dOmega/dt  (dM/dt's e-dependence through n unchanged)
};
NodeRateSensitivity node_rate_sensitivity(const EarthModel& earth, double a_km, double e, double i_rad);

}  // namespace skein
