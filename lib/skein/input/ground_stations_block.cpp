#include "skein/input/ground_stations_block.hpp"

#include <fmt/format.h>

#include "skein/input/yaml_reader.hpp"

namespace skein {

std::vector<GroundStation> read_ground_stations(const yaml::MapReader& root) {
  std::vector<GroundStation> stations;
  if (!root.has("ground_stations")) return stations;
  const auto items = root.sequence("ground_stations");
  if (static_cast<long>(items.size()) > max_ground_stations)
    root.fail_key("ground_stations", fmt::format("the design lists {} ground stations; expected at most {}",
                                                 items.size(), max_ground_stations));
  for (size_t k = 0; k < items.size(); ++k) {
    const std::string path = fmt::format("{}[{}]", root.path_of("ground_stations"), k);
    const yaml::MapReader s(root.file(), items[k], path, {"name", "lat_deg", "lon_deg", "height_km", "min_elevation_deg"});
    GroundStation g;
    g.name = s.name("name", "a station name");
    g.lat_deg = s.number("lat_deg", -90.0, 90.0, "a geodetic latitude in degrees");
    g.lon_deg = s.number("lon_deg", -180.0, 360.0, "a longitude in degrees");
    g.height_km = s.optional_number("height_km", -0.5, 10.0, "a height above the ellipsoid in km").value_or(0.0);
    g.min_elevation_deg =
        s.optional_number("min_elevation_deg", 0.0, 89.0, "an elevation mask in degrees").value_or(10.0);
    for (const GroundStation& other : stations)
      if (other.name == g.name)
        s.fail_key("name", fmt::format("station name {} is used twice; expected unique names",
                                       yaml::quote_for_message(g.name)));
    stations.push_back(std::move(g));
  }
  return stations;
}

}  // namespace skein
