#include "skein/sweep/sweep_folder.hpp"

#include <filesystem>
#include <system_error>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/io/folder_write.hpp"
#include "skein/io/read_file.hpp"
#include "skein/sweep/journal.hpp"
#include "skein/sweep/results_rows.hpp"

namespace skein {

std::string journal_path(const std::string& dir) { return (std::filesystem::path(dir) / "journal.txt").string(); }

void check_sweep_folder(const SweepFolderOptions& options, const std::string& dir, const Sweep& sweep) {
  namespace fs = std::filesystem;
  check_output_not_input(dir, {options.sweep_file, sweep.base_file}, "--out");
  std::error_code ec;
  if (!fs::exists(dir, ec)) return;
  if (!fs::is_directory(dir, ec))
    throw InputError(fmt::format("--out {}: exists and is not a folder; expected a folder path", dir));
  if (options.overwrite || is_skein_output_folder(dir) || (fs::is_empty(dir, ec) && !ec)) return;
  const std::string journal = journal_path(dir);
  if (fs::is_regular_file(journal, ec) &&
      read_file_text(journal, journal_max_bytes, "a sweep journal").rfind("skein-sweep-journal ", 0) == 0)
    return;
  throw InputError(fmt::format("--out {}: the folder exists and was not written by skein (it has no {} file); nothing "
                               "was changed. Expected a new or empty folder, a previous sweep output, or --overwrite "
                               "to write the results into it",
                               dir, output_marker_name));
}

JournalResume open_sweep_journal(const SweepFolderOptions& options, const std::string& dir, const Sweep& sweep,
                                 const LayoutSet& set) {
  check_sweep_folder(options, dir, sweep);
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec || !std::filesystem::is_directory(dir))
    throw InputError(fmt::format("{}: cannot create the output folder ({}); expected a writable path for --out", dir,
                                 ec ? ec.message() : "not a folder"));
  const std::string marker = (std::filesystem::path(dir) / output_marker_name).string();
  if (!is_skein_output_folder(dir)) write_file_atomic(marker, output_marker_text());
  const std::string path = journal_path(dir);
  const std::string header = journal_header(sweep.fingerprint, set.layouts.size());
  JournalResume out;
  if (std::filesystem::exists(path) && !options.restart) {
    const std::string text = read_file_text(path, journal_max_bytes, "a sweep journal");
    if (!options.resume && !options.salvage && text.size() > header.size())
      throw InputError(fmt::format("{}: a journal of an earlier run is there; pass --resume to continue it or --restart "
                                   "to discard it",
                                   path));
    if (options.resume || options.salvage) {
      JournalReadOptions read;
      read.layouts = set.layouts.size();
      read.columns = sweep_columns(sweep).size();
      read.belongs = [&](size_t i, const std::vector<Cell>& cells) { return row_is_layout(sweep, set.layouts[i], cells); };
      read.salvage = options.salvage;
      JournalContents j = parse_journal(text, header, read, path);
      // Valid lines only, so that appended lines never follow a cut-short one; in place, without a second copy.
      rewrite_journal_in_place(path, text, j.compact);
      out.rows = std::move(j.rows);
      out.damaged_lines = j.damaged_lines;
      return out;
    }
  }
  write_file_atomic(path, header);
  return out;
}

}  // namespace skein
