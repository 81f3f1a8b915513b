#include "skein/io/folder_write.hpp"

#include <unistd.h>

#include <cstdlib>
#include <filesystem>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/atomic_write.hpp"

namespace skein {

void write_folder_atomic(const std::string& dir, const std::vector<OutputFile>& files) {
  namespace fs = std::filesystem;
  fs::path target = fs::path(dir).lexically_normal();
  if (target.filename().empty()) target = target.parent_path();  // "reports/demo/" -> "reports/demo"
  const fs::path parent = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::error_code ec;
  fs::create_directories(parent, ec);  // like mkdir -p: reports/NAME/ works on a fresh checkout
  if (!fs::is_directory(parent, ec))
    throw InputError(fmt::format("{}: the folder {} cannot be created; choose another --out", dir, parent.string()));
  if (fs::exists(target, ec) && !fs::is_directory(target, ec))
    throw InputError(fmt::format("{}: exists and is not a folder; expected a folder path for --out", dir));
  std::string tmpl = (parent / ("." + target.filename().string() + ".tmp-XXXXXX")).string();
  if (::mkdtemp(tmpl.data()) == nullptr)
    throw InputError(fmt::format("{}: cannot create a folder in {}; check permissions", dir, parent.string()));
  const fs::path staging(tmpl);
  try {
    for (const auto& f : files) {
      const fs::path p = staging / f.relative_path;
      fs::create_directories(p.parent_path());
      write_file_atomic(p.string(), f.content);
    }
    fs::permissions(staging, fs::perms::owner_all | fs::perms::group_read | fs::perms::group_exec |
                                 fs::perms::others_read | fs::perms::others_exec);
    if (fs::exists(target)) {
      // Move the old folder aside, put the new one in place, then delete the old one.
      const fs::path old = parent / ("." + target.filename().string() + ".old-" + std::to_string(::getpid()));
      fs::rename(target, old);
      fs::rename(staging, target);
      fs::remove_all(old, ec);
    } else {
      fs::rename(staging, target);
    }
  } catch (const fs::filesystem_error& e) {
    fs::remove_all(staging, ec);
    throw InputError(fmt::format("{}: could not write the report: {}", dir, e.what()));
  } catch (...) {
    fs::remove_all(staging, ec);
    throw;
  }
}

}  // namespace skein
