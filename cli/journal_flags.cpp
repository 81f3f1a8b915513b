// The resume flags of the commands that keep a journal (sweep, search).
#include <fmt/format.h>

#include "commands.hpp"

namespace skein::cli {

void add_journal_flags(CLI::App& cmd, SweepFolderOptions& folder, const std::string& what) {
  cmd.add_flag("--resume", folder.resume,
               fmt::format("Continue an interrupted {} from its journal (finished rows are kept)", what));
  cmd.add_flag("--salvage", folder.salvage,
               "Resume from a journal whose first line is damaged: keep every row whose checksum and layout index "
               "are valid, compute the others");
  cmd.add_flag("--restart", folder.restart, "Discard an earlier run's journal and start over");
  cmd.add_flag("--overwrite", folder.overwrite,
               "Write into an existing --out folder even when skein did not write it (its result files are replaced)");
}

void check_journal_flags(const SweepFolderOptions& f) {
  if ((f.resume || f.salvage) && f.restart)
    throw InputError(fmt::format("{} and --restart exclude each other; expected one of them",
                                 f.salvage ? "--salvage" : "--resume"));
}

}  // namespace skein::cli
