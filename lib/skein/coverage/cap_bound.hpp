#pragma once
// The cap-area lower bound on the satellite count for continuous k-fold coverage: at any instant each
// satellite sees one spherical cap (the footprint of Earth-central angle lambda), so k-fold coverage of an area
// A needs the caps' areas to sum to at least k A, and N >= k A / A_cap when every cap is the same. The bound
// ignores overlaps, so real layouts need more; it says how far a layout is from the geometric limit.
// Source for the bound: J.R. Wertz & W.J. Larson, "Space Mission Analysis and Design", 3rd ed. (1999), sec. 7
// (constellation design), FROM MEMORY, not looked up; it follows from the cap areas alone. Spherical Earth of
// the equatorial radius; the cap area 2 pi R^2 (1 - cos lambda) is elementary spherical geometry.
#include <optional>

#include "skein/design/coverage_spec.hpp"
#include "skein/design/design.hpp"

namespace skein {

// Share of the sphere's area in a cap of Earth-central angle lambda (rad, 0..pi): (1 - cos lambda) / 2.
double cap_area_fraction(double central_angle_rad);

// Share of the sphere's area between two latitudes (rad): (sin phi_max - sin phi_min) / 2.
double band_area_fraction(double lat_min_rad, double lat_max_rad);

// The least count n of satellites of cap share `cap` such that, with other satellites whose cap shares sum to
// `others`, n cap + others >= fold * area; 0 when the others already reach it. cap > 0.
long cap_bound_count(int fold, double area, double cap, double others);

// For a design whose coverage grid is global or a band: the least satellite count of shell `shell` (the other
// shells as they are) that could give continuous coverage at fold `fold` of the grid's area, from the caps of
// the coverage block's elevation mask and nadir half-angle at each shell's apogee radius (the largest cap it
// reaches, so the bound stays a lower bound for eccentric orbits). nullopt for region and site grids.
std::optional<long> cap_bound_satellites(const Design& design, size_t shell, int fold);

}  // namespace skein
