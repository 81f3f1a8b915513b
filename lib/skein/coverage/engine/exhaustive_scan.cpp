#include "skein/coverage/engine/exhaustive_scan.hpp"

#include <algorithm>
#include <cassert>

#include "skein/coverage/engine/hidden_pass.hpp"
#include "skein/coverage/engine/margin.hpp"
#include "skein/coverage/engine/nearest.hpp"
#include "skein/coverage/engine/path_events.hpp"

namespace skein::coverage_engine {

// Exhaustive mode: one point over the instants [c0, c1) of the buffer, every satellite at every instant.
void scan_point(const EvaluationContext& sw, size_t p, long c0, long c1, Partial& acc, std::vector<int>& fresh,
                CrossingBatch& crossings, std::vector<double>& top, std::vector<Event>& hidden) {
  const PositionBuffer& buf = sw.buf;
  const PointGeo& pg = sw.geo[p];
  PointState& ps = sw.state[p];
  const PointSums sums = sw.sums(p);
  const int K = sw.K;
  double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
  for (long step = c0; step < c1; ++step) {
    fresh.clear();
    std::fill(top.begin(), top.end(), -2.0);
    double* tp = top.data();
    const size_t base = buf.at(step, 0);
    const SatPos* sp = &buf.pos[base];
    for (int s = 0; s < sw.T; ++s) {
      if (visible(pg, buf, base + static_cast<size_t>(s), sw.gm)) fresh.push_back(s);
      insert_top(tp, K, cos_to(pg, sp[s]));
    }
    acc.pair_tests += sw.T;
    acc.distance_tests += sw.T;
    for (int k = 0; k < K; ++k) wc[k] = std::min(wc[k], tp[k]);
    if (step == 0) {
      start_timeline(ps, sums, static_cast<int>(fresh.size()));
    } else {
      // Rises (in fresh, not in vis) and sets (in vis, not in fresh) inside (t_{j-1}, t_j].
      crossings.clear();
      hidden.clear();
      const double t0 = sw.smp.time(step - 1), t1 = sw.smp.time(step);
      const auto add = [&](int s, int delta) {
        if (sw.gm.roots_on_path)
          hidden.push_back({path_root(pg, buf, step, s, sw.gm, t0, t1), delta, 0});
        else
          crossings.add(crossing_bracket(pg, buf, step, s, sw.gm), delta, 0);
      };
      size_t a = 0, b = 0;
      while (a < ps.vis.size() || b < fresh.size()) {
        if (b == fresh.size() || (a < ps.vis.size() && ps.vis[a] < fresh[b])) {
          add(ps.vis[a], -1);
          ++a;
        } else if (a == ps.vis.size() || fresh[b] < ps.vis[a]) {
          add(fresh[b], +1);
          ++b;
        } else {
          ++a;
          ++b;
        }
      }
      crossings.solve(t0, t1);
      // Passes wholly between the instants: every satellite out of view at both.
      hidden.insert(hidden.end(), crossings.event.begin(), crossings.event.begin() + static_cast<long>(crossings.n));
      {
        size_t a0 = 0, b0 = 0;
        const SatPos* prev = &buf.pos[buf.at(step - 1, 0)];
        for (int s = 0; s < sw.T; ++s) {
          while (a0 < ps.vis.size() && ps.vis[a0] < s) ++a0;
          while (b0 < fresh.size() && fresh[b0] < s) ++b0;
          if ((a0 < ps.vis.size() && ps.vis[a0] == s) || (b0 < fresh.size() && fresh[b0] == s)) continue;
          // Outside the footprint swept over the step (seen from both ends, hidden_pass.hpp) the pair cannot
          // hold a pass: skipped before the path work. The row sweep's windows come from the same swept cap at
          // each row's (narrower) outer angle, so every pair it tests is tested here too; 1e-9 keeps rounding
          // on the side of testing.
          {
            const double c_w = swept_footprint_cos_from_half(sw.sat_widened_cos[static_cast<size_t>(s)],
                                                             buf.step_pole[base + static_cast<size_t>(s)].half_cos) - 1e-9;
            if (cos_to(pg, prev[s]) < c_w && cos_to(pg, sp[s]) < c_w) continue;
          }
          if (const auto pass = hidden_pass(pg, buf, step, s, sw.gm, sw.sat_sin_limit[static_cast<size_t>(s)], t0, t1)) {
            hidden.push_back({pass->rise_s, +1, 0});
            hidden.push_back({pass->set_s, -1, 0});
            ++acc.hidden_passes;
          }
        }
      }
      Event* events = hidden.data();
      std::sort(events, events + hidden.size(), event_before);
      acc.events += static_cast<std::int64_t>(hidden.size());
      apply_events(ps, sums, events, events + hidden.size(), t0, t1);
      if (sw.daylight) advance_daylight(ps, sums, t1);
      assert((sw.daylight ? ps.raw : ps.count) == static_cast<int>(fresh.size()));
    }
    add_covered(acc, static_cast<size_t>(step - c0), K, 0, ps.count, sw.weight_q[p]);
    ps.vis.swap(fresh);
  }
}


}  // namespace skein::coverage_engine
