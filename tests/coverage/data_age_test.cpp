// Evidence for the age of the data (coverage/data_age.*): against a brute-force scan over a small case, per
// pass the next contact found by stepping forward; and the streaming histogram's p95 against the sorted sample.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

#include "coverage_test_designs.hpp"
#include "skein/constants.hpp"
#include "skein/coverage/data_age.hpp"
#include "skein/coverage/evaluate.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"
#include "skein/time/sun.hpp"

using namespace skein;

TEST_CASE("data age: the histogram p95 is the nearest-rank p95, high by less than one bin") {
  // Reference: the nearest-rank 95th percentile (the ceil(0.95 n)-th smallest) of the sorted sample, as the
  // gap p95 uses (common practice). The histogram returns its bin's upper edge capped at the maximum: never
  // below the reference and above it by less than one bin (data_age.hpp).
  std::mt19937 rng(7);
  std::exponential_distribution<double> draw(1.0 / 3000.0);
  for (int n : {1, 2, 19, 20, 21, 500}) {
    DataAgeAccumulator acc(30.0);
    std::vector<double> v;
    for (int i = 0; i < n; ++i) {
      v.push_back(draw(rng));
      acc.add(v.back());
    }
    acc.add_censored();
    std::sort(v.begin(), v.end());
    const double ref = v[static_cast<size_t>(std::ceil(0.95 * n)) - 1];
    const DataAgeFigures f = acc.figures();
    CAPTURE(n);
    CHECK(f.observations == n + 1);
    CHECK(f.censored == 1);
    CHECK(f.p95_s >= ref - 1e-9);
    CHECK(f.p95_s < ref + 30.0);
    double sum = 0.0;
    for (double x : v) sum += x;
    CHECK(f.mean_s == doctest::Approx(sum / n).epsilon(1e-12));  // the mean is exact (streaming sum)
  }
}

TEST_CASE("data age: next contact of a sorted contact list") {
  const std::vector<ContactSpan> c = {{100.0, 200.0}, {500.0, 600.0}};
  CHECK(*age_to_next_contact(c, 0.0) == 100.0);
  CHECK(*age_to_next_contact(c, 150.0) == 0.0);  // in contact: the data goes down at once
  CHECK(*age_to_next_contact(c, 200.0) == 300.0);
  CHECK(!age_to_next_contact(c, 600.0).has_value());  // censored
}

