#include "skein/io/output_file.hpp"

#include <filesystem>
#include <fstream>

#include <fmt/format.h>

#include "skein/error.hpp"
#include "skein/io/folder_write.hpp"

namespace skein {

void check_output_file(const std::string& path, const OutputFileCheck& check) {
  namespace fs = std::filesystem;
  check_output_not_input(path, check.inputs, check.option);
  std::error_code ec;
  if (!fs::exists(path, ec)) return;
  if (fs::is_directory(path, ec))
    throw InputError(fmt::format("{} {}: is a folder; expected a file path", check.option, path));
  if (check.overwrite) return;
  std::ifstream in(path, std::ios::binary);
  std::string first(check.signature.size(), '\0');
  in.read(first.data(), static_cast<std::streamsize>(first.size()));
  const auto got = static_cast<size_t>(in.gcount());
  if (got == 0 || (got == first.size() && first == check.signature)) return;  // empty, or written by skein
  throw InputError(fmt::format("{} {}: the file exists and was not written by skein (its first line does not start "
                               "with \"{}\"); nothing was changed. Expected a new file, a previous skein output of "
                               "the same kind, or --overwrite to replace it",
                               check.option, path, check.signature));
}

}  // namespace skein
