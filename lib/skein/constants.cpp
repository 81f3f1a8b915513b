#include "skein/constants.hpp"

namespace skein {

std::optional<EarthModel> earth_model_from_string(std::string_view name) {
  for (const auto& m : earth_models)
    if (m.name == name) return m;
  return std::nullopt;
}

}  // namespace skein
