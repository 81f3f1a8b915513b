#include "skein/report/land_outlines.hpp"

#include <cmath>
#include <filesystem>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "skein/constants.hpp"
#include "skein/error.hpp"
#include "skein/io/read_file.hpp"

namespace skein {
namespace {

using json = nlohmann::json;

// A land outline file well above the largest world-atlas file (land-10m.json, 3.1 MB).
constexpr std::size_t max_outline_bytes = 64u * 1024u * 1024u;

struct Decoder {
  std::vector<std::vector<LonLat>> arcs;
  std::string where;

  [[noreturn]] void fail(const std::string& what) const {
    throw InputError(fmt::format("{}: {}; expected a TopoJSON Topology of land polygons (for example land-110m.json "
                                 "of the world-atlas package)", where, what));
  }

  double number(const json& j, const std::string& what) const {
    if (!j.is_number()) fail(what + " is not a number");
    const double v = j.get<double>();
    if (!std::isfinite(v)) fail(what + " is not finite");
    return v;
  }

  void read_arcs(const json& topo) {
    const json* transform = topo.contains("transform") ? &topo["transform"] : nullptr;
    double sx = 1, sy = 1, tx = 0, ty = 0;
    if (transform) {
      const json& s = (*transform)["scale"];
      const json& t = (*transform)["translate"];
      if (!s.is_array() || s.size() != 2 || !t.is_array() || t.size() != 2) fail("transform needs scale and translate pairs");
      sx = number(s[0], "transform.scale[0]");
      sy = number(s[1], "transform.scale[1]");
      tx = number(t[0], "transform.translate[0]");
      ty = number(t[1], "transform.translate[1]");
    }
    const json& list = topo["arcs"];
    if (!list.is_array()) fail("no arcs array");
    for (size_t a = 0; a < list.size(); ++a) {
      if (!list[a].is_array() || list[a].size() < 2) fail(fmt::format("arc {} is not a list of two or more positions", a));
      std::vector<LonLat> pts;
      double qx = 0, qy = 0;  // running sums of the quantized deltas
      for (const json& p : list[a]) {
        if (!p.is_array() || p.size() < 2) fail(fmt::format("arc {} holds a position that is not [x, y]", a));
        const double x = number(p[0], fmt::format("arc {} x", a)), y = number(p[1], fmt::format("arc {} y", a));
        if (transform) {
          qx += x;
          qy += y;
          pts.push_back({qx * sx + tx, qy * sy + ty});
        } else {
          pts.push_back({x, y});
        }
      }
      arcs.push_back(std::move(pts));
    }
  }

  Ring ring(const json& indices) const {
    if (!indices.is_array() || indices.empty()) fail("a ring is not a list of arc indices");
    Ring out;
    for (const json& ji : indices) {
      if (!ji.is_number_integer()) fail("an arc index is not an integer");
      const long long i = ji.get<long long>();
      const bool reversed = i < 0;
      const long long a = reversed ? ~i : i;
      if (a < 0 || a >= static_cast<long long>(arcs.size())) fail(fmt::format("arc index {} is out of range", i));
      const auto& pts = arcs[static_cast<size_t>(a)];
      const size_t n = pts.size();
      // Each next arc starts where the last ended: its first position is not repeated.
      for (size_t k = out.empty() ? 0 : 1; k < n; ++k) out.push_back(pts[reversed ? n - 1 - k : k]);
    }
    if (out.size() < 4) fail("a ring has fewer than four positions");
    return out;
  }

  LandPolygon polygon(const json& rings) const {
    if (!rings.is_array()) fail("a polygon is not a list of rings");
    LandPolygon p;
    for (const json& r : rings) p.rings.push_back(ring(r));
    return p;
  }

