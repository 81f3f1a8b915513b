#pragma once
// The one whole-file reader: reads at most a limit plus one byte (so a huge file or /dev/zero is refused at
// once) and throws InputError naming the path for a folder, an unopenable or unreadable file, or one over the
// limit. `kind` names the file in messages ("a YAML design file", "a sweep journal").
#include <cstddef>
#include <string>
#include <string_view>

namespace skein {

std::string read_file_text(const std::string& path, std::size_t max_bytes, std::string_view kind);

}  // namespace skein
