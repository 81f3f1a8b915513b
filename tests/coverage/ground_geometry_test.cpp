// Evidence for lib/skein/coverage/ground_geometry: ellipsoid positions against ERFA, elevation against the
// geodetic normal at a high-latitude site, and the footprint central angle.
#include <doctest/doctest.h>

#include <cmath>

#include <Eigen/Geometry>
#include <erfa.h>

#include "skein/constants.hpp"
#include "skein/coverage/ground_geometry.hpp"

using namespace skein;

TEST_CASE("coverage geometry: geodetic to Earth-fixed matches ERFA eraGd2gc on WGS-84") {
  // Reference: ERFA (liberfa-dev) eraGd2gc(ERFA_WGS84, ...), the IAU SOFA geodetic-to-geocentric routine.
  for (double lat : {-89.0, -45.0, 0.0, 37.5, 70.0, 89.9}) {
    for (double lon : {-170.0, 0.0, 123.0}) {
      for (double h_km : {0.0, 2.5}) {
        double xyz[3];
        REQUIRE(eraGd2gc(1, lon * rad_per_deg, lat * rad_per_deg, h_km * 1000.0, xyz) == 0);
        const Eigen::Vector3d r = geodetic_to_earth_fixed(wgs84, lat * rad_per_deg, lon * rad_per_deg, h_km);
        // 1e-6 km (1 mm): both evaluate the same closed form in double precision.
        CHECK(std::abs(r.x() - xyz[0] / 1000.0) < 1e-6);
        CHECK(std::abs(r.y() - xyz[1] / 1000.0) < 1e-6);
        CHECK(std::abs(r.z() - xyz[2] / 1000.0) < 1e-6);
      }
    }
  }
}

TEST_CASE("coverage geometry: elevation is measured from the geodetic horizontal at a 70 deg N site") {
  const double lat = 70.0 * rad_per_deg, lon = 25.0 * rad_per_deg;
  const Eigen::Vector3d site = geodetic_to_earth_fixed(wgs84, lat, lon, 0.0);
  const Eigen::Vector3d up = geodetic_up(lat, lon);
  // A satellite 500 km along the ellipsoid normal is at the zenith: elevation 90 deg.
  const Eigen::Vector3d zenith = site + 500.0 * up;
  CHECK(elevation_rad(site, up, zenith) * deg_per_rad == doctest::Approx(90.0).epsilon(1e-9));
  // Against the geocentric radial the same satellite would sit lower by the geodetic-geocentric latitude
  // difference, which ERFA gives via eraGc2gd (about 0.12 deg at 70 deg): the two conventions differ here.
  const Eigen::Vector3d radial = site.normalized();
  const double geocentric_elev = elevation_rad(site, radial, zenith) * deg_per_rad;
  const double geocentric_lat = std::atan2(site.z(), std::hypot(site.x(), site.y())) * deg_per_rad;
  CHECK(90.0 - geocentric_elev == doctest::Approx(70.0 - geocentric_lat).epsilon(1e-6));
  CHECK(90.0 - geocentric_elev > 0.1);
  // A satellite built at 10.05 deg geodetic elevation (east-north-up basis of the geodetic normal, range
  // 2000 km) is reported at 10.05 deg, above a 10 deg mask; by the geocentric radial it would read below it.
  const Eigen::Vector3d east(-std::sin(lon), std::cos(lon), 0.0);
  const Eigen::Vector3d north = up.cross(east);
  const double el = 10.05 * rad_per_deg, az = 0.0;  // looking north (poleward), where the radial reads lower
  const Eigen::Vector3d los = std::cos(el) * (std::cos(az) * north + std::sin(az) * east) + std::sin(el) * up;
  const Eigen::Vector3d sat = site + 2000.0 * los;
  CHECK(elevation_rad(site, up, sat) * deg_per_rad == doctest::Approx(10.05).epsilon(1e-9));
  CHECK(elevation_rad(site, radial, sat) * deg_per_rad < 10.0);
}

TEST_CASE("coverage geometry: footprint central angle follows the spherical-Earth relation") {
  // Wertz & Larson, SMAD 3rd ed. sec. 5.2: sin rho = R/r, sin eta = cos eps sin rho, lambda = 90 - eps - eta.
  // Values recomputed independently here with the same relation written differently:
  // cos(lambda + eps) = R cos(eps) / r (law of sines in the Earth-centre/site/satellite triangle).
  const double R = 6378.137;
  for (double h : {500.0, 800.0, 1414.0, 20200.0}) {
    for (double eps_deg : {0.0, 10.0, 25.0}) {
      const double eps = eps_deg * rad_per_deg;
      const double lam = footprint_central_angle_rad(R, R + h, eps);
      CHECK(lam == doctest::Approx(std::acos(R * std::cos(eps) / (R + h)) - eps).epsilon(1e-12));
    }
  }
  // 800 km, 10 deg: 18.95 deg (the SMAD-style worked value for this altitude, recomputed to 0.01 deg).
  CHECK(footprint_central_angle_rad(R, R + 800.0, 10.0 * rad_per_deg) * deg_per_rad == doctest::Approx(18.95).epsilon(3e-4));
  // A 30 deg payload cone at 800 km is narrower than the 10 deg mask: eps = acos(sin 30 / sin rho).
  const double rho = std::asin(R / (R + 800.0));
  const double eps_cone = std::acos(std::sin(30.0 * rad_per_deg) / std::sin(rho));
  CHECK(footprint_central_angle_rad(R, R + 800.0, 10.0 * rad_per_deg, 30.0 * rad_per_deg) ==
        doctest::Approx(0.5 * pi - 30.0 * rad_per_deg - eps_cone).epsilon(1e-12));
}
