#pragma once
// Land outlines for the report's maps, decoded from TopoJSON (the topology format of the world-atlas package,
// which carries Natural Earth's public-domain land polygons; scripts/setup.sh installs it). TopoJSON
// (specification 1.0, github.com/topojson/topojson-specification): a "Topology" holds shared "arcs", each a
// list of positions; with a "transform" {scale, translate} the positions are quantized and delta-encoded (the
// first position absolute, every later one the difference from the one before), and a decoded position is
// (sum of the deltas) * scale + translate. A geometry names its arcs by index, ~i (that is, -i - 1) for arc i
// reversed; a ring joins its arcs, each next arc starting where the last ended (the shared point kept once).
// Polygons hold rings (the first the exterior); MultiPolygons hold polygons; GeometryCollections hold geometries.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace skein {

struct LonLat {
  double lon_deg = 0.0;
  double lat_deg = 0.0;
};
using Ring = std::vector<LonLat>;  // closed: the last position repeats the first

struct LandPolygon {
  std::vector<Ring> rings;  // the exterior first, then holes
};

struct LandOutlines {
  std::vector<LandPolygon> polygons;
  std::string source;  // the file it was read from, for captions
};

// Every Polygon and MultiPolygon of every object of a TopoJSON Topology (other geometry types are skipped).
// Throws InputError naming `where` for text that is not JSON, not a Topology, or refers to a missing arc.
LandOutlines decode_topojson(std::string_view text, const std::string& where);

// The outlines at `path`, or the reason they are missing: a missing file gives nullopt and a note; a file that
// is there but not a valid TopoJSON Topology throws InputError (it was put there to be used).
struct LandOutlineLoad {
  std::optional<LandOutlines> outlines;
  std::string note;  // "" when loaded; otherwise says that the outlines are missing and why
};
LandOutlineLoad load_land_outlines(const std::string& path);

// A ring's longitudes made continuous: a step of more than 180 deg between neighbours is taken the short way
// round (adding or subtracting 360), so a ring crossing the antimeridian is one piece and can be drawn shifted
// by 360 deg. The result's net turn in longitude (last - first) is 0 for an ordinary ring and +-360 for a ring
// round a pole (Antarctica).
Ring unwrap_longitudes(const Ring& ring);

// The ring closed for filling on an equirectangular map: unwrapped, and a ring round a pole closed along that
// pole's latitude (+-90), the pole chosen on the side of the ring's mean latitude.
Ring fillable_ring(const Ring& ring);

// Area enclosed by a ring on the unit sphere, in steradians, signed by the ring's direction (counterclockwise
// seen from outside positive): the integral of sin(latitude) d(longitude) round the closed fillable ring, each
// edge by the trapezoid rule (exact for edges along a parallel; for the short edges of map outlines the error is
// far below a vertex's spacing). The region between a ring and the equator has area |int sin(lat) dlon| by
// Green's theorem on the area element cos(lat) dlat dlon = d(sin lat) dlon.
double ring_signed_area_sr(const Ring& ring);

// Share of the sphere's surface inside the outlines' polygons (exteriors less holes).
double land_area_fraction(const LandOutlines& land);

}  // namespace skein
