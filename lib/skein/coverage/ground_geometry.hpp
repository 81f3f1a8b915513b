#pragma once
// Geometry of a ground point on the reference ellipsoid and a satellite: Earth-fixed position, the
// geodetic local vertical, elevation and the payload's off-nadir angle, and the spherical-Earth
// Earth-central angle of a footprint. Distances in km, angles in radians unless the name says deg.
#include <Eigen/Core>

#include "skein/constants.hpp"

namespace skein {

// Earth-fixed position (km) of geodetic latitude phi, longitude lambda (rad) and height h (km) on the
// ellipsoid of equatorial radius a and flattening f: N = a / sqrt(1 - e^2 sin^2 phi), e^2 = f (2 - f);
// x = (N + h) cos phi cos lambda, y = (N + h) cos phi sin lambda, z = (N (1 - e^2) + h) sin phi.
// Source: NIMA TR8350.2 (WGS-84, 3rd ed. 2000), eq. 4-14; same as ERFA eraGd2gce.
Eigen::Vector3d geodetic_to_earth_fixed(const EarthModel& earth, double lat_rad, double lon_rad, double height_km);

// Unit outward normal of the ellipsoid (the geodetic vertical) at geodetic latitude phi, longitude lambda:
// (cos phi cos lambda, cos phi sin lambda, sin phi). Same source.
Eigen::Vector3d geodetic_up(double lat_rad, double lon_rad);

// Elevation (rad, -pi/2..pi/2) of a satellite at r_sat (Earth-fixed, km) seen from the ground point r_ground
// with local vertical `up`: asin(((r_sat - r_ground) . up) / |r_sat - r_ground|). The local horizontal is
// the plane normal to the geodetic vertical (common practice in geodesy and mission analysis).
double elevation_rad(const Eigen::Vector3d& r_ground, const Eigen::Vector3d& up, const Eigen::Vector3d& r_sat);

// Angle (rad, 0..pi) at the satellite between its geocentric nadir and the line of sight to the ground point.
double off_nadir_angle_rad(const Eigen::Vector3d& r_ground, const Eigen::Vector3d& r_sat);

// Earth-central angle (rad) of the footprint edge of a satellite at orbit radius r (km) over a spherical Earth
// of radius R (km) for a minimum elevation eps (rad): sin rho = R / r, sin eta = cos eps sin rho,
// lambda = pi/2 - eps - eta. Source: J.R. Wertz & W.J. Larson, "Space Mission Analysis and Design", 3rd ed.
// (1999), sec. 5.2, eqs. 5-16 to 5-18. Domain: r > R, 0 <= eps < pi/2.
double footprint_central_angle_rad(double body_radius_km, double orbit_radius_km, double min_elevation_rad);

// The same footprint limited by a payload cone of half-angle eta_max at the satellite: the smaller of the
// elevation-mask angle and pi/2 - eta_max - eps(eta_max), eps = acos(sin eta_max / sin rho), which applies
// while eta_max < rho (otherwise the cone reaches past the horizon and only the mask limits). Same source.
double footprint_central_angle_rad(double body_radius_km, double orbit_radius_km, double min_elevation_rad,
                                   double nadir_half_angle_rad);

}  // namespace skein
