#include "skein/sweep/layouts.hpp"

#include <algorithm>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/orbit/sun_synchronous.hpp"
#include "skein/time/sun.hpp"

namespace skein {
namespace {

enum class Skip { none, planes_not_dividing, phasing_out_of_range, no_sun_synchronous };

// One combination of a shell's axes: a valid choice, or why it is not a layout.
struct RawChoice {
  ShellChoice choice;
  Skip skip = Skip::none;
};

// Inclination choices times node local times: each sun-synchronous choice once per ltan.
size_t orbit_plane_choices(const ShellAxes& ax) {
  size_t n = 0;
  for (const auto& c : ax.inclinations) n += c.sun_synchronous ? ax.ltans.size() : 1;
  return n;
}

// The P values combined with T: the P axis, or every divisor of T (ascending) with `planes: divisors`.
std::vector<int> planes_for(const ShellAxes& ax, int t) {
  if (!ax.planes_divisors) return ax.planes;
  std::vector<int> out;
  for (int p = 1; p <= t; ++p)
    if (t % p == 0) out.push_back(p);
  return out;
}

double shell_combinations(const ShellAxes& ax) {
  double tpf = 0.0;
  for (int t : ax.satellites)
    for (int p : planes_for(ax, t)) tpf += ax.phasing ? static_cast<double>(ax.phasing->size()) : static_cast<double>(p);
  return tpf * static_cast<double>(ax.patterns.size()) * static_cast<double>(ax.altitude_km.size()) *
         static_cast<double>(orbit_plane_choices(ax));
}

double design_wide_combinations(const SweepAxes& ax) {
  return static_cast<double>(ax.min_elevation_deg.size() * ax.nadir_half_angle_deg.size() * ax.drag_area_m2.size() *
                             ax.dry_mass_kg.size() * ax.mission_life_years.size() * ax.solar_activity.size() *
                             ax.min_sun_elevation_deg.size());
}

// Every combination of one shell's axes, in the numbering's nesting order.
std::vector<RawChoice> shell_choices(const Sweep& sweep, const ShellAxes& ax) {
  const Shell& shell = sweep.base.shells[ax.shell_index];
  const EarthModel& earth = sweep.base.earth;
  std::vector<RawChoice> out;
  for (int t : ax.satellites) {
    for (int p : planes_for(ax, t)) {
      std::vector<int> fs;
      if (ax.phasing) {
        fs = *ax.phasing;
      } else {
        for (int f = 0; f < p; ++f) fs.push_back(f);
      }
      for (int f : fs) {
        for (PatternKind pattern : ax.patterns) {
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
              if (c.sun_synchronous)
                if (const auto i = sun_synchronous_inclination_rad(earth, a_km, shell.e)) sso_i = *i * deg_per_rad;
              for (const auto& lt : times) {
                RawChoice r;
                if (t % p != 0)
                  r.skip = Skip::planes_not_dividing;
                else if (f < 0 || f > p - 1)
                  r.skip = Skip::phasing_out_of_range;
                else if (c.sun_synchronous && !sso_i)
                  r.skip = Skip::no_sun_synchronous;
                ShellChoice& s = r.choice;
                s.shell_index = ax.shell_index;
                s.satellites = t;
                s.planes = p;
                s.phasing = f;
                s.pattern = pattern;
                s.altitude_km = alt;
                s.sun_synchronous = c.sun_synchronous;
                s.inclination_deg = sso_i ? *sso_i : c.inclination_deg;
                s.ltan = lt;
                out.push_back(r);
              }
            }
          }
        }
      }
    }
  }
  return out;
}

}  // namespace

double combination_count(const Sweep& sweep) {
  double n = design_wide_combinations(sweep.axes);
  for (const ShellAxes& s : sweep.axes.shells) n *= shell_combinations(s);
  return n;
}

