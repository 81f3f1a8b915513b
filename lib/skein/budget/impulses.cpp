#include "skein/budget/impulses.hpp"

#include <cmath>

#include "skein/constants.hpp"

namespace skein {

double circular_speed_m_s(double mu, double r_km) { return std::sqrt(mu / r_km) * 1000.0; }

double hohmann_dv_m_s(double mu, double r1, double r2) {
  const double s = r1 + r2;
  const double dv1 = std::sqrt(mu / r1) * std::abs(std::sqrt(2.0 * r2 / s) - 1.0);
  const double dv2 = std::sqrt(mu / r2) * std::abs(1.0 - std::sqrt(2.0 * r1 / s));
  return (dv1 + dv2) * 1000.0;
}

double perigee_lowering_dv_m_s(double mu, double r_apo, double a, double rp_new) {
  const double v_now = std::sqrt(mu * (2.0 / r_apo - 1.0 / a));
  const double v_new = std::sqrt(mu * (2.0 / r_apo - 2.0 / (r_apo + rp_new)));
  return std::abs(v_now - v_new) * 1000.0;
}

double plane_change_dv_m_s(double v_m_s, double di_rad) { return 2.0 * v_m_s * std::sin(std::abs(di_rad) / 2.0); }

double drag_dv_per_rev_m_s(double mu, double a_km, double b, double rho) {
  return pi * b * rho * (a_km * 1000.0) * circular_speed_m_s(mu, a_km);
}

double phasing_dv_m_s(double a_km, double shift_rad, double duration_s) {
  return 2.0 * (a_km * 1000.0) * std::abs(shift_rad) / (3.0 * duration_s);
}

double propellant_mass_kg(double dry_mass_kg, double dv_m_s, double isp_s) {
  return dry_mass_kg * std::expm1(dv_m_s / (standard_gravity_m_s2 * isp_s));
}

}  // namespace skein
