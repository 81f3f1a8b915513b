// Evidence for lib/skein/coverage/contacts: contact lengths against the closed form for an equatorial orbit,
// every interval and every station figure against a brute force that samples the elevation every second, and
// the same numbers whatever the thread count.
#include <doctest/doctest.h>

#include <cmath>

#include <tbb/global_control.h>

#include "coverage_test_designs.hpp"
#include "skein/coverage/contacts.hpp"
#include "skein/coverage/ground_geometry.hpp"
#include "skein/design/constellation.hpp"
#include "skein/error.hpp"
#include "skein/orbit/propagate.hpp"
#include "skein/time/epoch.hpp"

using namespace skein;

namespace {

std::string stations_block(const std::string& items) { return "ground_stations:\n" + items; }

// A mixed design: an inclined Walker shell, a sun-synchronous pair and an eccentric satellite; stations at low
// and high latitude, one with a 40 deg mask so that short, grazing passes (shorter than the 60 s step) occur.
Design mixed_design() {
  return read_design_text(
      test::coverage_design_head() +
          "shells:\n"
          "  - {name: w, pattern: walker-delta, satellites: 6, planes: 3, phasing: 1, altitude_km: 650, inclination_deg: 55}\n"
          "  - {name: s, pattern: walker-delta, satellites: 2, planes: 1, phasing: 0, altitude_km: 520, "
          "inclination_deg: sun-synchronous, ltan: \"10:30\"}\n"
          "  - name: e\n    pattern: explicit\n    semi_major_axis_km: 7600\n    eccentricity: 0.08\n"
          "    arg_perigee_deg: 40\n    inclination_deg: 98\n    planes:\n      - raan_deg: 30\n        slots_deg: [10]\n"
          "coverage:\n  span_h: 12\n  step_s: 60\n" +
          stations_block("  - {name: Low Quay, lat_deg: 5.5, lon_deg: 20.0}\n"
                         "  - {name: North Fell, lat_deg: 68.0, lon_deg: 200.0, height_km: 0.4, min_elevation_deg: 5}\n"
                         "  - {name: Steep Point, lat_deg: -35.0, lon_deg: 140.0, min_elevation_deg: 40}\n"),
      "mixed.yaml");
}

// In view at time t (the exact test of the contacts search, evaluated directly).
struct Brute {
  const Design& d;
  std::vector<SecularOrbit> orbits;
  double theta0;
  explicit Brute(const Design& design) : d(design), theta0(greenwich_mean_sidereal_angle_rad(julian_date(design.epoch))) {
    for (const Satellite& s : expand_constellation(design)) orbits.push_back(make_secular_orbit(design.earth, s.elements));
  }
  bool in_view(size_t sat, size_t station, double t) const {
    const GroundStation& g = d.ground_stations[station];
    const double lat = g.lat_deg * rad_per_deg, lon = g.lon_deg * rad_per_deg;
    const Eigen::Vector3d r = geodetic_to_earth_fixed(d.earth, lat, lon, g.height_km);
    const auto ef = earth_fixed_state_at(d.earth, orbits[sat], theta0 + d.earth.rotation_rad_s * t, t);
    return elevation_rad(r, geodetic_up(lat, lon), ef.r_km) >= g.min_elevation_deg * rad_per_deg;
  }
};

bool near_event(const std::vector<ContactInterval>& iv, double t, double tol_s) {
  for (const auto& c : iv)
    if (std::abs(t - c.rise_s) < tol_s || std::abs(t - c.set_s) < tol_s) return true;
  return false;
}

}  // namespace

