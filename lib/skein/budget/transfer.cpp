#include "skein/budget/transfer.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"

namespace skein {
namespace {
// Vis-viva speed (m/s) at radius r on an orbit of semi-major axis a (km, mu km^3/s^2).
double vis_viva_m_s(double mu, double r, double a) { return std::sqrt(mu * (2.0 / r - 1.0 / a)) * 1000.0; }

// First burn at r_b (an apsis of the injection orbit of semi-major axis a_inj) to the transfer orbit with apsides
// r_b and target; second burn at target to the circle.
ImpulsiveTransfer via(double mu, double r_b, double a_inj, double target, double di) {
  ImpulsiveTransfer t;
  t.first_burn_radius_km = r_b;
  const double a_tr = 0.5 * (r_b + target);
  const double v_inj = vis_viva_m_s(mu, r_b, a_inj), v_tr_b = vis_viva_m_s(mu, r_b, a_tr);
  const double v_tr_t = vis_viva_m_s(mu, target, a_tr), v_circ = vis_viva_m_s(mu, target, target);
  t.plane_change_on_first = r_b >= target;  // at equal radii: one combined burn
  t.first_burn_m_s = combined_burn_dv_m_s(v_inj, v_tr_b, t.plane_change_on_first ? di : 0.0);
  t.second_burn_m_s = combined_burn_dv_m_s(v_tr_t, v_circ, t.plane_change_on_first ? 0.0 : di);
  t.dv_m_s = t.first_burn_m_s + t.second_burn_m_s;
  return t;
}
}  // namespace

double combined_burn_dv_m_s(double v1, double v2, double di) {
  // max(.., 0): rounding can make the radicand a hair negative when v1 = v2 and di = 0.
  return std::sqrt(std::max(v1 * v1 + v2 * v2 - 2.0 * v1 * v2 * std::cos(di), 0.0));
}

ImpulsiveTransfer two_impulse_transfer(double mu, double rp, double ra, double target, double di) {
  const double a_inj = 0.5 * (rp + ra);
  const ImpulsiveTransfer at_p = via(mu, rp, a_inj, target, di), at_a = via(mu, ra, a_inj, target, di);
  return at_a.dv_m_s < at_p.dv_m_s ? at_a : at_p;
}

double edelbaum_dv_m_s(double mu, double r0, double r1, double di) {
  const double v0 = std::sqrt(mu / r0) * 1000.0, v1 = std::sqrt(mu / r1) * 1000.0;
  return std::sqrt(std::max(v0 * v0 - 2.0 * v0 * v1 * std::cos(pi / 2.0 * di) + v1 * v1, 0.0));
}

double constant_thrust_burn_time_s(double m0_kg, double dv_m_s, double thrust_n, double isp_s) {
  const double c = standard_gravity_m_s2 * isp_s;
  return m0_kg * c / thrust_n * -std::expm1(-dv_m_s / c);
}

}  // namespace skein
