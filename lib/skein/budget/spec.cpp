#include "skein/budget/spec.hpp"

#include "skein/design/yaml_reader.hpp"

namespace skein {

BudgetSpec read_budget_spec(const yaml::MapReader& root) {
  BudgetSpec spec;
  if (!root.has("budget")) return spec;
  const yaml::MapReader block = root.map("budget", {});
  spec.present = true;
  return spec;
}

}  // namespace skein