  void geometry(const json& g, LandOutlines& out) const {
    if (!g.is_object() || !g.contains("type") || !g["type"].is_string()) fail("a geometry has no type");
    const std::string type = g["type"].get<std::string>();
    if (type == "GeometryCollection") {
      if (!g.contains("geometries") || !g["geometries"].is_array()) fail("a GeometryCollection has no geometries");
      for (const json& c : g["geometries"]) geometry(c, out);
    } else if (type == "Polygon") {
      out.polygons.push_back(polygon(g["arcs"]));
    } else if (type == "MultiPolygon") {
      if (!g.contains("arcs") || !g["arcs"].is_array()) fail("a MultiPolygon has no arcs");
      for (const json& p : g["arcs"]) out.polygons.push_back(polygon(p));
    }
    // Points, lines and null geometries carry no land area: skipped.
  }
};

}  // namespace

LandOutlines decode_topojson(std::string_view text, const std::string& where) {
  Decoder d{{}, where};
  const json topo = json::parse(text.begin(), text.end(), nullptr, false);
  if (topo.is_discarded()) d.fail("not valid JSON");
  if (!topo.is_object() || topo.value("type", "") != "Topology") d.fail("not a Topology");
  if (!topo.contains("objects") || !topo["objects"].is_object()) d.fail("no objects");
  d.read_arcs(topo);
  LandOutlines out;
  out.source = where;
  for (const auto& [name, g] : topo["objects"].items()) d.geometry(g, out);
  if (out.polygons.empty()) d.fail("no polygons");
  return out;
}

LandOutlineLoad load_land_outlines(const std::string& path) {
  LandOutlineLoad r;
  std::error_code ec;
  if (path.empty()) {
    r.note = "land outlines missing: no outline file was given";
    return r;
  }
  if (!std::filesystem::exists(path, ec)) {
    r.note = fmt::format("land outlines missing: no file at {} (scripts/setup.sh installs it)", path);
    return r;
  }
  r.outlines = decode_topojson(read_file_text(path, max_outline_bytes, "a land outline file"), path);
  return r;
}

Ring unwrap_longitudes(const Ring& ring) {
  Ring out;
  out.reserve(ring.size());
  for (const LonLat& p : ring) {
    if (out.empty()) {
      out.push_back(p);
      continue;
    }
    double lon = p.lon_deg;
    const double prev = out.back().lon_deg;
    while (lon - prev > 180.0) lon -= 360.0;
    while (lon - prev < -180.0) lon += 360.0;
    out.push_back({lon, p.lat_deg});
  }
  return out;
}

Ring fillable_ring(const Ring& ring) {
  Ring u = unwrap_longitudes(ring);
  if (u.size() < 2) return u;
  const double turn = u.back().lon_deg - u.front().lon_deg;
  if (std::abs(turn) > 180.0) {
    // Round a pole: close the ring along the pole's parallel, back to the first longitude.
    double mean_lat = 0.0;
    for (const LonLat& p : u) mean_lat += p.lat_deg;
    const double pole = mean_lat < 0.0 ? -90.0 : 90.0;
    const LonLat first = u.front();
    u.push_back({u.back().lon_deg, pole});
    u.push_back({first.lon_deg, pole});
    u.push_back(first);
  }
  return u;
}

double ring_signed_area_sr(const Ring& ring) {
  const Ring u = fillable_ring(ring);
  double s = 0.0;
  for (size_t k = 0; k + 1 < u.size(); ++k) {
    const double dl = (u[k + 1].lon_deg - u[k].lon_deg) / deg_per_rad;
    s += dl * 0.5 * (std::sin(u[k].lat_deg / deg_per_rad) + std::sin(u[k + 1].lat_deg / deg_per_rad));
  }
  // Counterclockwise seen from outside (east along the south edge) gives a negative integral of sin(lat) dlon
  // for a ring north of the equator; the sign is flipped so that counterclockwise counts positive.
  return -s;
}

double land_area_fraction(const LandOutlines& land) {
  double total = 0.0;
  for (const LandPolygon& p : land.polygons)
    for (size_t r = 0; r < p.rings.size(); ++r) {
      double a = std::abs(ring_signed_area_sr(p.rings[r]));
      if (a > 2.0 * pi) a = 4.0 * pi - a;  // no land polygon or hole covers half the sphere: the smaller side
      total += r == 0 ? a : -a;
    }
  return total / (4.0 * pi);
}

}  // namespace skein
