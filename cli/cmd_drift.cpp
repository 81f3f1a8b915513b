// skein drift DESIGN.yaml: J2 secular drift figures per shell and between shells; beta angle and eclipses per plane.
#include <memory>
#include <regex>

#include "commands.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/report/layout_tables.hpp"

namespace skein::cli {

void add_drift_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string repeat;
    std::string format = "table";
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "drift", "Print per shell the J2 node and perigee rates, periods, sun-synchronous inclination, LTAN drift, "
               "node-rate sensitivities and differential node drift between shells, and per plane the beta angle "
               "range and the longest eclipse over one year from the epoch");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  cmd->add_option("--repeat", opt->repeat,
                  "Also solve the altitude of a repeat ground track of R revolutions in D days, given as R/D (e.g. 29/2), "
                  "at each shell's inclination and eccentricity");
  add_format_option(*cmd, opt->format);
  cmd->callback([opt] {
    DriftOptions options;
    if (!opt->repeat.empty()) {
      std::smatch m;
      static const std::regex form(R"(^([1-9][0-9]{0,3})/([1-9][0-9]{0,3})$)");
      if (!std::regex_match(opt->repeat, m, form))
        throw InputError("--repeat " + opt->repeat + ": expected R/D with whole numbers, e.g. 29/2 (29 revolutions in 2 days)");
      options.repeat = std::make_pair(std::stoi(m[1]), std::stoi(m[2]));
    }
    const Design design = read_design_file(opt->design);
    const DriftResult drift = compute_drift(design, options);
    const BetaEclipseResult beta_eclipse = compute_beta_eclipse(design);
    const Table shells = drift_table(drift), pairs = differential_drift_table(drift),
                planes = plane_table(design), eclipses = beta_eclipse_table(beta_eclipse);
    if (format_of(opt->format) == OutputFormat::json) {
      nlohmann::ordered_json j;
      j["design"] = design.name;
      j["earth_model"] = std::string(design.earth.name);
      j["shells"] = rows_to_json(shells);
      j["planes"] = rows_to_json(planes);
      j["differential_drift"] = rows_to_json(pairs);
      j["beta_eclipse"] = rows_to_json(eclipses);
      print_stdout(j.dump(2) + "\n");
    } else if (format_of(opt->format) == OutputFormat::csv) {
      print_stdout(render_csv(shells));
    } else {
      print_stdout(render_text(shells) + "\n" + render_text(planes));
      if (!drift.pairs.empty()) print_stdout("\n" + render_text(pairs));
      print_stdout("\n" + render_text(eclipses));
    }
  });
}

}  // namespace skein::cli
