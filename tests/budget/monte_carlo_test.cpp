// Monte Carlo budgets: the same numbers at any thread count, percentiles against a brute force, zero spreads giving
// the deterministic budget, the P95 standard error against its spread over repeated seeds, and the draws.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include <tbb/global_control.h>

#include "skein/budget/monte_carlo.hpp"
#include "skein/budget/sample_random.hpp"
#include "skein/budget/sample_stats.hpp"
#include "skein/error.hpp"
#include "skein/input/design_file.hpp"

using namespace skein;

namespace {

// One shell at 550 km; a cycle-driven budget so every spread acts.
std::string mc_design(const std::string& budget_extra) {
  return "name: Heron spread test\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: 120\n  drag_area_m2: 0.8\n"
         "  drag_coefficient: 2.2\n  isp_s: 220\nshells:\n  - name: mid\n    pattern: walker-delta\n    satellites: 8\n"
         "    planes: 2\n    phasing: 1\n    altitude_km: 550\n    inclination_deg: 53\n"
         "budget:\n  mission_life_years: 3\n  solar_activity: cycle\n" +
         budget_extra;
}

BudgetSpreadResult run(const Design& d, long samples, unsigned long long seed) {
  MonteCarloOptions o;
  o.samples = samples;
  o.seed = seed;
  const BudgetResult det = compute_budget(d, o.budget);
  return compute_budget_spread(d, det, o);
}

// numpy.percentile's default ("linear"), written out independently: the value at fractional rank (n - 1) p of the
// sorted values, found here by counting rather than by indexing a sorted copy.
double brute_percentile(const std::vector<double>& v, double p) {
  const double rank = static_cast<double>(v.size() - 1) * p;
  auto kth = [&](size_t k) {  // the k-th smallest (0-based): the value with <= k below it and > k at or below it
    for (double x : v) {
      const auto below = std::count_if(v.begin(), v.end(), [&](double y) { return y < x; });
      const auto at_or_below = std::count_if(v.begin(), v.end(), [&](double y) { return y <= x; });
      if (static_cast<size_t>(below) <= k && static_cast<size_t>(at_or_below) > k) return x;
    }
    return std::nan("");
  };
  const size_t lo = static_cast<size_t>(rank);
  const double f = rank - static_cast<double>(lo);
  const double a = kth(lo);
  return f == 0.0 ? a : a + f * (kth(std::min(lo + 1, v.size() - 1)) - a);
}

}  // namespace

