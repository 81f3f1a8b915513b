#pragma once
// The reader of a design's `coverage` block (grid, mask, cone, span, step, fold, band width), at the input
// edge. Throws InputError naming file:line:column, the YAML path and what was expected.
#include "skein/design/coverage_spec.hpp"

namespace skein::yaml {
class MapReader;
}

namespace skein {

// The coverage block of a design (defaults when absent; spec.present says which).
CoverageSpec read_coverage_spec(const yaml::MapReader& design_root);

}  // namespace skein
