#pragma once
// The data of the evaluator's inner loops: ground points, satellite states per instant, the visibility
// geometry (mask, payload cone). Km, km/s, unit vectors; Earth-fixed frame.
#include "skein/constants.hpp"

namespace skein::coverage_engine {

// Ground point data laid out for the inner loops.
struct PointGeo {
  double rx, ry, rz;  // Earth-fixed position, km
  double nx, ny, nz;  // geodetic vertical
  double ux, uy, uz;  // geocentric unit vector
};

// Earth-fixed position (km) and geocentric unit vector of one satellite at one instant, packed together so a
// pair test touches one cache line.
struct SatPos {
  double x, y, z, ux, uy, uz;
};
// Earth-fixed velocity, km/s (for the pass-boundary interpolation only, so kept apart from the positions).
struct SatVel {
  double vx, vy, vz;
};

// Satellite state for the culling windows, per instant.
struct SatAux {
  double sin_psi, cos_psi, lon, r_km;  // geocentric latitude (sine, cosine), longitude (rad), radius (km)
};

struct Geometry {
  double sin_min = 0.0;
  double sin_min2 = 0.0;  // sin_min squared
  bool cone = false;
  double cos_cone = 0.0;
  bool polynomial = false;  // crossing times on the polynomial form of the margin (no cone, mask >= 5 deg)
  // Rises and sets found on the satellite's cubic path instead of the margin's cubic in time: set when the
  // step is long against the shortest full pass, where the margin is far from a cubic over a step.
  bool roots_on_path = false;
};

inline double cos_to(const PointGeo& p, const SatPos& q) { return p.ux * q.ux + p.uy * q.uy + p.uz * q.uz; }


}  // namespace skein::coverage_engine
