#include "skein/coverage/engine/row_index.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include <Eigen/Geometry>

namespace skein::coverage_engine {

std::vector<Row> build_rows(const std::vector<PointGeo>& geo, double min_elevation_rad,
                            std::optional<double> nadir_half_angle_rad) {
  std::vector<int> order(geo.size());
  std::iota(order.begin(), order.end(), 0);
  std::vector<double> psi(geo.size()), lon(geo.size());
  for (size_t i = 0; i < geo.size(); ++i) {
    psi[i] = std::asin(std::clamp(geo[i].uz, -1.0, 1.0));
    lon[i] = std::atan2(geo[i].uy, geo[i].ux);
    if (lon[i] >= pi) lon[i] -= two_pi;
  }
  std::sort(order.begin(), order.end(), [&](int a, int b) { return psi[a] != psi[b] ? psi[a] < psi[b] : a < b; });
  // Points of one grid latitude differ in computed geocentric latitude by rounding only; a row takes them all
  // (within 1e-10 rad, far inside the footprint margins) and uses its first latitude.
  std::vector<Row> rows;
  for (size_t k = 0; k < order.size();) {
    size_t e = k + 1;
    while (e < order.size() && psi[static_cast<size_t>(order[e])] - psi[static_cast<size_t>(order[k])] <= 1e-10) ++e;
    std::sort(order.begin() + static_cast<long>(k), order.begin() + static_cast<long>(e),
              [&](int a, int b) { return lon[a] != lon[b] ? lon[a] < lon[b] : a < b; });
    Row r;
    r.psi = psi[static_cast<size_t>(order[k])];
    r.sin_psi = std::sin(r.psi);
    r.cos_psi = std::cos(r.psi);
    for (size_t m = k; m < e; ++m) {
      r.lon.push_back(lon[static_cast<size_t>(order[m])]);
      r.point.push_back(order[m]);
    }
    rows.push_back(std::move(r));
    k = e;
  }
  for (Row& r : rows) {
    double rmin = 1e300, rmax = 0.0, defl = 0.0;
    for (int i : r.point) {
      const PointGeo& g = geo[static_cast<size_t>(i)];
      const double len = std::sqrt(g.rx * g.rx + g.ry * g.ry + g.rz * g.rz);
      rmin = std::min(rmin, len);
      rmax = std::max(rmax, len);
      const Eigen::Vector3d n(g.nx, g.ny, g.nz), u(g.ux, g.uy, g.uz);
      defl = std::max(defl, std::atan2(n.cross(u).norm(), n.dot(u)));
    }
    // Pads: 1 m in radius, 1e-9 rad in deflection, against rounding.
    if (r.lon.size() > 1 && r.lon.back() > r.lon.front())
      r.guess_scale = static_cast<double>(r.lon.size() - 1) / (r.lon.back() - r.lon.front());
    if (r.lon.size() > 1) {
      const double spacing = (r.lon.back() - r.lon.front()) / static_cast<double>(r.lon.size() - 1);
      bool even = std::abs(spacing * static_cast<double>(r.lon.size()) - two_pi) < 1e-9;
      for (size_t m = 0; m < r.lon.size() && even; ++m)
        even = std::abs(r.lon[m] - (r.lon.front() + static_cast<double>(m) * spacing)) < 1e-9;
      if (even) {
        r.periodic = true;
        r.lon0 = r.lon.front();
        r.per_rad = 1.0 / spacing;
      }
    }
    r.bounds = make_footprint_row(rmin - 1e-3, rmax + 1e-3, defl + 1e-9, min_elevation_rad, nadir_half_angle_rad);
  }
  return rows;
}

}  // namespace skein::coverage_engine
