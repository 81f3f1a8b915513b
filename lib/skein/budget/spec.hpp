#pragma once
// The `budget` block of a design: mission life, deadbands, allowances. (Filled in by the budget evaluator work.)
namespace skein {
namespace yaml { class MapReader; }

struct BudgetSpec {
  bool present = false;  // the design has a budget block
};

// Read the optional `budget` block of the design's top-level map; defaults when absent.
BudgetSpec read_budget_spec(const yaml::MapReader& design_root);

}  // namespace skein
