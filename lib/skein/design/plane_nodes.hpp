#pragma once
// Every plane's node at epoch and its local mean time of the ascending node, for the layout listings of
// `skein check`, `skein drift` and the report (a delta pattern's later planes are otherwise hidden behind the
// first plane's LTAN).
#include <vector>

#include "skein/design/design.hpp"

namespace skein {

struct PlaneNode {
  int shell = 0;           // index into Design::shells
  int plane = 0;           // 0-based plane within the shell
  double raan_deg = 0.0;   // node right ascension at epoch, [0, 360)
  double ltan_h = 0.0;     // local mean time of the ascending node at epoch, [0, 24)
};

// All planes of all shells, in shell and plane order (Walker planes from walker_plane_raan_rad, explicit
// planes as given). The LTAN is the one at the epoch for every shell; it holds only for sun-synchronous ones.
std::vector<PlaneNode> plane_nodes(const Design& design);

}  // namespace skein