TEST_CASE("contacts: an equatorial circular orbit over an equator station matches the closed-form pass length") {
  // Reference: a station on the equator at height 0 sits on the sphere of the equatorial radius R with its
  // geodetic vertical radial, and a circular equatorial orbit stays in its plane at radius a, so the spherical
  // footprint formula is exact here: Earth-central angle lambda from SMAD (Wertz & Larson 1999) sec. 5.2, eqs.
  // 5-16 to 5-18 (footprint_central_angle_rad), and the satellite moves over the station at the relative rate
  // n_u - w_E, n_u = dM/dt + domega/dt + dOmega/dt (the J2 secular rate of the true longitude for i = 0, e = 0).
  // Pass length 2 lambda / (n_u - w_E). Tolerance 1.5 ms: each event lies within 0.5 ms of its crossing (1 ms
  // brackets), plus rounding.
  for (const double mask_deg : {0.0, 10.0, 30.0}) {
    const Design d = read_design_text(
        test::coverage_design_head() + test::equatorial_satellite(800.0, 0.0) + "coverage:\n  span_h: 24\n" +
            stations_block(fmt::format("  - {{name: Equator, lat_deg: 0, lon_deg: 37, min_elevation_deg: {}}}\n", mask_deg)),
        "eq.yaml");
    const ContactResult r = compute_contacts(d);
    const SecularOrbit orbit = make_secular_orbit(d.earth, expand_constellation(d)[0].elements);
    const double n_u = orbit.rates.mean_anomaly_rad_s + orbit.rates.argp_rad_s + orbit.rates.raan_rad_s;
    const double lambda = footprint_central_angle_rad(d.earth.radius_km, orbit.epoch_elements.a_km, mask_deg * rad_per_deg);
    const double expected_s = 2.0 * lambda / (n_u - d.earth.rotation_rad_s);
    int full = 0;
    for (const ContactInterval& c : r.satellites[0].stations[0].intervals) {
      if (c.rise_s <= 0.0 || c.set_s >= r.span_s) continue;  // cut by the span's edges
      ++full;
      CHECK(std::abs((c.set_s - c.rise_s) - expected_s) < 1.5e-3);
    }
    MESSAGE("mask ", mask_deg, " deg: expected pass ", expected_s, " s, full passes ", full);
    // 24 h at a synodic period 2 pi / (n_u - w_E) of about 1.8 h: 12 or 13 passes, at most two cut by the edges.
    CHECK(full >= 11);
  }
}

TEST_CASE("contacts: every interval agrees with a 1 s brute force of the elevation, and no short pass is lost") {
  // Reference: the elevation test itself (elevation_rad against the geodetic vertical, checked against ERFA in
  // ground_geometry_test.cpp) at every whole second of the 12 h span. At each second more than 2 ms from an
  // event the search and the brute force must agree on in view or not; and the count of the search's intervals
  // that hold a whole second must equal the count of runs of in-view seconds. (Passes shorter than the sampling
  // step are made on purpose in the next test.)
  const Design d = mixed_design();
  const ContactResult r = compute_contacts(d);
  const Brute brute(d);
  long disagreements = 0, checked = 0;
  for (size_t s = 0; s < r.satellites.size(); ++s)
    for (size_t k = 0; k < d.ground_stations.size(); ++k) {
      const auto& iv = r.satellites[s].stations[k].intervals;
      long runs = 0;
      bool prev = false;
      for (long t = 0; t <= static_cast<long>(r.span_s); ++t) {
        const bool b = brute.in_view(s, k, static_cast<double>(t));
        if (b && !prev) ++runs;
        prev = b;
        if (near_event(iv, static_cast<double>(t), 2e-3)) continue;
        const double td = static_cast<double>(t);
        bool in = false;
        for (const auto& c : iv) in = in || (c.rise_s <= td && td < c.set_s) || (td == r.span_s && c.set_s == r.span_s);
        ++checked;
        if (in != b) ++disagreements;
      }
      long holding = 0;
      for (const auto& c : iv) {
        if (std::floor(c.set_s) >= std::ceil(c.rise_s)) ++holding;
      }
      CHECK(holding == runs);
    }
  MESSAGE("seconds checked ", checked);
  CHECK(disagreements == 0);
}

