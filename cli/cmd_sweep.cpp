// skein sweep SWEEP.yaml: evaluate many layouts of one or several shells (coverage and budget), keep every row in a
// journal as it finishes, and write the results table, the best front (meets requirement) and the trade front
// (all layouts). Runs on the cores of one machine
// (TBB) and, started by an MPI launcher, over the ranks of a cluster (mpi_split).
#include <unistd.h>

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <filesystem>
#include <map>
#include <fstream>
#include <memory>
#include <mutex>
#include <sstream>
#include <thread>

#include <fmt/format.h>

#include "commands.hpp"
#include "progress.hpp"
#include "skein/io/read_file.hpp"
#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/results_rows.hpp"
#include "skein/sweep/sweep_outputs.hpp"
#include "skein/sweep/sweep_run.hpp"
#ifdef SKEIN_HAVE_MPI
#include "skein/sweep/mpi_split.hpp"
#endif

namespace skein::cli {
namespace {

// A journal holds one line per layout (a few hundred bytes) for at most hard_max_layouts layouts.
constexpr std::size_t journal_max_bytes = static_cast<std::size_t>(hard_max_layouts) * 4096;




struct Options {
  std::string sweep;
  std::string out;
  std::string format = "table";
  bool resume = false, salvage = false, restart = false, force = false, exhaustive = false, overwrite = false;
  int threads = 0;
};

std::string out_dir(const Options& opt) {
  return !opt.out.empty() ? opt.out : std::filesystem::path(opt.sweep).stem().string() + "-results";
}

// The sweep folder is written into (results replaced, the journal kept): it must not be or hold an input
// file, and an existing non-empty folder must be a skein output (its marker, or a journal a sweep wrote
// before the marker existed) unless --overwrite is given.
void check_sweep_folder(const Options& opt, const std::string& dir, const Sweep& sweep) {
  namespace fs = std::filesystem;
  check_output_not_input(dir, {opt.sweep, sweep.base_file}, "--out");
  std::error_code ec;
  if (!fs::exists(dir, ec)) return;
  if (!fs::is_directory(dir, ec))
    throw InputError(fmt::format("--out {}: exists and is not a folder; expected a folder path", dir));
  if (opt.overwrite || is_skein_output_folder(dir) || (fs::is_empty(dir, ec) && !ec)) return;
  const std::string journal = (fs::path(dir) / "journal.txt").string();
  if (fs::is_regular_file(journal, ec) && read_file_text(journal, journal_max_bytes, "a sweep journal").rfind("skein-sweep-journal ", 0) == 0) return;
  throw InputError(fmt::format("--out {}: the folder exists and was not written by skein (it has no {} file); nothing "
                               "was changed. Expected a new or empty folder, a previous sweep output, or --overwrite "
                               "to write the results into it",
                               dir, output_marker_name));
}

// Rank 0 (or the only process): the journal's finished rows, after checking and compacting it.
std::map<size_t, std::string> open_journal(const Options& opt, const std::string& dir, const Sweep& sweep,
                                           const LayoutSet& set, long* damaged) {
  // Before any layout is evaluated or anything written; rank 0 only (the others would race its marker), and
  // a refusal reaches the other ranks through the status broadcast.
  check_sweep_folder(opt, dir, sweep);
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec || !std::filesystem::is_directory(dir))
    throw InputError(fmt::format("{}: cannot create the output folder ({}); expected a writable path for --out", dir,
                                 ec ? ec.message() : "not a folder"));
  const std::string marker = (std::filesystem::path(dir) / output_marker_name).string();
  if (!is_skein_output_folder(dir)) write_file_atomic(marker, output_marker_text());
  const std::string path = (std::filesystem::path(dir) / "journal.txt").string();
  const std::string header = journal_header(sweep.fingerprint, set.layouts.size());
  std::map<size_t, std::string> rows;
  if (std::filesystem::exists(path) && !opt.restart) {
    const std::string text = read_file_text(path, journal_max_bytes, "a sweep journal");
    if (!opt.resume && !opt.salvage && text.size() > header.size())
      throw InputError(fmt::format("{}: a journal of an earlier run is there; pass --resume to continue it or --restart "
                                   "to discard it",
                                   path));
    if (opt.resume || opt.salvage) {
      JournalReadOptions read;
      read.layouts = set.layouts.size();
      read.columns = sweep_columns(sweep).size();
      read.belongs = [&](size_t i, const std::vector<Cell>& cells) { return row_is_layout(sweep, set.layouts[i], cells); };
      read.salvage = opt.salvage;
      const JournalContents j = parse_journal(text, header, read, path);
      rows = j.rows;
      *damaged = j.damaged_lines;
      // Valid lines only, so that appended lines never follow a cut-short one; in place, without a second copy.
      rewrite_journal_in_place(path, text, j.compact);
      return rows;
    }
  }
  write_file_atomic(path, header);
  return rows;
}

// "satellites 32, fleet_dv_m_s 4325.12, percent_covered 57.3" for the summary line.
std::string figures_text(const Sweep& sweep, const RowSummary& row) {
  std::string text;
  for (size_t k = 0; k < sweep.costs.size(); ++k)
    text += fmt::format("{}{} {}", k ? ", " : "", to_string(sweep.costs[k]),
                        sweep.costs[k] == CostFigure::satellites || sweep.costs[k] == CostFigure::planes
                            ? fmt::format("{:.0f}", row.costs[k])
                                                                 : fmt::format("{:.2f}", row.costs[k]));
  return text + fmt::format(", {} {:.3f}", to_string(sweep.requirement.figure), row.figure);
}

void write_outputs(const Options& opt, const std::string& dir, const Sweep& sweep, const LayoutSet& set,
                   const std::map<size_t, std::string>& rows, long resumed, long damaged) {
  const SweepOutputs out = assemble_outputs(sweep, set, rows);
  namespace fs = std::filesystem;
  write_file_atomic((fs::path(dir) / "results.csv").string(), out.results_csv);
  write_file_atomic((fs::path(dir) / "results.jsonl").string(), out.results_jsonl);
  write_file_atomic((fs::path(dir) / "best_front.csv").string(), out.best_front_csv);
  write_file_atomic((fs::path(dir) / "trade_front.csv").string(), out.trade_front_csv);
  if (!out.fronts_svg.empty()) write_file_atomic((fs::path(dir) / "fronts.svg").string(), out.fronts_svg);
  const SweepSummary& s = out.summary;
  std::string note = fmt::format(
      "sweep {}: {} layouts ({} resumed from the journal{}), {} evaluated, {} refused by an evaluator, {} meet the "
      "requirement; {} on the {}, {} on the {}\n",
      sweep.name, s.layouts, resumed, damaged ? fmt::format(", {} damaged or repeated journal lines dropped", damaged) : "",
      s.evaluated, s.errors, s.meeting, s.best_front, best_front_name, s.trade_front, trade_front_name);
  if (s.skipped.total() > 0)
    note += fmt::format("skipped combinations: {} (P not dividing T: {}, F outside 0..P-1: {}, no sun-synchronous "
                        "inclination: {}, fold above the satellite count: {})\n",
                        s.skipped.total(), s.skipped.planes_not_dividing, s.skipped.phasing_out_of_range,
                        s.skipped.no_sun_synchronous, s.skipped.fold_above_satellites);
  if (s.cheapest_meeting)
    note += fmt::format("cheapest layout meeting the requirement: {} ({}): {}\n", s.cheapest_meeting->layout,
                        walker_label(set.layouts[s.cheapest_meeting->layout]), figures_text(sweep, *s.cheapest_meeting));
  else
    note += fmt::format("no layout meets the requirement: the best front is empty; the {} is in trade_front.csv\n",
                        trade_front_name);
  note += fmt::format("written: {}/results.csv, results.jsonl, best_front.csv, trade_front.csv{}\n", dir,
                      out.fronts_svg.empty() ? "" : ", fronts.svg");
  print_stderr(note);
  print_caution();
  // Standard output: the best front (meets requirement), cheapest first.
  const OutputFormat f = format_of(opt.format);
  if (f == OutputFormat::json)
    print_stdout(render(out.best_front, f) + "\n");
  else
    print_stdout(render(out.best_front, f));
}

void run(const Options& opt) {
  int rank = 0, ranks = 1;
#ifdef SKEIN_HAVE_MPI
  std::unique_ptr<mpi_split::Session> mpi;
  if (mpi_split::launched()) {
    mpi = std::make_unique<mpi_split::Session>();
    rank = mpi->rank();
    ranks = mpi->size();
  }
#endif
  const auto threads = limit_threads(opt.threads);
  // Every rank reads and expands the same sweep, so every rank holds the same numbered layouts.
  Sweep sweep;
  LayoutSet set;
  LayoutEvaluationOptions eval;
  eval.mode = opt.exhaustive ? CoverageMode::exhaustive : CoverageMode::culled;
  eval.force = opt.force;
  double estimate_s = 0.0;
  try {
    sweep = read_sweep_file(opt.sweep);
    set = expand_layouts(sweep, opt.force ? hard_max_layouts : default_max_layouts);
    estimate_s = estimate_sweep_seconds(sweep, set, eval);
  } catch (const InputError&) {
    if (rank != 0) throw ReportedElsewhere{};  // rank 0 reports it
    throw;
  }
  const std::string dir = out_dir(opt);

  std::map<size_t, std::string> rows;
  long damaged = 0;
  std::string status;  // rank 0 to the others: "ok" and the finished mask, or "error"
  std::exception_ptr setup_error;
  if (rank == 0) {
    try {
      rows = open_journal(opt, dir, sweep, set, &damaged);
      status = "ok";
      std::string mask(set.layouts.size(), '0');
      for (const auto& r : rows) mask[r.first] = '1';
      status += mask;
    } catch (...) {
      setup_error = std::current_exception();
      status = "error";
    }
  }
#ifdef SKEIN_HAVE_MPI
  if (mpi) mpi_split::broadcast(status);
#endif
  if (status.rfind("ok", 0) != 0) {
    if (setup_error) std::rethrow_exception(setup_error);
    throw ReportedElsewhere{};  // rank 0 reports it
  }
  std::vector<size_t> pending;
  for (size_t i = 0; i < set.layouts.size(); ++i)
    if (status[2 + i] == '0') pending.push_back(i);
  const std::vector<size_t> share = round_robin_share(pending, rank, ranks);
  const long resumed = static_cast<long>(set.layouts.size() - pending.size());

  if (rank != 0) {
#ifdef SKEIN_HAVE_MPI
    try {
      evaluate_layouts(sweep, set, share, [](size_t i, const std::string& row) { mpi_split::send_row(i, row); }, eval);
      mpi_split::send_done();
    } catch (const std::exception& e) {
      print_stderr(fmt::format("skein: rank {}: {}\n", rank, e.what()));
      mpi_split::abort(3);
    }
#endif
    return;
  }

  const double pending_estimate_s =
      estimate_s * static_cast<double>(pending.size()) / static_cast<double>(std::max<size_t>(1, set.layouts.size()));
  std::string shells;
  for (const ShellAxes& a : sweep.axes.shells)
    shells += (shells.empty() ? "" : ", ") + sweep.base.shells[a.shell_index].name;
  print_stderr(fmt::format("sweep {}: {} layouts of shell{} {}, {} to evaluate{}{}\n", sweep.name, set.layouts.size(),
                           sweep.axes.shells.size() > 1 ? "s" : "", shells, pending.size(),
                           ranks > 1 ? fmt::format(" over {} ranks", ranks) : "",
                           pending_estimate_s >= 60.0
                               ? fmt::format("; the coverage work alone is estimated at about {} on 2 cores",
                                             format_duration(pending_estimate_s))
                               : ""));
  JournalWriter journal((std::filesystem::path(dir) / "journal.txt").string());
  std::mutex rows_mutex;
  std::atomic<long> finished{0};
  auto keep = [&](size_t i, const std::string& row) {
    std::lock_guard<std::mutex> lock(rows_mutex);
    if (rows.count(i)) return;
    journal.append(journal_line(i, row));
    rows.emplace(i, row);
    finished.fetch_add(1);
  };
  {
    Progress bar("sweep", [&finished] { return static_cast<double>(finished.load()); },
                 static_cast<double>(pending.size()), "layouts");
    if (ranks == 1) {
      evaluate_layouts(sweep, set, share, keep, eval);
    } else {
#ifdef SKEIN_HAVE_MPI
      std::exception_ptr worker_error;
      std::thread worker([&] {
        try {
          evaluate_layouts(sweep, set, share, keep, eval);
        } catch (...) {
          worker_error = std::current_exception();
        }
      });
      try {
        mpi_split::receive_rows(ranks, keep);
      } catch (const std::exception& e) {  // e.g. the journal cannot be written: end every rank
        print_stderr(fmt::format("skein: error: {}\n", e.what()));
        mpi_split::abort(2);
      }
      worker.join();
      if (worker_error) std::rethrow_exception(worker_error);
#endif
    }
  }
  if (rows.size() != set.layouts.size())
    throw std::runtime_error(fmt::format("{} of {} rows arrived", rows.size(), set.layouts.size()));
  write_outputs(opt, dir, sweep, set, rows, resumed, damaged);
}

}  // namespace

