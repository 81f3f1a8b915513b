#include "skein/orbit/propagate.hpp"

#include <cassert>
#include <cmath>

#include <Eigen/Geometry>

namespace skein {

double eccentric_anomaly_rad(double mean_anomaly_rad, double e) {
  assert(e >= 0.0 && e < 1.0);
  const double m = wrap_pi(mean_anomaly_rad);
  double ecc = (e < 0.8) ? m : (m < 0 ? -pi : pi);
  for (int k = 0; k < 50; ++k) {
    const double f = ecc - e * std::sin(ecc) - m;
    const double step = f / (1.0 - e * std::cos(ecc));
    ecc -= step;
    if (std::abs(step) < 1e-14) break;
  }
  return ecc + (mean_anomaly_rad - m);
}

StateVector state_from_elements(const EarthModel& earth, const MeanElements& el) {
  const double ecc_anom = eccentric_anomaly_rad(el.mean_anomaly_rad, el.e);
  const double cos_e = std::cos(ecc_anom), sin_e = std::sin(ecc_anom);
  const double b = std::sqrt(1.0 - el.e * el.e);
  // Perifocal position and velocity.
  const double x = el.a_km * (cos_e - el.e);
  const double y = el.a_km * b * sin_e;
  const double r = el.a_km * (1.0 - el.e * cos_e);
  const double n = std::sqrt(earth.mu_km3_s2 / (el.a_km * el.a_km * el.a_km));
  const double vx = -el.a_km * n * sin_e * el.a_km / r;
  const double vy = el.a_km * n * b * cos_e * el.a_km / r;

  const double co = std::cos(el.raan_rad), so = std::sin(el.raan_rad);
  const double cw = std::cos(el.argp_rad), sw = std::sin(el.argp_rad);
  const double ci = std::cos(el.i_rad), si = std::sin(el.i_rad);
  // Columns P and Q of the perifocal-to-inertial rotation.
  const Eigen::Vector3d p(co * cw - so * sw * ci, so * cw + co * sw * ci, sw * si);
  const Eigen::Vector3d q(-co * sw - so * cw * ci, -so * sw + co * cw * ci, cw * si);
  StateVector s;
  s.r_km = x * p + y * q;
  s.v_km_s = vx * p + vy * q;
  return s;
}

SecularOrbit make_secular_orbit(const EarthModel& earth, const MeanElements& el) {
  return SecularOrbit{el, secular_rates(earth, el.a_km, el.e, el.i_rad)};
}

MeanElements elements_at(const SecularOrbit& orbit, double dt_s) {
  MeanElements el = orbit.epoch_elements;
  el.raan_rad = wrap_two_pi(el.raan_rad + orbit.rates.raan_rad_s * dt_s);
  el.argp_rad = wrap_two_pi(el.argp_rad + orbit.rates.argp_rad_s * dt_s);
  el.mean_anomaly_rad = wrap_two_pi(el.mean_anomaly_rad + orbit.rates.mean_anomaly_rad_s * dt_s);
  return el;
}

StateVector state_at(const EarthModel& earth, const SecularOrbit& orbit, double dt_s) {
  return state_from_elements(earth, elements_at(orbit, dt_s));
}

Eigen::Vector3d inertial_to_earth_fixed(const Eigen::Vector3d& r_eci, double greenwich_angle_rad) {
  const double c = std::cos(greenwich_angle_rad), s = std::sin(greenwich_angle_rad);
  return Eigen::Vector3d(c * r_eci.x() + s * r_eci.y(), -s * r_eci.x() + c * r_eci.y(), r_eci.z());
}

EarthFixedState earth_fixed_state_at(const EarthModel& earth, const SecularOrbit& orbit, double theta_rad, double dt_s) {
  const StateVector sv = state_at(earth, orbit, dt_s);
  EarthFixedState out;
  out.r_km = inertial_to_earth_fixed(sv.r_km, theta_rad);
  const SecularRates& rt = orbit.rates;
  const Eigen::Vector3d h_unit = sv.r_km.cross(sv.v_km_s).normalized();
  const Eigen::Vector3d v_in = sv.v_km_s * (rt.mean_anomaly_rad_s / rt.mean_motion_rad_s) +
                               rt.argp_rad_s * h_unit.cross(sv.r_km) +
                               rt.raan_rad_s * Eigen::Vector3d(-sv.r_km.y(), sv.r_km.x(), 0.0);
  out.v_km_s = inertial_to_earth_fixed(v_in, theta_rad) +
               Eigen::Vector3d(earth.rotation_rad_s * out.r_km.y(), -earth.rotation_rad_s * out.r_km.x(), 0.0);
  return out;
}

}  // namespace skein
