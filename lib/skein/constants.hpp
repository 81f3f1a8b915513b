#pragma once
// Every physical constant the library uses, grouped by the model it belongs to, each with its source.
#include <numbers>
#include <string>
#include <string_view>
#include <optional>

namespace skein {

inline constexpr double pi = std::numbers::pi;
inline constexpr double two_pi = 2.0 * std::numbers::pi;
inline constexpr double deg_per_rad = 180.0 / std::numbers::pi;
inline constexpr double rad_per_deg = std::numbers::pi / 180.0;
inline constexpr double seconds_per_day = 86400.0;
// Julian year of 365.25 days (IAU definition); used for "per year" rates.
inline constexpr double days_per_julian_year = 365.25;
inline constexpr double seconds_per_julian_year = days_per_julian_year * seconds_per_day;
// Standard gravity, for the rocket equation: 9.80665 m/s^2 (CGPM 1901, the conventional value).
inline constexpr double standard_gravity_m_s2 = 9.80665;

// J2000.0 as a Julian date, the origin of the day counts of the almanac Sun and of GMST (IAU 1976/1982
// conventions; Astronomical Almanac, sec. B). Used with UTC for the day count (a 69 s offset from TT is
// 0.0008 deg of solar motion).
inline constexpr double j2000_julian_date = 2451545.0;
// Mean obliquity of the ecliptic at J2000.0: 84381.406 arcsec = 23.4392794 deg (IAU 2006 precession,
// Capitaine, Wallace and Chapront, A&A 412, 567, 2003). The one obliquity of every model that places the Sun
// on a fixed ecliptic (Harris-Priester bulge, solar inclination drift); the low-precision almanac Sun keeps its
// own slowly varying term, part of that published formula.
inline constexpr double obliquity_j2000_rad = 84381.406 / 3600.0 * rad_per_deg;
// Sun's gravitational parameter (km^3/s^2), IAU 2015 Resolution B3 nominal GM_sun = 1.3271244e20 m^3/s^2,
// and the astronomical unit 149 597 870.7 km (IAU 2012 Resolution B2).
inline constexpr double sun_mu_km3_s2 = 1.3271244e11;
inline constexpr double astronomical_unit_km = 149597870.7;

// The mean Sun's motion in right ascension: 360 deg per tropical year of 365.2422 days
// (Astronomical Almanac, mean tropical year). This is the node rate a sun-synchronous orbit needs.
inline constexpr double tropical_year_days = 365.2422;
inline constexpr double sun_mean_motion_rad_s = two_pi / (tropical_year_days * seconds_per_day);

// An Earth model: gravity parameter, equatorial radius, flattening, rotation rate and J2.
struct EarthModel {
  std::string_view name;          // the string used in YAML, flags and report headings
  double mu_km3_s2;               // gravitational parameter GM
  double radius_km;               // equatorial radius
  double flattening;              // ellipsoid flattening f
  double rotation_rad_s;          // Earth rotation rate
  double j2;                      // unnormalised second zonal harmonic
  std::string_view source;        // where the values come from
};

// WGS-84: NIMA TR8350.2 (3rd ed., 2000), defining parameters a, 1/f, GM, omega; J2 from the WGS-84
// normalised C20 = -484.16685e-6 (J2 = -sqrt(5) C20), the "wgs84" set of Vallado et al., AIAA 2006-6753.
inline constexpr EarthModel wgs84{"wgs84", 398600.4418, 6378.137, 1.0 / 298.257223563, 7.292115e-5,
                                  1.08262998905e-3,
                                  "NIMA TR8350.2 (WGS-84); J2 from C20 = -484.16685e-6 (Vallado et al. AIAA 2006-6753)"};
// EGM2008: Pavlis et al. 2012, J. Geophys. Res. 117, B04406; tide-free C20 = -4.84165143790815e-4.
// Ellipsoid shape and rotation stay WGS-84 (EGM2008 is referred to it).
inline constexpr EarthModel egm2008{"egm2008", 398600.4415, 6378.1363, 1.0 / 298.257223563, 7.292115e-5,
                                    1.08262617385e-3,
                                    "Pavlis et al. 2012, JGR 117 B04406 (EGM2008, tide-free C20)"};
// WGS-72: the constant set of the SGP4 reference code (Vallado et al., AIAA 2006-6753, getgravconst "wgs72").
inline constexpr EarthModel wgs72{"wgs72", 398600.8, 6378.135, 1.0 / 298.26, 7.292115147e-5, 0.001082616,
                                  "WGS-72 as used by SGP4 (Vallado et al. AIAA 2006-6753)"};

inline constexpr EarthModel earth_models[] = {wgs84, egm2008, wgs72};

// Look an Earth model up by its YAML name; nullopt when there is none of that name.
std::optional<EarthModel> earth_model_from_string(std::string_view name);

// Lowest perigee altitude the design reader accepts (km). Below about 100 km (the Karman line, common
// practice) an orbit decays within a revolution and the secular model means nothing.
inline constexpr double minimum_perigee_altitude_km = 100.0;

// Limits of the input, one place for every reader and check (common practice for a desktop trade study; each
// message names the limit it enforces).
inline constexpr long max_design_satellites = 100000;       // in one shell and in a whole design (and sweep layout)
inline constexpr long max_design_shells = 1000;             // shells in one design
inline constexpr double max_semi_major_axis_km = 500000.0;  // beyond the Moon's distance the J2 model is meaningless
inline constexpr int max_fold_limit = 16;                   // the largest coverage fold K

}  // namespace skein
