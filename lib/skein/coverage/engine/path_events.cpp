#include "skein/coverage/engine/path_events.hpp"

#include <algorithm>
#include <cmath>

#include "skein/coverage/engine/margin.hpp"

namespace skein::coverage_engine {
namespace {

// One pair over one step: the true margin at the two buffered instants, and along the satellite's cubic path
// between them (what both searches on the path read).
class PairPath {
 public:
  PairPath(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g, double t0, double t1)
      : p_(p), g_(g), q0_(b.pos[b.at(j - 1, s)]), q1_(b.pos[b.at(j, s)]), w0_(b.vel[b.at(j - 1, s)]),
        w1_(b.vel[b.at(j, s)]), path_(make_path(q0_, w0_, q1_, w1_, t1 - t0)) {}
  MarginSample start() const { return true_margin(p_, q0_, w0_, g_); }
  MarginSample end() const { return true_margin(p_, q1_, w1_, g_); }
  MarginSample at(double tau) const {
    double r[3], v[3];
    path_.at(tau, r, v);
    const double len = std::sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    return true_margin(p_, SatPos{r[0], r[1], r[2], r[0] / len, r[1] / len, r[2] / len}, SatVel{v[0], v[1], v[2]}, g_);
  }

 private:
  static CubicPath make_path(const SatPos& q0, const SatVel& w0, const SatPos& q1, const SatVel& w1, double h) {
    const double p0[3] = {q0.x, q0.y, q0.z}, v0[3] = {w0.vx, w0.vy, w0.vz};
    const double p1[3] = {q1.x, q1.y, q1.z}, v1[3] = {w1.vx, w1.vy, w1.vz};
    return CubicPath(p0, v0, p1, v1, h);
  }
  const PointGeo& p_;
  const Geometry& g_;
  const SatPos& q0_;
  const SatPos& q1_;
  const SatVel& w0_;
  const SatVel& w1_;
  CubicPath path_;
};

}  // namespace

// A pass of (p, s) wholly inside (t_{j-1}, t_j] for a pair out of view at both instants (hidden_pass.hpp).
// sin_limit is the sine of an outer footprint angle of s valid for p over the step, widened by the track's
// deviation bound: the satellite's ground direction stays within that deviation of the great circle through
// its directions at the two instants, so a point farther than the outer angle plus the deviation from that
// circle cannot see it during the step (first test, no orbit evaluation). The path between the instants is
// the cubic Hermite interpolant of the buffered positions and velocities. Both modes call this with the same
// arguments for every pair that can hold a pass, so they find the same passes to the bit.
std::optional<HiddenPass> hidden_pass(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g,
                                      double sin_limit, double t0, double t1) {
  const SatPos& q0 = b.pos[b.at(j - 1, s)];
  const SatPos& q1 = b.pos[b.at(j, s)];
  if (sin_limit < 1.0) {
    const StepPole& n = b.step_pole[b.at(j, s)];  // u(t_{j-1}) x u(t_j), PositionBuffer
    if (n.norm > 1e-12 && std::abs(p.ux * n.nx + p.uy * n.ny + p.uz * n.nz) > sin_limit * n.norm) return std::nullopt;
  }
  // The rate test first: most candidates end here, before the path is built.
  const MarginSample a = true_margin(p, q0, b.vel[b.at(j - 1, s)], g), c = true_margin(p, q1, b.vel[b.at(j, s)], g);
  if (!(a.rate > 0.0 && c.rate < 0.0)) return std::nullopt;
  const PairPath path(p, b, j, s, g, t0, t1);
  return find_hidden_pass(t0, t1, a, c, [&](double tau) { return path.at(tau); });
}

// The time of the one rise or set of (p, s) inside (t_{j-1}, t_j) (visible at one instant, not the other),
// as the root of the true margin along the satellite's cubic path (regula falsi, Illinois, to 1e-9 of the
// step). Used instead of the margin's cubic in time when Geometry::roots_on_path is set.
double path_root(const PointGeo& p, const PositionBuffer& b, long j, int s, const Geometry& g, double t0, double t1) {
  const PairPath path(p, b, j, s, g, t0, t1);
  const auto f = [&](double tau) { return path.at(tau).value; };
  return t0 + (t1 - t0) * illinois_root(0.0, path.start().value, 1.0, path.end().value, f, 1e-9);
}

// Sine of the cross-track limit for hidden_pass from the cosine of an outer footprint angle and the track's
// deviation bound eps: sin(lambda + eps), or 2 (no limit) when lambda + eps reaches 90 deg.
double cross_track_sin_limit(double cos_lambda, double eps_rad) {
  const double lam = std::acos(std::clamp(cos_lambda, -1.0, 1.0)) + eps_rad + 1e-9;
  return lam >= pi / 2 ? 2.0 : std::sin(lam);
}


PathBounds path_bounds(const EarthModel& earth, const std::vector<SecularOrbit>& orbits, double step_s) {
  // Hidden passes (hidden_pass.hpp): bounds of each satellite's Earth-fixed ground-direction rate over the
  // run, from Kepler's second law (h = r^2 dnu/dt) on its mean elements with the J2 secular rates: the
  // true-anomaly rate lies between n (1 - e)^2 / (1 - e^2)^(3/2) at apogee and n (1 + e)^2 / (1 - e^2)^(3/2)
  // at perigee (Vallado 2013, sec. 2.2), the perigee drift and the mean-anomaly correction add at most their
  // size, and the frame turns at the Earth's rate plus the node drift. |d2nu/dt2| = 2 (dnu/dt) |dr/dt| / r is
  // at most 2 nu'_max n a e / (sqrt(1 - e^2) r_min).
  PathBounds pb;
  TrackRates& tr = pb.rates;
  const int T = static_cast<int>(orbits.size());
  tr.rate_min_rad_s = 1e300;
  double frame_rate = earth.rotation_rad_s, path_r4 = 0.0, r_apo_max = 0.0;
  std::vector<double>& r_apo = pb.r_apo_km;
  r_apo.resize(static_cast<size_t>(T));
  for (const SecularOrbit& o : orbits) frame_rate = std::max(frame_rate, earth.rotation_rad_s + std::abs(o.rates.raan_rad_s));
  for (int s = 0; s < T; ++s) {
    const SecularOrbit& o = orbits[static_cast<size_t>(s)];
    const double e = o.epoch_elements.e, a = o.epoch_elements.a_km, n = o.rates.mean_motion_rad_s;
    const double q = std::pow(1.0 - e * e, 1.5);
    const double extra = std::abs(o.rates.argp_rad_s) + std::abs(o.rates.mean_anomaly_rad_s - n);
    const double nu_max = n * (1.0 + e) * (1.0 + e) / q + extra, nu_min = n * (1.0 - e) * (1.0 - e) / q - extra;
    tr.rate_max_rad_s = std::max(tr.rate_max_rad_s, nu_max + frame_rate);
    tr.rate_min_rad_s = std::min(tr.rate_min_rad_s, nu_min - frame_rate);
    tr.accel_max_rad_s2 = std::max(tr.accel_max_rad_s2, 2.0 * nu_max * n * a * e / (std::sqrt(1.0 - e * e) * a * (1.0 - e)));
    r_apo[static_cast<size_t>(s)] = a * (1.0 + e);
    r_apo_max = std::max(r_apo_max, a * (1.0 + e));
    path_r4 = std::max(path_r4, a * (1.0 + e) * std::pow(nu_max + frame_rate, 4));
  }
  tr.frame_rate_rad_s = frame_rate;
  pb.track_eps_rad = track_deviation_bound_rad(tr, step_s);
  // Position error of the cubic path between two instants, h^4 max|d4r/dt4| / 384 (hidden_pass.hpp), in m.
  pb.path_error_m = 1000.0 * std::pow(step_s, 4) * path_r4 / 384.0;
  pb.r_apo_max_km = r_apo_max;
  return pb;
}

}  // namespace skein::coverage_engine
