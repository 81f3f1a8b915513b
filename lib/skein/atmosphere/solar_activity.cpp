#include "skein/atmosphere/solar_activity.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "skein/constants.hpp"

namespace skein {

std::string_view to_string(SolarLevel level) {
  switch (level) {
    case SolarLevel::low: return "low";
    case SolarLevel::mean: return "mean";
    case SolarLevel::high: return "high";
    case SolarLevel::cycle: return "cycle";
  }
  return "mean";
}

std::optional<SolarLevel> solar_level_from_string(std::string_view text) {
  for (SolarLevel l : {SolarLevel::low, SolarLevel::mean, SolarLevel::high, SolarLevel::cycle})
    if (to_string(l) == text) return l;
  return std::nullopt;
}

SolarIndices solar_indices(SolarLevel level) {
  switch (level) {
    case SolarLevel::low: return {65.0, 0.0};
    case SolarLevel::high: return {250.0, 25.0};
    case SolarLevel::mean: return {140.0, 15.0};
    case SolarLevel::cycle: break;
  }
  assert(false && "the cycle has no fixed indices");
  return {140.0, 15.0};
}

double solar_cycle_phase_at(double jd) {
  const double cycles = (jd - solar_minimum_reference_jd) / (solar_cycle_years * days_per_julian_year);
  return cycles - std::floor(cycles);
}

SolarIndices solar_cycle_indices(double phase) {
  const double x = 0.5 * (1.0 - std::cos(two_pi * phase));
  const SolarIndices lo = solar_indices(SolarLevel::low), hi = solar_indices(SolarLevel::high);
  return {lo.f107_sfu + x * (hi.f107_sfu - lo.f107_sfu), lo.ap + x * (hi.ap - lo.ap)};
}

SolarIndices solar_indices_at(const SolarActivity& activity, double t_days) {
  assert(activity.amplitude >= 0.0);
  const SolarIndices stated =
      activity.level != SolarLevel::cycle
          ? solar_indices(activity.level)
          : solar_cycle_indices(activity.phase_at_epoch + t_days / (solar_cycle_years * days_per_julian_year));
  if (activity.amplitude == 1.0) return stated;  // exactly the stated indices (no rounding through I_low)
  const SolarIndices lo = solar_indices(SolarLevel::low);
  return {lo.f107_sfu + activity.amplitude * (stated.f107_sfu - lo.f107_sfu),
          lo.ap + activity.amplitude * (stated.ap - lo.ap)};
}

double ips_density_kg_m3(double h, const SolarIndices& s) {
  const double scale_km = (900.0 + 2.5 * (s.f107_sfu - 70.0) + 1.5 * s.ap) / (27.0 - 0.012 * (h - 200.0));
  return 6e-10 * std::exp(-(h - 175.0) / scale_km);
}

namespace {
double ips_numerator_km(const SolarIndices& s) { return 900.0 + 2.5 * (s.f107_sfu - 70.0) + 1.5 * s.ap; }
}  // namespace

double solar_inverse_numerator_difference(const SolarIndices& indices) {
  static const double mean_inverse = 1.0 / ips_numerator_km(solar_indices(SolarLevel::mean));
  return 1.0 / ips_numerator_km(indices) - mean_inverse;
}

double solar_density_log_factor(double altitude_km, double inverse_difference) {
  const double h = std::clamp(altitude_km, 180.0, 500.0);
  const double log_ratio = -(h - 175.0) * (27.0 - 0.012 * (h - 200.0)) * inverse_difference;
  if (altitude_km >= 180.0) return log_ratio;
  return std::clamp((altitude_km - 100.0) / 80.0, 0.0, 1.0) * log_ratio;  // ratio^taper
}

double solar_density_factor(double altitude_km, const SolarIndices& indices) {
  return std::exp(solar_density_log_factor(altitude_km, solar_inverse_numerator_difference(indices)));
}

}  // namespace skein
