#include "skein/design/coverage_spec.hpp"

namespace skein {

std::string_view to_string(GridKind kind) {
  switch (kind) {
    case GridKind::global: return "global";
    case GridKind::band: return "band";
    case GridKind::region: return "region";
    case GridKind::sites: return "sites";
  }
  return "global";
}

std::optional<GridKind> grid_kind_from_string(std::string_view text) {
  for (GridKind k : {GridKind::global, GridKind::band, GridKind::region, GridKind::sites})
    if (to_string(k) == text) return k;
  return std::nullopt;
}

}  // namespace skein
