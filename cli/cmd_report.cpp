// skein report DESIGN.yaml --out reports/NAME/: the whole report folder for one design.
#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <memory>
#include <optional>

#include <fmt/format.h>

#include "commands.hpp"
#include "skein/input/design_file.hpp"
#include "skein/error.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/report/report.hpp"

namespace skein::cli {
namespace {

// OEM CREATION_DATE: --creation-date, else SOURCE_DATE_EPOCH (the reproducible-builds convention), else now.
std::string creation_date(const std::string& flag) {
  if (!flag.empty()) {
    const auto e = parse_utc_iso8601(flag);
    if (!e) throw InputError("--creation-date " + flag + ": expected an ISO 8601 UTC instant such as 2027-03-01T00:00:00Z");
    return format_utc_iso8601(*e, 3).substr(0, 23);
  }
  double unix_s = 0;
  if (const char* sde = std::getenv("SOURCE_DATE_EPOCH")) {
    char* end = nullptr;
    unix_s = std::strtod(sde, &end);
    if (end == sde || *end != '\0' || unix_s < 0)
      throw InputError(fmt::format("SOURCE_DATE_EPOCH={}: expected whole seconds since 1970-01-01", sde));
  } else {
    unix_s = static_cast<double>(std::chrono::duration_cast<std::chrono::seconds>(
                                     std::chrono::system_clock::now().time_since_epoch()).count());
  }
  return format_utc_iso8601(add_seconds(*parse_utc_iso8601("1970-01-01T00:00:00Z"), unix_s), 3).substr(0, 23);
}

// The land outlines of the maps: --land-outlines PATH (must exist), else the SKEIN_LAND_OUTLINES environment
// variable, else the file scripts/setup.sh installs (SKEIN_LAND_OUTLINES_DEFAULT, set by CMake). A missing file
// other than the flag's leaves the maps without outlines and the report says so.
void set_land_outlines(ReportOptions& options, const std::string& flag) {
  if (!flag.empty() && !std::filesystem::exists(flag))
    throw InputError(fmt::format("--land-outlines {}: no such file; expected a TopoJSON file of land polygons such as "
                                 "land-110m.json of the world-atlas package", flag));
  std::string path = flag;
  if (path.empty()) {
    const char* env = std::getenv("SKEIN_LAND_OUTLINES");
    path = env ? env : SKEIN_LAND_OUTLINES_DEFAULT;
  }
  LandOutlineLoad load = load_land_outlines(path);
  options.land = std::move(load.outlines);
  options.land_note = std::move(load.note);
}

}  // namespace

void add_report_command(CLI::App& app) {
  struct Options {
    std::string design, out, solar, created, land;
    int threads = 0;
    bool force = false, overwrite = false;
    double ephemeris_step_s = 60.0;
  };
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "report", "Write the whole report folder for a design: summary.md, index.html, tables (CSV, JSON), plots (SVG), "
                "coverage cells (GeoJSON) and ephemerides (CCSDS OEM)");
  cmd->add_option("design", opt->design, "Design file (YAML)")->required();
  cmd->add_option("--out", opt->out,
                  "Report folder (default: reports/DESIGN-NAME/); replaced as a whole when it is a previous skein "
                  "output (it holds a .skein-output file) or empty");
  cmd->add_flag("--overwrite", opt->overwrite,
                "Replace the --out folder even when skein did not write it (everything in it is deleted)");
  add_solar_option(*cmd, opt->solar, "Solar activity for the budget: low, mean, high or cycle (default: the design's)");
  cmd->add_option("--creation-date", opt->created,
                  "CREATION_DATE written in the OEM files (default: SOURCE_DATE_EPOCH if set, else now); the only "
                  "time stamp in the report, so fixing it makes the folder byte-identical across runs");
  cmd->add_option("--ephemeris-step", opt->ephemeris_step_s, "OEM sample step in seconds (default 60)")
      ->check(CLI::Range(1.0, 86400.0));
  cmd->add_option("--land-outlines", opt->land,
                  "Land outlines for the maps: a TopoJSON file such as land-110m.json of the world-atlas package "
                  "(default: $SKEIN_LAND_OUTLINES, else the copy scripts/setup.sh installs; without one the maps say "
                  "that the outlines are missing)");
  add_threads_option(*cmd, opt->threads, "Worker threads (default: all cores); results do not depend on it");
  cmd->add_flag("--force", opt->force,
                "Run the coverage even when its work estimate exceeds the limits, and write a report above the size "
                "limits (50000 files, 2 GiB)");
  cmd->callback([opt] {
    const Design design = read_design_file(opt->design);
    const auto threads = limit_threads(opt->threads);
    ReportOptions options;
    options.coverage.force = opt->force;
    options.budget.solar = solar_of(opt->solar);
    options.creation_date = creation_date(opt->created);
    options.ephemeris_step_s = opt->ephemeris_step_s;
    set_land_outlines(options, opt->land);
    // The command as typed, with the output folder written FOLDER: it does not change a figure, and so two runs of
    // the same command into different folders stay byte-identical.
    std::vector<std::string> args = command_args();
    for (size_t i = 0; i < args.size(); ++i) {
      if (args[i] == "--out" && i + 1 < args.size()) args[++i] = "FOLDER";
      else if (args[i].rfind("--out=", 0) == 0) args[i] = "--out=FOLDER";
    }
    options.record.command_line = shell_quoted(args);
    options.record.design_text = read_design_file_bytes(opt->design);
    std::string out = opt->out.empty() ? "reports/" + std::filesystem::path(opt->design).stem().string() : opt->out;
    while (out.size() > 1 && out.back() == '/') out.pop_back();
    FolderWriteOptions folder;
    folder.overwrite = opt->overwrite;
    folder.inputs = {opt->design};
    check_output_folder(out, folder);  // before any work: nothing is computed for an output that would be refused
    std::optional<FolderWriter> writer;  // made at the first file, after the coverage ran
    const Report report = build_report(design, options, [&](const std::string& path, std::string_view content) {
      if (!writer) writer.emplace(out, folder);
      writer->add(path, content);
    });
    if (!writer) writer.emplace(out, folder);
    writer->commit();
    print_stdout(fmt::format("Report for \"{}\" written to {} ({} files).\n"
                             "  summary:  {}/summary.md\n  browser:  {}/index.html\n"
                             "  tables:   {}/tables/   plots: {}/plots/   exports: {}/exports/\n",
                             design.name, out, report.files_written, out, out, out, out, out));
    for (const auto& w : report.budget.warnings) print_stderr("skein: warning: " + w + "\n");
    print_caution();
  });
}

}  // namespace skein::cli
