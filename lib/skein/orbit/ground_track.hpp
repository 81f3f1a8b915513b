#pragma once
// Sub-satellite points over time, for ground-track plots.
#include <Eigen/Core>
#include <vector>

#include "skein/constants.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

namespace skein {

struct GeodeticPoint {
  double lat_deg = 0.0;  // geodetic latitude
  double lon_deg = 0.0;  // east longitude, [-180, 180)
  double height_km = 0.0;
};

// Geodetic latitude, longitude and height of an Earth-fixed position on the model's ellipsoid, by Bowring's
// iteration. Source: B.R. Bowring, "Transformation from spatial to geographical coordinates", Survey Review
// 23 (1976) 323-327; iterated to 1e-12 rad, valid from the centre of the Earth outwards (not at r = 0).
GeodeticPoint geodetic_from_earth_fixed(const EarthModel& earth, const Eigen::Vector3d& r_ecef_km);

// Greenwich sidereal angle dt_s after the epoch: GMST at epoch plus the Earth's rotation rate times dt.
double greenwich_angle_at(const EarthModel& earth, const JulianDate& epoch_jd, double dt_s);

// Sub-satellite points from t = 0 to span_s in steps of step_s (both ends included).
std::vector<GeodeticPoint> ground_track(const EarthModel& earth, const SecularOrbit& orbit, const JulianDate& epoch_jd,
                                        double span_s, double step_s);

}  // namespace skein
