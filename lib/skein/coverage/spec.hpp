#pragma once
// The `coverage` block of a design: grid, visibility mask, time span. (Filled in by the coverage evaluator work.)
namespace skein {
namespace yaml { class MapReader; }

struct CoverageSpec {
  bool present = false;  // the design has a coverage block
};

// Read the optional `coverage` block of the design's top-level map; defaults when absent.
CoverageSpec read_coverage_spec(const yaml::MapReader& design_root);

}  // namespace skein
