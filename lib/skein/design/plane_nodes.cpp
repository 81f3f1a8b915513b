#include "skein/design/plane_nodes.hpp"

#include "skein/angles.hpp"
#include "skein/constants.hpp"
#include "skein/design/constellation.hpp"
#include "skein/time/sun.hpp"

namespace skein {

std::vector<PlaneNode> plane_nodes(const Design& design) {
  const JulianDate jd = julian_date(design.epoch);
  std::vector<PlaneNode> out;
  for (size_t s = 0; s < design.shells.size(); ++s) {
    const Shell& shell = design.shells[s];
    for (int p = 0; p < shell.planes; ++p) {
      const double raan_rad = shell.pattern == PatternKind::explicit_planes
                                  ? wrap_two_pi(shell.explicit_planes[p].raan_deg * rad_per_deg)
                                  : walker_plane_raan_rad(shell, p);
      out.push_back({static_cast<int>(s), p, raan_rad * deg_per_rad, local_time_of_node_h(raan_rad, jd)});
    }
  }
  return out;
}

}  // namespace skein
