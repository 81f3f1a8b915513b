#pragma once
// Expansion of a design's shells into individual satellites with mean elements at epoch.
#include <string>
#include <vector>

#include "skein/design/design.hpp"
#include "skein/orbit/elements.hpp"

namespace skein {

struct Satellite {
  int shell = 0;   // index into Design::shells
  int plane = 0;   // 0-based plane within the shell
  int slot = 0;    // 0-based slot within the plane
  std::string id;  // "SHELL-pPP-sSS", 1-based numbers, stable across runs
  MeanElements elements;
  double arg_latitude_rad = 0.0;  // mean argument of latitude omega + M at epoch
};

// Node of plane j and mean argument of latitude of slot k in a Walker pattern T/P/F:
//   Omega_j = Omega_0 + j * spread / P   (spread 360 deg for delta, 180 deg for star, or the shell's
//                                         node_span_deg)
//   Omega_j = Omega_0 + j * 15 deg/h * ltan_span_h / (P - 1)   (a span of local times, first and last plane
//                                         included; local mean time turns with the node at 15 deg per hour)
//   u_jk    = k * 360 deg / (T/P) + j * F * 360 deg / T   (the same phasing offset whatever the node span).
// Source: J.G. Walker, "Satellite constellations", J. British Interplanetary Society 37 (1984) 559-572
// (delta patterns); the star layout spreads the same pattern over 180 deg of node (common practice, and the
// same phasing unit 360 F / T is used for both here).
double walker_plane_raan_rad(const Shell& shell, int plane);
double walker_slot_arg_latitude_rad(const Shell& shell, int plane, int slot);

// All satellites of all shells, in shell, plane, slot order.
std::vector<Satellite> expand_constellation(const Design& design);

}  // namespace skein
