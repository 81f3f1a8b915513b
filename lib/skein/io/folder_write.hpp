#pragma once
// Writing a folder of files as one unit, without ever destroying what skein did not write.
//
// - Every folder skein writes holds a marker file (output_marker_name) naming the program version. An
//   existing --out folder is replaced only when it holds that marker, is empty, or the caller passes
//   overwrite; otherwise InputError before any work. No output path may equal or contain an input file.
// - Files go into a hidden sibling staging folder ".NAME.skein-staging-XXXXXX" (the marker first, then each
//   file through write_file_atomic as it is made), and the staging folder is put in place by one atomic
//   exchange (Linux renameat2 RENAME_EXCHANGE; elsewhere, or where the file system refuses it, two renames).
//   An interrupted run leaves the previous folder whole under its name, and at most a staging folder, which
//   the next run for the same target removes (recognised by name pattern AND marker, nothing else).
// - SIGINT/SIGTERM while a FolderWriter lives only set a flag; it is checked between files, the staging
//   folder is removed and the signal is raised again with its default action.
// - Fault injection for tests: SKEIN_FAULT_AT=<step> makes the writer kill itself (SIGKILL) at that step;
//   the steps are listed in folder_write_fault_steps. SKEIN_FAULT_SIGNAL=TERM or INT sends that signal instead.
//   SKEIN_FAULT_NO_EXCHANGE=1 takes the two-rename path, as on a platform without the exchange.
#include <string>
#include <string_view>
#include <vector>

namespace skein {

struct OutputFile {
  std::string relative_path;  // "plots/coverage_map.svg"
  std::string content;
};

// The marker file skein writes into every output folder (report folders, sweep folders).
inline constexpr std::string_view output_marker_name = ".skein-output";
// Its content: "skein output folder, version X.Y.Z\n".
std::string output_marker_text();
// True when `dir` holds a marker file whose first line is one skein writes.
bool is_skein_output_folder(const std::string& dir);

// The steps SKEIN_FAULT_AT may name, in the order the writer passes them.
inline constexpr std::string_view folder_write_fault_steps[] = {
    "staging-created", "marker-written", "first-file-written", "files-written", "exchanged", "old-removed"};

struct FolderWriteOptions {
  bool overwrite = false;           // replace an existing folder that is not a skein output (--overwrite)
  std::vector<std::string> inputs;  // input files the output folder must not be nor contain
};

// Throw InputError when `path` (a folder or a file to be written) equals or contains one of `inputs`
// (compared as canonical paths; inputs that do not exist are ignored). `what` names the option ("--out").
void check_output_not_input(const std::string& path, const std::vector<std::string>& inputs, std::string_view what);

// The checks made before any work: `dir` is not a file, does not equal or contain an input, and, when it
// exists, is empty, a skein output folder, or options.overwrite is set. Throws InputError otherwise.
void check_output_folder(const std::string& dir, const FolderWriteOptions& options);

// A folder being written. The constructor checks (check_output_folder), removes stale staging folders of
// earlier interrupted runs for the same target, creates the staging folder and writes the marker; add()
// writes one file; commit() puts the folder in place. Destroyed without commit(), it removes its staging
// folder and leaves the target as it was.
class FolderWriter {
 public:
  FolderWriter(const std::string& dir, FolderWriteOptions options);
  ~FolderWriter();
  FolderWriter(const FolderWriter&) = delete;
  FolderWriter& operator=(const FolderWriter&) = delete;

  void add(const std::string& relative_path, std::string_view content);
  void commit();
  long files() const { return files_; }
  double bytes() const { return bytes_; }
  const std::string& target() const { return target_; }

 private:
  void stop_if_interrupted();
  std::string dir_, target_, parent_, staging_;
  FolderWriteOptions options_;
  bool committed_ = false;
  long files_ = 0;
  double bytes_ = 0.0;
};

// Replace folder `dir` by one holding exactly `files` (and the marker), creating missing parent folders.
void write_folder_atomic(const std::string& dir, const std::vector<OutputFile>& files,
                         const FolderWriteOptions& options = {});

// Remove the hidden staging folders ".NAME.skein-staging-*" beside `dir` that hold the marker (or are
// empty); returns how many were removed. Called by FolderWriter; public for tests.
int remove_stale_staging(const std::string& dir);

}  // namespace skein