TEST_CASE("data age: sites with daylight against a brute-force scan of passes and next contacts") {
  // Reference: a 1 s scan over 12 h of every satellite's elevation at two sites and two stations (the same secular
  // J2 orbits and sidereal angle) and of the Sun's elevation at the sites (the same Almanac Sun). An observation
  // is a sample where (in view of the site and lit) starts; its age is the wait, in samples, until the satellite
  // is in view of any station (0 when it already is); none before the end: censored. Each scanned time errs by
  // under 1 s, so an age by under 2 s: mean within 2 s; the p95 within 2 s below and one bin plus 2 s above
  // (the histogram's upward error, data_age.hpp); counts exact.
  const Design d = read_design_text(
      test::coverage_design_head() + test::walker_shell(6, 3, 1, 650.0, 97.9) +
          "coverage:\n  grid:\n    kind: sites\n    sites:\n"
          "      - {name: amber field, lat_deg: 44, lon_deg: 5}\n"
          "      - {name: slate coast, lat_deg: -20, lon_deg: 140}\n"
          "  min_elevation_deg: 15\n  min_sun_elevation_deg: 5\n  span_h: 12\n  step_s: 60\n  max_fold: 1\n"
          "ground_stations:\n"
          "  - {name: North Rig, lat_deg: 70, lon_deg: 20, min_elevation_deg: 5}\n"
          "  - {name: Cape Dim, lat_deg: -50, lon_deg: -70, min_elevation_deg: 5}\n",
      "age.yaml");
  const CoverageResult r = evaluate_coverage(d);
  REQUIRE(r.data_age.has_value());
  const DataAgeResult& age = *r.data_age;
  const std::vector<Satellite> sats = expand_constellation(d);
  std::vector<SecularOrbit> orbits;
  for (const Satellite& s : sats) orbits.push_back(make_secular_orbit(d.earth, s.elements));
  const JulianDate epoch = julian_date(d.epoch);
  const double theta0 = greenwich_mean_sidereal_angle_rad(epoch);
  struct Place {
    Eigen::Vector3d r, up;
    double sin_mask;
  };
  const auto place = [&](double lat, double lon, double mask) {
    return Place{geodetic_to_earth_fixed(d.earth, lat * rad_per_deg, lon * rad_per_deg, 0.0),
                 geodetic_up(lat * rad_per_deg, lon * rad_per_deg), std::sin(mask * rad_per_deg)};
  };
  const std::vector<Place> sites = {place(44, 5, 15), place(-20, 140, 15)};
  const std::vector<Place> stations = {place(70, 20, 5), place(-50, -70, 5)};
  const auto sees = [](const Place& p, const Eigen::Vector3d& s) {
    const Eigen::Vector3d dv = s - p.r;
    return p.up.dot(dv) >= p.sin_mask * dv.norm();
  };
  const long n = 12 * 3600;
  const size_t T = sats.size();
  // seen[site][sat][t] (lit and in view) and link[sat][t] (in view of a station).
  std::vector<std::vector<std::vector<char>>> seen(2, std::vector<std::vector<char>>(T, std::vector<char>(n, 0)));
  std::vector<std::vector<char>> link(T, std::vector<char>(n, 0));
  for (long j = 0; j < n; ++j) {
    const double t = static_cast<double>(j);
    const double theta = theta0 + d.earth.rotation_rad_s * t;
    JulianDate jd = epoch;
    jd.fraction += t / seconds_per_day;
    const Eigen::Vector3d sun = inertial_to_earth_fixed(sun_position(jd).unit_eci, theta);
    for (size_t s = 0; s < T; ++s) {
      const Eigen::Vector3d pos = earth_fixed_state_at(d.earth, orbits[s], theta, t).r_km;
      for (size_t i = 0; i < 2; ++i)
        seen[i][s][static_cast<size_t>(j)] = sites[i].up.dot(sun) >= std::sin(5.0 * rad_per_deg) && sees(sites[i], pos);
      link[s][static_cast<size_t>(j)] = sees(stations[0], pos) || sees(stations[1], pos);
    }
  }
  long total_obs = 0;
  for (size_t i = 0; i < 2; ++i) {
    CAPTURE(i);
    std::vector<double> ages;
    long obs = 0, censored = 0;
    for (size_t s = 0; s < T; ++s)
      for (long j = 0; j < n; ++j) {
        const size_t u = static_cast<size_t>(j);
        if (!seen[i][s][u] || (j > 0 && seen[i][s][u - 1])) continue;
        ++obs;
        long k = j;
        while (k < n && !link[s][static_cast<size_t>(k)]) ++k;
        if (k == n) ++censored;
        else ages.push_back(static_cast<double>(k - j));
      }
    const DataAgeFigures& f = age.per_point[i];
    CHECK(f.observations == obs);
    CHECK(f.censored == censored);
    REQUIRE(!ages.empty());
    double sum = 0.0;
    for (double a : ages) sum += a;
    std::sort(ages.begin(), ages.end());
    const double p95 = ages[static_cast<size_t>(std::ceil(0.95 * static_cast<double>(ages.size()))) - 1];
    CHECK(std::abs(f.mean_s - sum / static_cast<double>(ages.size())) < 2.0);
    CHECK(f.p95_s > p95 - 2.0);
    CHECK(f.p95_s < p95 + age.bin_s + 2.0);
    CHECK(std::abs(f.max_s - ages.back()) < 2.0);
    total_obs += obs;
  }
  CHECK(age.total.observations == total_obs);
  CHECK(total_obs >= 4);  // the case is not empty
}

TEST_CASE("data age: a max_p95_data_age_s requirement is judged on the grid's p95") {
  const std::string text =
      test::coverage_design_head() + test::walker_shell(6, 3, 1, 650.0, 97.9) +
      "coverage:\n  grid:\n    kind: sites\n    sites:\n      - {name: amber field, lat_deg: 44, lon_deg: 5}\n"
      "  min_elevation_deg: 15\n  span_h: 12\n  step_s: 60\n  max_fold: 1\n"
      "  requirement:\n    max_p95_data_age_s: THRESHOLD\n"
      "ground_stations:\n  - {name: North Rig, lat_deg: 70, lon_deg: 20, min_elevation_deg: 5}\n";
  const auto with = [&](const std::string& v) {
    std::string s = text;
    s.replace(s.find("THRESHOLD"), 9, v);
    return evaluate_coverage(read_design_text(s, "req.yaml"));
  };
  const CoverageResult loose = with("40000"), tight = with("1");
  REQUIRE(loose.data_age.has_value());
  REQUIRE(loose.requirement.has_value());
  CHECK(loose.requirement->checks.front().value == loose.data_age->total.p95_s);
  CHECK(loose.data_age->total.p95_s > 1.0);
  CHECK(loose.requirement->met);
  CHECK(!tight.requirement->met);
}
