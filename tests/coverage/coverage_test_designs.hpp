#pragma once
// Small designs shared by the coverage tests.
#include <string>

#include <fmt/format.h>

#include "skein/input/design_file.hpp"
#include "skein/constants.hpp"
#include "skein/time/epoch.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/sun.hpp"

namespace skein::test {

inline std::string coverage_design_head() {
  return "name: coverage test\nepoch: 2027-03-01T00:00:00Z\nearth: wgs84\nspacecraft:\n  dry_mass_kg: 100\n"
         "  drag_area_m2: 1\n  drag_coefficient: 2.2\n";
}

// One satellite on an equatorial circular orbit at `altitude_km`, node 0, argument of latitude `u_deg`.
inline std::string equatorial_satellite(double altitude_km, double u_deg) {
  return fmt::format("shells:\n  - name: eq\n    pattern: explicit\n    altitude_km: {}\n    inclination_deg: 0\n"
                     "    planes:\n      - raan_deg: 0\n        slots_deg: [{}]\n",
                     altitude_km, u_deg);
}

inline std::string walker_shell(int t, int p, int f, double altitude_km, double inclination_deg) {
  return fmt::format("shells:\n  - name: w\n    pattern: walker-delta\n    satellites: {}\n    planes: {}\n    phasing: {}\n"
                     "    altitude_km: {}\n    inclination_deg: {}\n",
                     t, p, f, altitude_km, inclination_deg);
}

// The brute-force scans' Sun: its unit direction in the Earth-fixed frame t seconds after `epoch`, from the
// low-precision almanac (time/sun.hpp), turned by the sidereal angle theta (rad) the scan uses for the
// satellites, so Sun and satellites share one frame.
inline Eigen::Vector3d scan_sun_earth_fixed(const JulianDate& epoch, double t, double theta) {
  JulianDate jd = epoch;
  jd.fraction += t / seconds_per_day;
  return inertial_to_earth_fixed(sun_position(jd).unit_eci, theta);
}

}  // namespace skein::test
