#pragma once
// A simple polygon in the longitude/latitude plane, for regional grids. Edges are straight in
// (lon, lat): adequate for regions a few tens of degrees across (common practice); the polygon may not
// cross the antimeridian unless its longitudes run past 180 continuously (e.g. 170 to 190).
#include <optional>
#include <string>
#include <vector>

#include "skein/design/coverage_spec.hpp"

namespace skein {

// Why the ring of vertices is not a usable polygon (fewer than 3 vertices, zero area, two edges that
// cross or touch away from their shared vertex, a repeated vertex), or nullopt when it is.
std::optional<std::string> polygon_problem(const std::vector<GeoVertex>& ring);

// Whether (lon, lat) lies inside the ring, by the even-odd crossing rule (W.R. Franklin's point-inclusion
// test; J. O'Rourke, "Computational Geometry in C", 2nd ed. 1998, sec. 7.4). The point's longitude is also
// tried shifted by +-360 deg so that rings given in 0..360 work.
bool point_in_polygon(double lon_deg, double lat_deg, const std::vector<GeoVertex>& ring);

}  // namespace skein
