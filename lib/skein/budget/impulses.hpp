#pragma once
// Impulsive delta-v formulas of the budget lines and the rocket equation. Distances km, speeds m/s.
namespace skein {

// Circular speed sqrt(mu / r), m/s, for mu in km^3/s^2 and r in km.
double circular_speed_m_s(double mu_km3_s2, double r_km);

// Total delta-v of a two-impulse Hohmann transfer between circular orbits of radii r1 and r2 (km):
//   dv1 = sqrt(mu/r1) (sqrt(2 r2/(r1+r2)) - 1), dv2 = sqrt(mu/r2) (1 - sqrt(2 r1/(r1+r2))).
// Source: Vallado (2013) ch. 6, the Hohmann transfer (its Example 6-1 is checked in the tests).
// Small changes: about v |r2 - r1| / (2 r).
double hohmann_dv_m_s(double mu_km3_s2, double r1_km, double r2_km);

// One tangential burn at apoapsis radius r_apo (km) of an orbit of semi-major axis a_km that sets the
// periapsis radius to rp_new_km: dv = sqrt(mu (2/r_apo - 1/a)) - sqrt(mu (2/r_apo - 2/(r_apo + rp_new))).
// From the vis-viva equation v^2 = mu (2/r - 1/a) (Vallado 2013 ch. 1). For a circular orbit of radius r this is
// v_c [1 - sqrt(2 rp/(r + rp))].
double perigee_lowering_dv_m_s(double mu_km3_s2, double r_apo_km, double a_km, double rp_new_km);

// A plane change of di_rad at speed v_m_s (no change of speed): dv = 2 v sin(di/2).
// Source: Vallado (2013) ch. 6, inclination-only change of a circular orbit.
double plane_change_dv_m_s(double v_m_s, double di_rad);

// Drag delta-v per revolution of a circular orbit: dv = pi B rho a v (B = Cd A/m in m^2/kg, rho kg/m^3):
// the drag acceleration rho v^2 B / 2 over one period 2 pi a / v. Source: J.R. Wertz, W.J. Larson (eds.),
// "Space Mission Analysis and Design", 3rd ed. (1999), Table 6-3 (recalled from memory: MEMORY; it follows
// directly from the drag acceleration, so it is checked against the integrator in the tests).
double drag_dv_per_rev_m_s(double mu_km3_s2, double a_km, double b_m2_kg, double rho_kg_m3);

// In-plane phasing: move a slot by shift_rad along its orbit over duration_s by changing a by da and back.
// The along-track drift rate is (3/2) (n/a) da (Kepler's third law, dn/da = -3n/(2a)) and each of the two
// small transfers costs v da/(2a) (Hohmann, small change), so dv = 2 a shift / (3 duration), a in m.
// Source: derived here from Kepler's third law and the Hohmann cost (Vallado 2013 ch. 6, phasing and
// Hohmann transfers); first order in da/a.
double phasing_dv_m_s(double a_km, double shift_rad, double duration_s);

// Propellant mass (kg) for delta-v dv_m_s with specific impulse isp_s from final (dry) mass dry_mass_kg:
// m_p = m_dry (exp(dv / (g0 Isp)) - 1). Source: K. Tsiolkovsky (1903) rocket equation; g0 = 9.80665 m/s^2.
double propellant_mass_kg(double dry_mass_kg, double dv_m_s, double isp_s);

}  // namespace skein
