// Evidence for lib/skein/coverage/footprint: the bounds that let the culled evaluator skip pairs never
// disagree with the exact visibility test (elevation from the geodetic vertical, ground_geometry.hpp, which is
// itself checked against ERFA), and the fast arc cosine stays inside the error bound its windows are padded by.
#include <doctest/doctest.h>

#include <cmath>
#include <random>

#include <Eigen/Geometry>

#include "skein/constants.hpp"
#include "skein/coverage/footprint.hpp"
#include "skein/coverage/ground_geometry.hpp"

using namespace skein;

TEST_CASE("coverage footprint: the fast arc cosine is within its stated error") {
  // Reference: std::acos. Abramowitz and Stegun (1964) eq. 4.4.45 states |error| <= 6.7e-5 rad on [0, 1]
  // (the bound is from memory, to the two figures printed there); measured here 6.753e-5, so the check allows
  // 6.8e-5. The windows are padded by fast_acos_error_rad = 1e-4, above either.
  double worst = 0.0;
  for (int i = 0; i <= 2000000; ++i) {
    const double x = -1.0 + 2.0 * i / 2000000.0;
    worst = std::max(worst, std::abs(fast_acos(x) - std::acos(x)));
  }
  MESSAGE("largest fast_acos error (rad): ", worst);
  CHECK(worst < 6.8e-5);
  CHECK(worst < fast_acos_error_rad);
  CHECK(fast_acos(1.5) == fast_acos(1.0));  // clamped, no NaN
}

TEST_CASE("coverage footprint: outer and inner bounds agree with the exact elevation test") {
  // Reference: the exact test, elevation_rad() against the geodetic vertical on WGS-84, with and without a
  // payload cone (off_nadir_angle_rad). Random ground points (heights 0 to 4 km) and satellites (200 to
  // 2000 km altitude, placed near the footprint edge so that both bounds are exercised). A bound is wrong if
  // a visible point lies outside the outer one or an invisible point inside the inner one: none may.
  const EarthModel earth = wgs84;
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> u01(0.0, 1.0);
  long outer_checked = 0, inner_checked = 0, outer_wrong = 0, inner_wrong = 0;
  for (double cone_deg : {0.0, 40.0}) {
    for (double mask_deg : {0.0, 10.0, 25.0}) {
      for (int n = 0; n < 20000; ++n) {
        const double lat = std::asin(2.0 * u01(rng) - 1.0), lon = pi * (2.0 * u01(rng) - 1.0), h = 4.0 * u01(rng);
        const Eigen::Vector3d g = geodetic_to_earth_fixed(earth, lat, lon, h);
        const Eigen::Vector3d up = geodetic_up(lat, lon);
        const Eigen::Vector3d gu = g.normalized();
        const double r = earth.radius_km + 200.0 + 1800.0 * u01(rng);
        // A satellite direction at a random azimuth and a central angle around the spherical footprint edge.
        const double lam = footprint_central_angle_rad(earth.radius_km, r, mask_deg * rad_per_deg);
        const double theta = lam * (0.8 + 0.4 * u01(rng)), az = two_pi * u01(rng);
        Eigen::Vector3d east = Eigen::Vector3d::UnitZ().cross(gu);
        if (east.norm() < 1e-9) east = Eigen::Vector3d::UnitX();
        east.normalize();
        const Eigen::Vector3d north = gu.cross(east);
        const Eigen::Vector3d dir =
            std::cos(theta) * gu + std::sin(theta) * (std::cos(az) * north + std::sin(az) * east);
        const Eigen::Vector3d sat = r * dir;
        const double defl = std::atan2(up.cross(gu).norm(), up.dot(gu));
        const std::optional<double> cone = cone_deg > 0.0 ? std::optional<double>(cone_deg * rad_per_deg) : std::nullopt;
        const FootprintRow row = make_footprint_row(g.norm(), g.norm(), defl, mask_deg * rad_per_deg, cone);
        const FootprintCosines f = footprint_cosines(row, r);
        bool visible = elevation_rad(g, up, sat) >= mask_deg * rad_per_deg;
        if (cone) visible = visible && off_nadir_angle_rad(g, sat) <= *cone;
        const double c = gu.dot(dir);
        if (visible) {
          ++outer_checked;
          if (!(c >= f.outer)) ++outer_wrong;
        }
        if (c >= f.inner) {
          ++inner_checked;
          if (!visible) ++inner_wrong;
        }
      }
    }
  }
  CHECK(outer_wrong == 0);
  CHECK(inner_wrong == 0);
  // Both bounds were exercised many times, so the checks above are not empty.
  CHECK(outer_checked > 20000);
  CHECK(inner_checked > 10000);
}

TEST_CASE("coverage footprint: row windows hold exactly the longitudes inside the cap") {
  // Reference: the spherical law of cosines evaluated point by point on a row of 3600 longitudes. The outer
  // window (widened) must hold every longitude inside the cap; the inner one (narrowed) none outside it.
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> u01(0.0, 1.0);
  long wrong = 0;
  for (int n = 0; n < 3000; ++n) {
    const double psi_r = (u01(rng) - 0.5) * pi, psi_s = (u01(rng) - 0.5) * pi;
    const double c = std::cos(u01(rng) * 1.2);
    const double sr = std::sin(psi_r), cr = std::cos(psi_r), ss = std::sin(psi_s), cs = std::cos(psi_s);
    const double ho = row_half_width(sr, cr, ss, cs, c, true), hi = row_half_width(sr, cr, ss, cs, c, false);
    for (int k = 0; k < 3600; ++k) {
      const double dlon = -pi + two_pi * k / 3600.0;
      const bool inside = sr * ss + cr * cs * std::cos(dlon) >= c;
      if (inside && !(ho >= std::abs(dlon))) ++wrong;
      if (hi >= 0.0 && std::abs(dlon) <= hi && !inside) ++wrong;
    }
  }
  CHECK(wrong == 0);
}
