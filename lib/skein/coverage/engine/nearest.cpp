#include "skein/coverage/engine/nearest.hpp"

#include <algorithm>
#include <cmath>

#include "skein/constants.hpp"

namespace skein::coverage_engine {

// The K nearest satellites of a point, exactly, among all satellites at one instant. The central angle to a
// satellite is at least the difference of the geocentric latitudes, so its cosine is at most
// cos psi_s cos psi_p + sin psi_s sin psi_p (spherical law of cosines). The satellites are sorted by latitude,
// so the scan runs outward from the point's latitude and stops on each side once that bound is below the
// k-th best cosine found (less 1e-12 for rounding). The top-K values do not depend on the scan order, so
// this equals the full scan. `mid` is where the point's latitude falls in the sorted list (the scan stays exact
// if it is off by satellites within rounding of that latitude). Returns the number of satellites looked at.
long nearest_by_latitude(const PointGeo& pg, const PositionBuffer& buf, long step, int K, double* tp, int* ts, int mid) {
  std::fill(tp, tp + K, -2.0);
  std::fill(ts, ts + K, -1);
  const int T = buf.sats;
  const size_t base = buf.at(step, 0);
  const SatPos* sp = &buf.pos[base];
  const int* ord = &buf.by_lat[base];
  const double* zs = &buf.by_lat_sin[base];
  const SatAux* xs = &buf.by_lat_aux[base];
  const double zp = std::clamp(pg.uz, -1.0, 1.0), cp = std::sqrt(1.0 - zp * zp);
  long looked = 0;
  for (int k = mid; k < T; ++k) {
    if (xs[k].cos_psi * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
    insert_top_sat(tp, ts, K, cos_to(pg, sp[ord[k]]), ord[k]);
    ++looked;
  }
  for (int k = mid - 1; k >= 0; --k) {
    if (xs[k].cos_psi * cp + zs[k] * zp < tp[K - 1] - 1e-12) break;
    insert_top_sat(tp, ts, K, cos_to(pg, sp[ord[k]]), ord[k]);
    ++looked;
  }
  return looked;
}

// Range [lo, hi) of the latitude-sorted satellites at one instant with geocentric latitude within `half`
// (rad) of psi.
std::pair<int, int> latitude_range(const PositionBuffer& buf, long step, double psi, double half) {
  const size_t base = buf.at(step, 0);
  const double* zs = &buf.by_lat_sin[base];
  const double lo = psi - half <= -pi / 2 ? -2.0 : std::sin(psi - half);
  const double hi = psi + half >= pi / 2 ? 2.0 : std::sin(psi + half);
  const int a = static_cast<int>(std::lower_bound(zs, zs + buf.sats, lo) - zs);
  const int b = static_cast<int>(std::upper_bound(zs, zs + buf.sats, hi) - zs);
  return {a, b};
}


}  // namespace skein::coverage_engine
