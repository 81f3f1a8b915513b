#pragma once
// Satellite positions and velocities (Earth-fixed) for a chunk of sample instants, and their latitude order.
#include <cstddef>
#include <functional>
#include <vector>

#include "skein/coverage/engine/geometry.hpp"
#include "skein/coverage/engine/settings.hpp"
#include "skein/orbit/propagate.hpp"

namespace skein::coverage_engine {

// The pole of a satellite's step arc and the cosine of half the arc (see PositionBuffer::step_pole).
struct StepPole {
  double nx, ny, nz, norm;
  double half_cos;  // cos(D / 2), D the angle between the ground directions at the step's two instants
};

// Satellite positions (Earth-fixed) for a window of sample instants.
struct PositionBuffer {
  long first = 0, count = 0;
  int sats = 0;
  std::vector<SatPos> pos;   // [local * sats + s]
  std::vector<SatVel> vel;   // [local * sats + s]
  std::vector<SatAux> aux;   // [local * sats + s]
  // Per instant: the largest outer footprint angle of any satellite over any row, and the largest change of a
  // satellite's geocentric latitude since the previous instant (both rad).
  std::vector<double> reach_rad, moved_rad;
  // The largest angle from a satellite's ground direction at t_{j-1} or t_j to a point that can see it
  // during the step (the outer angle at the largest orbit radius, plus the chord's half and the track's
  // deviation bound; hidden_pass.hpp). Constant over the run.
  double swept_reach_rad = 0.0;
  // Both modes: per satellite and instant t_j (j after the buffer's first), n = u(t_{j-1}) x u(t_j) and |n|,
  // the pole of the great circle through the satellite's ground directions at the step's two instants, for the
  // hidden-pass cross-track test (path_events.cpp), and cos(D / 2) for the footprint swept over the step
  // (hidden_pass.hpp). Computed once per satellite and step instead of once per (point or row, satellite,
  // step); the same numbers for both modes, so both make the same decisions.
  std::vector<StepPole> step_pole;  // [local * sats + s]; unset for the buffer's first instant
  // Culled mode only: per instant, the satellites sorted by geocentric latitude.
  std::vector<int> by_lat;
  std::vector<double> by_lat_sin;   // sin of the latitude, same order (contiguous for the binary searches)
  std::vector<SatAux> by_lat_aux;   // aux in the same order
  std::vector<SatAux> by_lat_prev;  // aux of the previous instant, same order (unset for the buffer's first)
  size_t at(long step, int s) const { return static_cast<size_t>((step - first) * sats + s); }
  size_t local(long step) const { return static_cast<size_t>(step - first); }
};


// Fill the buffer's instants [first, first + count) (set by the caller) with every satellite's Earth-fixed
// position and velocity (the J2 secular model; orbit/propagate.hpp), and, for the culled mode, the latitude
// order, the widest outer footprint angle per instant (reach_of of the largest radius) and the largest change
// of latitude since the previous instant. Parallel over instants; the result does not depend on the threads.
void fill_positions(PositionBuffer& buf, const std::vector<SecularOrbit>& orbits, const EarthModel& earth, double theta0_rad,
                    const Sampling& smp, bool culled, const std::function<double(double)>& reach_of);

}  // namespace skein::coverage_engine
