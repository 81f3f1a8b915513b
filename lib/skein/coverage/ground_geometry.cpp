#include "skein/coverage/ground_geometry.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <Eigen/Geometry>

namespace skein {

Eigen::Vector3d geodetic_to_earth_fixed(const EarthModel& earth, double lat_rad, double lon_rad, double height_km) {
  const double e2 = earth.flattening * (2.0 - earth.flattening);
  const double s = std::sin(lat_rad), c = std::cos(lat_rad);
  const double n = earth.radius_km / std::sqrt(1.0 - e2 * s * s);
  return {(n + height_km) * c * std::cos(lon_rad), (n + height_km) * c * std::sin(lon_rad),
          (n * (1.0 - e2) + height_km) * s};
}

Eigen::Vector3d geodetic_up(double lat_rad, double lon_rad) {
  const double c = std::cos(lat_rad);
  return {c * std::cos(lon_rad), c * std::sin(lon_rad), std::sin(lat_rad)};
}

double elevation_rad(const Eigen::Vector3d& r_ground, const Eigen::Vector3d& up, const Eigen::Vector3d& r_sat) {
  const Eigen::Vector3d d = r_sat - r_ground;
  const double len = d.norm();
  assert(len > 0.0);
  return std::asin(std::clamp(d.dot(up) / len, -1.0, 1.0));
}

double off_nadir_angle_rad(const Eigen::Vector3d& r_ground, const Eigen::Vector3d& r_sat) {
  const Eigen::Vector3d d = r_ground - r_sat;
  const double c = -r_sat.dot(d) / (r_sat.norm() * d.norm());
  return std::acos(std::clamp(c, -1.0, 1.0));
}

double footprint_central_angle_rad(double body_radius_km, double orbit_radius_km, double min_elevation_rad) {
  assert(orbit_radius_km > body_radius_km);
  const double sin_rho = body_radius_km / orbit_radius_km;
  const double eta = std::asin(std::cos(min_elevation_rad) * sin_rho);
  return 0.5 * pi - min_elevation_rad - eta;
}

double footprint_central_angle_rad(double body_radius_km, double orbit_radius_km, double min_elevation_rad,
                                   double nadir_half_angle_rad) {
  const double by_mask = footprint_central_angle_rad(body_radius_km, orbit_radius_km, min_elevation_rad);
  const double sin_rho = body_radius_km / orbit_radius_km;
  if (std::sin(nadir_half_angle_rad) >= sin_rho) return by_mask;
  const double eps = std::acos(std::sin(nadir_half_angle_rad) / sin_rho);
  return std::min(by_mask, 0.5 * pi - nadir_half_angle_rad - eps);
}

}  // namespace skein
