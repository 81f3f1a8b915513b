// skein contacts DESIGN.yaml: ground contacts of every satellite with every station of the design's
// ground_stations list, the longest time each satellite goes without contact, and each station's load.
#include <memory>

#include "commands.hpp"
#include "skein/coverage/contacts.hpp"
#include "skein/input/design_file.hpp"
#include "skein/report/contact_tables.hpp"

namespace skein::cli {

void add_contacts_command(CLI::App& app) {
  struct Options {
    std::string design;
    std::string format = "table";
    int threads = 0;
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "contacts", "Per satellite and ground station: contacts and contact minutes per day, mean and longest contact; "
                  "per satellite the longest time without any contact; per station the busy share and the most "
                  "satellites in contact at once, over the coverage span (coverage.span_h)");
  cmd->add_option("design", opt->design, "Design file (YAML) with a ground_stations list")->required();
  add_format_option(*cmd, opt->format);
  add_threads_option(*cmd, opt->threads, "Worker threads for the search over satellites (default: all cores)");
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    const auto cap = limit_threads(opt->threads);
    const ContactResult result = compute_contacts(design);
    print_caution();
    const Table pairs = contact_pair_table(result), gaps = contact_gap_table(result),
                load = station_load_table(result), by_count = station_in_view_table(result);
    const OutputFormat f = format_of(opt->format);
    if (f == OutputFormat::json) {
      nlohmann::ordered_json j;
      j["design"] = design.name;
      j["span_s"] = result.span_s;
      j["sample_step_s"] = result.sample_step_s;
      j["contacts"] = rows_to_json(pairs);
      j["satellites"] = rows_to_json(gaps);
      j["stations"] = rows_to_json(load);
      j["stations_by_count"] = rows_to_json(by_count);
      print_stdout(j.dump(2) + "\n");
    } else if (f == OutputFormat::csv) {
      print_stdout(render_csv(pairs));
    } else {
      print_stdout(render_text(load) + "\n" + render_text(by_count) + "\n" + render_text(gaps) + "\n" +
                   render_text(pairs));
    }
  });
}

}  // namespace skein::cli
