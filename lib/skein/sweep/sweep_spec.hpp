#pragma once
// A sweep: the base design, the shells to vary and each one's axes (T, P, F, pattern, altitude, inclination or
// sun-synchronous with node local times), the design-wide axes (elevation mask, nadir half-angle, spacecraft
// drag area and dry mass, mission life, solar activity level), the coverage requirement and the cost figures
// the best front is ranked by. Read from a sweep file by input/sweep_file.hpp (the format is documented in the
// README, "Trade sweeps"); these types carry no YAML positions.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "skein/atmosphere/solar_activity.hpp"
#include "skein/design/design.hpp"
#include "skein/design/requirement.hpp"

namespace skein {

// A cost figure to rank layouts by (every cost is lower-is-better).
enum class CostFigure {
  satellites,                  // all satellites of the design (every shell)
  fleet_dv_m_s,                // delta-v over the mission life summed over every satellite of the design
  fleet_propellant_kg,         // propellant summed over every satellite (needs spacecraft.isp_s)
  dv_per_satellite_m_s,        // the first varied shell's per-satellite delta-v
  propellant_per_satellite_kg, // the first varied shell's per-satellite propellant (needs spacecraft.isp_s)
  planes                       // orbit planes of the whole design (every shell): a proxy for launches
};
std::string_view to_string(CostFigure cost);
std::optional<CostFigure> cost_figure_from_string(std::string_view text);

// One value of the inclination axis.
struct InclinationChoice {
  bool sun_synchronous = false;
  double inclination_deg = 0.0;  // when not sun-synchronous
};

// One node local time of the ltan axis.
struct LocalTimeChoice {
  std::string text;  // "HH:MM" as written
  double hours = 0.0;
};

// The resolved axes of one varied shell: every axis holds at least one value (an absent axis holds the base
// shell's value).
struct ShellAxes {
  size_t shell_index = 0;                      // the shell of the base design that is varied
  std::vector<int> satellites;                 // T
  std::vector<int> planes;                     // P (empty when planes_divisors)
  bool planes_divisors = false;                // P takes every divisor of each T, ascending (`planes: divisors`)
  std::optional<std::vector<int>> phasing;     // F; nullopt: every F from 0 to P-1 ("all")
  std::vector<PatternKind> patterns;           // walker-delta and/or walker-star
  bool pattern_given = false;                  // the file gives `pattern` (the results then list it)
  std::vector<double> altitude_km;
  std::vector<InclinationChoice> inclinations;
  std::vector<LocalTimeChoice> ltans;          // used by sun-synchronous choices only (empty when there is none)
};

// The resolved axes. The design-wide axes hold the base design's value when absent; `*_given` says whether the
// file gives the axis (the results then have a column for it).
struct SweepAxes {
  std::vector<ShellAxes> shells;               // at least one, in the file's order (the numbering's order)
  std::vector<double> min_elevation_deg;
  std::vector<std::optional<double>> nadir_half_angle_deg;  // none: no payload cone (the base's default)
  std::vector<double> drag_area_m2;            // spacecraft.drag_area_m2 (every shell flies the same spacecraft)
  std::vector<double> dry_mass_kg;             // spacecraft.dry_mass_kg
  std::vector<double> mission_life_years;      // budget.mission_life_years
  std::vector<SolarLevel> solar_activity;      // budget.solar_activity
  std::vector<std::optional<double>> min_sun_elevation_deg;  // coverage.min_sun_elevation_deg; none: no daylight mask
  bool nadir_given = false, drag_area_given = false, dry_mass_given = false, mission_life_given = false,
       solar_given = false, sun_given = false;
};

// Stated limits (common practice for a desktop trade study; --force lifts the layout limit).
constexpr double default_max_layouts = 20000;   // layouts a sweep may expand to without --force
constexpr double hard_max_layouts = 2000000;    // never expanded, even with --force (memory of the layout list)
constexpr size_t max_axis_values = 10000;       // values one axis may hold

// The budget figure a sweep trades (budget_percentile): the deterministic budget (none), or a percentile of the
// Monte Carlo budget of each layout (budget/monte_carlo.hpp) with the base design's budget.samples and budget.seed.
struct SweepBudgetPercentile {
  double percent = 95.0;   // 1 .. 99
  long samples = 1000;     // budget.samples of the base design, else 1000
  unsigned long long seed = 1;
};

struct Sweep {
  std::string file;            // the sweep file
  std::string name;            // its `name`
  std::string base_file;       // the base design file, as resolved from the sweep file's folder
  Design base;                 // the base design, with the sweep's coverage block (when given) in place
  size_t shell_index = 0;      // the first varied shell (its per-satellite figures are the rows' per-satellite ones)
  SweepAxes axes;
  Requirement requirement;
  std::vector<CostFigure> costs;  // at least one; the first is the plot's x axis
  std::optional<SweepBudgetPercentile> budget_percentile;  // the delta-v and propellant figures at this percentile
  std::string fingerprint;     // hash of the sweep and base design texts and the program version (for resume)
};

}  // namespace skein
