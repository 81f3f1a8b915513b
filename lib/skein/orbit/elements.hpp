#pragma once
// Mean (orbit-averaged) Keplerian elements at an epoch. Angles in radians, distances in km.
namespace skein {

struct MeanElements {
  double a_km = 0.0;        // mean semi-major axis
  double e = 0.0;           // eccentricity, 0 <= e < 1
  double i_rad = 0.0;       // inclination, 0..pi
  double raan_rad = 0.0;    // right ascension of the ascending node
  double argp_rad = 0.0;    // argument of perigee
  double mean_anomaly_rad = 0.0;
};

}  // namespace skein
