// skein budget DESIGN.yaml: natural lifetime and station-keeping delta-v budget per shell, and with --samples (or
// budget.samples) the Monte Carlo percentiles beside them.
#include <memory>
#include <optional>

#include "commands.hpp"
#include "skein/budget/budget.hpp"
#include "skein/budget/monte_carlo.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/budget_spread_tables.hpp"
#include "skein/report/budget_tables.hpp"
#include "skein/report/deployment_tables.hpp"

namespace skein::cli {

void add_budget_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string format = "table";
    std::string solar;
    std::optional<long> samples;
    std::optional<unsigned long long> seed;
    int threads = 0;
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "budget", "Print per shell the natural lifetime under drag and the station-keeping delta-v budget over the "
                "mission life (drag make-up, node drift control, sun-synchronous inclination, slot keeping, collision "
                "avoidance, disposal, margin), with propellant by the rocket equation; with --samples, Monte Carlo "
                "percentiles beside them");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  add_format_option(*cmd, opt->format);
  add_solar_option(*cmd, opt->solar, "Solar activity, overriding budget.solar_activity: low, mean, high or cycle");
  cmd->add_option("--samples", opt->samples,
                  "Monte Carlo samples (100 to 1000000), overriding budget.samples: draws the solar cycle, drag "
                  "coefficient, area and injection errors by budget.spread and reports P5/P50/P95");
  cmd->add_option("--seed", opt->seed, "Monte Carlo seed (0 to 2^53), overriding budget.seed (default 1)");
  add_threads_option(*cmd, opt->threads, "Worker threads (default: all cores); results do not depend on it");
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    BudgetOptions options;
    options.solar = solar_of(opt->solar);
    std::optional<MonteCarloOptions> mc;
    if (opt->samples || design.budget.samples) {
      mc.emplace();
      mc->samples = opt->samples.value_or(design.budget.samples.value_or(0));
      mc->seed = opt->seed.value_or(design.budget.seed.value_or(1));
      mc->budget = options;
      naming_flags({{"budget.samples", "--samples", opt->samples.has_value()},
                    {"budget.seed", "--seed", opt->seed.has_value()}},
                   [&] { check_monte_carlo_options(*mc); });  // before any work
    }
    const auto threads = limit_threads(opt->threads);
    const BudgetResult result = compute_budget(design, options);
    std::optional<BudgetSpreadResult> spread;
    if (mc) spread = compute_budget_spread(design, result, *mc);
    print_caution();
    for (const auto& w : result.warnings) print_stderr("warning: " + w + "\n");
    if (spread) {
      print_stderr("Caution: Monte Carlo " + std::string(budget_spread_caution) + "\n");
      for (const auto& w : spread->warnings) print_stderr("warning: Monte Carlo: " + w + "\n");
    }
    const OutputFormat f = format_of(opt->format);
    if (f == OutputFormat::json) {
      nlohmann::ordered_json j = budget_to_json(result, design.earth.radius_km);
      if (spread) j["monte_carlo"] = budget_spread_to_json(*spread);
      print_stdout(j.dump(2) + "\n");
    } else if (f == OutputFormat::csv) {
      print_stdout(render_csv(spread ? budget_spread_table(*spread) : budget_shell_table(result)));
    } else {
      std::string text = render_text(budget_shell_table(result)) + "\n" + render_text(budget_lines_table(result)) +
                         "\n" + render_text(lifetime_by_level_table(result));
      for (const auto& shell : result.shells)
        if (shell.deployment)
          text += "\n" + render_text(deployment_plans_table(shell)) + "\n" + render_text(deployment_curve_table(shell));
      if (spread) {
        text += "\n" + render_text(budget_spread_table(*spread)) + "\n" + render_text(budget_spread_inputs_table(*spread));
        for (const auto& n : spread->notes) text += "  " + n + "\n";
      }
      print_stdout(text);
    }
  });
}

}  // namespace skein::cli