TEST_SUITE("budget.monte_carlo") {

TEST_CASE("the same seed gives bit-identical samples with 1 thread and with several") {
  // Each sample's generator comes from (seed, index) and results are stored by index and reduced in index order,
  // so the thread count cannot change a bit. 100 samples; 1 thread against 4 (oversubscribed on 2 cores on purpose).
  const Design d = read_design_text(mc_design(""), "mc.yaml");
  BudgetSpreadResult one, many;
  {
    tbb::global_control limit(tbb::global_control::max_allowed_parallelism, 1);
    one = run(d, 100, 42);
  }
  {
    tbb::global_control limit(tbb::global_control::max_allowed_parallelism, 4);
    many = run(d, 100, 42);
  }
  REQUIRE(one.shells.size() == many.shells.size());
  for (size_t s = 0; s < one.shells.size(); ++s) {
    REQUIRE(one.shells[s].figures.size() == many.shells[s].figures.size());
    for (size_t f = 0; f < one.shells[s].figures.size(); ++f) {
      const SpreadFigure &a = one.shells[s].figures[f], &b = many.shells[s].figures[f];
      CHECK(a.values == b.values);  // every sample, exactly
      CHECK(a.summary.p95 == b.summary.p95);
      CHECK(a.summary.mean == b.summary.mean);
      CHECK(a.summary.p95_interval.standard_error == b.summary.p95_interval.standard_error);
    }
  }
  // And the samples do differ from one another (the spreads act), and a different seed changes them.
  const SpreadFigure* life = one.shells[0].find("natural_lifetime");
  REQUIRE(life);
  CHECK(life->summary.p95 > life->summary.p5 * 1.05);
  const BudgetSpreadResult other = run(d, 100, 43);
  CHECK(other.shells[0].find("natural_lifetime")->values != life->values);
}

TEST_CASE("reported percentiles equal a brute-force rank count over the per-sample values") {
  const Design d = read_design_text(mc_design(""), "mc.yaml");
  const BudgetSpreadResult r = run(d, 101, 7);
  for (const auto& sh : r.shells)
    for (const auto& f : sh.figures) {
      CAPTURE(f.name);
      // Same formula, different evaluation order: agreement to rounding (1e-12 relative).
      CHECK(f.summary.p5 == doctest::Approx(brute_percentile(f.values, 0.05)).epsilon(1e-12));
      CHECK(f.summary.p50 == doctest::Approx(brute_percentile(f.values, 0.50)).epsilon(1e-12));
      CHECK(f.summary.p95 == doctest::Approx(brute_percentile(f.values, 0.95)).epsilon(1e-12));
      double sum = 0.0;
      for (double v : f.values) sum += v;
      CHECK(f.summary.mean == doctest::Approx(sum / static_cast<double>(f.values.size())).epsilon(1e-12));
    }
  // numpy.percentile([1..10], 95) = 9.55 and np.percentile([1..10], 5) = 1.45 (rank 8.55 and 0.45).
  const std::vector<double> ten{1, 2, 3, 4, 5, 6, 7, 8, 9, 10};
  CHECK(percentile_of_sorted(ten, 0.95) == doctest::Approx(9.55).epsilon(1e-14));
  CHECK(percentile_of_sorted(ten, 0.05) == doctest::Approx(1.45).epsilon(1e-14));
  CHECK(percentile_of_sorted(ten, 0.5) == doctest::Approx(5.5).epsilon(1e-14));
}

TEST_CASE("with every spread zero every percentile is the deterministic value") {
  // Zero spreads draw the design itself (factors 1, no phase shift, zero injection errors); the deterministic budget
  // with zero injection sigmas budgets a zero node line, so each sample equals compute_budget exactly.
  const Design d = read_design_text(
      mc_design("  injection_sigma:\n    altitude_km: 0\n    inclination_deg: 0\n  spread:\n    solar_minimum_years: 0\n"
                "    solar_amplitude: 0\n    drag_coefficient: 0\n    drag_area: 0\n"),
      "mc.yaml");
  const BudgetSpreadResult r = run(d, 100, 3);
  for (const auto& sh : r.shells)
    for (const auto& f : sh.figures) {
      CAPTURE(f.name);
      CHECK(f.summary.p5 == f.deterministic);
      CHECK(f.summary.p50 == f.deterministic);
      CHECK(f.summary.p95 == f.deterministic);
      CHECK(f.summary.p95_interval.standard_error == 0.0);
      // The mean sums 100 equal values and divides: rounding only.
      CHECK(f.summary.mean == doctest::Approx(f.deterministic).epsilon(1e-13));
    }
  for (const auto& f : r.fleet) CHECK(f.summary.p95 == f.deterministic);
}

TEST_CASE("the P95 standard error matches the spread of P95 over repeated seeds") {
  // Standard normal samples (SampleRandom), n = 1000, 300 seeds. The asymptotic standard error of the sample
  // 0.95-quantile is sqrt(p (1 - p) / n) / phi(z_0.95) = sqrt(0.0475 / 1000) / 0.103136 = 0.06683 (Serfling 1980,
  // sec. 2.3, from memory; phi(1.6449) = 0.103136 from the normal density). Checks: (a) the empirical standard
  // deviation of the 300 P95 estimates, whose own relative error is about 1 / sqrt(2 x 299) = 4 %; (b) the mean
  // reported standard error, which rounds the interval outward (+2 ranks on 27, about +4 %) and averages 300 noisy
  // widths. Tolerance 15 % for both: over 3 sigma of (a)'s noise plus (b)'s rounding bias.
  constexpr int repeats = 300;
  constexpr size_t n = 1000;
  const double asymptotic = std::sqrt(0.95 * 0.05 / n) / 0.103136;
  std::vector<double> p95s;
  double se_sum = 0.0;
  for (int seed = 0; seed < repeats; ++seed) {
    std::vector<double> v(n);
    for (size_t i = 0; i < n; ++i) {
      SampleRandom rng(static_cast<unsigned long long>(seed), i);
      v[i] = rng.normal();
    }
    const SampleSummary s = summarise_samples(v);
    p95s.push_back(s.p95);
    se_sum += s.p95_interval.standard_error;
  }
  double mean = 0.0, var = 0.0;
  for (double x : p95s) mean += x / repeats;
  for (double x : p95s) var += (x - mean) * (x - mean) / (repeats - 1);
  CHECK(mean == doctest::Approx(1.6449).epsilon(0.01));  // the true quantile; the estimate's bias is far below 1 %
  CHECK(std::sqrt(var) == doctest::Approx(asymptotic).epsilon(0.15));
  CHECK(se_sum / repeats == doctest::Approx(asymptotic).epsilon(0.15));
  CHECK(se_sum / repeats == doctest::Approx(std::sqrt(var)).epsilon(0.15));
}

TEST_CASE("the draws: centred, with the stated spreads, each spread independent of the others") {
  // 20000 draws: the mean of a factor 1 + 0.1 z is 1 within 4 standard errors (4 x 0.1 / sqrt(20000) = 0.0028);
  // its standard deviation is 0.1 x 0.9975 (a normal clipped at 3 sigma keeps E[z^2] = 0.995) within 3 %.
  const Design d = read_design_text(mc_design("  spread:\n    drag_coefficient: 0.1\n    drag_area: 0.2\n"), "mc.yaml");
  constexpr int n = 20000;
  double m = 0.0, m2 = 0.0, shift_max = 0.0;
  for (int i = 0; i < n; ++i) {
    const BudgetDraw dr = draw_budget_sample(d.budget, 9, static_cast<unsigned long long>(i), 0);
    m += dr.drag_coefficient_factor / n;
    m2 += (dr.drag_coefficient_factor - 1.0) * (dr.drag_coefficient_factor - 1.0) / n;
    shift_max = std::max(shift_max, std::abs(dr.phase_shift_cycles));
    CHECK(dr.drag_area_factor >= 1.0 - 3 * 0.2);
  }
  CHECK(m == doctest::Approx(1.0).epsilon(0.0028));
  CHECK(std::sqrt(m2) == doctest::Approx(0.1 * 0.9975).epsilon(0.03));
  // +-1 year (the default) of an 11-year cycle: the shift stays inside 1/11 cycle and reaches near it.
  CHECK(shift_max <= 1.0 / 11.0);
  CHECK(shift_max > 0.99 / 11.0);
  // Setting the area spread to zero leaves the Cd draw of every sample as it was.
  const Design d0 = read_design_text(mc_design("  spread:\n    drag_coefficient: 0.1\n    drag_area: 0\n"), "mc.yaml");
  for (unsigned long long i = 0; i < 50; ++i) {
    CHECK(draw_budget_sample(d0.budget, 9, i, 0).drag_coefficient_factor ==
          draw_budget_sample(d.budget, 9, i, 0).drag_coefficient_factor);
    CHECK(draw_budget_sample(d0.budget, 9, i, 0).drag_area_factor == 1.0);
  }
}

TEST_CASE("an activity amplitude of 1 is the stated activity, and others scale the swing above the low level") {
  // F = F_low + s (F - F_low): mean level F10.7 140, low 65, so s = 0.5 gives 102.5 and Ap 0 + 0.5 x 15 = 7.5.
  SolarActivity a{SolarLevel::mean, 0.0, 0.5};
  CHECK(solar_indices_at(a, 0.0).f107_sfu == doctest::Approx(102.5).epsilon(1e-14));
  CHECK(solar_indices_at(a, 0.0).ap == doctest::Approx(7.5).epsilon(1e-14));
  a.amplitude = 1.0;
  CHECK(solar_indices_at(a, 0.0).f107_sfu == 140.0);
}

TEST_CASE("bad sample counts and seeds are refused with the valid range") {
  const Design d = read_design_text(mc_design(""), "mc.yaml");
  MonteCarloOptions o;
  o.samples = 0;
  CHECK_THROWS_WITH_AS(check_monte_carlo_options(o),
                       "budget.samples = 0: expected 100 to 1000000 Monte Carlo samples (fewer leave under 5 samples "
                       "beyond P95; more would run for hours)",
                       InputError);
  o.samples = 2000000;
  CHECK_THROWS_AS(check_monte_carlo_options(o), InputError);
  o.samples = 100;
  o.seed = 1ULL << 60;
  CHECK_THROWS_WITH_AS(check_monte_carlo_options(o),
                       "budget.seed = 1152921504606846976: expected a seed from 0 to 2^53 = 9007199254740992", InputError);
  CHECK_THROWS_AS(read_design_text(mc_design("  spread:\n    drag_area: 0.5\n"), "mc.yaml"), InputError);
  CHECK_THROWS_AS(read_design_text(mc_design("  samples: 10\n"), "mc.yaml"), InputError);
}

}  // TEST_SUITE
