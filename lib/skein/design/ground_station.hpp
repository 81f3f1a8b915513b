#pragma once
// A ground station of the design's `ground_stations` list: where it stands and the lowest elevation at which
// it can hold a contact with a satellite.
#include <string>

namespace skein {

struct GroundStation {
  std::string name;
  double lat_deg = 0.0;            // geodetic latitude, -90 to 90
  double lon_deg = 0.0;            // longitude, -180 to 360
  double height_km = 0.0;          // above the ellipsoid
  double min_elevation_deg = 10.0; // elevation mask from the local (geodetic) horizontal, 0 to 89
};

}  // namespace skein
