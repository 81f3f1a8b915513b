#pragma once
// Reading a design file (YAML) into a validated Design. The file format is documented in README.md.
#include <string>

#include "skein/design/design.hpp"

namespace skein {

// Read and validate a design file. Throws InputError naming file:line:column, the YAML path, what was
// wrong and what was expected.
Design read_design_file(const std::string& path);

// The same from text; `name` stands for the file name in messages.
Design read_design_text(const std::string& text, const std::string& name);

// The bytes of a design file, read with the same size guard as read_design_file (for the report's record).
std::string read_design_file_bytes(const std::string& path);

// Parse a local time of day "HH:MM" (00:00 to 23:59) to hours; nullopt when malformed.
std::optional<double> parse_local_time_h(std::string_view text);

}  // namespace skein
