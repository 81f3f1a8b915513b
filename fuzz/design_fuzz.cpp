// libFuzzer target: the design-file reader and validator, then, for every design it accepts, what the commands
// compute from it and every writer that carries its names and figures out:
//   - the satellite expansion and the J2 drift figures (skein check, skein drift);
//   - the lifetime and delta-v budget (skein budget): every figure finite, or the budget refused with an
//     InputError naming the file (non-finite figures are errors naming the shell; budgets that cannot be
//     flown are returned with cannot_fly and warnings, and their figures must still be finite);
//   - the JSON of check, drift and budget as the commands build it, and the report's per-table JSON: no NaN or
//     infinity anywhere in the tree (nlohmann would write them as null), and the text parses back to the same
//     tree;
//   - the report's summary.md and index.html (report_pages.hpp) on the layout, drift and budget tables, with the
//     budget's figures: no control character but the line feed, no raw "<script" (names are escaped);
//   - the CCSDS OEM (KVN) text of satellites: every line is blank, META_START/META_STOP, a COMMENT, one
//     "KEY = VALUE" with a known keyword, or a data line of an epoch and six finite numbers; no control
//     character; and it parses back (parse_oem) to the same names and sample count, so no name adds a line.
// All in memory: no file is written.
//
// The one accepted failure is skein::InputError whose message starts with the file name (the
// "FILE:LINE:COL: PATH: message" policy of lib/skein/error.hpp), from the reader or from compute_budget. Any
// other exception (an InputError from a writer included: a design the reader accepts must be writable), a
// crash, a sanitizer report or a broken property aborts, so that libFuzzer keeps the input.
//
// Bounds, so that one input stays well under the fuzzer's -timeout=10 under ASan at -O1 (each keeps the
// check meaningful):
//   - The budget runs on designs of at most max_budget_shells shells. Shells are budgeted independently
//     (compute_budget runs one shell_budget per shell and only sums the fleet totals), so a few shells already
//     reach every per-shell path and the fleet sums over more than one shell.
//   - BudgetOptions::level_curves = false: the low/mean/high curves are the same integration as the selected
//     level's, three more times; the selected level (including cycle) is still integrated and written.
//   - Solar-cycle activity integrates the drag make-up one deadband cycle at a time (up to 200000 cycles).
//     When a cheap upper estimate of the cycle count (the first cycle under high activity and the full
//     Harris-Priester bulge, which bound the cycle's density from above) exceeds max_cycle_raises, the fuzz
//     path budgets that design under high activity instead: the same code except the per-cycle loop, whose
//     arithmetic is exercised by every design below the bound.
//   - The disposal rule is cut to max_disposal_rule_years (the reader allows 0.1 to 100). The rule is only the
//     horizon of the natural-decay runs of the disposal search, which bisects the disposal perigee to 0.05 km
//     with up to about 16 of them: a 100-year rule on three shells at 1500 to 2400 km took 7.3 s under ASan,
//     10 years 1.1 s, 5 years (the default rule) 0.6 s. Every branch (no burn needed, a burn found) is reached
//     with rules up to 5 years: the lifetime is cut at the rule either way.
//     Measured likewise: the solar-cycle make-up of 1 year at 300 km with a 0.01 km deadband (some 70000
//     cycles) took 5 s without the cycle bound above; with it no design tried took over 2 s.
//   - The writers run on designs of at most max_writer_satellites satellites; the OEM is written for the first
//     and last satellite of each shell only (every satellite of a shell carries the same names into the KVN:
//     the design name and SHELL-pPP-sSS), over oem_span_s with three samples. The sampling itself is the
//     secular propagation whose elements check_expansion already requires finite.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <optional>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "skein/atmosphere/atmosphere.hpp"
#include "skein/budget/budget.hpp"
#include "skein/caution.hpp"
#include "skein/design/constellation.hpp"
#include "skein/drift/drift_summary.hpp"
#include "skein/error.hpp"
#include "skein/export/oem.hpp"
#include "skein/input/design_file.hpp"
#include "skein/lifetime/decay.hpp"
#include "skein/report/budget_tables.hpp"
#include "skein/report/layout_tables.hpp"
#include "skein/report/report_pages.hpp"
#include "skein/report/report_plots.hpp"

