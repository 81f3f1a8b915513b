#include "skein/coverage/engine/position_buffer.hpp"

#include "skein/coverage/engine/hidden_pass.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include <tbb/blocked_range.h>
#include <tbb/parallel_for.h>

namespace skein::coverage_engine {

void fill_positions(PositionBuffer& buf, const std::vector<SecularOrbit>& orbits, const EarthModel& earth, double theta0,
                    const Sampling& smp, bool culled, const std::function<double(double)>& reach_of) {
  const int T = buf.sats;
  const size_t cells = static_cast<size_t>(buf.count) * static_cast<size_t>(T);
  buf.pos.resize(cells);
  buf.vel.resize(cells);
  buf.aux.resize(cells);
  if (culled) {
    buf.by_lat.resize(cells);
    buf.by_lat_sin.resize(cells);
    buf.by_lat_aux.resize(cells);
    buf.by_lat_prev.resize(cells);
  }
  buf.step_pole.resize(cells);
  buf.reach_rad.assign(static_cast<size_t>(buf.count), 0.0);
  buf.moved_rad.assign(static_cast<size_t>(buf.count), 0.0);
  tbb::parallel_for(tbb::blocked_range<long>(0, buf.count), [&](const tbb::blocked_range<long>& r) {
    for (long l = r.begin(); l < r.end(); ++l) {
      const long step = buf.first + l;
      const double t = smp.time(step);
      const double theta = theta0 + earth.rotation_rad_s * t;
      double r_max = 0.0;
      for (int s = 0; s < T; ++s) {
        const EarthFixedState ef = earth_fixed_state_at(earth, orbits[static_cast<size_t>(s)], theta, t);
        const Eigen::Vector3d& r_ef = ef.r_km;
        const Eigen::Vector3d& v_ef = ef.v_km_s;
        const size_t i = buf.at(step, s);
        const double len = r_ef.norm();
        const double uz = std::clamp(r_ef.z() / len, -1.0, 1.0);
        buf.pos[i] = {r_ef.x(), r_ef.y(), r_ef.z(), r_ef.x() / len, r_ef.y() / len, r_ef.z() / len};
        buf.vel[i] = {v_ef.x(), v_ef.y(), v_ef.z()};
        buf.aux[i] = {uz, std::sqrt(1.0 - uz * uz), std::atan2(r_ef.y(), r_ef.x()), len};
        r_max = std::max(r_max, len);
      }
      if (!culled) continue;  // the latitude order below serves the row sweep only
      buf.reach_rad[static_cast<size_t>(l)] = reach_of(r_max);
      const size_t base = buf.at(step, 0);
      int* ord = &buf.by_lat[base];
      std::iota(ord, ord + T, 0);
      std::sort(ord, ord + T, [&](int a, int b) {
        const double za = buf.pos[base + static_cast<size_t>(a)].uz, zb = buf.pos[base + static_cast<size_t>(b)].uz;
        return za != zb ? za < zb : a < b;
      });
      for (int k = 0; k < T; ++k) {
        const SatAux& x = buf.aux[base + static_cast<size_t>(ord[k])];
        buf.by_lat_sin[base + static_cast<size_t>(k)] = x.sin_psi;
        buf.by_lat_aux[base + static_cast<size_t>(k)] = x;
      }
    }
  });
  // The poles and half-arc cosines of every satellite's step arc (hidden_pass.hpp), both modes.
  tbb::parallel_for(tbb::blocked_range<long>(1, std::max(1L, buf.count)), [&](const tbb::blocked_range<long>& r) {
    for (long l = r.begin(); l < r.end(); ++l) {
      const long step = buf.first + l;
      for (int s = 0; s < T; ++s) {
        const SatPos& q0 = buf.pos[buf.at(step - 1, s)];
        const SatPos& q1 = buf.pos[buf.at(step, s)];
        const double nx = q0.uy * q1.uz - q0.uz * q1.uy, ny = q0.uz * q1.ux - q0.ux * q1.uz, nz = q0.ux * q1.uy - q0.uy * q1.ux;
        buf.step_pole[buf.at(step, s)] = {nx, ny, nz, std::sqrt(nx * nx + ny * ny + nz * nz),
                                          swept_half_cos(q0.ux * q1.ux + q0.uy * q1.uy + q0.uz * q1.uz)};
      }
    }
  });
  // Largest change of latitude of any satellite since the previous instant, and the previous instant's data
  // in this instant's latitude order (the first instant of the buffer has none before it in the buffer; it
  // is only ever used as t_{j-1}).
  if (culled)
    tbb::parallel_for(tbb::blocked_range<long>(1, std::max(1L, buf.count)), [&](const tbb::blocked_range<long>& r) {
    for (long l = r.begin(); l < r.end(); ++l) {
      const long step = buf.first + l;
      const size_t base = buf.at(step, 0);
      double moved = 0.0;
      for (int k = 0; k < T; ++k) {
        const int s = buf.by_lat[base + static_cast<size_t>(k)];
        const SatAux& x1 = buf.by_lat_aux[base + static_cast<size_t>(k)];
        const SatAux& x0 = buf.aux[buf.at(step - 1, s)];
        buf.by_lat_prev[base + static_cast<size_t>(k)] = x0;
        moved = std::max(moved, std::abs(std::asin(x1.sin_psi) - std::asin(x0.sin_psi)));
      }
      buf.moved_rad[static_cast<size_t>(l)] = moved + 1e-9;
    }
  });

}

}  // namespace skein::coverage_engine
