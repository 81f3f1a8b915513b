#include "skein/io/read_file.hpp"

#include <algorithm>
#include <filesystem>
#include <fstream>

#include <fmt/format.h>

#include "skein/error.hpp"

namespace skein {

std::string read_file_text(const std::string& path, std::size_t max_bytes, std::string_view kind) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) throw InputError(fmt::format("{}: is a directory; expected {}", path, kind));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(fmt::format("{}: cannot be opened for reading; check the path", path));
  // In chunks, so memory follows the file's size, not the limit; stop one byte past the limit.
  std::string text;
  constexpr std::size_t chunk = 1 << 16;
  while (text.size() <= max_bytes) {
    const std::size_t want = std::min(chunk, max_bytes + 1 - text.size());
    const std::size_t at = text.size();
    text.resize(at + want);
    in.read(text.data() + at, static_cast<std::streamsize>(want));
    text.resize(at + static_cast<std::size_t>(in.gcount()));
    if (in.bad()) throw InputError(fmt::format("{}: could not be read; check the path", path));
    if (!in) break;  // end of file
  }
  if (text.size() > max_bytes)
    throw InputError(fmt::format("{}: is larger than {} bytes; {} is expected to be under {} bytes", path, max_bytes,
                                 kind, max_bytes));
  return text;
}

}  // namespace skein
