#pragma once
// The deployment trade curve of one shell as an SVG figure: delta-v per satellite against days to full
// deployment, the deadline and the point chosen for it.
#include <string>

#include "skein/budget/budget.hpp"

namespace skein {

// Requires shell.deployment. Series: the non-dominated curve, the plane plans alone, the deadline, the choice.
std::string deployment_curve_svg(const ShellBudget& shell);

}  // namespace skein
