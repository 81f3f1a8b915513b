// Evidence for lib/skein/orbit/ground_track.hpp: geodetic conversion against ERFA, track geometry.
#include <doctest/doctest.h>
#include <erfa.h>
#include <erfam.h>

#include <cmath>

#include "skein/constants.hpp"
#include "skein/orbit/ground_track.hpp"

using namespace skein;

TEST_CASE("ground track: Earth-fixed to geodetic agrees with ERFA eraGc2gd (WGS-84) to 1 mm") {
  // Source: ERFA eraGc2gd with ERFA_WGS84 (SOFA iauGc2gd, Fukushima's method). 1e-6 km and 1e-9 rad.
  for (const Eigen::Vector3d r : {Eigen::Vector3d(6878.0, 0, 0), Eigen::Vector3d(1200.0, -3400.0, 5800.0),
                                  Eigen::Vector3d(-3000.0, 2000.0, -6100.0), Eigen::Vector3d(10.0, 5.0, 7000.0)}) {
    const GeodeticPoint g = geodetic_from_earth_fixed(wgs84, r);
    double xyz[3] = {r.x() * 1e3, r.y() * 1e3, r.z() * 1e3}, elong = 0, phi = 0, height = 0;
    REQUIRE(eraGc2gd(ERFA_WGS84, xyz, &elong, &phi, &height) == 0);
    CHECK(std::abs(g.lat_deg * rad_per_deg - phi) < 1e-9);
    CHECK(std::abs(std::remainder(g.lon_deg * rad_per_deg - elong, two_pi)) < 1e-9);
    CHECK(std::abs(g.height_km - height / 1e3) < 1e-6);
  }
}

TEST_CASE("ground track: the track reaches the inclination in latitude and drifts west by Earth rotation") {
  MeanElements el;
  el.a_km = wgs84.radius_km + 700.0;
  el.i_rad = 53.0 * rad_per_deg;
  const SecularOrbit orbit = make_secular_orbit(wgs84, el);
  const JulianDate jd = julian_date(*parse_utc_iso8601("2027-03-01T00:00:00Z"));
  const auto track = ground_track(wgs84, orbit, jd, 6000.0, 10.0);
  double max_lat = -90;
  for (const auto& p : track) max_lat = std::max(max_lat, p.lat_deg);
  // Geocentric latitude peaks at i; the geodetic one is a little higher (about 0.19 deg at 53 deg, from
  // tan(phi_gd) = tan(phi_gc) / (1 - e^2) on the ellipsoid, WGS-84). 10 s sampling loses < 0.01 deg.
  CHECK(max_lat == doctest::Approx(53.0 + 0.18).epsilon(0.03 / 53.0));
  // Height stays near 700 km (the ellipsoid is up to 21 km below the sphere of equatorial radius).
  for (const auto& p : track) {
    CHECK(p.height_km > 699.0);
    CHECK(p.height_km < 722.0);
  }
}
