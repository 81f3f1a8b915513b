#pragma once
// Mean-element propagation under the J2 secular model, and conversion to Cartesian states.
// Frame: an Earth-centred inertial frame aligned with the mean equator and equinox of the epoch
// (precession over a mission span is ignored, a common-practice simplification for design work).
#include <Eigen/Core>

#include "skein/angles.hpp"
#include "skein/constants.hpp"
#include "skein/orbit/elements.hpp"
#include "skein/orbit/secular.hpp"

namespace skein {

struct StateVector {
  Eigen::Vector3d r_km = Eigen::Vector3d::Zero();
  Eigen::Vector3d v_km_s = Eigen::Vector3d::Zero();
};

// Eccentric anomaly E (rad) from mean anomaly M (rad) and e (0 <= e < 1), solving Kepler's equation
// M = E - e sin E by Newton's method to 1e-14 rad. Source: Vallado (2013) Algorithm 2.
double eccentric_anomaly_rad(double mean_anomaly_rad, double e);

// Cartesian state (inertial) of Keplerian elements; the true anomaly comes from Kepler's equation.
// Source: Vallado (2013) Algorithm 10 (COE2RV) with the perifocal-to-inertial rotation R3(-Omega)R1(-i)R3(-omega).
StateVector state_from_elements(const EarthModel& earth, const MeanElements& el);

// A satellite's mean elements at epoch with their J2 secular rates precomputed, so that many
// evaluations over time cost one Kepler solve each.
struct SecularOrbit {
  MeanElements epoch_elements;
  SecularRates rates;
};

SecularOrbit make_secular_orbit(const EarthModel& earth, const MeanElements& el);

// Mean elements dt_s seconds after epoch: Omega, omega and M advance linearly at the secular rates
// (angles wrapped to [0, 2 pi)); a, e, i stay fixed.
MeanElements elements_at(const SecularOrbit& orbit, double dt_s);

// Inertial state dt_s seconds after epoch.
StateVector state_at(const EarthModel& earth, const SecularOrbit& orbit, double dt_s);

// Earth-fixed position (km) and velocity (km/s) of a satellite dt_s seconds after epoch, with the Greenwich
// angle theta_rad at that time. The velocity is the time derivative of the J2 secular-model position, not the
// osculating Kepler velocity: with the rates of M, omega and Omega, dr/dt = v_kep (dM/dt)/n + (domega/dt) h x r
// + (dOmega/dt) z x r, h the orbit normal (chain rule on r(Omega(t), omega(t), M(t)); v_kep = n dr/dM, Vallado
// 2013 sec. 2.3), then v_ef = R3(theta) v_in - w x r_ef with w = (0, 0, w_E) (rotating-frame kinematics).
struct EarthFixedState {
  Eigen::Vector3d r_km = Eigen::Vector3d::Zero();
  Eigen::Vector3d v_km_s = Eigen::Vector3d::Zero();
};
EarthFixedState earth_fixed_state_at(const EarthModel& earth, const SecularOrbit& orbit, double theta_rad, double dt_s);

// Rotate an inertial vector into the Earth-fixed frame given the Greenwich sidereal angle theta (rad):
// r_ecef = R3(theta) r_eci (polar motion and the equation of the equinoxes are neglected).
Eigen::Vector3d inertial_to_earth_fixed(const Eigen::Vector3d& r_eci, double greenwich_angle_rad);

}  // namespace skein
