#pragma once
// Each subcommand adds itself to the application here; one file per subcommand.
#include <CLI/CLI.hpp>

#include <string>

#include "skein/report/table.hpp"

namespace skein::cli {

// Adds `--format table|csv|json` to a subcommand, bound to `format` (the text as typed, checked).
void add_format_option(CLI::App& cmd, std::string& format);
// The format named by a checked --format value.
OutputFormat format_of(const std::string& format);

// Writes text to standard output (the one place commands print results).
void print_stdout(const std::string& text);
// Writes a note to standard error (warnings, progress, cautions).
void print_stderr(const std::string& text);

void add_check_command(CLI::App& app);
void add_drift_command(CLI::App& app);
void add_coverage_command(CLI::App& app);
void add_budget_command(CLI::App& app);
void add_report_command(CLI::App& app);
void add_sweep_command(CLI::App& app);

}  // namespace skein::cli
