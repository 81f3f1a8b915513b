#pragma once
// Atomic file output: write to a temporary file beside the target, flush, then rename over it, so an
// interrupted run leaves either the old file or the whole new one, never a part.
#include <string>
#include <string_view>

namespace skein {

// Write `content` to `path` atomically. Throws InputError when the folder does not exist or is not writable.
void write_file_atomic(const std::string& path, std::string_view content);

}  // namespace skein