TEST_CASE("contacts: grazing passes much shorter than the sampling step are all found") {
  // A circular equatorial orbit passes a station at latitude 19 deg with the same geometry every time, and by
  // the mirror symmetry of the ellipsoid about the station's meridian the highest elevation is reached with the
  // satellite on that meridian. With the mask 0.01 deg below that highest elevation every pass lasts a few
  // seconds, far less than the 60 s samples. Reference: a brute force of the elevation every 0.05 s over the
  // 24 h; every run it finds must be one interval of the search (same count), each interval must hold its
  // brute-force run to within 0.05 s at both ends, and with a 0 deg mask the count of passes must be the same.
  const Design probe = read_design_text(test::coverage_design_head() + test::equatorial_satellite(800.0, 0.0) +
                                            stations_block("  - {name: Rim, lat_deg: 19, lon_deg: 37, min_elevation_deg: 0}\n"),
                                        "probe.yaml");
  const SecularOrbit orbit = make_secular_orbit(probe.earth, expand_constellation(probe)[0].elements);
  const double lat = 19.0 * rad_per_deg, lon = 37.0 * rad_per_deg;
  const Eigen::Vector3d ground = geodetic_to_earth_fixed(probe.earth, lat, lon, 0.0);
  const Eigen::Vector3d sat = orbit.epoch_elements.a_km * Eigen::Vector3d(std::cos(lon), std::sin(lon), 0.0);
  const double top_deg = elevation_rad(ground, geodetic_up(lat, lon), sat) * deg_per_rad;
  const double mask_deg = top_deg - 0.01;
  const Design d = read_design_text(
      test::coverage_design_head() + test::equatorial_satellite(800.0, 0.0) +
          stations_block(fmt::format("  - {{name: Rim, lat_deg: 19, lon_deg: 37, min_elevation_deg: {}}}\n", mask_deg)),
      "graze.yaml");
  const ContactResult wide = compute_contacts(probe);
  const ContactResult r = compute_contacts(d);
  const auto& iv = r.satellites[0].stations[0].intervals;
  const Brute brute(d);
  std::vector<ContactInterval> runs;
  bool prev = false;
  for (long j = 0; j <= 86400 * 20; ++j) {
    const double t = 0.05 * static_cast<double>(j);
    const bool b = brute.in_view(0, 0, t);
    if (b && !prev) runs.push_back({t, t});
    if (b) runs.back().set_s = t;
    prev = b;
  }
  MESSAGE("highest elevation ", top_deg, " deg, mask ", mask_deg, " deg; passes ", iv.size(),
          ", first lasts ", iv.empty() ? 0.0 : iv[0].set_s - iv[0].rise_s, " s");
  CHECK(iv.size() == wide.satellites[0].stations[0].intervals.size());
  REQUIRE(iv.size() == runs.size());
  CHECK(iv.size() >= 12);
  for (size_t i = 0; i < iv.size(); ++i) {
    CHECK(iv[i].set_s - iv[i].rise_s < 0.5 * r.sample_step_s);
    CHECK(iv[i].rise_s <= runs[i].rise_s + 1e-3);
    CHECK(iv[i].rise_s > runs[i].rise_s - 0.05 - 1e-3);
    CHECK(iv[i].set_s >= runs[i].set_s - 1e-3);
    CHECK(iv[i].set_s < runs[i].set_s + 0.05 + 1e-3);
  }
}

TEST_CASE("contacts: station busy share and antenna count agree with the brute force") {
  // Reference: at every whole second, the number of satellites in view of each station by the elevation test.
  // The busy share from 1 s samples differs from the exact share by at most 1 s per event over the span
  // (each event moves the sampled share by less than one sample), so that is the tolerance; the antenna count
  // (the most in view at once) must be equal (no overlap in this design is shorter than a second: checked by
  // the count of seconds at the maximum).
  const Design d = mixed_design();
  const ContactResult r = compute_contacts(d);
  const Brute brute(d);
  for (size_t k = 0; k < d.ground_stations.size(); ++k) {
    long busy = 0, events = 0;
    int most = 0;
    std::vector<long> seconds_by_count(r.satellites.size() + 1, 0);
    const long n = static_cast<long>(r.span_s);
    for (long t = 0; t < n; ++t) {
      int c = 0;
      for (size_t s = 0; s < r.satellites.size(); ++s) c += brute.in_view(s, k, static_cast<double>(t) + 0.5) ? 1 : 0;
      busy += c > 0;
      most = std::max(most, c);
      ++seconds_by_count[static_cast<size_t>(c)];
    }
    for (const auto& s : r.satellites) events += 2 * static_cast<long>(s.stations[k].intervals.size());
    const StationLoad& load = r.stations[k];
    const double tol = static_cast<double>(events) / r.span_s + 1e-12;
    MESSAGE(load.name, ": busy ", load.busy_share, " brute ", static_cast<double>(busy) / r.span_s, " tol ", tol, ", antennas ", load.max_in_view);
    CHECK(std::abs(load.busy_share - static_cast<double>(busy) / r.span_s) <= tol);
    CHECK(load.max_in_view == most);
    REQUIRE(load.share_by_count.size() == static_cast<size_t>(most) + 1);
    double total = 0.0;
    for (size_t c = 0; c < load.share_by_count.size(); ++c) {
      CHECK(std::abs(load.share_by_count[c] - static_cast<double>(seconds_by_count[c]) / r.span_s) <= tol);
      total += load.share_by_count[c];
    }
    CHECK(total == doctest::Approx(1.0).epsilon(1e-12));
    CHECK(load.busy_share == doctest::Approx(1.0 - load.share_by_count[0]).epsilon(1e-12));
  }
}

