#include "skein/design/budget_spec.hpp"

namespace skein {

std::string_view to_string(RaisingPropulsion propulsion) {
  return propulsion == RaisingPropulsion::electric ? "electric" : "chemical";
}

std::string_view to_string(DisposalMode mode) {
  switch (mode) {
    case DisposalMode::natural_decay: return "natural-decay";
    case DisposalMode::direct: return "direct";
    case DisposalMode::none: return "none";
  }
  return "natural-decay";
}

std::optional<DisposalMode> disposal_mode_from_string(std::string_view text) {
  for (DisposalMode m : {DisposalMode::natural_decay, DisposalMode::direct, DisposalMode::none})
    if (to_string(m) == text) return m;
  return std::nullopt;
}

std::string_view to_string(NodeControl control) {
  return control == NodeControl::none ? "none" : "correct";
}

std::optional<NodeControl> node_control_from_string(std::string_view text) {
  for (NodeControl c : {NodeControl::correct, NodeControl::none})
    if (to_string(c) == text) return c;
  return std::nullopt;
}

}  // namespace skein
