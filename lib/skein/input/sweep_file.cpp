#include "skein/input/sweep_file.hpp"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include <fmt/format.h>

#include "skein/input/design_file.hpp"
#include "skein/input/coverage_block.hpp"
#include "skein/input/requirement_block.hpp"
#include "skein/input/yaml_reader.hpp"
#include "skein/io/checksum.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/version.hpp"

namespace skein {
namespace {

using yaml::MapReader;


std::string read_whole_file(const std::string& path) { return yaml::read_text_file(path); }

// The raw values of an axis: a single scalar, a list, or a range {from, to, step} (both ends included).
std::vector<double> read_number_axis(const MapReader& axes, std::string_view key, double min, double max,
                                     std::string_view what, bool whole) {
  const YAML::Node n = axes.node(key);
  const std::string path = axes.path_of(key);
  const std::string& file = axes.file();
  auto value_of = [&](const YAML::Node& item, const std::string& item_path) {
    const double v = yaml::scalar_number(file, item, item_path, min, max, what);
    if (whole && v != std::floor(v))
      yaml::fail_at(file, item, item_path, fmt::format("{} is not a whole number; expected {}", v, what));
    return v;
  };
  std::vector<double> values;
  if (n.IsScalar()) {
    values.push_back(value_of(n, path));
  } else if (n.IsSequence()) {
    for (size_t i = 0; i < n.size(); ++i) {
      if (values.size() >= max_axis_values)
        yaml::fail_at(file, n, path, fmt::format("the axis lists more than {} values; expected at most {}",
                                                 max_axis_values, max_axis_values));
      values.push_back(value_of(n[i], fmt::format("{}[{}]", path, i)));
    }
  } else if (n.IsMap()) {
    const MapReader r = axes.map(key, {"from", "to", "step"});
    const double from = value_of(r.node("from"), r.path_of("from"));
    const double to = value_of(r.node("to"), r.path_of("to"));
    const double step = r.number("step", 0.0, 1e9, "a positive step");
    if (!(step > 0.0)) r.fail_key("step", "a step of 0 expands to nothing; expected a positive step");
    if (whole && step != std::floor(step)) r.fail_key("step", fmt::format("{} is not a whole step; expected a whole number", step));
    if (from > to)
      r.fail(r.self(), path, fmt::format("from {} to {} expands to no values; expected from <= to", from, to));
    // Both ends included; the small allowance keeps "500 to 600 step 0.1" from losing its last value to rounding.
    const double count = std::floor((to - from) / step * (1.0 + 1e-12) + 1e-9) + 1.0;
    if (count > static_cast<double>(max_axis_values))
      r.fail(r.self(), path, fmt::format("the range holds {:.0f} values; expected at most {}", count, max_axis_values));
    for (long i = 0; i < static_cast<long>(count); ++i) values.push_back(from + static_cast<double>(i) * step);
  } else {
    yaml::fail_at(file, n, path, fmt::format("expected {}: a value, a list, or a range {{from, to, step}}", what));
  }
  if (values.empty()) yaml::fail_at(file, n, path, "the axis expands to no values; expected at least one value");
  std::set<double> seen;
  for (double v : values)
    if (!seen.insert(v).second)
      yaml::fail_at(file, n, path, fmt::format("the value {} appears twice; expected each value once", v));
  return values;
}

std::vector<int> to_ints(const std::vector<double>& v) {
  std::vector<int> out;
  for (double x : v) out.push_back(static_cast<int>(x));
  return out;
}

std::vector<InclinationChoice> read_inclination_axis(const MapReader& axes) {
  const YAML::Node n = axes.node("inclination_deg");
  const std::string path = axes.path_of("inclination_deg");
  std::vector<YAML::Node> items;
  if (n.IsSequence()) {
    for (size_t i = 0; i < n.size(); ++i) items.push_back(n[i]);
  } else if (n.IsScalar()) {
    items.push_back(n);
  } else if (n.IsMap()) {
    std::vector<InclinationChoice> out;
    for (double v : read_number_axis(axes, "inclination_deg", 0.0, 180.0, "an inclination in degrees", false))
      out.push_back({false, v});
    return out;
  } else {
    yaml::fail_at(axes.file(), n, path, "expected inclinations: a list of degrees and/or sun-synchronous, or a range");
  }
  if (items.empty()) yaml::fail_at(axes.file(), n, path, "the axis expands to no values; expected at least one value");
  if (items.size() > max_axis_values)
    yaml::fail_at(axes.file(), n, path, fmt::format("the axis lists more than {} values", max_axis_values));
  std::vector<InclinationChoice> out;
  std::set<double> seen;
  bool sso = false;
  for (size_t i = 0; i < items.size(); ++i) {
    const std::string p = n.IsSequence() ? fmt::format("{}[{}]", path, i) : path;
    if (items[i].IsScalar() && items[i].Scalar() == "sun-synchronous") {
      if (sso) yaml::fail_at(axes.file(), items[i], p, "sun-synchronous appears twice; expected it once");
      sso = true;
      out.push_back({true, 0.0});
    } else {
      const double v = yaml::scalar_number(axes.file(), items[i], p, 0.0, 180.0,
                                           "an inclination in degrees (0 to 180) or sun-synchronous");
      if (!seen.insert(v).second)
        yaml::fail_at(axes.file(), items[i], p, fmt::format("the value {} appears twice; expected each value once", v));
      out.push_back({false, v});
    }
  }
  return out;
}

std::vector<LocalTimeChoice> read_ltan_axis(const MapReader& axes) {
  const YAML::Node n = axes.node("ltan");
  const std::string path = axes.path_of("ltan");
  std::vector<std::pair<YAML::Node, std::string>> items;
  if (n.IsSequence()) {
    for (size_t i = 0; i < n.size(); ++i) items.emplace_back(n[i], fmt::format("{}[{}]", path, i));
  } else if (n.IsScalar()) {
    items.emplace_back(n, path);
  } else {
    yaml::fail_at(axes.file(), n, path, "expected node local times: a list of \"HH:MM\"");
  }
  if (items.empty()) yaml::fail_at(axes.file(), n, path, "the axis expands to no values; expected at least one \"HH:MM\"");
  if (items.size() > max_axis_values)
    yaml::fail_at(axes.file(), n, path, fmt::format("the axis lists more than {} values", max_axis_values));
  std::vector<LocalTimeChoice> out;
  std::set<std::string> seen;
  for (const auto& [item, p] : items) {
    const std::string text = item.IsScalar() ? item.Scalar() : std::string();
    const auto h = item.IsScalar() ? parse_local_time_h(text) : std::nullopt;
    if (!h)
      yaml::fail_at(axes.file(), item, p, fmt::format("{} is not a local time; expected \"HH:MM\" from 00:00 to 23:59",
                                                      yaml::quote_for_message(text)));
    if (!seen.insert(text).second)
      yaml::fail_at(axes.file(), item, p, fmt::format("{} appears twice; expected each time once", yaml::quote_for_message(text)));
    out.push_back({text, *h});
  }
  return out;
}

std::string format_ltan(double hours) {
  const int minutes = static_cast<int>(std::lround(hours * 60.0));
  return fmt::format("{:02d}:{:02d}", minutes / 60, minutes % 60);
}

constexpr std::string_view shell_axis_keys[] = {"satellites", "planes", "phasing", "pattern", "altitude_km",
                                                "inclination_deg", "ltan"};

// The axes of one shell, read from `m` (the axes block in the single-shell form, or one entry of axes.shells).
ShellAxes read_shell_axes(const MapReader& m, const Design& base, size_t shell_index) {
  const Shell& shell = base.shells[shell_index];
  const double re = base.earth.radius_km;
  ShellAxes ax;
  ax.shell_index = shell_index;
  ax.satellites = m.has("satellites")
                      ? to_ints(read_number_axis(m, "satellites", 1, static_cast<double>(max_design_satellites), fmt::format("a satellite count T from 1 to {}", max_design_satellites), true))
                      : std::vector<int>{shell.satellites};
  if (m.has("planes") && m.node("planes").IsScalar() && m.node("planes").Scalar() == "divisors")
    ax.planes_divisors = true;
  else
    ax.planes = m.has("planes") ? to_ints(read_number_axis(m, "planes", 1, static_cast<double>(max_design_satellites), fmt::format("a plane count P from 1 to {}, or divisors,", max_design_satellites), true))
                                : std::vector<int>{shell.planes};
  if (m.has("phasing")) {
    const YAML::Node f = m.node("phasing");
    if (f.IsScalar() && f.Scalar() == "all") {
      ax.phasing = std::nullopt;
    } else {
      ax.phasing = to_ints(read_number_axis(m, "phasing", -1000000, 1000000, "a relative phasing F (or all)", true));
    }
  } else {
    ax.phasing = std::vector<int>{shell.phasing};
  }
  if (m.has("pattern")) {
    ax.pattern_given = true;
    const YAML::Node n = m.node("pattern");
    std::vector<std::pair<YAML::Node, std::string>> items;
    if (n.IsSequence()) {
      for (size_t i = 0; i < n.size(); ++i) items.emplace_back(n[i], fmt::format("{}[{}]", m.path_of("pattern"), i));
    } else {
      items.emplace_back(n, m.path_of("pattern"));
    }
    if (items.empty()) m.fail_key("pattern", "the axis expands to no values; expected walker-delta and/or walker-star");
    for (const auto& [item, p] : items) {
      const std::string text = item.IsScalar() ? item.Scalar() : std::string();
      const auto k = pattern_kind_from_string(text);
      if (!k || *k == PatternKind::explicit_planes)
        yaml::fail_at(m.file(), item, p, fmt::format("{} is not a Walker pattern; expected walker-delta or walker-star",
                                                     yaml::quote_for_message(text)));
      if (std::find(ax.patterns.begin(), ax.patterns.end(), *k) != ax.patterns.end())
        yaml::fail_at(m.file(), item, p, fmt::format("{} appears twice; expected each pattern once", text));
      ax.patterns.push_back(*k);
    }
  } else {
    ax.patterns = {shell.pattern};
  }
  if (m.has("altitude_km")) {
    ax.altitude_km = read_number_axis(m, "altitude_km", -re, max_semi_major_axis_km, "an altitude in km", false);
    for (double alt : ax.altitude_km) {
      const double perigee = (re + alt) * (1.0 - shell.e) - re;
      if (perigee < minimum_perigee_altitude_km)
        m.fail_key("altitude_km", fmt::format("altitude {} km puts the perigee at {:.1f} km, below {} km; expected orbits "
                                              "that clear the atmosphere",
                                              alt, perigee, minimum_perigee_altitude_km));
    }
  } else {
    ax.altitude_km = {shell.a_km - re};
  }
  if (m.has("inclination_deg")) {
    ax.inclinations = read_inclination_axis(m);
  } else {
    ax.inclinations = {{shell.sun_synchronous, shell.sun_synchronous ? 0.0 : shell.inclination_deg}};
  }
  const bool any_sso = std::any_of(ax.inclinations.begin(), ax.inclinations.end(),
                                   [](const InclinationChoice& c) { return c.sun_synchronous; });
  if (m.has("ltan")) {
    if (!any_sso)
      m.fail_key("ltan", "ltan applies only to sun-synchronous layouts; add sun-synchronous to inclination_deg or remove ltan");
    ax.ltans = read_ltan_axis(m);
  } else if (any_sso) {
    if (!shell.ltan_h)
      m.fail(m.self(), m.path(),
             fmt::format("sun-synchronous layouts need node local times: the base shell {} has no ltan; expected "
                         "axes.ltan, e.g. [\"10:30\"]",
                         shell.name));
    ax.ltans = {{format_ltan(*shell.ltan_h), *shell.ltan_h}};
  }
  return ax;
}

// The index of the shell named by `key` of `m`, with a file:line:column error for an unknown or explicit shell.
size_t named_shell(const MapReader& m, std::string_view key, const Design& base) {
  const std::string shell = m.string(key, "the name of a shell of the base design to vary");
  auto it = std::find_if(base.shells.begin(), base.shells.end(), [&](const Shell& s) { return s.name == shell; });
  if (it == base.shells.end()) {
    std::vector<std::string_view> names;
    for (const auto& s : base.shells) names.push_back(s.name);
    m.fail_key(key, fmt::format("the base design has no shell {}; expected one of its shells{}",
                                yaml::quote_for_message(shell),
                                yaml::closest_match(shell, names).empty()
                                    ? std::string()
                                    : " (did you mean \"" + yaml::closest_match(shell, names) + "\"?)"));
  }
  if (it->pattern == PatternKind::explicit_planes)
    m.fail_key(key, fmt::format("the varied shell {} is an explicit shell; expected a walker-delta or walker-star shell",
                                it->name));
  return static_cast<size_t>(it - base.shells.begin());
}

std::vector<SolarLevel> read_solar_axis(const MapReader& m) {
  const YAML::Node n = m.node("solar_activity");
  std::vector<std::pair<YAML::Node, std::string>> items;
  if (n.IsSequence()) {
    for (size_t i = 0; i < n.size(); ++i) items.emplace_back(n[i], fmt::format("{}[{}]", m.path_of("solar_activity"), i));
  } else {
    items.emplace_back(n, m.path_of("solar_activity"));
  }
  if (items.empty()) m.fail_key("solar_activity", "the axis expands to no values; expected low, mean, high or cycle");
  std::vector<SolarLevel> out;
  for (const auto& [item, p] : items) {
    const std::string text = item.IsScalar() ? item.Scalar() : std::string();
    const auto l = solar_level_from_string(text);
    if (!l)
      yaml::fail_at(m.file(), item, p, fmt::format("{} is not a solar activity level; expected low, mean, high or cycle",
                                                   yaml::quote_for_message(text)));
    if (std::find(out.begin(), out.end(), *l) != out.end())
      yaml::fail_at(m.file(), item, p, fmt::format("{} appears twice; expected each level once", text));
    out.push_back(*l);
  }
  return out;
}

// The axes in either form: per-shell keys directly under axes (the shell named by the top-level `shell`, or the
// first shell), or axes.shells, a list of blocks that each name their shell. Sets sw.shell_index to the first
// varied shell.
SweepAxes read_axes(const MapReader& root, Sweep& sw) {
  const Design& base = sw.base;
  SweepAxes ax;
  if (!root.has("axes")) root.fail(root.self(), root.path(), "missing key axes; expected the axes to vary, e.g. satellites, planes");
  std::vector<std::string_view> keys = {"shells", "min_elevation_deg", "nadir_half_angle_deg", "drag_area_m2",
                                        "dry_mass_kg", "mission_life_years", "solar_activity",
                                        "min_sun_elevation_deg"};
  keys.insert(keys.end(), std::begin(shell_axis_keys), std::end(shell_axis_keys));
  const MapReader m = root.map("axes", keys);
  std::vector<MapReader> blocks;  // where each shell's axes were read (for the satellite cap message)
  if (m.has("shells")) {
    if (root.has("shell"))
      root.fail_key("shell", "shell names the one varied shell of the single-shell form, but axes.shells is given; "
                             "expected the shell named in each entry of axes.shells instead");
    for (std::string_view k : shell_axis_keys)
      if (m.has(k))
        m.fail_key(k, fmt::format("{} varies one shell, but axes.shells is given; expected it inside the entry of "
                                  "axes.shells that names its shell",
                                  k));
    const auto items = m.sequence("shells");
    std::set<size_t> seen;
    for (size_t i = 0; i < items.size(); ++i) {
      std::vector<std::string_view> entry_keys = {"shell"};
      entry_keys.insert(entry_keys.end(), std::begin(shell_axis_keys), std::end(shell_axis_keys));
      const MapReader e(m.file(), items[i], fmt::format("{}[{}]", m.path_of("shells"), i), entry_keys);
      if (!e.has("shell"))
        e.fail(e.self(), e.path(), "missing key shell; expected the name of the shell these axes vary");
      const size_t index = named_shell(e, "shell", base);
      if (!seen.insert(index).second)
        e.fail_key("shell", fmt::format("shell {} is named by two entries; expected each shell once, with all its axes "
                                        "in one entry",
                                        base.shells[index].name));
      ax.shells.push_back(read_shell_axes(e, base, index));
      blocks.push_back(e);
    }
  } else {
    size_t index = 0;
    if (root.has("shell")) index = named_shell(root, "shell", base);
    else if (base.shells[0].pattern == PatternKind::explicit_planes)
      root.fail(root.self(), root.path(),
                fmt::format("the varied shell {} is an explicit shell; expected a walker-delta or walker-star shell",
                            base.shells[0].name));
    ax.shells.push_back(read_shell_axes(m, base, index));
    blocks.push_back(m);
  }
  sw.shell_index = ax.shells.front().shell_index;
  // The design's satellite cap holds for every layout: each varied shell's T with the other shells at their
  // largest (a varied shell at its largest T, the others as in the base design).
  std::vector<long> largest(base.shells.size());
  for (size_t s = 0; s < base.shells.size(); ++s) largest[s] = base.shells[s].satellites;
  for (const ShellAxes& sa : ax.shells)
    largest[sa.shell_index] = *std::max_element(sa.satellites.begin(), sa.satellites.end());
  for (size_t k = 0; k < ax.shells.size(); ++k) {
    if (!blocks[k].has("satellites")) continue;
    long others = 0;
    for (size_t s = 0; s < base.shells.size(); ++s)
      if (s != ax.shells[k].shell_index) others += largest[s];
    for (int t : ax.shells[k].satellites)
      if (t + others > max_design_satellites)
        blocks[k].fail_key("satellites", fmt::format("T = {} with the {} satellites of the other shells makes {} "
                                                     "satellites; expected at most {} in the whole design for every layout",
                                                     t, others, t + others, max_design_satellites));
  }
  ax.min_elevation_deg = m.has("min_elevation_deg")
                             ? read_number_axis(m, "min_elevation_deg", 0.0, 89.0, "an elevation mask in degrees (0 to 89)", false)
                             : std::vector<double>{base.coverage.min_elevation_deg};
  ax.nadir_given = m.has("nadir_half_angle_deg");
  if (ax.nadir_given) {
    for (double v : read_number_axis(m, "nadir_half_angle_deg", 0.1, 90.0,
                                     "a payload cone half-angle from nadir in degrees (0.1 to 90)", false))
      ax.nadir_half_angle_deg.emplace_back(v);
  } else {
    ax.nadir_half_angle_deg = {base.coverage.nadir_half_angle_deg};
  }
  ax.drag_area_given = m.has("drag_area_m2");
  ax.drag_area_m2 = ax.drag_area_given ? read_number_axis(m, "drag_area_m2", 1e-4, 1e4,
                                                          "a drag reference area in m^2 (1e-4 to 1e4)", false)
                                       : std::vector<double>{base.spacecraft.drag_area_m2};
  ax.dry_mass_given = m.has("dry_mass_kg");
  ax.dry_mass_kg = ax.dry_mass_given ? read_number_axis(m, "dry_mass_kg", 0.01, 1e6, "a dry mass in kg (0.01 to 1e6)", false)
                                     : std::vector<double>{base.spacecraft.dry_mass_kg};
  ax.mission_life_given = m.has("mission_life_years");
  ax.mission_life_years = ax.mission_life_given ? read_number_axis(m, "mission_life_years", 0.01, 100.0,
                                                                   "a mission life in years (0.01 to 100)", false)
                                                : std::vector<double>{base.budget.mission_life_years};
  ax.solar_given = m.has("solar_activity");
  ax.solar_activity = ax.solar_given ? read_solar_axis(m) : std::vector<SolarLevel>{base.budget.solar};
  ax.sun_given = m.has("min_sun_elevation_deg");
  if (ax.sun_given) {
    for (double v : read_number_axis(m, "min_sun_elevation_deg", -18.0, 90.0,
                                     "a Sun elevation in degrees (-18 is astronomical twilight)", false))
      ax.min_sun_elevation_deg.emplace_back(v);
  } else {
    ax.min_sun_elevation_deg = {base.coverage.min_sun_elevation_deg};
  }
  return ax;
}

Requirement read_requirement(const MapReader& root, const Sweep& sw) {
  const Design& base = sw.base;
  // The most satellites a layout can hold: the largest T of each varied shell plus the other shells' satellites.
  int largest_t = 0, others = 0;
  std::string varied;
  std::vector<bool> is_varied(base.shells.size(), false);
  for (const ShellAxes& sa : sw.axes.shells) {
    largest_t += *std::max_element(sa.satellites.begin(), sa.satellites.end());
    is_varied[sa.shell_index] = true;
    varied += (varied.empty() ? "" : ", ") + base.shells[sa.shell_index].name;
  }
  for (size_t s = 0; s < base.shells.size(); ++s)
    if (!is_varied[s]) others += base.shells[s].satellites;
  if (!root.has("requirement"))
    root.fail(root.self(), root.path(), "missing key requirement; expected e.g. requirement: {min_percent_covered: 90}");
  RequirementReadOptions ro;
  ro.allow_within_tank = true;
  ro.has_tank = base.spacecraft.isp_s && base.spacecraft.propellant_capacity_kg;
  ro.sites_grid = base.coverage.grid == GridKind::sites;
  ro.has_ground_stations = !base.ground_stations.empty();
  ro.has_payload_cone = base.coverage.nadir_half_angle_deg.has_value();
  // Layouts whose own count is below the fold are skipped and counted; a fold above every layout's count
  // leaves nothing to evaluate, and is said here, at the fold, rather than as "no valid layout".
  ro.fold_problem = [&](int fold) -> std::optional<std::string> {
    if (fold <= largest_t + others) return std::nullopt;
    return fmt::format("fold {} is larger than any layout's satellite count (at most {}: {} in shell{} {} "
                       "and {} in the other shells); expected a fold from 1 to {}",
                       fold, largest_t + others, largest_t, sw.axes.shells.size() > 1 ? "s" : "", varied, others,
                       largest_t + others);
  };
  return read_requirement_block(root, "requirement", ro);
}

std::vector<CostFigure> read_costs(const MapReader& root, const Design& base) {
  if (!root.has("cost")) return {CostFigure::satellites, CostFigure::fleet_dv_m_s};
  std::vector<CostFigure> out;
  const auto items = root.sequence("cost");
  for (size_t i = 0; i < items.size(); ++i) {
    const std::string p = fmt::format("{}[{}]", root.path_of("cost"), i);
    const std::string text = items[i].IsScalar() ? items[i].Scalar() : std::string();
    const auto c = cost_figure_from_string(text);
    if (!c)
      yaml::fail_at(root.file(), items[i], p,
                    fmt::format("{} is not a cost figure; expected satellites, fleet_dv_m_s, fleet_propellant_kg, "
                                "dv_per_satellite_m_s, propellant_per_satellite_kg or planes",
                                yaml::quote_for_message(text)));
    if (std::find(out.begin(), out.end(), *c) != out.end())
      yaml::fail_at(root.file(), items[i], p, fmt::format("{} appears twice; expected each cost once", text));
    if ((*c == CostFigure::fleet_propellant_kg || *c == CostFigure::propellant_per_satellite_kg) && !base.spacecraft.isp_s)
      yaml::fail_at(root.file(), items[i], p, "a propellant cost needs spacecraft.isp_s in the base design");
    out.push_back(*c);
  }
  return out;
}

// The expansion checked where its position is known: the combination count against the limit, and at least
// one valid layout (expand_layouts says the same without a position to callers that did not read a file).
void check_expansion(const MapReader& root, const Sweep& sw, const SweepReadOptions& options) {
  try {
    (void)expand_layouts(sw, options.max_layouts);
  } catch (const InputError& e) {
    // expand_layouts words its refusals "FILE: axes: ..."; say the same at the axes block's position.
    const std::string what = e.what();
    const std::string prefix = sw.file + ": axes: ";
    root.fail(root.node("axes"), "axes", what.rfind(prefix, 0) == 0 ? what.substr(prefix.size()) : what);
  }
}

Sweep read_sweep(const YAML::Node& node, const std::string& file, const std::string& folder, const std::string& text,
                 const SweepReadOptions& options) {
  // A design file given to skein sweep: say what it is instead of "unknown key epoch".
  if (node.IsMap() && !node["base"] && !node["axes"] && (node["shells"] || node["epoch"]))
    yaml::fail_at(file, yaml::key_node(node, node["shells"] ? "shells" : "epoch"), "",
                  "this is a design file (it has shells, no base or axes), not a sweep; run skein check, coverage, "
                  "budget or report on it, or give skein sweep a sweep file (name, base, axes, requirement)");
  std::vector<std::string_view> keys = {"name", "base", "shell", "coverage", "axes", "requirement", "cost",
                                       "budget_percentile"};
  keys.insert(keys.end(), options.extra_keys.begin(), options.extra_keys.end());
  const MapReader root(file, node, "", keys);
  Sweep sw;
  sw.file = file;
  sw.name = root.string("name", "a sweep name");
  const std::string base = root.string("base", "the base design file, relative to the sweep file");
  const std::filesystem::path base_path = std::filesystem::path(base).is_absolute()
                                              ? std::filesystem::path(base)
                                              : std::filesystem::path(folder) / base;
  sw.base_file = base_path.lexically_normal().string();
  if (!std::filesystem::is_regular_file(sw.base_file))
    root.fail_key("base", fmt::format("the base design {} is not a readable file; expected a design file path relative "
                                      "to the sweep file",
                                      yaml::quote_for_message(sw.base_file)));
  sw.base = read_design_file(sw.base_file);
  if (root.has("coverage")) {
    sw.base.coverage = read_coverage_spec(root);
    if (sw.base.coverage.requirement)
      yaml::fail_at(file, yaml::key_node(root.node("coverage"), "requirement"), root.path_of("coverage") + ".requirement",
                    "a sweep states its requirement at the top level (requirement: ...), not in its coverage block");
  }
  sw.base.coverage.requirement.reset();  // layouts are judged by the sweep's requirement, not the base design's
  sw.axes = read_axes(root, sw);
  sw.requirement = read_requirement(root, sw);
  sw.costs = read_costs(root, sw.base);
  if (root.has("budget_percentile")) {
    SweepBudgetPercentile bp;
    bp.percent = root.number("budget_percentile", 1.0, 99.0,
                             "a percentile of the Monte Carlo budget (e.g. 95), traded instead of the deterministic "
                             "delta-v and propellant");
    bp.samples = sw.base.budget.samples.value_or(1000);
    bp.seed = sw.base.budget.seed.value_or(1);
    sw.budget_percentile = bp;
  }
  std::uint64_t h = fnv1a64(text);
  h = fnv1a64(read_whole_file(sw.base_file), h);
  h = fnv1a64(SKEIN_VERSION, h);
  sw.fingerprint = hex64(h);
  check_expansion(root, sw, options);
  return sw;
}

}  // namespace

Sweep read_sweep_file(const std::string& path, const SweepReadOptions& options) {
  const std::string text = read_whole_file(path);  // the size guard runs before anything else
  const std::string folder = std::filesystem::path(path).parent_path().string();
  return read_sweep(yaml::load_text(text, path), path, folder.empty() ? "." : folder, text, options);
}

Sweep read_sweep_text(const std::string& text, const std::string& name, const std::string& folder,
                      const SweepReadOptions& options) {
  return read_sweep(yaml::load_text(text, name), name, folder, text, options);
}

}  // namespace skein
