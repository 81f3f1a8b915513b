#include "skein/io/atomic_write.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>

#include <fmt/format.h>

#include "skein/error.hpp"

namespace skein {

void write_file_atomic(const std::string& path, std::string_view content) {
  namespace fs = std::filesystem;
  const fs::path target(path);
  const fs::path dir = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::string tmpl = (dir / ("." + target.filename().string() + ".tmp-XXXXXX")).string();
  const int fd = ::mkstemp(tmpl.data());
  if (fd < 0)
    throw InputError(fmt::format("{}: cannot create a file in {}: {}; expected a writable folder", path, dir.string(),
                                 std::strerror(errno)));
  size_t done = 0;
  while (done < content.size()) {
    const ssize_t w = ::write(fd, content.data() + done, content.size() - done);
    if (w < 0) {
      if (errno == EINTR) continue;
      const int err = errno;
      ::close(fd);
      ::unlink(tmpl.c_str());
      throw InputError(fmt::format("{}: write failed: {}", path, std::strerror(err)));
    }
    done += static_cast<size_t>(w);
  }
  ::fchmod(fd, 0644);
  if (::fsync(fd) != 0 || ::close(fd) != 0) {
    ::unlink(tmpl.c_str());
    throw InputError(fmt::format("{}: could not be flushed to disk: {}", path, std::strerror(errno)));
  }
  if (::rename(tmpl.c_str(), path.c_str()) != 0) {
    const int err = errno;
    ::unlink(tmpl.c_str());
    throw InputError(fmt::format("{}: could not be put in place: {}", path, std::strerror(err)));
  }
}

}  // namespace skein
