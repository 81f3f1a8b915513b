#pragma once
// Expansion of a sweep's axes into layouts, and of one layout into a Design (a copy of the base design with
// the varied shell changed).
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "skein/design/design.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

// One varied shell's values in a layout.
struct ShellChoice {
  size_t shell_index = 0;
  int satellites = 0;  // T
  int planes = 0;      // P
  int phasing = 0;     // F
  PatternKind pattern = PatternKind::walker_delta;
  double altitude_km = 0.0;
  bool sun_synchronous = false;
  double inclination_deg = 0.0;      // the chosen value, or the sun-synchronous inclination for the altitude
  std::optional<LocalTimeChoice> ltan;  // sun-synchronous layouts only
};

// One point of the trade space. Layouts are numbered 0, 1, ... in a fixed nesting order, outermost first:
// for each varied shell in the file's order, T, P, F, pattern, altitude, inclination (sun-synchronous choices
// once per node local time); then elevation mask, nadir half-angle, drag area, dry mass, mission life, solar
// activity, least Sun elevation. An axis with one value does not change the numbering, so a sweep that adds no axis keeps its numbers.
struct Layout {
  size_t index = 0;
  std::vector<ShellChoice> shells;  // one per varied shell, in SweepAxes::shells order
  double min_elevation_deg = 0.0;
  std::optional<double> nadir_half_angle_deg;
  double drag_area_m2 = 0.0;
  double dry_mass_kg = 0.0;
  double mission_life_years = 0.0;
  SolarLevel solar_activity = SolarLevel::mean;
  std::optional<double> min_sun_elevation_deg;  // daylight mask (innermost axis)
};

// Combinations of the axes that are not layouts, counted by reason, each as the number of layout
// combinations it stands for (F "all" stands for P values), so that layouts + skipped = combination_count.
struct SkippedCounts {
  long planes_not_dividing = 0;  // P does not divide T
  long phasing_out_of_range = 0; // F outside 0..P-1
  long no_sun_synchronous = 0;   // no sun-synchronous inclination exists at the altitude
  long fold_above_satellites = 0; // the requirement's fold k exceeds the design's satellite count
  // A combination invalid for several reasons is counted once, under the first varied shell's first reason
  // in the order above; the fold is checked last.
  long total() const { return planes_not_dividing + phasing_out_of_range + no_sun_synchronous + fold_above_satellites; }
};

struct LayoutSet {
  std::vector<Layout> layouts;
  SkippedCounts skipped;
};

// The number of axis combinations before skipping (an upper bound of the layout count), computed without
// expanding; F "all" counts P values for each P.
double combination_count(const Sweep& sweep);

// Expand the axes. Throws InputError, before expanding, when the combinations exceed max_layouts
// (default_max_layouts unless --force) or hard_max_layouts, and after expanding when no valid layout remains.
LayoutSet expand_layouts(const Sweep& sweep, double max_layouts = default_max_layouts);

// The base design with each varied shell set to the layout: T, P, F, pattern, semi-major axis (equatorial radius
// plus altitude), inclination (sun-synchronous inclination for a and e, Vallado 2013 eq. 9-41, with the first
// node from the node local time, as the design reader does); and the design-wide values: coverage elevation
// mask and nadir half-angle, spacecraft drag area and dry mass, mission life and solar activity level.
Design layout_design(const Sweep& sweep, const Layout& layout);

// "T/P/F" text of each varied shell, e.g. "24/4/1", or "24/4/1 + 8/2/1" for two varied shells.
std::string walker_label(const Layout& layout);

}  // namespace skein
