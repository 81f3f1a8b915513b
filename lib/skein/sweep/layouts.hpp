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

// One point of the trade space. Layouts are numbered 0, 1, ... in the fixed nesting order
// T, P, F, altitude, inclination (sun-synchronous choices once per node local time), elevation mask.
struct Layout {
  size_t index = 0;
  int satellites = 0;  // T
  int planes = 0;      // P
  int phasing = 0;     // F
  double altitude_km = 0.0;
  bool sun_synchronous = false;
  double inclination_deg = 0.0;      // the chosen value, or the sun-synchronous inclination for the altitude
  std::optional<LocalTimeChoice> ltan;  // sun-synchronous layouts only
  double min_elevation_deg = 0.0;
};

// Combinations of the axes that are not layouts, counted by reason, each as the number of layout
// combinations it stands for (F "all" stands for P values), so that layouts + skipped = combination_count.
struct SkippedCounts {
  long planes_not_dividing = 0;  // P does not divide T
  long phasing_out_of_range = 0; // F outside 0..P-1
  long no_sun_synchronous = 0;   // no sun-synchronous inclination exists at the altitude
  long fold_above_satellites = 0; // the requirement's fold k exceeds the design's satellite count
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

// The base design with the varied shell set to the layout: T, P, F, semi-major axis (equatorial radius plus
// altitude), inclination (sun-synchronous inclination for a and e, Vallado 2013 eq. 9-41, with the first node
// from the node local time, as the design reader does), and the coverage elevation mask.
Design layout_design(const Sweep& sweep, const Layout& layout);

// "T/P/F" text, e.g. "24/4/1".
std::string walker_label(const Layout& layout);

}  // namespace skein
