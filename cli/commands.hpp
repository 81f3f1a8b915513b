#pragma once
// Each subcommand adds itself to the application here; one file per subcommand.
#include <CLI/CLI.hpp>
#include <tbb/global_control.h>

#include <memory>
#include <optional>
#include <string>

#include "skein/atmosphere/solar_activity.hpp"

#include "skein/report/table.hpp"

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

void add_check_command(CLI::App& app);
void add_drift_command(CLI::App& app);
void add_coverage_command(CLI::App& app);
void add_budget_command(CLI::App& app);
void add_report_command(CLI::App& app);
void add_sweep_command(CLI::App& app);

}  // namespace skein::cli
