#include "skein/atmosphere/harris_priester.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>

#include "skein/constants.hpp"

namespace skein {
namespace {

struct Node {
  double h_km;
  double min_g_km3;  // antapex density
  double max_g_km3;  // apex density
};

// Montenbruck & Gill (2000) Table 3.8, g/km^3 (1 g/km^3 = 1e-12 kg/m^3).
constexpr Node nodes[] = {
    {100, 497400.0, 497400.0}, {120, 24900.0, 24900.0}, {130, 8377.0, 8710.0},   {140, 3899.0, 4059.0},
    {150, 2122.0, 2215.0},     {160, 1263.0, 1344.0},   {170, 800.8, 875.8},     {180, 528.3, 601.0},
    {190, 361.7, 429.7},       {200, 255.7, 316.2},     {210, 183.9, 239.6},     {220, 134.1, 185.3},
    {230, 99.49, 145.5},       {240, 74.88, 115.7},     {250, 57.09, 93.08},     {260, 44.03, 75.55},
    {270, 34.30, 61.82},       {280, 26.97, 50.95},     {290, 21.39, 42.26},     {300, 17.08, 35.26},
    {320, 10.99, 25.11},       {340, 7.214, 18.19},     {360, 4.824, 13.37},     {380, 3.274, 9.955},
    {400, 2.249, 7.492},       {420, 1.558, 5.684},     {440, 1.091, 4.355},     {460, 0.7701, 3.362},
    {480, 0.5474, 2.612},      {500, 0.3916, 2.042},    {520, 0.2819, 1.605},    {540, 0.2042, 1.267},
    {560, 0.1488, 1.005},      {580, 0.1092, 0.7997},   {600, 0.08070, 0.6390},  {620, 0.06012, 0.5123},
    {640, 0.04519, 0.4121},    {660, 0.03430, 0.3325},  {680, 0.02632, 0.2691},  {700, 0.02043, 0.2185},
    {720, 0.01607, 0.1779},    {740, 0.01281, 0.1452},  {760, 0.01036, 0.1190},  {780, 0.008496, 0.09776},
    {800, 0.007069, 0.08059},  {840, 0.004680, 0.05741}, {880, 0.003200, 0.04210}, {920, 0.002210, 0.03130},
    {960, 0.001560, 0.02360},  {1000, 0.001150, 0.01810},
};
constexpr size_t node_count = std::size(nodes);

// Exponential interpolation between two node values (Montenbruck & Gill sec. 3.5.2):
//   v(h) = v0 exp((h0 - h) / H),  H = (h0 - h1) / ln(v1 / v0).
// The scale heights H of every band, computed once.
struct BandScales {
  double min_km[node_count - 1];
  double max_km[node_count - 1];
};
const BandScales& band_scales() {
  static const BandScales scales = [] {
    BandScales s{};
    for (size_t k = 0; k + 1 < node_count; ++k) {
      s.min_km[k] = (nodes[k].h_km - nodes[k + 1].h_km) / std::log(nodes[k + 1].min_g_km3 / nodes[k].min_g_km3);
      s.max_km[k] = (nodes[k].h_km - nodes[k + 1].h_km) / std::log(nodes[k + 1].max_g_km3 / nodes[k].max_g_km3);
    }
    return s;
  }();
  return scales;
}

}  // namespace

HarrisPriesterBounds harris_priester_bounds(double altitude_km) {
  constexpr double to_si = 1e-12;
  if (altitude_km <= nodes[0].h_km) return {nodes[0].min_g_km3 * to_si, nodes[0].max_g_km3 * to_si};
  // Band [k, k+1] holding h (the last band extended above the table): the last node at or below h, by bisection.
  size_t lo = 0, hi = node_count - 2;
  while (lo < hi) {
    const size_t mid = (lo + hi + 1) / 2;
    if (nodes[mid].h_km <= altitude_km) lo = mid; else hi = mid - 1;
  }
  const size_t k = lo;
  const Node& a = nodes[k];
  const BandScales& sc = band_scales();
  return {a.min_g_km3 * std::exp((a.h_km - altitude_km) / sc.min_km[k]) * to_si,
          a.max_g_km3 * std::exp((a.h_km - altitude_km) / sc.max_km[k]) * to_si};
}

double harris_priester_density_kg_m3(double altitude_km, double cos_psi, double exponent) {
  const HarrisPriesterBounds b = harris_priester_bounds(altitude_km);
  const double half = std::clamp(0.5 * (1.0 + cos_psi), 0.0, 1.0);
  return b.min_kg_m3 + (b.max_kg_m3 - b.min_kg_m3) * std::pow(half, 0.5 * exponent);
}

Eigen::Vector3d harris_priester_apex(double sun_ra_rad, double sun_dec_rad) {
  const double ra = sun_ra_rad + harris_priester_lag_rad;
  return {std::cos(sun_dec_rad) * std::cos(ra), std::cos(sun_dec_rad) * std::sin(ra), std::sin(sun_dec_rad)};
}

double harris_priester_mean_weight(double i_rad, bool sun_locked, double node_minus_mean_sun_rad, double exponent) {
  // Midpoint rules over the year (Sun's longitude), the node offset and the argument of latitude: the
  // integrand is smooth and periodic, so 24 x 24 x 36 points converge far below the model's own accuracy.
  constexpr int n_sun = 24, n_node = 24, n_u = 36;
  const int nodes_used = sun_locked ? 1 : n_node;
  double sum = 0.0;
  for (int s = 0; s < n_sun; ++s) {
    const double lambda = two_pi * (s + 0.5) / n_sun;  // Sun's ecliptic (= mean) longitude
    const double sun_ra = std::atan2(std::cos(obliquity_j2000_rad) * std::sin(lambda), std::cos(lambda));
    const double sun_dec = std::asin(std::sin(obliquity_j2000_rad) * std::sin(lambda));
    const Eigen::Vector3d apex = harris_priester_apex(sun_ra, sun_dec);
    for (int k = 0; k < nodes_used; ++k) {
      const double offset = sun_locked ? node_minus_mean_sun_rad : two_pi * (k + 0.5) / n_node;
      const double raan = lambda + offset;  // the mean Sun's right ascension equals its mean longitude
      for (int j = 0; j < n_u; ++j) {
        const double u = two_pi * (j + 0.5) / n_u;
        const Eigen::Vector3d r{std::cos(raan) * std::cos(u) - std::sin(raan) * std::sin(u) * std::cos(i_rad),
                                std::sin(raan) * std::cos(u) + std::cos(raan) * std::sin(u) * std::cos(i_rad),
                                std::sin(u) * std::sin(i_rad)};
        sum += std::pow(std::clamp(0.5 * (1.0 + r.dot(apex)), 0.0, 1.0), 0.5 * exponent);
      }
    }
  }
  return sum / (static_cast<double>(n_sun) * nodes_used * n_u);
}

double harris_priester_default_exponent(double i_rad) {
  const double i_deg = i_rad * deg_per_rad;
  const double tilt = std::min(i_deg, 180.0 - i_deg);  // 0..90
  return 2.0 + 4.0 * std::clamp(tilt, 0.0, 90.0) / 90.0;
}

}  // namespace skein
