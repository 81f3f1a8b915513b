#pragma once
// The reader of a design's `budget` block (mission life, atmosphere, solar level, deadband, injection errors,
// collision avoidance, disposal, margin), at the input edge. Throws InputError naming file:line:column.
#include "skein/design/budget_spec.hpp"

namespace skein::yaml {
class MapReader;
}

namespace skein {

// The budget block of a design (defaults when absent).
BudgetSpec read_budget_spec(const yaml::MapReader& design_root);

}  // namespace skein