void add_sweep_command(CLI::App& app) {
  auto opt = std::make_shared<Options>();
  CLI::App* cmd = app.add_subcommand(
      "sweep", "Trade sweep: evaluate coverage and budget for every layout of a sweep file's axes (per varied shell: "
               "T, P, F, pattern, altitude, inclination or sun-synchronous node times; design-wide: elevation mask, "
               "nadir half-angle, drag area, dry mass, mission life, solar activity), mark the layouts meeting the requirement, "
               "name the cheapest layout meeting the requirement and the best front (meets requirement) of requirement figure "
               "against cost, beside the trade front over all layouts. Start it with an MPI launcher "
               "(mpirun -n N skein sweep ...) to split the layouts over ranks");
  cmd->add_option("sweep", opt->sweep, "Sweep file (YAML)")->required();
  cmd->add_option("--out", opt->out, "Output folder (default: SWEEP-NAME-results in the current folder)");
  add_format_option(*cmd, opt->format);
  cmd->add_flag("--resume", opt->resume, "Continue an interrupted sweep from its journal (finished rows are kept)");
  cmd->add_flag("--salvage", opt->salvage,
                "Resume from a journal whose first line is damaged: keep every row whose checksum and layout index "
                "are valid, compute the others");
  cmd->add_flag("--restart", opt->restart, "Discard an earlier run's journal and start over");
  cmd->add_flag("--overwrite", opt->overwrite,
                "Write into an existing --out folder even when skein did not write it (its result files are replaced)");
  cmd->add_flag("--force", opt->force,
                "Run above the layout limit (20000) and the coverage work and memory limits of each layout");
  cmd->add_flag("--exhaustive", opt->exhaustive, "Test every (satellite, point) pair instead of culling footprints");
  add_threads_option(*cmd, opt->threads, "Worker threads per process (default: all cores); rows do not depend on it");
  cmd->callback([opt] {
    if ((opt->resume || opt->salvage) && opt->restart)
      throw InputError(fmt::format("{} and --restart exclude each other; expected one of them",
                                   opt->salvage ? "--salvage" : "--resume"));
    run(*opt);
  });
}

}  // namespace skein::cli
