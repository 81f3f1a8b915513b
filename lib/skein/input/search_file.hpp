#pragma once
// The reader of a search file, at the input edge: a sweep file (input/sweep_file.hpp: name, base, shell,
// coverage, axes, requirement, cost, with the same words and ranges) plus a `search` block of the search's own
// settings. The space is what the sweep reader reads, so a full sweep of the same file without its search block
// (equivalent_sweep_text) numbers and judges the same layouts. Throws InputError naming file:line:column.
#include <string>

#include "skein/search/search_spec.hpp"

namespace skein {

// The layouts a search space may expand to without --force (common practice: the search computes every layout's
// budget, a few milliseconds each, before any coverage); hard_max_layouts with --force.
constexpr double search_max_layouts = 200000;

struct SearchReadOptions {
  double max_layouts = search_max_layouts;
};

Search read_search_file(const std::string& path, const SearchReadOptions& options = {});

// The equivalent sweep file of a search file: the same keys without the search block, with `base` made an
// absolute path (so the text may be saved anywhere). Reads and checks the search file first.
std::string equivalent_sweep_text(const std::string& path, const SearchReadOptions& options = {});

}  // namespace skein
