#pragma once
// The usual caution, one text for every command, the report and the JSON outputs (common practice for design
// tools whose figures could be mistaken for operational ones).
#include <string_view>

namespace skein {

inline constexpr std::string_view caution_text =
    "These are preliminary design estimates; operations, collision avoidance and licensing follow the applicable "
    "national rules, international debris-mitigation standards and licensed flight-dynamics practice.";

}  // namespace skein
