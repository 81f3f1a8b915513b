#include "skein/io/folder_write.hpp"

#ifndef _GNU_SOURCE
#define _GNU_SOURCE  // renameat2 and RENAME_EXCHANGE in <stdio.h> (glibc 2.28+)
#endif
#include <fcntl.h>
#include <signal.h>
#include <stdio.h>
#include <unistd.h>

#include <algorithm>
#include <cassert>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"
#include "skein/version.hpp"

namespace skein {
namespace fs = std::filesystem;
namespace {

constexpr std::string_view marker_first_line_prefix = "skein output folder, version ";
constexpr std::string_view staging_infix = ".skein-staging-";

// --- signals: the handler only records the signal; FolderWriter::add checks it between files. ---
volatile sig_atomic_t pending_signal = 0;
struct sigaction saved_int, saved_term;
int live_writers = 0;

extern "C" void record_signal(int sig) { pending_signal = sig; }

void install_handlers() {
  if (live_writers++ > 0) return;
  struct sigaction sa {};
  sa.sa_handler = record_signal;
  sigemptyset(&sa.sa_mask);
  sa.sa_flags = 0;
  ::sigaction(SIGINT, &sa, &saved_int);
  ::sigaction(SIGTERM, &sa, &saved_term);
  // A signal the process was started to ignore (SIGINT of a background job) stays ignored.
  if (saved_int.sa_handler == SIG_IGN) ::sigaction(SIGINT, &saved_int, nullptr);
  if (saved_term.sa_handler == SIG_IGN) ::sigaction(SIGTERM, &saved_term, nullptr);
}

void restore_handlers() {
  if (--live_writers > 0) return;
  ::sigaction(SIGINT, &saved_int, nullptr);
  ::sigaction(SIGTERM, &saved_term, nullptr);
}

// SKEIN_FAULT_AT=<step>: die by SIGKILL at that step (tests of the interrupted-run promise); with
// SKEIN_FAULT_SIGNAL=TERM or INT, send that signal instead (the writer then cleans up at the next file).
void fault_point(std::string_view step) {
  const char* at = std::getenv("SKEIN_FAULT_AT");
  if (at == nullptr || step != at) return;
  const char* sig = std::getenv("SKEIN_FAULT_SIGNAL");
  const std::string_view name = sig != nullptr ? sig : "KILL";
  ::raise(name == "TERM" ? SIGTERM : name == "INT" ? SIGINT : SIGKILL);
}

fs::path normal_target(const std::string& dir) {
  fs::path target = fs::path(dir).lexically_normal();
  if (target.filename().empty()) target = target.parent_path();  // "reports/demo/" -> "reports/demo"
  return target;
}

fs::path parent_of(const fs::path& target) { return target.has_parent_path() ? target.parent_path() : fs::path("."); }

bool pid_alive(long pid) { return pid > 0 && (::kill(static_cast<pid_t>(pid), 0) == 0 || errno == EPERM); }

// Swap `from` into `to` (which exists). True on success; false when the platform or file system has no
// atomic exchange (then the caller falls back to two renames).
bool exchange(const fs::path& from, const fs::path& to) {
  if (std::getenv("SKEIN_FAULT_NO_EXCHANGE") != nullptr) return false;  // tests of the fallback path
#if defined(__linux__) && defined(RENAME_EXCHANGE)
  if (::renameat2(AT_FDCWD, from.c_str(), AT_FDCWD, to.c_str(), RENAME_EXCHANGE) == 0) return true;
  if (errno == EINVAL || errno == ENOSYS || errno == ENOTSUP) return false;
  throw fs::filesystem_error("cannot exchange the folders", from, to, std::error_code(errno, std::generic_category()));
#else
  (void)from;
  (void)to;
  return false;
#endif
}

}  // namespace

std::string output_marker_text() {
  return std::string(marker_first_line_prefix) + SKEIN_VERSION +
         "\nThis folder was written by skein and is replaced as a whole by the next run with the same output path.\n";
}

bool is_skein_output_folder(const std::string& dir) {
  std::error_code ec;
  const fs::path m = fs::path(dir) / output_marker_name;
  if (!fs::is_regular_file(m, ec)) return false;
  std::ifstream in(m, std::ios::binary);
  std::string line;
  std::getline(in, line);
  return line.rfind(marker_first_line_prefix, 0) == 0;
}

void check_output_not_input(const std::string& path, const std::vector<std::string>& inputs, std::string_view what) {
  std::error_code ec;
  const fs::path out = fs::weakly_canonical(fs::absolute(normal_target(path), ec), ec);
  if (ec) return;  // nothing there can be an input
  for (const std::string& input : inputs) {
    std::error_code ec2;
    const fs::path in = fs::canonical(input, ec2);
    if (ec2) continue;
    const auto [o, i] = std::mismatch(out.begin(), out.end(), in.begin(), in.end());
    std::error_code ec3;
    const bool same_file = fs::equivalent(out, in, ec3) && !ec3;  // also a hard link to the input
    if (same_file)
      throw InputError(fmt::format("{} {}: is the input file {} (the same file under another name); expected an "
                                   "output path outside the inputs",
                                   what, path, input));
    if (o == out.end())
      throw InputError(fmt::format("{} {}: {} the input file {}; expected an output path outside the inputs", what, path,
                                   i == in.end() ? "is" : "contains", input));
  }
}

void check_output_folder(const std::string& dir, const FolderWriteOptions& options) {
  const fs::path target = normal_target(dir);
  std::error_code ec;
  check_output_not_input(dir, options.inputs, "--out");
  if (!fs::exists(fs::symlink_status(target, ec)) && !fs::exists(target, ec)) return;
  if (!fs::is_directory(target, ec))
    throw InputError(fmt::format("--out {}: exists and is not a folder; expected a folder path", dir));
  if (options.overwrite || is_skein_output_folder(target.string())) return;
  if (fs::is_empty(target, ec) && !ec) return;
  throw InputError(fmt::format("--out {}: the folder exists and was not written by skein (it has no {} file); "
                               "nothing was changed. Expected a new or empty folder, a previous skein output, or "
                               "--overwrite to replace it and everything in it",
                               dir, output_marker_name));
}

int remove_stale_staging(const std::string& dir) {
  const fs::path target = normal_target(dir);
  const fs::path parent = parent_of(target);
  const std::string prefix = "." + target.filename().string() + std::string(staging_infix);
  int removed = 0;
  std::error_code ec;
  for (fs::directory_iterator it(parent, ec), end; !ec && it != end; it.increment(ec)) {
    const std::string name = it->path().filename().string();
    if (name.rfind(prefix, 0) != 0 || !it->is_directory(ec) || it->is_symlink(ec)) continue;
    // ".NAME.skein-staging-PID-XXXXXX": leave the staging folder of a run that is still going.
    const std::string rest = name.substr(prefix.size());
    char* endp = nullptr;
    const long pid = std::strtol(rest.c_str(), &endp, 10);
    if (endp == rest.c_str() || *endp != '-' || std::strlen(endp + 1) != 6) continue;
    if (pid_alive(pid)) continue;
    std::error_code ec2;
    if (is_skein_output_folder(it->path().string())) {
      if (fs::remove_all(it->path(), ec2) > 0 && !ec2) ++removed;
    } else if (fs::is_empty(it->path(), ec2) && !ec2 && fs::remove(it->path(), ec2) && !ec2) {
      ++removed;  // killed before the marker was written: an empty folder
    }
  }
  return removed;
}

FolderWriter::FolderWriter(const std::string& dir, FolderWriteOptions options) : dir_(dir), options_(std::move(options)) {
  const fs::path target = normal_target(dir);
  const fs::path parent = parent_of(target);
  target_ = target.string();
  parent_ = parent.string();
  check_output_folder(dir, options_);
  std::error_code ec;
  fs::create_directories(parent, ec);  // like mkdir -p: reports/NAME/ works on a fresh checkout
  if (!fs::is_directory(parent, ec))
    throw InputError(fmt::format("{}: the folder {} cannot be created; choose another --out", dir, parent.string()));
  remove_stale_staging(dir);
  std::string tmpl = (parent / ("." + target.filename().string() + std::string(staging_infix) +
                                std::to_string(::getpid()) + "-XXXXXX"))
                         .string();
  if (::mkdtemp(tmpl.data()) == nullptr)
    throw InputError(fmt::format("{}: cannot create a folder in {}; check permissions", dir, parent.string()));
  staging_ = tmpl;
  install_handlers();
  fault_point("staging-created");
  try {
    write_file_atomic((fs::path(staging_) / output_marker_name).string(), output_marker_text());
  } catch (...) {
    fs::remove_all(staging_, ec);
    restore_handlers();
    throw;
  }
  fault_point("marker-written");
}

FolderWriter::~FolderWriter() {
  if (!committed_) {
    std::error_code ec;
    fs::remove_all(staging_, ec);
  }
  restore_handlers();
  // A signal that came after the last check (during the exchange) still ends the process, now that the
  // folder is in place and the previous handlers are back.
  if (live_writers == 0 && pending_signal != 0) {
    const int sig = pending_signal;
    pending_signal = 0;
    ::raise(sig);
  }
}

void FolderWriter::stop_if_interrupted() {
  if (pending_signal == 0) return;
  // Interrupted: remove the staging folder, then end the way the signal would have.
  const int sig = pending_signal;
  std::error_code ec;
  fs::remove_all(staging_, ec);
  committed_ = true;  // nothing left to clean
  ::signal(sig, SIG_DFL);
  ::raise(sig);
}

void FolderWriter::add(const std::string& relative_path, std::string_view content) {
  assert(!committed_);
  assert(!relative_path.empty() && fs::path(relative_path).is_relative() &&
         relative_path.find("..") == std::string::npos && "a file of the folder stays inside it");
  stop_if_interrupted();
  try {
    const fs::path p = fs::path(staging_) / relative_path;
    fs::create_directories(p.parent_path());
    write_file_atomic(p.string(), content);
  } catch (const fs::filesystem_error& e) {
    throw InputError(fmt::format("{}: could not write {}: {}", dir_, relative_path, e.what()));
  }
  ++files_;
  bytes_ += static_cast<double>(content.size());
  if (files_ == 1) fault_point("first-file-written");
}

void FolderWriter::commit() {
  assert(!committed_);
  stop_if_interrupted();
  const fs::path target(target_), staging(staging_);
  try {
    fs::permissions(staging, fs::perms::owner_all | fs::perms::group_read | fs::perms::group_exec |
                                 fs::perms::others_read | fs::perms::others_exec);
    fault_point("files-written");
    std::error_code ec;
    // Check again right before replacing: the folder may have changed since the constructor looked.
    check_output_folder(dir_, options_);
    stop_if_interrupted();  // the last moment an interrupt leaves the previous folder as it was
    if (fs::exists(fs::symlink_status(target, ec))) {
      if (exchange(staging, target)) {
        // The staging name now holds the previous folder (with its marker, unless --overwrite replaced a
        // foreign one, which is then left for the user if we are killed here).
        fault_point("exchanged");
        fs::remove_all(staging, ec);
      } else {
        // No atomic exchange: move the old folder aside, put the new one in place, delete the old one.
        const fs::path old(staging.string() + "-old");
        fs::rename(target, old);
        fault_point("exchanged");
        fs::rename(staging, target);
        fs::remove_all(old, ec);
      }
    } else {
      fs::rename(staging, target);
      fault_point("exchanged");
    }
    committed_ = true;
    fault_point("old-removed");
  } catch (const fs::filesystem_error& e) {
    throw InputError(fmt::format("{}: could not put the folder in place: {}", dir_, e.what()));
  }
}

void write_folder_atomic(const std::string& dir, const std::vector<OutputFile>& files, const FolderWriteOptions& options) {
  FolderWriter w(dir, options);
  for (const auto& f : files) w.add(f.relative_path, f.content);
  w.commit();
}

}  // namespace skein
