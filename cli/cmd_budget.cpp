// skein budget DESIGN.yaml: natural lifetime and station-keeping delta-v budget per shell.
#include <memory>

#include "commands.hpp"
#include "skein/budget/budget.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/budget_tables.hpp"
#include "skein/report/deployment_tables.hpp"

namespace skein::cli {

void add_budget_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string format = "table";
    std::string solar;
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "budget", "Print per shell the natural lifetime under drag and the station-keeping delta-v budget over the "
                "mission life (drag make-up, node drift control, sun-synchronous inclination, slot keeping, collision "
                "avoidance, disposal, margin), with propellant by the rocket equation");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  add_format_option(*cmd, opt->format);
  add_solar_option(*cmd, opt->solar, "Solar activity, overriding budget.solar_activity: low, mean, high or cycle");
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    BudgetOptions options;
    options.solar = solar_of(opt->solar);
    const BudgetResult result = compute_budget(design, options);
    print_caution();
    for (const auto& w : result.warnings) print_stderr("warning: " + w + "\n");
    const OutputFormat f = format_of(opt->format);
    if (f == OutputFormat::json) {
      print_stdout(budget_to_json(result, design.earth.radius_km).dump(2) + "\n");
    } else if (f == OutputFormat::csv) {
      print_stdout(render_csv(budget_shell_table(result)));
    } else {
      print_stdout(render_text(budget_shell_table(result)) + "\n" + render_text(budget_lines_table(result)) + "\n" +
                   render_text(lifetime_by_level_table(result)));
      for (const auto& shell : result.shells)
        if (shell.deployment)
          print_stdout("\n" + render_text(deployment_plans_table(shell)) + "\n" + render_text(deployment_curve_table(shell)));
    }
  });
}

}  // namespace skein::cli
