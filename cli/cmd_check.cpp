// skein check DESIGN.yaml: validate a design and print the expanded satellite table.
#include <memory>

#include <fmt/format.h>

#include "commands.hpp"
#include "skein/design/constellation.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/layout_tables.hpp"

namespace skein::cli {

void add_check_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string format = "table";
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand("check", "Validate a design file and print every satellite's mean elements at epoch");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  add_format_option(*cmd, opt->format);
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    const Table sats = satellite_table(design, expand_constellation(design));
    if (format_of(opt->format) == OutputFormat::json) {
      nlohmann::ordered_json j;
      j["design"] = design.name;
      j["epoch"] = format_utc_iso8601(design.epoch, 3);
      j["earth_model"] = std::string(design.earth.name);
      j["shells"] = rows_to_json(shell_table(design));
      j["planes"] = rows_to_json(plane_table(design));
      j["satellites"] = rows_to_json(sats);
      print_stdout(j.dump(2) + "\n");
    } else if (format_of(opt->format) == OutputFormat::csv) {
      print_stdout(render_csv(sats));
    } else {
      print_stdout(fmt::format("Design \"{}\" ({}), epoch {}, Earth model {}: valid.\n\n", design.name, design.file,
                               format_utc_iso8601(design.epoch, 3), design.earth.name));
      print_stdout(render_text(shell_table(design)) + "\n" + render_text(plane_table(design)) + "\n" +
                   render_text(sats));
    }
  });
}

}  // namespace skein::cli