LayoutSet expand_layouts(const Sweep& sweep, double max_layouts) {
  const SweepAxes& ax = sweep.axes;
  const double combos = combination_count(sweep);
  if (combos > hard_max_layouts)
    throw InputError(fmt::format("{}: axes: the axes combine into {:.0f} layouts, above the hard limit of {:.0f}; "
                                 "expected fewer values on some axis",
                                 sweep.file, combos, hard_max_layouts));
  if (combos > max_layouts)
    throw InputError(fmt::format("{}: axes: the axes combine into {:.0f} layouts, above the limit of {:.0f}; expected "
                                 "fewer values, or pass --force to run them all",
                                 sweep.file, combos, max_layouts));
  std::vector<std::vector<RawChoice>> raw;
  for (const ShellAxes& s : ax.shells) raw.push_back(shell_choices(sweep, s));
  std::vector<bool> varied(sweep.base.shells.size(), false);
  for (const ShellAxes& s : ax.shells) varied[s.shell_index] = true;
  int fixed_satellites = 0;  // the shells that are not varied
  for (size_t s = 0; s < sweep.base.shells.size(); ++s)
    if (!varied[s]) fixed_satellites += sweep.base.shells[s].satellites;
  const auto inner = static_cast<long>(design_wide_combinations(ax));
  LayoutSet set;
  // An odometer over the shells' combinations, the first shell outermost.
  std::vector<size_t> at(raw.size(), 0);
  if (std::any_of(raw.begin(), raw.end(), [](const auto& r) { return r.empty(); })) at.clear();
  while (!at.empty()) {
    Skip skip = Skip::none;
    int satellites = fixed_satellites;
    for (size_t k = 0; k < raw.size() && skip == Skip::none; ++k) {
      skip = raw[k][at[k]].skip;
      satellites += raw[k][at[k]].choice.satellites;
    }
    switch (skip) {
      case Skip::planes_not_dividing: set.skipped.planes_not_dividing += inner; break;
      case Skip::phasing_out_of_range: set.skipped.phasing_out_of_range += inner; break;
      case Skip::no_sun_synchronous: set.skipped.no_sun_synchronous += inner; break;
      case Skip::none:
        if (satellites < sweep.requirement.fold) {
          set.skipped.fold_above_satellites += inner;
          break;
        }
        for (double elev : ax.min_elevation_deg)
          for (const auto& nadir : ax.nadir_half_angle_deg)
            for (double area : ax.drag_area_m2)
              for (double mass : ax.dry_mass_kg)
                for (double life : ax.mission_life_years)
                  for (SolarLevel solar : ax.solar_activity)
                    for (const auto& sun : ax.min_sun_elevation_deg) {
                    Layout l;
                    l.index = set.layouts.size();
                    for (size_t k = 0; k < raw.size(); ++k) l.shells.push_back(raw[k][at[k]].choice);
                    l.min_elevation_deg = elev;
                    l.nadir_half_angle_deg = nadir;
                    l.drag_area_m2 = area;
                    l.dry_mass_kg = mass;
                    l.mission_life_years = life;
                    l.solar_activity = solar;
                    l.min_sun_elevation_deg = sun;
                    set.layouts.push_back(std::move(l));
                  }
        break;
    }
    size_t k = raw.size();
    while (k > 0 && ++at[k - 1] == raw[k - 1].size()) at[--k] = 0;
    if (k == 0) break;
  }
  if (set.layouts.empty())
    throw InputError(fmt::format("{}: axes: no valid layout: {} combinations skipped (P not dividing T: {}, F outside "
                                 "0..P-1: {}, no sun-synchronous inclination: {}, fold above the satellite count: {}); "
                                 "expected at least one valid combination",
                                 sweep.file, set.skipped.total(), set.skipped.planes_not_dividing,
                                 set.skipped.phasing_out_of_range, set.skipped.no_sun_synchronous,
                                 set.skipped.fold_above_satellites));
  return set;
}

Design layout_design(const Sweep& sweep, const Layout& l) {
  Design d = sweep.base;
  d.name = fmt::format("{} / layout {}", sweep.base.name, l.index);
  for (const ShellChoice& c : l.shells) {
    Shell& s = d.shells[c.shell_index];
    s.satellites = c.satellites;
    s.planes = c.planes;
    s.phasing = c.phasing;
    s.pattern = c.pattern;
    s.a_km = d.earth.radius_km + c.altitude_km;
    s.inclination_deg = c.inclination_deg;
    s.sun_synchronous = c.sun_synchronous;
    if (c.ltan) {
      s.ltan_h = c.ltan->hours;
      s.raan0_deg = node_for_local_time_rad(c.ltan->hours, julian_date(d.epoch)) * deg_per_rad;
    } else {
      s.ltan_h = std::nullopt;  // the first node stays the base shell's node at epoch
    }
  }
  d.coverage.min_elevation_deg = l.min_elevation_deg;
  d.coverage.nadir_half_angle_deg = l.nadir_half_angle_deg;
  d.coverage.min_sun_elevation_deg = l.min_sun_elevation_deg;
  d.spacecraft.drag_area_m2 = l.drag_area_m2;
  d.spacecraft.dry_mass_kg = l.dry_mass_kg;
  d.budget.mission_life_years = l.mission_life_years;
  d.budget.solar = l.solar_activity;
  return d;
}

std::string walker_label(const Layout& l) {
  std::string out;
  for (const ShellChoice& c : l.shells)
    out += fmt::format("{}{}/{}/{}", out.empty() ? "" : " + ", c.satellites, c.planes, c.phasing);
  return out;
}

}  // namespace skein
