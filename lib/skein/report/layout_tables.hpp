#pragma once
// Tables for the layout (expanded satellites) and the J2 drift figures, shared by `skein check`,
// `skein drift` and the report folder.
#include <vector>

#include "skein/design/constellation.hpp"
#include "skein/drift/beta_eclipse.hpp"
#include "skein/drift/drift_summary.hpp"
#include "skein/report/table.hpp"

namespace skein {

Table satellite_table(const Design& design, const std::vector<Satellite>& satellites);
Table shell_table(const Design& design);
// One row per plane of every shell: its node at epoch and the local time of its ascending node then.
Table plane_table(const Design& design);
Table drift_table(const DriftResult& drift);
Table differential_drift_table(const DriftResult& drift);
// One row per plane: beta range, longest eclipse and its day, largest shadow share, eclipse-free days.
Table beta_eclipse_table(const BetaEclipseResult& result);

}  // namespace skein
