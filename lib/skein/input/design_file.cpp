#include "skein/input/design_file.hpp"

#include <algorithm>
#include <cmath>
#include <set>

#include <fmt/format.h>

#include "skein/input/budget_block.hpp"
#include "skein/budget/deployment.hpp"
#include "skein/input/coverage_block.hpp"
#include "skein/input/ground_stations_block.hpp"
#include "skein/input/yaml_reader.hpp"
#include "skein/orbit/sun_synchronous.hpp"
#include "skein/time/sun.hpp"

namespace skein {
namespace {

using yaml::MapReader;

// Resource guards (common practice: the largest filed constellations hold a few tens of thousands of
// satellites in a few dozen shells). They bound what every evaluator expands, and the shell pairs of the
// differential drift table (shells^2 / 2).
constexpr long max_satellites = max_design_satellites;  // in one shell and in the whole design

Spacecraft read_spacecraft(const MapReader& root) {
  const MapReader m = root.map("spacecraft", {"dry_mass_kg", "drag_area_m2", "drag_coefficient", "isp_s",
                                              "propellant_capacity_kg"});
  Spacecraft sc;
  sc.dry_mass_kg = m.number("dry_mass_kg", 0.01, 1e6, "a dry mass in kg");
  sc.drag_area_m2 = m.number("drag_area_m2", 1e-4, 1e4, "a drag reference area in m^2 (above zero)");
  sc.drag_coefficient = m.number("drag_coefficient", 0.1, 10.0, "a drag coefficient (typically 2.0 to 2.4)");
  sc.isp_s = m.optional_number("isp_s", 1.0, 1e5, "a specific impulse in s");
  sc.propellant_capacity_kg = m.optional_number("propellant_capacity_kg", 0.0, 1e6, "a tank capacity in kg");
  return sc;
}

void read_orbit(const MapReader& m, const EarthModel& earth, Shell& shell) {
  const bool has_alt = m.has("altitude_km"), has_a = m.has("semi_major_axis_km");
  if (has_alt == has_a)
    m.fail(m.self(), m.path(), has_alt ? "give altitude_km or semi_major_axis_km, not both"
                                       : "missing the orbit size; expected altitude_km or semi_major_axis_km");
  if (has_alt) {
    shell.a_km = earth.radius_km + m.number("altitude_km", -earth.radius_km, max_semi_major_axis_km,
                                            "an altitude above the equatorial radius in km");
  } else {
    shell.a_km = m.number("semi_major_axis_km", 1.0, max_semi_major_axis_km, "a semi-major axis in km");
  }
  shell.e = m.optional_number("eccentricity", -1e9, 1e9, "an eccentricity").value_or(0.0);
  if (shell.e < 0.0)
    m.fail_key("eccentricity", fmt::format("eccentricity {} is negative; expected 0 <= e < 1", shell.e));
  if (shell.e >= 1.0)
    m.fail_key("eccentricity", fmt::format("eccentricity {} is not a closed orbit; expected 0 <= e < 1", shell.e));
  shell.argp_deg = m.optional_number("arg_perigee_deg", -360.0, 360.0, "an argument of perigee in degrees").value_or(0.0);
  const double perigee_alt = shell.a_km * (1.0 - shell.e) - earth.radius_km;
  if (perigee_alt < minimum_perigee_altitude_km)
    m.fail(m.node(has_alt ? "altitude_km" : "semi_major_axis_km"), m.path_of(has_alt ? "altitude_km" : "semi_major_axis_km"),
           fmt::format("perigee altitude {:.1f} km is below {} km; expected an orbit that clears the atmosphere",
                       perigee_alt, minimum_perigee_altitude_km));
}

void read_inclination(const MapReader& m, const EarthModel& earth, const UtcEpoch& epoch, Shell& shell) {
  const YAML::Node inc = m.node("inclination_deg");
  if (inc.IsScalar() && inc.Scalar() == "sun-synchronous") {
    shell.sun_synchronous = true;
    const auto i = sun_synchronous_inclination_rad(earth, shell.a_km, shell.e);
    if (!i)
      m.fail(inc, m.path_of("inclination_deg"),
             fmt::format("no sun-synchronous inclination exists for a = {:.1f} km, e = {}: J2 cannot turn the node "
                         "fast enough above about 12350 km (circular); expected a lower orbit or a number of degrees",
                         shell.a_km, shell.e));
    shell.inclination_deg = *i * deg_per_rad;
    if (shell.pattern != PatternKind::explicit_planes) {
      if (!m.has("ltan") && !m.has("ltan_span"))
        m.fail(m.self(), m.path(), "a sun-synchronous shell needs ltan, the local time of the first plane's ascending node, e.g. \"10:30\"");
      if (m.has("ltan") && m.has("ltan_span"))
        m.fail_key("ltan_span", "give ltan or ltan_span, not both: ltan_span's first time is the first plane's ltan");
      if (m.has("raan_deg"))
        m.fail_key("raan_deg", "a sun-synchronous shell sets its first node from ltan; remove raan_deg");
    }
  } else {
    shell.inclination_deg = yaml::scalar_number(m.file(), inc, m.path_of("inclination_deg"), 0.0, 180.0,
                                                "an inclination in degrees or sun-synchronous");
    if (m.has("ltan")) m.fail_key("ltan", "ltan applies only to sun-synchronous shells; use raan_deg for the first node");
    if (m.has("ltan_span"))
      m.fail_key("ltan_span", "ltan_span applies only to sun-synchronous shells; use node_span_deg (and raan_deg for the "
                              "first node)");
  }
  if (m.has("ltan")) {
    const std::string t = m.string("ltan", "a local time \"HH:MM\"");
    const auto h = parse_local_time_h(t);
    if (!h) m.fail_key("ltan", fmt::format("{} is not a local time; expected \"HH:MM\" from 00:00 to 23:59", yaml::quote_for_message(t)));
    shell.ltan_h = *h;
    shell.raan0_deg = node_for_local_time_rad(*h, julian_date(epoch)) * deg_per_rad;
  } else if (!m.has("ltan_span")) {  // with ltan_span, read_node_span sets the first node
    shell.raan0_deg = m.optional_number("raan_deg", -360.0, 360.0, "the first plane's node in degrees").value_or(0.0);
  }
}

void read_walker(const MapReader& m, Shell& shell) {
  shell.satellites = static_cast<int>(m.integer("satellites", 1, max_satellites, "the total number of satellites T"));
  shell.planes = static_cast<int>(m.integer("planes", 1, max_satellites, "the number of planes P"));
  shell.phasing = static_cast<int>(m.integer("phasing", -1000000, 1000000, "the relative phasing F"));
  if (shell.satellites % shell.planes != 0)
    m.fail_key("planes", fmt::format("T = {} satellites do not divide into P = {} equal planes; expected P to divide T",
                                     shell.satellites, shell.planes));
  if (shell.phasing < 0 || shell.phasing > shell.planes - 1)
    m.fail_key("phasing", fmt::format("F = {} is outside 0..P-1 = 0..{}", shell.phasing, shell.planes - 1));
}

// The optional node span of a Walker shell, read after its plane count: node_span_deg (the span the P planes
// divide, like the pattern's 360 or 180 deg) or, for sun-synchronous shells, ltan_span (the first and last
// planes' local times, both included; through midnight when the last is earlier than the first).
void read_node_span(const MapReader& m, const UtcEpoch& epoch, Shell& shell) {
  if (m.has("node_span_deg") && m.has("ltan_span"))
    m.fail_key("ltan_span", "give node_span_deg or ltan_span, not both");
  if (m.has("node_span_deg")) {
    const double span = m.number("node_span_deg", -1e9, 1e9, "a node span in degrees");
    if (!(span > 0.0 && span <= 360.0))
      m.fail_key("node_span_deg", fmt::format("node span {} deg is outside (0, 360]; expected the span of node the "
                                              "planes divide evenly, above 0 and at most 360 deg",
                                              span));
    shell.node_span_deg = span;
  }
  if (!m.has("ltan_span")) return;
  const std::string path = m.path_of("ltan_span");
  const YAML::Node list = m.node("ltan_span");
  constexpr std::string_view expected = "expected two local times [\"HH:MM\", \"HH:MM\"], the first and the last plane's";
  if (!list.IsSequence() || list.size() != 2)
    m.fail(list, path, fmt::format("ltan_span is not a list of two items; {}", expected));
  double h[2] = {0.0, 0.0};
  for (size_t k = 0; k < 2; ++k) {
    const std::string item_path = fmt::format("{}[{}]", path, k);
    if (!list[k].IsScalar())
      yaml::fail_at(m.file(), list[k], item_path, "expected a local time \"HH:MM\" (text), got a list or a map");
    const auto t = parse_local_time_h(list[k].Scalar());
    if (!t)
      yaml::fail_at(m.file(), list[k], item_path,
                    fmt::format("{} is not a local time; expected \"HH:MM\" from 00:00 to 23:59",
                                yaml::quote_for_message(list[k].Scalar())));
    h[k] = *t;
  }
  if (shell.planes < 2)
    m.fail_key("ltan_span", "a one-plane shell has no span of local times; give ltan instead");
  const double span_h = std::fmod(h[1] - h[0] + 24.0, 24.0);
  if (span_h == 0.0)
    m.fail_key("ltan_span", "the first and last local times are the same; expected two different times (the span "
                            "runs forward from the first to the last, through midnight when the last is earlier)");
  shell.ltan_h = h[0];
  shell.ltan_span_h = span_h;
  shell.raan0_deg = node_for_local_time_rad(h[0], julian_date(epoch)) * deg_per_rad;
}

void read_explicit(const MapReader& m, const UtcEpoch& epoch, Shell& shell) {
  const auto planes = m.sequence("planes");
  long count = 0;
  for (size_t p = 0; p < planes.size(); ++p) {
    const std::string path = fmt::format("{}[{}]", m.path_of("planes"), p);
    const MapReader pm(m.file(), planes[p], path, {"raan_deg", "ltan", "slots_deg"});
    ExplicitPlane plane;
    if (pm.has("ltan") == pm.has("raan_deg"))
      pm.fail(pm.self(), path, "give the plane's node as raan_deg or (sun-synchronous shells) ltan, exactly one");
    if (pm.has("ltan")) {
      if (!shell.sun_synchronous) pm.fail_key("ltan", "ltan applies only to sun-synchronous shells; use raan_deg");
      const std::string t = pm.string("ltan", "a local time \"HH:MM\"");
      const auto h = parse_local_time_h(t);
      if (!h) pm.fail_key("ltan", fmt::format("{} is not a local time; expected \"HH:MM\"", yaml::quote_for_message(t)));
      plane.raan_deg = node_for_local_time_rad(*h, julian_date(epoch)) * deg_per_rad;
    } else {
      plane.raan_deg = pm.number("raan_deg", -360.0, 360.0, "a node right ascension in degrees");
    }
    const auto slots = pm.sequence("slots_deg");
    // Checked before the slots are read: aliases can repeat one long slot list in many planes.
    if (count + static_cast<long>(slots.size()) > max_satellites)
      pm.fail_key("slots_deg", fmt::format("the shell's planes hold more than {} slots in all; expected at most {} "
                                           "satellites in one shell",
                                           max_satellites, max_satellites));
    for (size_t k = 0; k < slots.size(); ++k)
      plane.slots_deg.push_back(yaml::scalar_number(m.file(), slots[k], fmt::format("{}.slots_deg[{}]", path, k),
                                                    -360.0, 360.0, "an argument of latitude in degrees"));
    count += static_cast<long>(plane.slots_deg.size());
    shell.explicit_planes.push_back(std::move(plane));
  }
  shell.planes = static_cast<int>(shell.explicit_planes.size());
  shell.satellites = static_cast<int>(count);
}

Shell read_shell(const std::string& file, const YAML::Node& node, const std::string& path, const EarthModel& earth,
                 const UtcEpoch& epoch) {
  // Which keys are allowed depends on the pattern, so read it first from a permissive view.
  static const std::vector<std::string_view> common = {"name", "pattern", "altitude_km", "semi_major_axis_km",
                                                       "eccentricity", "arg_perigee_deg", "inclination_deg", "ltan"};
  std::vector<std::string_view> all = common;
  for (auto k : {"satellites", "planes", "phasing", "raan_deg", "node_span_deg", "ltan_span"}) all.push_back(k);
  const MapReader probe(file, node, path, all);
  Shell shell;
  shell.name = probe.name("name", "a shell name");
  for (char c : shell.name)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_'))
      probe.fail_key("name", fmt::format("shell name {} has the character {}; expected letters, digits, - and _",
                                         yaml::quote_for_message(shell.name),
                                         static_cast<unsigned char>(c) < 0x80
                                             ? "'" + std::string(1, c) + "'"
                                             : fmt::format("byte 0x{:02X}", static_cast<unsigned char>(c))));
  const std::string pattern = probe.choice("pattern", {"walker-delta", "walker-star", "explicit"});
  shell.pattern = *pattern_kind_from_string(pattern);
  std::vector<std::string_view> allowed = common;
  if (shell.pattern == PatternKind::explicit_planes) {
    allowed.push_back("planes");
  } else {
    for (auto k : {"satellites", "planes", "phasing", "raan_deg", "node_span_deg", "ltan_span"}) allowed.push_back(k);
  }
  const MapReader m(file, node, path, allowed);
  read_orbit(m, earth, shell);
  read_inclination(m, earth, epoch, shell);
  if (shell.pattern == PatternKind::explicit_planes)
    read_explicit(m, epoch, shell);
  else {
    read_walker(m, shell);
    read_node_span(m, epoch, shell);
  }
  return shell;
}

Design read_design(const YAML::Node& root_node, const std::string& file) {
  // A sweep file given where a design is expected: say what it is instead of "unknown key base".
  if (root_node.IsMap() && !root_node["shells"] && (root_node["base"] || root_node["axes"]))
    yaml::fail_at(file, yaml::key_node(root_node, root_node["base"] ? "base" : "axes"), "",
                  "this is a sweep file (it has base and axes, no shells), not a design; run skein sweep on it, or "
                  "give this command a design file");
  const MapReader root(file, root_node, "", {"name", "epoch", "earth", "spacecraft", "shells", "coverage", "budget",
                                                  "ground_stations"});
  Design d;
  d.file = file;
  d.name = root.name("name", "a design name");
  const std::string epoch_text = root.string("epoch", "a UTC epoch");
  const auto epoch = parse_utc_iso8601(epoch_text);
  if (!epoch && epoch_text.size() >= 4) {
    // A well-formed epoch whose year lies outside the supported years gets a range message.
    std::string in_range = epoch_text;
    in_range.replace(0, 4, "2000");
    const bool digits = std::all_of(epoch_text.begin(), epoch_text.begin() + 4, [](char c) { return c >= '0' && c <= '9'; });
    if (digits && parse_utc_iso8601(in_range))
      root.fail_key("epoch", fmt::format("the year {} is outside the supported years {} to {}; expected an epoch in "
                                         "that range (the time scales and the Sun's almanac formulas are fitted there)",
                                         epoch_text.substr(0, 4), min_epoch_year, max_epoch_year));
  }
  if (!epoch)
    root.fail_key("epoch", fmt::format("{} is not a UTC epoch; expected ISO 8601 like 2027-03-01T00:00:00Z",
                                       yaml::quote_for_message(epoch_text)));
  d.epoch = *epoch;
  if (root.has("earth")) {
    std::vector<std::string_view> names;
    for (const auto& m : earth_models) names.push_back(m.name);
    d.earth = *earth_model_from_string(root.choice("earth", names));
  }
  d.spacecraft = read_spacecraft(root);
  const auto shells = root.sequence("shells");
  if (shells.size() > static_cast<size_t>(max_design_shells))
    root.fail_key("shells", fmt::format("the design has {} shells; expected at most {}", shells.size(), max_design_shells));
  std::set<std::string> names;
  long total = 0;
  for (size_t s = 0; s < shells.size(); ++s) {
    const std::string path = fmt::format("shells[{}]", s);
    Shell shell = read_shell(file, shells[s], path, d.earth, d.epoch);
    if (!names.insert(shell.name).second)
      yaml::fail_at(file, shells[s], path + ".name",
                    fmt::format("shell name {} is used twice; expected unique names", yaml::quote_for_message(shell.name)));
    total += shell.satellites;
    if (total > max_satellites)
      yaml::fail_at(file, shells[s], path,
                    fmt::format("with this shell the design holds {} satellites; expected at most {} in all shells",
                                total, max_satellites));
    d.shells.push_back(std::move(shell));
  }
  d.coverage = read_coverage_spec(root);
  // The fold against the satellite count, here where both positions are known (the domain type keeps none).
  if (d.coverage.max_fold && *d.coverage.max_fold > total)
    yaml::fail_at(file, root.node("coverage")["max_fold"], "coverage.max_fold",
                  fmt::format("fold {} is larger than the design's {} satellites; expected at most {}",
                              *d.coverage.max_fold, total, total));
  if (d.coverage.requirement && d.coverage.requirement->fold > total) {
    const YAML::Node req = root.node("coverage")["requirement"];
    yaml::fail_at(file, req["fold"] ? req["fold"] : req, "coverage.requirement.fold",
                  fmt::format("fold {} is larger than the design's {} satellites; expected at most {}",
                              d.coverage.requirement->fold, total, total));
  }
  d.budget = read_budget_spec(root);
  // An electric raise needs a specific impulse for its propellant and time, from either block.
  if (d.budget.injection && d.budget.injection->propulsion == RaisingPropulsion::electric && !d.budget.injection->isp_s &&
      !d.spacecraft.isp_s)
    yaml::fail_at(file, root.node("budget")["injection"]["propulsion"], "budget.injection.propulsion",
                  "propulsion: electric needs a specific impulse; expected budget.injection.isp_s or spacecraft.isp_s");
  // Edelbaum's transfer is used up to 90 deg of plane change (transfer.hpp); compute_budget guards it again for
  // shells made elsewhere (sweep layouts).
  if (d.budget.injection && d.budget.injection->propulsion == RaisingPropulsion::electric &&
      d.budget.injection->inclination_deg)
    for (const auto& shell : d.shells)
      if (std::abs(*d.budget.injection->inclination_deg - shell.inclination_deg) > 90.0)
        yaml::fail_at(file, root.node("budget")["injection"]["inclination_deg"], "budget.injection.inclination_deg",
                      fmt::format("injection inclination {} deg is {:.6g} deg from shell {} ({} deg); propulsion: "
                                  "electric (Edelbaum's transfer) is used here up to 90 deg of plane change; expected "
                                  "an inclination within 90 deg of every shell's",
                                  *d.budget.injection->inclination_deg,
                                  std::abs(*d.budget.injection->inclination_deg - shell.inclination_deg), shell.name,
                                  shell.inclination_deg));
  // The deployment deadline against the fastest plan of every shell, here where its position is known.
  if (d.budget.deployment) {
    const YAML::Node dep = root.node("budget")["deployment"];
    for (const auto& shell : d.shells) {
      DeploymentResult plan;
      try {
        plan = plan_deployment(deployment_options(d, shell));
      } catch (const InputError& e) {
        yaml::fail_at(file, dep, "budget.deployment", fmt::format("shell {}: {}", shell.name, e.what()));
      }
      if (!plan.chosen)
        yaml::fail_at(file, dep["deadline_days"], "budget.deployment.deadline_days",
                      fmt::format("deadline {} days is shorter than any deployment of shell {}: the shortest achievable "
                                  "is {:.1f} days (with the largest offsets); expected a deadline of at least that, or "
                                  "larger offsets",
                                  d.budget.deployment->deadline_days, shell.name,
                                  std::ceil(plan.fastest_days * 10.0) / 10.0));
    }
  }
  d.ground_stations = read_ground_stations(root);
  return d;
}

}  // namespace

std::optional<double> parse_local_time_h(std::string_view t) {
  if (t.size() != 5 || t[2] != ':') return std::nullopt;
  auto digit = [](char c) { return c >= '0' && c <= '9'; };
  if (!digit(t[0]) || !digit(t[1]) || !digit(t[3]) || !digit(t[4])) return std::nullopt;
  const int h = (t[0] - '0') * 10 + (t[1] - '0'), mi = (t[3] - '0') * 10 + (t[4] - '0');
  if (h > 23 || mi > 59) return std::nullopt;
  return h + mi / 60.0;
}

Design read_design_file(const std::string& path) { return read_design(yaml::load_file(path), path); }

std::string read_design_file_bytes(const std::string& path) { return yaml::read_text_file(path); }

Design read_design_text(const std::string& text, const std::string& name) {
  return read_design(yaml::load_text(text, name), name);
}

}  // namespace skein
