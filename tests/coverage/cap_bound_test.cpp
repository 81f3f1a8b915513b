// Evidence for lib/skein/coverage/cap_bound: the cap-area lower bound N >= k A / A_cap (Wertz & Larson, SMAD
// 3rd ed. 1999, sec. 7, FROM MEMORY) on cases worked by hand. With a 0 deg mask the footprint's Earth-central
// angle is acos(R/r) (SMAD sec. 5.2: sin rho = R/r, eta = rho, lambda = 90 deg - rho), so the cap share of
// the sphere is (1 - R/r)/2 = h/(2r) and a global grid needs N >= 2 k r / h: a closed form to check against.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "skein/constants.hpp"
#include "skein/coverage/cap_bound.hpp"
#include "skein/input/design_file.hpp"

using namespace skein;

namespace {

// Two Walker shells at 1000 km (WGS-84 equatorial radius 6378.137 km, so r = 7378.137 km), a 0 deg mask.
Design two_shells(int relay_satellites, const std::string& grid) {
  return read_design_text(
      "name: cap test\nepoch: 2027-03-01T00:00:00Z\n"
      "spacecraft:\n  dry_mass_kg: 100\n  drag_area_m2: 1\n  drag_coefficient: 2.2\nshells:\n"
      "  - name: a\n    pattern: walker-delta\n    satellites: 6\n    planes: 2\n    phasing: 0\n"
      "    altitude_km: 1000\n    inclination_deg: 60\n"
      "  - name: b\n    pattern: walker-delta\n    satellites: " + std::to_string(relay_satellites) +
          "\n    planes: 1\n    phasing: 0\n    altitude_km: 1000\n    inclination_deg: 60\n"
          "coverage:\n  grid:\n" + grid + "  min_elevation_deg: 0\n",
      "cap.yaml");
}

}  // namespace

TEST_CASE("cap bound: sphere shares of a cap and a band") {
  // Elementary spherical geometry: a hemisphere (lambda = 90 deg) is half the sphere; a band from the
  // equator to 30 deg is sin 30 / 2 = 1/4 of it. Exact up to rounding of cos and sin (1e-15).
  CHECK(cap_area_fraction(0.5 * pi) == doctest::Approx(0.5).epsilon(1e-15));
  CHECK(cap_area_fraction(pi) == doctest::Approx(1.0).epsilon(1e-15));
  CHECK(band_area_fraction(0.0, 30.0 * rad_per_deg) == doctest::Approx(0.25).epsilon(1e-15));
  CHECK(band_area_fraction(-90.0 * rad_per_deg, 90.0 * rad_per_deg) == doctest::Approx(1.0).epsilon(1e-15));
  // Whole counts: 4 caps of a quarter cover the sphere at k = 1 (not 5: the allowance keeps 4.0 at 4),
  // 8 at k = 2; others already reaching k A need none.
  CHECK(cap_bound_count(1, 1.0, 0.25, 0.0) == 4);
  CHECK(cap_bound_count(2, 1.0, 0.25, 0.0) == 8);
  CHECK(cap_bound_count(1, 1.0, 0.25, 0.3) == 3);  // 0.7 / 0.25 = 2.8
  CHECK(cap_bound_count(1, 0.5, 0.25, 0.6) == 0);
}

TEST_CASE("cap bound: a design's least satellite count against the closed form 2 k r / h") {
  const double r = 6378.137 + 1000.0, h = 1000.0;
  const double per_k = 2.0 * r / h;  // 14.756 satellites of the shell's cap per fold, globally
  REQUIRE(per_k == doctest::Approx(14.756274).epsilon(1e-7));
  // Shell a alone would need 15 (k = 1) and 30 (k = 2: 29.51); shell b's 10 satellites already give 10 of
  // the 14.76, so a needs ceil(4.756) = 5, and ceil(19.51) = 20 at k = 2.
  const Design d = two_shells(10, "    kind: global\n    spacing_deg: 10\n");
  CHECK(cap_bound_satellites(d, 0, 1) == 5);
  CHECK(cap_bound_satellites(d, 0, 2) == 20);
  CHECK(cap_bound_satellites(d, 1, 1) == 9);  // b, with a's 6: ceil(8.756)
  // A band from -30 to 30 deg is half the sphere: 7.378 per fold; with b's 10 at k = 1 a needs none.
  const Design band = two_shells(1, "    kind: band\n    lat_min_deg: -30\n    lat_max_deg: 30\n    spacing_deg: 10\n");
  CHECK(cap_bound_satellites(band, 0, 1) == 7);  // ceil(7.378 - 1)
  CHECK(cap_bound_satellites(band, 0, 3) == 22);  // ceil(22.134 - 1)
  // Site grids have no area: no bound.
  const Design sites = two_shells(1, "    kind: sites\n    sites:\n      - name: s\n        lat_deg: 0\n        lon_deg: 0\n");
  CHECK_FALSE(cap_bound_satellites(sites, 0, 1));
}
