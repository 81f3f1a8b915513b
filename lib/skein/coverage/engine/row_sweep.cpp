#include "skein/coverage/engine/row_sweep.hpp"

#include <algorithm>
#include <cmath>

#include "skein/coverage/engine/margin.hpp"
#include "skein/coverage/engine/nearest.hpp"
#include "skein/coverage/engine/path_events.hpp"
#include "skein/coverage/footprint.hpp"

namespace skein::coverage_engine {

// Culled mode: row number r of `rows_total` over the instants [c0, c1) of the buffer.
void sweep_row(const EvaluationContext& sw, const Row& row, long r, long rows_total, long c0, long c1, Partial& acc,
               RowScratch& scratch) {
  const PositionBuffer& buf = sw.buf;
  CrossingBatch& crossings = scratch.crossings;
  std::vector<Event>& sorted = scratch.sorted;
  std::vector<int>& count = scratch.count;
  std::vector<double>& top = scratch.top;
  std::vector<int>& top_sat = scratch.top_sat;
  WindowCache& cache = scratch.cache;
  // Footprint cosines of the last orbit radius seen on this row, made good for radii within 1 mm of it (the
  // outer cosine of the largest radius, the inner of the smallest: both bounds shrink the safe side only,
  // since both angles grow with the radius). Circular shells then compute them once per row.
  constexpr double radius_tolerance_km = 1e-6;
  double r_seen = -1.0;
  FootprintCosines f_seen;
  const auto cosines = [&](double r_km) {
    if (std::abs(r_km - r_seen) > radius_tolerance_km) {
      r_seen = r_km;
      f_seen = {footprint_cosines(row.bounds, r_km + radius_tolerance_km).outer,
                footprint_cosines(row.bounds, r_km - radius_tolerance_km).inner};
    }
    return f_seen;
  };
  // The same at a satellite's largest orbit radius (its outer cosine holds over a whole step), with the sine of
  // the hidden-pass cross-track limit.
  double r_apo_seen = -1.0, cos_apo = 1.0, sin_limit_apo = 2.0, widened_apo = 1.0;
  const auto apogee_outer = [&](double r_km) {
    if (r_km != r_apo_seen) {
      r_apo_seen = r_km;
      cos_apo = footprint_cosines(row.bounds, r_km + radius_tolerance_km).outer;
      sin_limit_apo = cross_track_sin_limit(cos_apo, sw.track_eps_rad);
      widened_apo = widened_footprint_cos(cos_apo, sw.track_eps_rad);
    }
  };
  if (cache.key.size() != static_cast<size_t>(sw.T)) {
    cache.key.assign(static_cast<size_t>(sw.T), -1);
    cache.in.assign(static_cast<size_t>(sw.T), 0.0);
  }
  const size_t n = row.point.size();
  const int K = sw.K;
  // The points whose nearest satellites are looked at, step by step. A point its remembered satellites settle
  // for some instants is put on the wake list of the first instant after them and not touched before; the
  // others are due again at the next instant. So the per-step work of the nearest search follows the
  // unsettled points, not the row. Each point is on at most one list at a time (wake_next links a list).
  std::vector<int>& wake_head = scratch.wake_head;
  std::vector<int>& wake_next = scratch.wake_next;
  std::vector<std::uint32_t>& due = scratch.due;
  std::vector<std::uint32_t>& next_due = scratch.next_due;
  std::vector<std::uint32_t>& open_list = scratch.open_list;
  std::vector<std::uint64_t>& open_bits = scratch.open_bits;
  wake_head.assign(static_cast<size_t>(c1 - c0 + 1), -1);
  wake_next.assign(n, -1);
  top.assign(n * static_cast<size_t>(K), -2.0);
  top_sat.assign(n * static_cast<size_t>(K), -1);
  next_due.resize(n);
  for (size_t i = 0; i < n; ++i) next_due[i] = static_cast<std::uint32_t>(i);
  for (long step = c0; step < c1; ++step) {
    const SatPos* sp1 = &buf.pos[buf.at(step, 0)];
    const SatAux* sx1 = &buf.by_lat_aux[buf.at(step, 0)];
    const int* ord = &buf.by_lat[buf.at(step, 0)];
    const size_t ls = static_cast<size_t>(step - c0);
    if (step == 0) {
      // Satellites in view at the first instant, inside each satellite's outer window.
      count.assign(n, 0);
      const auto [a, b] = latitude_range(buf, step, row.psi, buf.reach_rad[buf.local(step)]);
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x = sx1[k];
        const double h = row_half_width(row.sin_psi, row.cos_psi, x.sin_psi, x.cos_psi,
                                        cosines(x.r_km).outer, true);
        if (h < 0.0) continue;
        const auto test = [&](long i) {
          ++acc.pair_tests;
          if (visible(sw.geo[static_cast<size_t>(row.point[static_cast<size_t>(i)])], buf, buf.at(step, s), sw.gm))
            ++count[static_cast<size_t>(i)];
        };
        for_window(row, x.lon, h, test);
      }
      for (size_t i = 0; i < n; ++i) {
        const size_t p = static_cast<size_t>(row.point[i]);
        start_timeline(sw.state[p], sw.sums(p), count[i]);
        add_covered(acc, ls, K, 0, sw.state[p].count, sw.weight_q[p]);
      }
    } else {
      // Rises and sets inside (t_{j-1}, t_j].
      crossings.clear();
      scratch.hidden.clear();
      const double t0 = sw.smp.time(step - 1), t1 = sw.smp.time(step);
      const SatAux* sx0 = &buf.by_lat_prev[buf.at(step, 0)];
      // Satellites whose swept footprint can reach the row: the widest outer angle at the largest orbit
      // radius, widened as in swept_footprint_cos for the largest chord of a step (so never below the
      // instant's own reach_rad), plus the largest move in latitude since t_{j-1}.
      const double reach = buf.swept_reach_rad + buf.moved_rad[buf.local(step)];
      const auto [a, b] = latitude_range(buf, step, row.psi, reach);
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x1 = sx1[k];
        const SatAux& x0 = sx0[k];
        const FootprintCosines f1 = cosines(x1.r_km);
        const FootprintCosines f0 = cosines(x0.r_km);
        // The inner window of t_{j-1}, from this row's previous instant when it was computed there.
        const size_t su = static_cast<size_t>(s);
        const bool cached = cache.key[su] == (step - 1) * rows_total + r;
        const double cache_in0 = cached ? cache.in[su] : no_window;
        cache.key[su] = step * rows_total + r;
        cache.in[su] = no_window;
        // The windows swept over the step (hidden passes): the outer angle at the satellite's largest radius,
        // widened for its motion between the instants. They hold the outer windows of both instants.
        apogee_outer(sw.sat_r_apo_km[su]);
        const double c_w = swept_footprint_cos_from_half(widened_apo, buf.step_pole[buf.at(step, s)].half_cos);
        const double sin_limit = sin_limit_apo;
        const double h1w = row_half_width(row.sin_psi, row.cos_psi, x1.sin_psi, x1.cos_psi, c_w, true);
        const double h0w = row_half_width(row.sin_psi, row.cos_psi, x0.sin_psi, x0.cos_psi, c_w, true);
        if (h1w < 0.0 && h0w < 0.0) continue;
        // Longitudes as offsets from the satellite's at t_j; d0 is its offset at t_{j-1}.
        double d0 = x0.lon - x1.lon;
        if (d0 > pi) d0 -= two_pi;
        if (d0 < -pi) d0 += two_pi;
        constexpr double whole = 4.0 * pi;  // a window that holds the whole row
        double ulo = 1e300, uhi = -1e300;
        if (h1w >= 0.0) {
          ulo = h1w >= pi ? -whole : -h1w;
          uhi = h1w >= pi ? whole : h1w;
        }
        if (h0w >= 0.0) {
          ulo = std::min(ulo, h0w >= pi ? -whole : d0 - h0w);
          uhi = std::max(uhi, h0w >= pi ? whole : d0 + h0w);
        }
        bool inner = false;
        double ilo = 0.0, ihi = 0.0;
        if (h1w >= 0.0 && h0w >= 0.0 && f1.inner <= 1.0 && f0.inner <= 1.0) {
          const double h1i = row_half_width(row.sin_psi, row.cos_psi, x1.sin_psi, x1.cos_psi, f1.inner, false);
          cache.in[su] = h1i;
          const double h0i = h1i < 0.0 ? -1.0
                             : cache_in0 != no_window
                                 ? cache_in0
                                 : row_half_width(row.sin_psi, row.cos_psi, x0.sin_psi, x0.cos_psi, f0.inner, false);
          if (h1i >= 0.0 && h0i >= 0.0) {
            ilo = std::max(h1i >= pi ? -whole : -h1i, h0i >= pi ? -whole : d0 - h0i);
            ihi = std::min(h1i >= pi ? whole : h1i, h0i >= pi ? whole : d0 + h0i);
            inner = ilo <= ihi;
          }
        }
        if (inner && ihi - ilo >= two_pi) continue;  // the whole row sees the satellite at both instants
        const size_t i1 = buf.at(step, s), i0 = buf.at(step - 1, s);
        const auto add_hidden = [&](const PointGeo& pg, long i) {
          if (const auto pass = hidden_pass(pg, buf, step, s, sw.gm, sin_limit, t0, t1)) {
            scratch.hidden.push_back({pass->rise_s, +1, static_cast<std::uint32_t>(i)});
            scratch.hidden.push_back({pass->set_s, -1, static_cast<std::uint32_t>(i)});
            ++acc.hidden_passes;
          }
        };
        const auto add_on_path = [&](const PointGeo& pg, int delta, long i) {
          scratch.hidden.push_back({path_root(pg, buf, step, s, sw.gm, t0, t1), delta, static_cast<std::uint32_t>(i)});
        };
        const auto test = [&](long i) {
          const size_t p = static_cast<size_t>(row.point[static_cast<size_t>(i)]);
          const PointGeo& pg = sw.geo[p];
          acc.pair_tests += 2;
          if (sw.gm.polynomial) {
            // The visibility test and the crossing share the margin's value: its sign is visible()'s, and its
            // numbers are those crossing_bracket computes, so exhaustive mode finds the same times.
            const PolynomialValue e1 = polynomial_value(pg, buf.pos[i1], sw.gm);
            const PolynomialValue e0 = polynomial_value(pg, buf.pos[i0], sw.gm);
            const bool v1 = e1.value >= 0.0, v0 = e0.value >= 0.0;
            if (v1 != v0 && sw.gm.roots_on_path)
              add_on_path(pg, v1 ? 1 : -1, i);
            else if (v1 != v0)
              crossings.add({e0.value, polynomial_rate(pg, e0, buf.vel[i0], sw.gm), e1.value,
                             polynomial_rate(pg, e1, buf.vel[i1], sw.gm)},
                            v1 ? 1 : -1, static_cast<std::uint32_t>(i));
            else if (!v1)
              add_hidden(pg, i);
            return;
          }
          const bool v1 = visible(pg, buf, i1, sw.gm), v0 = visible(pg, buf, i0, sw.gm);
          if (v1 != v0 && sw.gm.roots_on_path)
            add_on_path(pg, v1 ? 1 : -1, i);
          else if (v1 != v0)
            crossings.add(crossing_bracket(pg, buf, step, s, sw.gm), v1 ? 1 : -1, static_cast<std::uint32_t>(i));
          else if (!v1)
            add_hidden(pg, i);
        };
        if (uhi - ulo >= two_pi) {
          if (inner) {
            for_arc(row, x1.lon + ihi, x1.lon + ilo + two_pi, true, true, test);
          } else {
            for_row(row, test);
          }
        } else if (inner) {
          for_two_arcs(row, x1.lon + ulo, x1.lon + ilo, x1.lon + ihi, x1.lon + uhi, test);
        } else {
          for_arc(row, x1.lon + ulo, x1.lon + uhi, false, false, test);
        }
      }
      if (crossings.n > 0 || !scratch.hidden.empty()) {
        crossings.solve(t0, t1);
        // Group the events by point, each point's few events in time (event_before): each event is linked to
        // the previous one of its point, the points with events are listed as they first appear, and each
        // point's run is gathered, put in time order and applied. O(events) work, whatever the row's length;
        // events equal in time and sign are interchangeable, and the points' order changes no sum (the
        // covered weights are integers).
        const size_t m = crossings.n + scratch.hidden.size();
        acc.events += static_cast<std::int64_t>(m);
        std::vector<int>& head = scratch.head;
        std::vector<int>& link = scratch.link;
        std::vector<std::uint32_t>& touched = scratch.touched;
        if (head.size() < n) head.assign(n, -1);
        link.resize(m);
        touched.clear();
        const auto event_at = [&](size_t k) -> const Event& {
          return k < crossings.n ? crossings.event[k] : scratch.hidden[k - crossings.n];
        };
        for (size_t k = 0; k < m; ++k) {
          const std::uint32_t i = event_at(k).point;
          if (head[i] < 0) touched.push_back(i);
          link[k] = head[i];
          head[i] = static_cast<int>(k);
        }
        for (const std::uint32_t i : touched) {
          sorted.clear();
          for (int k = head[i]; k >= 0; k = link[static_cast<size_t>(k)]) sorted.push_back(event_at(static_cast<size_t>(k)));
          head[i] = -1;
          Event* eb = sorted.data();
          Event* ee = eb + sorted.size();
          sort_short(eb, ee);
          const size_t p = static_cast<size_t>(row.point[i]);
          PointState& ps = sw.state[p];
          const int before = ps.count;
          apply_events(ps, sw.sums(p), eb, ee, t0, t1);
          add_covered(acc, ls, K, before, ps.count, sw.weight_q[p]);
        }
      }
      // Daylight mask: the changes of daylight up to t_j of every point of the row, with or without events.
      if (sw.daylight) {
        for (size_t i = 0; i < n; ++i) {
          const size_t p = static_cast<size_t>(row.point[i]);
          PointState& ps = sw.state[p];
          const int before = ps.count;
          advance_daylight(ps, sw.sums(p), t1);
          add_covered(acc, ls, K, before, ps.count, sw.weight_q[p]);
        }
      }
    }
    // The K nearest satellites of each point, for the required radius. Only the worst (smallest) k-th cosine
    // over time is kept, so an instant matters only if it could lower it. First the satellites that were the
    // K nearest when the point was last searched: the k-th largest of their cosines now is a lower bound of
    // the k-th nearest's, so when it is at least the worst so far for every k, the instant cannot lower it
    // and the point is settled. The other points look inside the search cap, then scan exactly where fewer
    // than K lie there, and remember the K found.
    // The points due now: those due again after the last instant, and those whose skip ends here.
    due.swap(next_due);
    next_due.clear();
    for (int i = wake_head[static_cast<size_t>(step - c0)]; i >= 0; i = wake_next[static_cast<size_t>(i)])
      due.push_back(static_cast<std::uint32_t>(i));
    open_list.clear();
    // A settled point runs forward with the same remembered satellites: at each later instant of the buffer the
    // k-th largest of their cosines is again a lower bound of the k-th nearest's, so while it stays at or
    // above the worst so far for every k, that instant cannot lower the worst and is skipped (exactly: the same
    // numbers as if it were checked there). One dot product per remembered satellite and instant, in a tight
    // loop over the buffer; the point is due again at the first instant the remembered satellites do not
    // settle, or at the next buffer.
    for (const std::uint32_t i : due) {
      const size_t p = static_cast<size_t>(row.point[i]);
      const int* nb = &sw.nearest[p * static_cast<size_t>(K)];
      if (nb[0] < 0) {
        open_list.push_back(i);
        continue;
      }
      const PointGeo& pg = sw.geo[p];
      const double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
      long j = step;
      if (K == 1) {
        // One satellite: its cosine at each instant against the worst, walking its column of the buffer.
        const double w0 = wc[0];
        const SatPos* column = buf.pos.data();
        size_t at = buf.at(step, nb[0]);
        const size_t stride = static_cast<size_t>(sw.T);
        while (j < c1 && cos_to(pg, column[at]) >= w0) {
          ++j;
          at += stride;
        }
      } else {
        const auto settles = [&](long l) {
          const SatPos* spl = &buf.pos[buf.at(l, 0)];
          double lower[max_fold_limit];
          std::fill(lower, lower + K, -2.0);
          for (int k = 0; k < K; ++k) insert_top(lower, K, cos_to(pg, spl[nb[k]]));
          for (int k = 0; k < K; ++k)
            if (lower[k] < wc[k]) return false;
          return true;
        };
        while (j < c1 && settles(j)) ++j;
      }
      acc.distance_tests += static_cast<std::int64_t>(K) * (std::min(j, c1 - 1) - step + 1);
      if (j == step) {
        open_list.push_back(i);
      } else if (j < c1) {
        const size_t w = static_cast<size_t>(j - c0);
        wake_next[i] = wake_head[w];
        wake_head[w] = static_cast<int>(i);
      }
    }
    if (open_list.empty()) continue;
    // The open points as a bit set, so each satellite's window visits only them (for_marked); cleared below.
    open_bits.resize((n + 63) / 64, 0);
    for (const std::uint32_t i : open_list) open_bits[i >> 6] |= std::uint64_t{1} << (i & 63u);
    for (const std::uint32_t i : open_list) {
      std::fill_n(&top[i * static_cast<size_t>(K)], K, -2.0);
      std::fill_n(&top_sat[i * static_cast<size_t>(K)], K, -1);
    }
    {
      const auto [a, b] = latitude_range(buf, step, row.psi, sw.search_rad + 1e-9);
      const double c = std::cos(std::min(pi, sw.search_rad + 1e-9));
      for (int k = a; k < b; ++k) {
        const int s = ord[k];
        const SatAux& x = sx1[k];
        const double h = row_half_width(row.sin_psi, row.cos_psi, x.sin_psi, x.cos_psi, c, true);
        if (h < 0.0) continue;
        const SatPos& q = sp1[s];
        const auto near = [&](long i) {
          ++acc.distance_tests;
          const size_t o = static_cast<size_t>(i) * static_cast<size_t>(K);
          insert_top_sat(&top[o], &top_sat[o], K, cos_to(sw.geo[static_cast<size_t>(row.point[static_cast<size_t>(i)])], q), s);
        };
        for_marked(row, open_bits, x.lon, h, near);
      }
    }
    int mid = -1;
    for (const std::uint32_t i : open_list) {
      open_bits[i >> 6] = 0;
      next_due.push_back(i);
      const size_t p = static_cast<size_t>(row.point[i]);
      double* tp = &top[i * static_cast<size_t>(K)];
      int* ts = &top_sat[i * static_cast<size_t>(K)];
      if (tp[K - 1] < sw.search_cos) {
        ++acc.fallbacks;
        if (mid < 0) {
          const double* zs = &buf.by_lat_sin[buf.at(step, 0)];
          mid = static_cast<int>(std::lower_bound(zs, zs + sw.T, row.sin_psi) - zs);
        }
        acc.distance_tests += nearest_by_latitude(sw.geo[p], buf, step, K, tp, ts, mid);
      }
      std::copy(ts, ts + K, &sw.nearest[p * static_cast<size_t>(K)]);
      double* wc = &sw.worst_cos[p * static_cast<size_t>(K)];
      for (int k = 0; k < K; ++k) wc[k] = std::min(wc[k], tp[k]);
    }
  }
}


}  // namespace skein::coverage_engine
