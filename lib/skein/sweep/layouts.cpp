#include "skein/sweep/layouts.hpp"

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/orbit/sun_synchronous.hpp"
#include "skein/time/sun.hpp"

namespace skein {
namespace {

// Inclination choices times node local times: each sun-synchronous choice once per ltan.
size_t orbit_plane_choices(const SweepAxes& ax) {
  size_t n = 0;
  for (const auto& c : ax.inclinations) n += c.sun_synchronous ? ax.ltans.size() : 1;
  return n;
}

int other_satellites(const Sweep& sweep) {
  int n = 0;
  for (size_t s = 0; s < sweep.base.shells.size(); ++s)
    if (s != sweep.shell_index) n += sweep.base.shells[s].satellites;
  return n;
}

}  // namespace

double combination_count(const Sweep& sweep) {
  const SweepAxes& ax = sweep.axes;
  double f_per_tp = 0.0;
  for (int p : ax.planes) f_per_tp += ax.phasing ? static_cast<double>(ax.phasing->size()) : static_cast<double>(p);
  return static_cast<double>(ax.satellites.size()) * f_per_tp * static_cast<double>(ax.altitude_km.size()) *
         static_cast<double>(orbit_plane_choices(ax)) * static_cast<double>(ax.min_elevation_deg.size());
}

LayoutSet expand_layouts(const Sweep& sweep, double max_layouts) {
  const SweepAxes& ax = sweep.axes;
  const double combos = combination_count(sweep);
  if (combos > hard_max_layouts)
    throw InputError(fmt::format("{}: axes: the axes combine into {:.0f} layouts, above the hard limit of {:.0f}; "
                                 "expected fewer values on some axis",
                                 sweep.axes_location, combos, hard_max_layouts));
  if (combos > max_layouts)
    throw InputError(fmt::format("{}: axes: the axes combine into {:.0f} layouts, above the limit of {:.0f}; expected "
                                 "fewer values, or pass --force to run them all",
                                 sweep.axes_location, combos, max_layouts));
  const Shell& shell = sweep.base.shells[sweep.shell_index];
  const EarthModel& earth = sweep.base.earth;
  const int others = other_satellites(sweep);
  const auto inner = static_cast<long>(ax.altitude_km.size() * orbit_plane_choices(ax) * ax.min_elevation_deg.size());
  const auto per_altitude = static_cast<long>(ax.min_elevation_deg.size());
  LayoutSet set;
  for (int t : ax.satellites) {
    for (int p : ax.planes) {
      if (t % p != 0) {
        set.skipped.planes_not_dividing += inner * (ax.phasing ? static_cast<long>(ax.phasing->size()) : p);
        continue;
      }
      std::vector<int> fs;
      if (ax.phasing) {
        fs = *ax.phasing;
      } else {
        for (int f = 0; f < p; ++f) fs.push_back(f);
      }
      for (int f : fs) {
        if (f < 0 || f > p - 1) {
          set.skipped.phasing_out_of_range += inner;
          continue;
        }
        if (t + others < sweep.requirement.fold) {
          set.skipped.fold_above_satellites += inner;
          continue;
        }
        for (double alt : ax.altitude_km) {
          const double a_km = earth.radius_km + alt;
          for (const InclinationChoice& c : ax.inclinations) {
            std::vector<std::optional<LocalTimeChoice>> times;
            if (c.sun_synchronous) {
              for (const auto& lt : ax.ltans) times.emplace_back(lt);
            } else {
              times.emplace_back(std::nullopt);
            }
            std::optional<double> sso_i;
            if (c.sun_synchronous) {
              const auto i = sun_synchronous_inclination_rad(earth, a_km, shell.e);
              if (!i) {
                set.skipped.no_sun_synchronous += per_altitude * static_cast<long>(times.size());
                continue;
              }
              sso_i = *i * deg_per_rad;
            }
            for (const auto& lt : times) {
              for (double elev : ax.min_elevation_deg) {
                Layout l;
                l.index = set.layouts.size();
                l.satellites = t;
                l.planes = p;
                l.phasing = f;
                l.altitude_km = alt;
                l.sun_synchronous = c.sun_synchronous;
                l.inclination_deg = sso_i ? *sso_i : c.inclination_deg;
                l.ltan = lt;
                l.min_elevation_deg = elev;
                set.layouts.push_back(l);
              }
            }
          }
        }
      }
    }
  }
  if (set.layouts.empty())
    throw InputError(fmt::format("{}: axes: no valid layout: {} combinations skipped (P not dividing T: {}, F outside "
                                 "0..P-1: {}, no sun-synchronous inclination: {}, fold above the satellite count: {}); "
                                 "expected at least one valid combination",
                                 sweep.axes_location, set.skipped.total(), set.skipped.planes_not_dividing,
                                 set.skipped.phasing_out_of_range, set.skipped.no_sun_synchronous,
                                 set.skipped.fold_above_satellites));
  return set;
}

Design layout_design(const Sweep& sweep, const Layout& l) {
  Design d = sweep.base;
  d.name = fmt::format("{} / layout {}", sweep.base.name, l.index);
  Shell& s = d.shells[sweep.shell_index];
  s.satellites = l.satellites;
  s.planes = l.planes;
  s.phasing = l.phasing;
  s.a_km = d.earth.radius_km + l.altitude_km;
  s.inclination_deg = l.inclination_deg;
  s.sun_synchronous = l.sun_synchronous;
  if (l.ltan) {
    s.ltan_h = l.ltan->hours;
    s.raan0_deg = node_for_local_time_rad(l.ltan->hours, julian_date(d.epoch)) * deg_per_rad;
  } else {
    s.ltan_h = std::nullopt;  // the first node stays the base shell's node at epoch
  }
  d.coverage.min_elevation_deg = l.min_elevation_deg;
  return d;
}

std::string walker_label(const Layout& l) { return fmt::format("{}/{}/{}", l.satellites, l.planes, l.phasing); }

}  // namespace skein
