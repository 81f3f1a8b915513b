#pragma once
// The reader of a sweep file (the base design, the shells to vary and their axes, the design-wide axes, the
// requirement and the costs), at the input edge. The file format is documented in the README ("Trade
// sweeps"). Throws InputError naming file:line:column, the YAML path and what was expected.
#include <string>
#include <string_view>
#include <vector>

#include "skein/sweep/sweep_spec.hpp"

namespace skein {

struct SweepReadOptions {
  // The layouts the axes may expand to (default_max_layouts; hard_max_layouts with --force). A larger
  // expansion, or one with no valid layout, is refused at the axes block.
  double max_layouts = default_max_layouts;
  // Top-level keys the caller reads itself and the sweep reader accepts without reading (the search file's
  // `search` block, input/search_file.hpp). Empty for a sweep file.
  std::vector<std::string_view> extra_keys;
};

// Read and validate a sweep file and its base design; an axis that expands to no value is an error.
Sweep read_sweep_file(const std::string& path, const SweepReadOptions& options = {});
// The same from text; the base design path is resolved against `folder`.
Sweep read_sweep_text(const std::string& text, const std::string& name, const std::string& folder,
                      const SweepReadOptions& options = {});

}  // namespace skein
