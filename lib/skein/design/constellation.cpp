#include "skein/design/constellation.hpp"

#include <cassert>

#include <fmt/format.h>

#include "skein/constants.hpp"
#include "skein/orbit/propagate.hpp"

namespace skein {

double walker_plane_raan_rad(const Shell& shell, int plane) {
  assert(shell.planes > 0);
  if (shell.ltan_span_h) {
    // First and last planes at the span's ends; local mean time advances 15 deg of node per hour. The reader
    // refuses a one-plane shell with a span, but a sweep may vary P down to 1: that plane keeps the first time.
    if (shell.planes == 1) return wrap_two_pi(shell.raan0_deg * rad_per_deg);
    return wrap_two_pi((shell.raan0_deg + plane * (*shell.ltan_span_h * 15.0) / (shell.planes - 1)) * rad_per_deg);
  }
  const double spread = shell.node_span_deg ? *shell.node_span_deg
                                            : (shell.pattern == PatternKind::walker_star ? 180.0 : 360.0);
  return wrap_two_pi((shell.raan0_deg + plane * spread / shell.planes) * rad_per_deg);
}

double walker_slot_arg_latitude_rad(const Shell& shell, int plane, int slot) {
  assert(shell.planes > 0 && shell.satellites % shell.planes == 0);
  const int per_plane = shell.satellites / shell.planes;
  const double u_deg = slot * 360.0 / per_plane + plane * (shell.phasing * 360.0) / shell.satellites;
  return wrap_two_pi(u_deg * rad_per_deg);
}

std::vector<Satellite> expand_constellation(const Design& design) {
  std::vector<Satellite> out;
  for (size_t s = 0; s < design.shells.size(); ++s) {
    const Shell& shell = design.shells[s];
    auto add = [&](int plane, int slot, double raan, double u) {
      Satellite sat;
      sat.shell = static_cast<int>(s);
      sat.plane = plane;
      sat.slot = slot;
      sat.id = fmt::format("{}-p{:02d}-s{:02d}", shell.name, plane + 1, slot + 1);
      sat.elements.a_km = shell.a_km;
      sat.elements.e = shell.e;
      sat.elements.i_rad = shell.inclination_deg * rad_per_deg;
      sat.elements.raan_rad = raan;
      sat.elements.argp_rad = wrap_two_pi(shell.argp_deg * rad_per_deg);
      sat.elements.mean_anomaly_rad = wrap_two_pi(u - sat.elements.argp_rad);
      sat.arg_latitude_rad = u;
      out.push_back(std::move(sat));
    };
    if (shell.pattern == PatternKind::explicit_planes) {
      for (size_t p = 0; p < shell.explicit_planes.size(); ++p) {
        const ExplicitPlane& pl = shell.explicit_planes[p];
        for (size_t k = 0; k < pl.slots_deg.size(); ++k)
          add(static_cast<int>(p), static_cast<int>(k), wrap_two_pi(pl.raan_deg * rad_per_deg),
              wrap_two_pi(pl.slots_deg[k] * rad_per_deg));
      }
    } else {
      const int per_plane = shell.satellites / shell.planes;
      for (int p = 0; p < shell.planes; ++p)
        for (int k = 0; k < per_plane; ++k)
          add(p, k, walker_plane_raan_rad(shell, p), walker_slot_arg_latitude_rad(shell, p, k));
    }
  }
  return out;
}

}  // namespace skein
