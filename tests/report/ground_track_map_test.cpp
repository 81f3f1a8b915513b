// Evidence for the layout map (ground_track_svg, lib/skein/report/report_plots.cpp): one orbit of one
// satellite per plane and the footprint circle of every satellite at the epoch. Reference for the footprint:
// the Earth-central angle of a footprint's edge, lambda = 90 deg - eps - eta with sin eta = cos eps sin rho
// and sin rho = R / r (Wertz & Larson, "Space Mission Analysis and Design", 3rd ed., 1999, sec. 5.2), computed
// here on its own. A satellite over the equator (inclination 0) has its footprint's northernmost point at
// latitude lambda; the map draws 2 px per degree with coordinates to 0.1 px, so the drawn extent matches to
// 0.05 deg plus the circle's sampling (120 points: the top sample is within 1.5 deg of bearing of the true top,
// which lowers it by lambda (1 - cos 1.5 deg), under 0.01 deg here); tolerance 0.1 deg.
#include <doctest/doctest.h>

#include <cmath>
#include <regex>
#include <string>

#include "skein/constants.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/report_plots.hpp"

using namespace skein;

TEST_CASE("layout map: one orbit per plane, one footprint per satellite, footprint radius as published") {
  const Design d = read_design_text(
      "name: Ring test (invented)\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n"
      "  drag_coefficient: 2.2\nshells:\n  - name: ring\n    pattern: walker-delta\n    satellites: 6\n    planes: 2\n"
      "    phasing: 0\n    altitude_km: 1000\n    inclination_deg: 0\n",
      "ring.yaml");
  const double mask_deg = 10.0;
  const std::string svg = ground_track_svg(d, mask_deg, std::nullopt, {});
  // Legend: one entry per plane; paths: 2 orbits (solid, 2 px) and 6 footprints (dashed).
  CHECK(svg.find(">ring plane 1<") != std::string::npos);
  CHECK(svg.find(">ring plane 2<") != std::string::npos);
  CHECK(svg.find(">ring plane 3<") == std::string::npos);
  const std::regex footprint_re("<path d=\"([^\"]*)\" fill=\"none\" stroke=\"[^\"]*\" stroke-width=\"1.1\" stroke-dasharray");
  const std::regex orbit_re("<path d=\"[^\"]*\" fill=\"none\" stroke=\"[^\"]*\" stroke-width=\"2\"/>");
  CHECK(std::distance(std::sregex_iterator(svg.begin(), svg.end(), orbit_re), std::sregex_iterator()) == 2);
  CHECK(std::distance(std::sregex_iterator(svg.begin(), svg.end(), footprint_re), std::sregex_iterator()) == 6);

  // The plot's top edge and scale from the clip rectangle (720 x 360 px for the world).
  std::smatch clip;
  REQUIRE(std::regex_search(svg, clip, std::regex("<clipPath id=\"[^\"]*\"><rect x=\"([-0-9.]+)\" y=\"([-0-9.]+)\" "
                                                  "width=\"720.0\" height=\"360.0\"/>")));
  const double y0 = std::stod(clip[2].str());
  const double r_km = d.earth.radius_km + 1000.0;  // circular, equatorial: the geocentric radius at any time
  const double rho = std::asin(d.earth.radius_km / r_km), eps = mask_deg * rad_per_deg;
  const double lambda_deg = (pi / 2 - eps - std::asin(std::cos(eps) * std::sin(rho))) * deg_per_rad;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), footprint_re); it != std::sregex_iterator(); ++it) {
    const std::string dpath = (*it)[1].str();
    double top = 1e9, bottom = -1e9;
    const std::regex pt("[ML]([-0-9.]+) ([-0-9.]+)");
    for (auto p = std::sregex_iterator(dpath.begin(), dpath.end(), pt); p != std::sregex_iterator(); ++p) {
      top = std::min(top, std::stod((*p)[2].str()));
      bottom = std::max(bottom, std::stod((*p)[2].str()));
    }
    const double lat_top = 90.0 - (top - y0) / 2.0, lat_bottom = 90.0 - (bottom - y0) / 2.0;
    INFO("footprint from " << lat_bottom << " to " << lat_top << " deg; lambda " << lambda_deg << " deg");
    CHECK(lat_top == doctest::Approx(lambda_deg).epsilon(0.1 / lambda_deg));
    CHECK(lat_bottom == doctest::Approx(-lambda_deg).epsilon(0.1 / lambda_deg));
  }
}
