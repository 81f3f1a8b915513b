#include "skein/coverage/polygon.hpp"

#include <cmath>

#include <fmt/format.h>

namespace skein {
namespace {

double cross(const GeoVertex& o, const GeoVertex& a, const GeoVertex& b) {
  return (a.lon_deg - o.lon_deg) * (b.lat_deg - o.lat_deg) - (a.lat_deg - o.lat_deg) * (b.lon_deg - o.lon_deg);
}

bool on_segment(const GeoVertex& p, const GeoVertex& q, const GeoVertex& r) {
  return std::min(p.lon_deg, r.lon_deg) <= q.lon_deg && q.lon_deg <= std::max(p.lon_deg, r.lon_deg) &&
         std::min(p.lat_deg, r.lat_deg) <= q.lat_deg && q.lat_deg <= std::max(p.lat_deg, r.lat_deg);
}

// Segments p1-p2 and p3-p4 intersect (including touching), by orientation tests (Cormen et al.,
// "Introduction to Algorithms", 3rd ed., sec. 33.1).
bool segments_intersect(const GeoVertex& p1, const GeoVertex& p2, const GeoVertex& p3, const GeoVertex& p4) {
  const double d1 = cross(p3, p4, p1), d2 = cross(p3, p4, p2), d3 = cross(p1, p2, p3), d4 = cross(p1, p2, p4);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  if (d1 == 0 && on_segment(p3, p1, p4)) return true;
  if (d2 == 0 && on_segment(p3, p2, p4)) return true;
  if (d3 == 0 && on_segment(p1, p3, p2)) return true;
  if (d4 == 0 && on_segment(p1, p4, p2)) return true;
  return false;
}

bool inside(double x, double y, const std::vector<GeoVertex>& ring) {
  bool in = false;
  const size_t n = ring.size();
  for (size_t i = 0, j = n - 1; i < n; j = i++) {
    const GeoVertex& a = ring[i];
    const GeoVertex& b = ring[j];
    if ((a.lat_deg > y) != (b.lat_deg > y)) {
      const double x_cross = a.lon_deg + (y - a.lat_deg) * (b.lon_deg - a.lon_deg) / (b.lat_deg - a.lat_deg);
      if (x < x_cross) in = !in;
    }
  }
  return in;
}

}  // namespace

std::optional<std::string> polygon_problem(const std::vector<GeoVertex>& ring) {
  const size_t n = ring.size();
  if (n < 3) return fmt::format("a region needs at least 3 vertices, got {}", n);
  for (size_t i = 0; i < n; ++i)
    for (size_t j = i + 1; j < n; ++j)
      if (ring[i].lon_deg == ring[j].lon_deg && ring[i].lat_deg == ring[j].lat_deg)
        return fmt::format("vertices {} and {} are the same point; give an open ring without repeats", i, j);
  // An edge runs the short way in the plane of longitude and latitude, so an edge over more than 180 deg of
  // longitude is almost surely an antimeridian crossing written with a jump (170 to -170): read literally it
  // would make the complement of the region meant. Refused, saying how to write it.
  for (size_t i = 0; i < n; ++i) {
    const GeoVertex& a = ring[i];
    const GeoVertex& b = ring[(i + 1) % n];
    if (std::abs(b.lon_deg - a.lon_deg) > 180.0)
      return fmt::format("the edge from vertex {} (lon {}) to vertex {} (lon {}) spans {} deg of longitude; an edge may "
                         "span at most 180 deg. To cross the antimeridian write the longitudes past 180 (for example 170 "
                         "to 190); to go the long way round, add vertices in between",
                         i, a.lon_deg, (i + 1) % n, b.lon_deg, std::abs(b.lon_deg - a.lon_deg));
  }
  for (size_t i = 0; i < n; ++i) {
    for (size_t j = i + 1; j < n; ++j) {
      const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
      if (adjacent) continue;
      if (segments_intersect(ring[i], ring[(i + 1) % n], ring[j], ring[(j + 1) % n]))
        return fmt::format("edges {}-{} and {}-{} cross; the region must be a simple (non-self-intersecting) polygon",
                           i, (i + 1) % n, j, (j + 1) % n);
    }
  }
  double twice_area = 0.0;  // shoelace formula
  for (size_t i = 0; i < n; ++i) {
    const GeoVertex& a = ring[i];
    const GeoVertex& b = ring[(i + 1) % n];
    twice_area += a.lon_deg * b.lat_deg - b.lon_deg * a.lat_deg;
  }
  if (std::abs(twice_area) < 1e-9) return std::string("the region has zero area (its vertices are collinear)");
  return std::nullopt;
}

bool point_in_polygon(double lon_deg, double lat_deg, const std::vector<GeoVertex>& ring) {
  return inside(lon_deg, lat_deg, ring) || inside(lon_deg + 360.0, lat_deg, ring) ||
         inside(lon_deg - 360.0, lat_deg, ring);
}

}  // namespace skein
