#include "skein/coverage/spec.hpp"

#include "skein/design/yaml_reader.hpp"

namespace skein {

CoverageSpec read_coverage_spec(const yaml::MapReader& root) {
  CoverageSpec spec;
  if (!root.has("coverage")) return spec;
  const yaml::MapReader block = root.map("coverage", {});
  spec.present = true;
  return spec;
}

}  // namespace skein