namespace {

const std::string file_name = "fuzz.yaml";

constexpr size_t max_budget_shells = 3;
constexpr double max_cycle_raises = 2000.0;
constexpr double max_disposal_rule_years = 5.0;
constexpr size_t max_writer_satellites = 2000;
constexpr double oem_span_s = 600.0;
constexpr double oem_step_s = 300.0;

[[noreturn]] void fail(const std::string& what) {
  std::fprintf(stderr, "design_fuzz: %s\n", what.c_str());
  std::abort();
}

void finite(double v, const std::string& what) {
  if (!std::isfinite(v)) fail("non-finite " + what);
}

void finite(const std::optional<double>& v, const std::string& what) {
  if (v) finite(*v, what);
}

// A refusal is accepted only as an InputError naming the file first.
void require_named(const skein::InputError& e) {
  const std::string message = e.what();
  if (message.rfind(file_name, 0) != 0) fail("an InputError message does not start with the file name: " + message);
}

void check_expansion(const std::vector<skein::Satellite>& satellites) {
  for (const skein::Satellite& sat : satellites) {
    const skein::MeanElements& el = sat.elements;
    finite(el.a_km, "a_km");
    finite(el.e, "e");
    finite(el.i_rad, "i_rad");
    finite(el.raan_rad, "raan_rad");
    finite(el.argp_rad, "argp_rad");
    finite(el.mean_anomaly_rad, "mean_anomaly_rad");
    finite(sat.arg_latitude_rad, "arg_latitude_rad");
    // Invariants the validator promises (design.hpp, elements.hpp).
    if (!(el.a_km > 0.0) || !(el.e >= 0.0 && el.e < 1.0)) fail("an accepted design has a <= 0 or e outside [0, 1)");
  }
}

void check_drift(const skein::DriftResult& drift) {
  for (const skein::ShellDrift& s : drift.shells) {
    finite(s.altitude_km, "altitude_km");
    finite(s.a_km, "a_km");
    finite(s.e, "e");
    finite(s.inclination_deg, "inclination_deg");
    finite(s.raan_rate_deg_per_day, "raan_rate_deg_per_day");
    finite(s.argp_rate_deg_per_day, "argp_rate_deg_per_day");
    finite(s.mean_anomaly_correction_deg_per_day, "mean_anomaly_correction_deg_per_day");
    finite(s.kepler_period_s, "kepler_period_s");
    finite(s.anomalistic_period_s, "anomalistic_period_s");
    finite(s.nodal_period_s, "nodal_period_s");
    finite(s.sun_synchronous_inclination_deg, "sun_synchronous_inclination_deg");
    finite(s.ltan_h, "ltan_h");
    finite(s.ltan_drift_min_per_year, "ltan_drift_min_per_year");
    finite(s.raan_rate_per_km_deg_per_day, "raan_rate_per_km_deg_per_day");
    finite(s.raan_rate_per_deg_deg_per_day, "raan_rate_per_deg_deg_per_day");
    finite(s.raan_rate_per_0p001_e_deg_per_day, "raan_rate_per_0p001_e_deg_per_day");
    finite(s.critical_inclination_deg, "critical_inclination_deg");
    finite(s.repeat_altitude_km, "repeat_altitude_km");
  }
  for (const skein::DifferentialDrift& p : drift.pairs) {
    finite(p.relative_raan_rate_deg_per_day, "relative_raan_rate_deg_per_day");
    finite(p.days_per_full_turn, "days_per_full_turn");
  }
}

void check_budget(const skein::BudgetResult& b) {
  finite(b.mission_life_years, "mission_life_years");
  finite(b.solar_cycle_phase_at_epoch, "solar_cycle_phase_at_epoch");
  finite(b.reentry_altitude_km, "reentry_altitude_km");
  finite(b.fleet_dv_m_s, "fleet_dv_m_s");
  finite(b.fleet_propellant_kg, "fleet_propellant_kg");
  for (const skein::ShellBudget& s : b.shells) {
    const std::string n = " (shell " + s.name + ")";
    finite(s.altitude_km, "altitude_km" + n);
    finite(s.perigee_km, "perigee_km" + n);
    finite(s.apogee_km, "apogee_km" + n);
    finite(s.inclination_deg, "inclination_deg" + n);
    finite(s.ballistic_coefficient_m2_kg, "ballistic_coefficient_m2_kg" + n);
    finite(s.bulge_weight, "bulge_weight" + n);
    finite(s.lifetime_natural_days, "lifetime_natural_days" + n);
    for (const skein::LevelDecay& d : s.decay) {
      finite(d.lifetime_days, "decay lifetime_days" + n);
      for (const skein::DecayPoint& p : d.curve) {
        finite(p.t_days, "decay curve t_days" + n);
        finite(p.a_km, "decay curve a_km" + n);
        finite(p.e, "decay curve e" + n);
      }
    }
    finite(s.drag_makeup_dv_m_s_per_year, "drag_makeup_dv_m_s_per_year" + n);
    finite(s.drag_makeup_interval_days, "drag_makeup_interval_days" + n);
    finite(s.node_spread_uncontrolled_deg, "node_spread_uncontrolled_deg" + n);
    finite(s.sso_inclination_drift_deg_per_year, "sso_inclination_drift_deg_per_year" + n);
    for (const skein::DvLine& l : s.dv_lines) finite(l.dv_m_s, "dv line " + l.name + n);
    finite(s.total_dv_m_s, "total_dv_m_s" + n);
    finite(s.fleet_dv_m_s, "fleet_dv_m_s" + n);
    finite(s.propellant_kg, "propellant_kg" + n);
    finite(s.fleet_propellant_kg, "fleet_propellant_kg" + n);
    finite(s.disposal_perigee_km, "disposal_perigee_km" + n);
    finite(s.disposal_lifetime_days, "disposal_lifetime_days" + n);
    if (s.drag_makeup_manoeuvres < 0) fail("negative drag_makeup_manoeuvres" + n);
    // Every figure is flagged or not: a budget that cannot be flown says so in its warnings too.
    for (const std::string& why : s.cannot_fly)
      if (std::find(s.warnings.begin(), s.warnings.end(), why) == s.warnings.end() &&
          std::find(s.warnings.begin(), s.warnings.end(), "cannot be flown: " + why) == s.warnings.end())
        fail("a cannot_fly reason is not among the warnings" + n + ": " + why);
  }
}

// --- writers --------------------------------------------------------------------------------------------------

void no_control_but_newline(std::string_view text, const std::string& what) {
  for (size_t i = 0; i < text.size(); ++i) {
    const auto c = static_cast<unsigned char>(text[i]);
    const bool c1 = c == 0xC2 && i + 1 < text.size() && static_cast<unsigned char>(text[i + 1]) >= 0x80 &&
                    static_cast<unsigned char>(text[i + 1]) <= 0x9F;
    if ((c < 0x20 && c != '\n') || c == 0x7F || c1)
      fail(what + " holds the control byte " + std::to_string(c) + " at offset " + std::to_string(i));
  }
}

void no_script(std::string_view text, const std::string& what) {
  std::string lower(text);
  std::transform(lower.begin(), lower.end(), lower.begin(), [](unsigned char c) { return std::tolower(c); });
  if (lower.find("<script") != std::string::npos) fail(what + " holds a raw <script");
}

// No NaN or infinity anywhere in the tree (dump() would turn them into null silently).
void json_all_finite(const nlohmann::ordered_json& j, const std::string& what) {
  if (j.is_number_float()) {
    finite(j.get<double>(), what + " JSON number");
  } else if (j.is_structured()) {
    for (const auto& child : j) json_all_finite(child, what);
  }
}

void check_json(const nlohmann::ordered_json& j, const std::string& what) {
  json_all_finite(j, what);
  const std::string text = j.dump(2) + "\n";  // as the commands print it
  const auto back = nlohmann::ordered_json::parse(text, nullptr, /*allow_exceptions=*/false);
  if (back.is_discarded()) fail(what + " JSON does not parse back");
  if (back != j) fail(what + " JSON does not parse back to the same values");
}

const std::vector<std::string> oem_keywords = {"CCSDS_OEM_VERS", "CREATION_DATE", "ORIGINATOR", "OBJECT_NAME",
                                               "OBJECT_ID", "CENTER_NAME", "REF_FRAME", "TIME_SYSTEM",
                                               "START_TIME", "STOP_TIME"};

void check_kvn(const std::string& text, const skein::OemMessage& m) {
  no_control_but_newline(text, "OEM");
  if (text.empty() || text.back() != '\n') fail("OEM text does not end with a line feed");
  std::istringstream in(text);
  std::string line;
  size_t data_lines = 0;
  int meta_starts = 0;
  while (std::getline(in, line)) {
    if (line.empty() || line == "META_START" || line == "META_STOP") {
      meta_starts += line == "META_START";
      continue;
    }
    if (line.rfind("COMMENT ", 0) == 0) continue;
    const auto eq = line.find(" = ");
    if (eq != std::string::npos) {
      const std::string key = line.substr(0, eq);
      if (std::find(oem_keywords.begin(), oem_keywords.end(), key) == oem_keywords.end())
        fail("OEM line with an unknown keyword: " + line);
      if (line.size() == eq + 3) fail("OEM keyword without a value: " + line);
      continue;
    }
    std::istringstream fields(line);
    std::string epoch, extra;
    double v[6];
    fields >> epoch >> v[0] >> v[1] >> v[2] >> v[3] >> v[4] >> v[5];
    if (!fields || (fields >> extra) || !skein::parse_utc_iso8601(epoch + "Z"))
      fail("OEM line is neither a keyword line nor a data line: " + line);
    for (double x : v) finite(x, "OEM state");
    ++data_lines;
  }
  size_t samples = 0;
  for (const auto& seg : m.segments) samples += seg.samples.size();
  if (data_lines != samples || meta_starts != static_cast<int>(m.segments.size()))
    fail("OEM holds other lines than its segments and samples (a name added lines)");
  const skein::OemMessage back = skein::parse_oem(text, "fuzz.oem");
  if (back.segments.size() != m.segments.size() || back.comments.size() != m.comments.size())
    fail("OEM does not parse back to the same segments and comments");
  for (size_t s = 0; s < m.segments.size(); ++s)
    if (back.segments[s].object_name != m.segments[s].object_name ||
        back.segments[s].object_id != m.segments[s].object_id ||
        back.segments[s].samples.size() != m.segments[s].samples.size())
      fail("OEM does not parse back to the same object names and samples");
}

void check_oem(const skein::Design& design, const std::vector<skein::Satellite>& satellites) {
  for (size_t i = 0; i < satellites.size(); ++i) {
    const bool first_of_shell = i == 0 || satellites[i - 1].shell != satellites[i].shell;
    const bool last_of_shell = i + 1 == satellites.size() || satellites[i + 1].shell != satellites[i].shell;
    if (!first_of_shell && !last_of_shell) continue;
    const skein::Satellite& sat = satellites[i];
    skein::OemMessage m;  // as build_report makes it
    m.creation_date = "2027-01-01T00:00:00";
    m.originator = "skein";
    m.comments = {"Design: " + design.name, std::string(skein::caution_text)};
    m.segments.push_back(skein::sample_oem_segment(design.earth, skein::make_secular_orbit(design.earth, sat.elements),
                                                   design.epoch, oem_span_s, oem_step_s, sat.id, sat.id));
    check_kvn(skein::render_oem(m), m);
  }
}

void check_pages(const skein::Design& design, const std::vector<skein::NamedTable>& tables,
                 const std::vector<skein::Figure>& figures, const std::vector<std::string>& warnings) {
  const std::string md = skein::summary_markdown(design, tables, figures, warnings);
  no_control_but_newline(md, "summary.md");
  no_script(md, "summary.md");
  const std::string html = skein::html_page(design, tables, figures, warnings);
  no_control_but_newline(html, "index.html");
  no_script(html, "index.html");
  for (const auto& f : figures) {
    no_control_but_newline(f.svg, "plots/" + f.file + ".svg");
    no_script(f.svg, "plots/" + f.file + ".svg");
  }
  for (const auto& t : tables) {  // the report's tables/*.json
    nlohmann::ordered_json j;
    j["title"] = t.table.title;
    j["rows"] = skein::rows_to_json(t.table);
    check_json(j, "tables/" + t.file + ".json");
  }
}

// The budget of the fuzz path (see the bounds in the header); nullopt when the budget refuses the design.
std::optional<skein::BudgetResult> fuzz_budget(skein::Design design) {
  design.budget.disposal_rule_years = std::min(design.budget.disposal_rule_years, max_disposal_rule_years);
  skein::BudgetOptions options;
  options.level_curves = false;
  const skein::BudgetSpec& spec = design.budget;
  const double b = design.spacecraft.ballistic_coefficient_m2_kg();
  if (spec.solar == skein::SolarLevel::cycle && b > 0.0 && std::isfinite(b)) {
    // Upper estimate of the deadband cycles of any shell: its first cycle under high activity and the
    // full bulge (the densest the cycle profile gets), from the design orbit.
    skein::OrbitAtmosphere worst;
    worst.kind = spec.atmosphere;
    worst.bulge_weight = 1.0;
    worst.solar = {skein::SolarLevel::high, 0.0};
    const skein::DensityFn rho = [worst](double h, double t) { return skein::orbit_density_kg_m3(worst, h, t); };
    const double life_days = spec.mission_life_years * skein::days_per_julian_year;
    for (const skein::Shell& shell : design.shells) {
      if (!(shell.a_km - spec.deadband_km - design.earth.radius_km > spec.reentry_altitude_km + 1.0)) continue;
      skein::DecayOptions opt;
      opt.reentry_altitude_km = spec.reentry_altitude_km;
      opt.stop_below_a_km = shell.a_km - spec.deadband_km;
      opt.horizon_days = life_days;
      opt.record = false;
      const skein::DecayResult r = skein::integrate_decay(design.earth, rho, b, {0.0, shell.a_km, shell.e}, opt);
      if (r.stop == skein::DecayStop::target && life_days > max_cycle_raises * r.end.t_days) {
        options.solar = skein::SolarLevel::high;
        break;
      }
    }
  }
  try {
    return skein::compute_budget(design, options);
  } catch (const skein::InputError& e) {
    require_named(e);
    return std::nullopt;
  }
}

void run(const skein::Design& design) {
  const std::vector<skein::Satellite> satellites = skein::expand_constellation(design);
  check_expansion(satellites);
  const skein::DriftResult drift = skein::compute_drift(design);
  check_drift(drift);

  std::optional<skein::BudgetResult> budget;
  if (design.shells.size() <= max_budget_shells) {
    budget = fuzz_budget(design);
    if (budget) check_budget(*budget);
  }
  if (satellites.size() > max_writer_satellites) return;

  // skein check --format json
  nlohmann::ordered_json check;
  check["design"] = design.name;
  check["epoch"] = skein::format_utc_iso8601(design.epoch, 3);
  check["earth_model"] = std::string(design.earth.name);
  check["shells"] = skein::rows_to_json(skein::shell_table(design));
  check["planes"] = skein::rows_to_json(skein::plane_table(design));
  check["satellites"] = skein::rows_to_json(skein::satellite_table(design, satellites));
  check_json(check, "check");

  // skein drift --format json
  nlohmann::ordered_json dj;
  dj["design"] = design.name;
  dj["earth_model"] = std::string(design.earth.name);
  dj["shells"] = skein::rows_to_json(skein::drift_table(drift));
  dj["planes"] = skein::rows_to_json(skein::plane_table(design));
  dj["differential_drift"] = skein::rows_to_json(skein::differential_drift_table(drift));
  check_json(dj, "drift");

  check_oem(design, satellites);

  // The report's pages on everything but coverage.
  std::vector<skein::NamedTable> tables = {
      {"shells", skein::shell_table(design)},
      {"planes", skein::plane_table(design)},
      {"satellites", skein::satellite_table(design, satellites)},
      {"drift", skein::drift_table(drift)},
      {"differential_drift", skein::differential_drift_table(drift)},
  };
  std::vector<skein::Figure> figures = {{"ground_tracks", "Ground tracks", skein::ground_track_svg(design, design.coverage.min_elevation_deg, design.coverage.nadir_half_angle_deg, {})}};
  std::vector<std::string> warnings;
  if (budget) {
    // skein budget --format json
    check_json(skein::budget_to_json(*budget, design.earth.radius_km), "budget");
    tables.push_back({"budget_shells", skein::budget_shell_table(*budget)});
    tables.push_back({"budget_lines", skein::budget_lines_table(*budget)});
    tables.push_back({"lifetime_by_level", skein::lifetime_by_level_table(*budget)});
    figures.push_back({"dv_budget", "Delta-v", skein::dv_budget_svg(*budget)});
    for (const auto& sh : budget->shells) {
      for (const auto& dec : sh.decay)
        tables.push_back({"decay_" + sh.name + "_" + std::string(skein::to_string(dec.level)),
                          skein::decay_curve_table(sh, dec, design.earth.radius_km)});
      figures.push_back({"decay_" + sh.name, "Decay of " + sh.name, skein::decay_curves_svg(sh, design.earth.radius_km)});
    }
    warnings = budget->warnings;
  }
  check_pages(design, tables, figures, warnings);
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  std::optional<skein::Design> design;
  try {
    design = skein::read_design_text(text, file_name);
  } catch (const skein::InputError& e) {
    require_named(e);
    return 0;
  } catch (const std::exception& e) {
    fail(std::string("unexpected exception from the reader: ") + e.what());
  } catch (...) {
    fail("unexpected exception of unknown type from the reader");
  }
  try {
    run(*design);
  } catch (const skein::InputError& e) {
    fail(std::string("an accepted design was refused after reading (a writer or the drift): ") + e.what());
  } catch (const std::exception& e) {
    fail(std::string("unexpected exception: ") + e.what());
  } catch (...) {
    fail("unexpected exception of unknown type");
  }
  return 0;
}
