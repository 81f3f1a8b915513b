#pragma once
// Orbit raising from an injection orbit to a shell: two-impulse (chemical) and low-thrust (electric) transfers,
// and the burn time of a constant-thrust engine. Distances km, speeds m/s, angles rad, masses kg, thrust N.
namespace skein {

// The one burn that changes speed from v1 to v2 (m/s) and turns the velocity by di_rad, both along the local
// horizontal: the law of cosines, dv = sqrt(v1^2 + v2^2 - 2 v1 v2 cos(di)). Domain: v1, v2 >= 0, any di.
// Source: Vallado (2013), "Fundamentals of Astrodynamics and Applications", 4th ed., sec. 6.4 (combined
// changes of speed and inclination); Curtis, "Orbital Mechanics for Engineering Students", ch. 6 (plane changes).
// With v1 = v2 it is the pure plane change 2 v sin(di/2) (impulses.hpp).
double combined_burn_dv_m_s(double v1_m_s, double v2_m_s, double di_rad);

// A two-impulse transfer from an injection orbit of periapsis and apoapsis radii rp_km <= ra_km to the circle of
// radius target_km, changing the inclination by di_rad.
// Strategy: the first burn, at one apsis of the injection orbit (r_b), moves the other apsis to target_km; the
// second, at target_km, circularises. Both apsides are tried and the cheaper kept. The whole plane change goes
// with the burn at the larger radius (where the speed is lower; common practice: Vallado sec. 6.4 shows the
// optimal split puts most of it there), combined by the law of cosines. From a circular injection orbit this is
// the Hohmann transfer (Vallado 2013 sec. 6.3, Algorithm 36; Curtis ch. 6). Speeds from vis-viva
// v^2 = mu (2/r - 1/a). Domain: 0 < rp_km <= ra_km, target_km > 0, 0 <= di_rad <= pi.
struct ImpulsiveTransfer {
  double dv_m_s = 0.0;           // first + second burn
  double first_burn_m_s = 0.0;   // at the injection orbit's apsis first_burn_radius_km
  double second_burn_m_s = 0.0;  // at target_km
  double first_burn_radius_km = 0.0;
  bool plane_change_on_first = false;  // the plane change went with the first burn (it was at the larger radius)
};
ImpulsiveTransfer two_impulse_transfer(double mu_km3_s2, double rp_km, double ra_km, double target_km, double di_rad);

// Edelbaum's low-thrust transfer between circular orbits of radii r0_km and r1_km with a plane change di_rad,
// under constant acceleration and a piecewise-constant out-of-plane steering angle per revolution:
//   dv = sqrt(v0^2 - 2 v0 v1 cos(pi/2 di) + v1^2),   v = sqrt(mu / r).
// Source: T.N. Edelbaum, "Propulsion requirements for controllable satellites", ARS Journal 31 (1961) 1079-1089;
// the closed form as reformulated by J.A. Kechichian, J. Guidance Control Dyn. 20 (1997) 803-811 (formula recalled
// from memory: MEMORY; the tests integrate the averaged equations it solves). Domain: r0, r1 > 0, 0 <= di <= pi/2
// (beyond about 114.6 deg the constant-steering solution no longer applies; skein keeps to 90 deg). With di = 0 it
// is |v0 - v1|.
double edelbaum_dv_m_s(double mu_km3_s2, double r0_km, double r1_km, double di_rad);

// Time (s) a constant-thrust engine (thrust_n > 0, isp_s > 0) needs to give delta-v dv_m_s to a spacecraft of
// initial mass m0_kg: the mass flow is F/c with exhaust speed c = g0 Isp, and the rocket equation gives the
// propellant burnt m0 (1 - exp(-dv/c)), so t = (m0 c / F)(1 - exp(-dv/c)). Source: Tsiolkovsky rocket equation
// (1903) with constant mass flow (Vallado 2013 sec. 6.7, or any propulsion text); tends to m0 dv / F when dv << c.
double constant_thrust_burn_time_s(double m0_kg, double dv_m_s, double thrust_n, double isp_s);

}  // namespace skein