TEST_CASE("contacts: the longest time without contact agrees with the brute force") {
  // Reference: runs of whole seconds with no station in view, edges of the span included; the search's gap
  // may exceed the sampled one by up to 2 s (one second at each end).
  const Design d = mixed_design();
  const ContactResult r = compute_contacts(d);
  const Brute brute(d);
  for (size_t s = 0; s < r.satellites.size(); ++s) {
    long run = 0, longest = 0;
    for (long t = 0; t <= static_cast<long>(r.span_s); ++t) {
      bool any = false;
      for (size_t k = 0; k < d.ground_stations.size() && !any; ++k) any = brute.in_view(s, k, static_cast<double>(t));
      run = any ? 0 : run + 1;
      longest = std::max(longest, run);
    }
    // `longest` counts seconds without contact; the gap lies within (longest - 1, longest + 1) s.
    CHECK(std::abs(r.satellites[s].longest_gap_min * 60.0 - static_cast<double>(longest)) <= 2.0);
  }
}

TEST_CASE("contacts: the same numbers whatever the thread count") {
  const Design d = mixed_design();
  ContactResult one, two;
  {
    tbb::global_control cap(tbb::global_control::max_allowed_parallelism, 1);
    one = compute_contacts(d);
  }
  {
    tbb::global_control cap(tbb::global_control::max_allowed_parallelism, 4);
    two = compute_contacts(d);
  }
  REQUIRE(one.satellites.size() == two.satellites.size());
  for (size_t s = 0; s < one.satellites.size(); ++s) {
    CHECK(one.satellites[s].longest_gap_min == two.satellites[s].longest_gap_min);
    for (size_t k = 0; k < one.satellites[s].stations.size(); ++k) {
      const auto& a = one.satellites[s].stations[k].intervals;
      const auto& b = two.satellites[s].stations[k].intervals;
      REQUIRE(a.size() == b.size());
      for (size_t i = 0; i < a.size(); ++i) {
        CHECK(a[i].rise_s == b[i].rise_s);
        CHECK(a[i].set_s == b[i].set_s);
      }
    }
  }
  for (size_t k = 0; k < one.stations.size(); ++k) {
    CHECK(one.stations[k].busy_share == two.stations[k].busy_share);
    CHECK(one.stations[k].max_in_view == two.stations[k].max_in_view);
  }
}

TEST_CASE("contacts: a design without ground stations is refused") {
  const Design d = read_design_text(test::coverage_design_head() + test::equatorial_satellite(800.0, 0.0), "none.yaml");
  CHECK_THROWS_AS(compute_contacts(d), InputError);
}

TEST_CASE("contacts: the ground_stations reader keeps the values and fills the stated defaults") {
  const Design d = read_design_text(
      test::coverage_design_head() + test::equatorial_satellite(800.0, 0.0) +
          stations_block("  - {name: Alpha, lat_deg: -12.5, lon_deg: 350}\n"
                         "  - {name: Beta, lat_deg: 40, lon_deg: -3, height_km: 0.65, min_elevation_deg: 7.5}\n"),
      "read.yaml");
  REQUIRE(d.ground_stations.size() == 2);
  CHECK(d.ground_stations[0].name == "Alpha");
  CHECK(d.ground_stations[0].lat_deg == -12.5);
  CHECK(d.ground_stations[0].lon_deg == 350.0);
  CHECK(d.ground_stations[0].height_km == 0.0);           // default
  CHECK(d.ground_stations[0].min_elevation_deg == 10.0);  // default
  CHECK(d.ground_stations[1].height_km == 0.65);
  CHECK(d.ground_stations[1].min_elevation_deg == 7.5);
}
