#pragma once
// Each subcommand adds itself to the application here; one file per subcommand.
#include <CLI/CLI.hpp>
#include <tbb/global_control.h>

#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "skein/atmosphere/solar_activity.hpp"
#include "skein/error.hpp"

#include "skein/report/table.hpp"
#include "skein/sweep/sweep_folder.hpp"

namespace skein::cli {

// Adds `--format table|csv|json` to a subcommand, bound to `format` (the text as typed, checked).
void add_format_option(CLI::App& cmd, std::string& format);
// The format named by a checked --format value.
OutputFormat format_of(const std::string& format);

// Adds `--threads N` (1..1024), bound to `threads`; `help` says what the count applies to.
void add_threads_option(CLI::App& cmd, int& threads, const std::string& help);
// Caps TBB's worker count at `threads` while the returned object lives; no cap (null) for 0.
std::unique_ptr<tbb::global_control> limit_threads(int threads);

// Adds `--solar low|mean|high|cycle`, bound to `solar` (empty when not given).
void add_solar_option(CLI::App& cmd, std::string& solar, const std::string& help);
// The level named by a checked --solar value; none when the option was not given.
std::optional<SolarLevel> solar_of(const std::string& solar);

// Writes text to standard output (the one place commands print results).
void print_stdout(const std::string& text);
// Writes a note to standard error (warnings, progress, cautions).
void print_stderr(const std::string& text);
// Writes the usual caution (skein::caution_text) to standard error; every command that computes figures ends
// with it.
void print_caution();

// The command line's arguments (the program name as "skein"), for the report's run record; set once by main
// before parsing.
void set_command_args(int argc, char** argv);
const std::vector<std::string>& command_args();
// Arguments joined into one line, each quoted where a shell would need it, control bytes shown as \xNN.
std::string shell_quoted(const std::vector<std::string>& args);

// Library errors name the design field ("coverage.step_s = 0 s: ..."). Where a value came from a flag, the
// command says which: run f, and when it throws an InputError whose message starts with one of the given
// fields, throw it again prefixed with that field's flag ("--step: coverage.step_s = 0 s: ...").
// Thrown by a command whose error was already reported elsewhere (an MPI rank other than 0 when rank 0 prints
// the message): main() ends with the exit status of that kind of error, printing nothing. Exit statuses are
// decided in main() only: 1 usage, 2 bad input, 3 internal.
struct ReportedElsewhere {
  bool bad_input = true;
};

struct FlagField {
  std::string field;  // e.g. "coverage.step_s"
  std::string flag;   // e.g. "--step"
  bool given = false; // the flag was on the command line
};
template <class F>
auto naming_flags(const std::vector<FlagField>& fields, F&& f) -> decltype(f()) {
  try {
    return f();
  } catch (const InputError& e) {
    const std::string m = e.what();
    for (const FlagField& ff : fields)
      if (ff.given && m.rfind(ff.field, 0) == 0) throw InputError(ff.flag + ": " + m);
    throw;
  }
}

void add_check_command(CLI::App& app);
void add_drift_command(CLI::App& app);
void add_coverage_command(CLI::App& app);
void add_budget_command(CLI::App& app);
void add_report_command(CLI::App& app);
// --resume, --salvage, --restart and --overwrite of a command that keeps a journal ("sweep", "search"), and the
// refusal of --resume or --salvage with --restart.
void add_journal_flags(CLI::App& cmd, SweepFolderOptions& folder, const std::string& what);
void check_journal_flags(const SweepFolderOptions& folder);

void add_sweep_command(CLI::App& app);
void add_search_command(CLI::App& app);
void add_contacts_command(CLI::App& app);

}  // namespace skein::cli
