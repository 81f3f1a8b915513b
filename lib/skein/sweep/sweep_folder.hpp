#pragma once
// The sweep's output folder and the resume protocol of its journal (journal.hpp): the folder check before any
// layout is evaluated, then the journal read, checked and compacted (--resume, --salvage) or started afresh
// (a new folder, --restart). Rank 0 only: the other ranks learn the outcome from rank 0 (sweep_driver.hpp).
#include <cstddef>
#include <map>
#include <string>

#include "skein/sweep/layouts.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

// A journal holds one line per layout (a few hundred bytes) for at most hard_max_layouts layouts.
inline constexpr std::size_t journal_max_bytes = static_cast<std::size_t>(hard_max_layouts) * 4096;

// The file a sweep journals its rows to, inside the output folder.
std::string journal_path(const std::string& dir);

struct SweepFolderOptions {
  std::string sweep_file;  // the sweep file (an input: the folder may not be or hold it)
  bool resume = false;     // continue the journal of an earlier run
  bool salvage = false;    // resume, keeping the valid rows of a journal whose first line is damaged
  bool restart = false;    // discard an earlier run's journal
  bool overwrite = false;  // write into an existing folder skein did not write
};

struct JournalResume {
  std::map<size_t, std::string> rows;  // finished rows kept from the journal: layout index -> encoded row
  long damaged_lines = 0;              // journal lines dropped (damaged, repeated, or another layout's)
};

// The sweep folder is written into (results replaced, the journal kept): it must not be or hold an input file,
// and an existing non-empty folder must be a skein output (its marker, or a journal a sweep wrote before the
// marker existed) unless options.overwrite. Throws InputError otherwise; changes nothing.
void check_sweep_folder(const SweepFolderOptions& options, const std::string& dir, const Sweep& sweep);

// Checks the folder (check_sweep_folder), creates it with its marker, and returns the journal's finished rows:
// none for a new journal (written as its header alone) or with options.restart; with options.resume or
// options.salvage, the rows parse_journal keeps, after rewriting the journal in place to exactly those lines.
// An earlier run's journal with rows and neither flag is refused (InputError naming --resume and --restart).
JournalResume open_sweep_journal(const SweepFolderOptions& options, const std::string& dir, const Sweep& sweep,
                                 const LayoutSet& set);

}  // namespace skein
