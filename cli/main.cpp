// skein: constellation coverage and station-keeping budget calculator. The CLI is the only place that
// prints; it catches every error at the top (error policy in lib/skein/error.hpp).
#include <cassert>
#include <cstdio>
#include <exception>
#include <iostream>
#include <map>
#include <string_view>

#include <fmt/format.h>

#include "commands.hpp"
#include "skein/error.hpp"
#include "skein/caution.hpp"
#include "skein/version.hpp"

namespace skein::cli {

void add_format_option(CLI::App& cmd, std::string& format) {
  cmd.add_option("--format", format, "Output format: table (aligned text), csv, or json")
      ->check(CLI::IsMember({"table", "csv", "json"}))
      ->capture_default_str();
}

OutputFormat format_of(const std::string& format) {
  const auto f = output_format_from_string(format);
  assert(f && "--format is checked by CLI11");
  return *f;
}

void add_threads_option(CLI::App& cmd, int& threads, const std::string& help) {
  cmd.add_option("--threads", threads, help)->check(CLI::Range(1, 1024));
}

std::unique_ptr<tbb::global_control> limit_threads(int threads) {
  if (threads <= 0) return nullptr;
  return std::make_unique<tbb::global_control>(tbb::global_control::max_allowed_parallelism,
                                               static_cast<size_t>(threads));
}

void add_solar_option(CLI::App& cmd, std::string& solar, const std::string& help) {
  cmd.add_option("--solar", solar, help)->check(CLI::IsMember({"low", "mean", "high", "cycle"}));
}

std::optional<SolarLevel> solar_of(const std::string& solar) {
  if (solar.empty()) return std::nullopt;
  const auto level = solar_level_from_string(solar);
  assert(level && "--solar is checked by CLI11");
  return level;
}

void print_stdout(const std::string& text) {
  std::fwrite(text.data(), 1, text.size(), stdout);
  std::fflush(stdout);
}

void print_stderr(const std::string& text) {
  std::fwrite(text.data(), 1, text.size(), stderr);
  std::fflush(stderr);
}

void print_caution() { print_stderr("Caution: " + std::string(caution_text) + "\n"); }

namespace {
std::vector<std::string> typed_args;
}  // namespace

void set_command_args(int argc, char** argv) {
  typed_args.assign(1, "skein");
  for (int i = 1; i < argc; ++i) typed_args.emplace_back(argv[i]);
}

const std::vector<std::string>& command_args() { return typed_args; }

std::string shell_quoted(const std::vector<std::string>& args) {
  std::string line;
  for (const std::string& arg : args) {
    std::string shown;
    bool quote = arg.empty();
    for (unsigned char ch : arg) {
      if (ch < 0x20 || ch == 0x7f) {
        shown += fmt::format("\\x{:02x}", ch);
        quote = true;
      } else if (ch == '\'') {
        shown += "'\\''";
        quote = true;
      } else {
        shown += static_cast<char>(ch);
        if (std::string_view(" \t\"$`\\!*?;&|<>()[]{}#~").find(static_cast<char>(ch)) != std::string_view::npos) quote = true;
      }
    }
    line += (line.empty() ? "" : " ") + (quote ? "'" + shown + "'" : shown);
  }
  return line;
}

}  // namespace skein::cli

int main(int argc, char** argv) {
  CLI::App app{"skein: constellation coverage and station-keeping budget calculator.\n"
               "Reads a YAML design of shells, planes and phasing; reports J2 drift, coverage and delta-v budgets."};
  app.set_version_flag("--version", std::string("skein ") + SKEIN_VERSION);
  app.require_subcommand(1);
  skein::cli::add_check_command(app);
  skein::cli::add_drift_command(app);
  skein::cli::add_coverage_command(app);
  skein::cli::add_contacts_command(app);
  skein::cli::add_budget_command(app);
  skein::cli::add_report_command(app);
  skein::cli::add_sweep_command(app);
  skein::cli::add_search_command(app);
  skein::cli::set_command_args(argc, argv);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    // --help and --version end here with 0; every usage error gets status 1.
    return app.exit(e) == 0 ? 0 : 1;
  } catch (const skein::InputError& e) {
    std::cerr << "skein: error: " << e.what() << "\n";
    return 2;
  } catch (const skein::cli::ReportedElsewhere& e) {
    return e.bad_input ? 2 : 3;
  } catch (const std::exception& e) {
    std::cerr << "skein: internal error: " << e.what() << "\n";
    return 3;
  }
  return 0;
}
