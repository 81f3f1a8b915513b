#pragma once
// The reader of a design's `ground_stations` list (name, latitude, longitude, height, elevation mask), at the
// input edge. Throws InputError naming file:line:column, the YAML path and what was expected.
#include <vector>

#include "skein/design/ground_station.hpp"

namespace skein::yaml {
class MapReader;
}

namespace skein {

// The most stations a design may list (common practice: operator networks hold a few dozen antennas sites;
// the cap bounds the contact work, satellites x stations x samples).
constexpr long max_ground_stations = 1000;

// The stations of a design (empty when the list is absent).
std::vector<GroundStation> read_ground_stations(const yaml::MapReader& design_root);

}  // namespace skein
