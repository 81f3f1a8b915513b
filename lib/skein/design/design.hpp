#pragma once
// The constellation design: what the YAML design file holds, after validation, in SI-with-units values.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/design/budget_spec.hpp"
#include "skein/constants.hpp"
#include "skein/design/coverage_spec.hpp"
#include "skein/design/ground_station.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

// How a shell's satellites are laid out.
enum class PatternKind {
  walker_delta,    // T/P/F, planes spread over 360 deg of node (unless the shell gives a node span)
  walker_star,     // T/P/F, planes spread over 180 deg of node (unless the shell gives a node span)
  explicit_planes  // each plane's node and slots given
};
std::string_view to_string(PatternKind kind);
std::optional<PatternKind> pattern_kind_from_string(std::string_view text);

// One plane of an explicit shell.
struct ExplicitPlane {
  double raan_deg = 0.0;                  // node right ascension at epoch (set from ltan for SSO shells)
  std::vector<double> slots_deg;          // mean argument of latitude (omega + M) of each slot at epoch
};

struct Shell {
  std::string name;
  PatternKind pattern = PatternKind::walker_delta;
  int satellites = 0;   // T (Walker); for explicit shells, the count of all slots
  int planes = 0;       // P
  int phasing = 0;      // F, 0..P-1
  double raan0_deg = 0.0;  // node of the first plane at epoch
  std::vector<ExplicitPlane> explicit_planes;
  double a_km = 0.0;       // mean semi-major axis
  double e = 0.0;
  double argp_deg = 0.0;
  double inclination_deg = 0.0;  // resolved; for SSO shells the computed value
  bool sun_synchronous = false;
  std::optional<double> ltan_h;  // local mean time of the ascending node of the first plane, hours
  // Walker shells only, at most one of the two (both absent: the pattern's 360 or 180 deg):
  std::optional<double> node_span_deg;  // the node span the P planes divide: plane j at raan0 + j * span / P
  std::optional<double> ltan_span_h;    // sun-synchronous: hours from the first plane's LTAN to the last plane's
                                        // (inclusive, P >= 2): plane j at ltan + j * span / (P - 1)
};

struct Spacecraft {
  double dry_mass_kg = 0.0;
  double drag_area_m2 = 0.0;
  double drag_coefficient = 0.0;
  std::optional<double> isp_s;                  // absent: no propulsion
  std::optional<double> propellant_capacity_kg; // tank capacity, for the budget flag
  // Ballistic coefficient B = Cd A / m, m^2/kg (mass taken as dry mass plus capacity when given).
  double ballistic_coefficient_m2_kg() const;
};

struct Design {
  std::string name;
  std::string file;   // the file it was read from (for messages and report headings)
  UtcEpoch epoch;
  EarthModel earth = wgs84;
  Spacecraft spacecraft;
  std::vector<Shell> shells;
  CoverageSpec coverage;  // the `coverage` block (defaults when absent)
  BudgetSpec budget;      // the `budget` block (defaults when absent)
  std::vector<GroundStation> ground_stations;  // the `ground_stations` list (none when absent)
};

}  // namespace skein
