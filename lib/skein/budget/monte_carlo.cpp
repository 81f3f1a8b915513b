#include "skein/budget/monte_carlo.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include <fmt/format.h>

#include "skein/budget/sample_random.hpp"
#include "skein/error.hpp"
#include "skein/parallel_items.hpp"

namespace skein {
namespace {

double clipped_normal(SampleRandom& rng, double limit) { return std::clamp(rng.normal(), -limit, limit); }

// The figures of one shell, in report order, and how to read each from a ShellBudget.
struct FigureKey {
  std::string name;
  std::string unit;
  int line = -1;  // index into dv_lines, or -1 for the named figures below
};
std::vector<FigureKey> figure_keys(const ShellBudget& s) {
  std::vector<FigureKey> keys{{"natural_lifetime", "days"}};
  for (size_t k = 0; k < s.dv_lines.size(); ++k) keys.push_back({s.dv_lines[k].name, "m/s", static_cast<int>(k)});
  keys.push_back({"total_dv", "m/s"});
  if (s.propellant_kg) keys.push_back({"propellant", "kg"});
  keys.push_back({"fleet_dv", "m/s"});
  if (s.fleet_propellant_kg) keys.push_back({"fleet_propellant", "kg"});
  return keys;
}
double figure_value(const ShellBudget& s, const FigureKey& key) {
  if (key.line >= 0) return s.dv_lines[static_cast<size_t>(key.line)].dv_m_s;
  if (key.name == "natural_lifetime") return s.lifetime_natural_days;
  if (key.name == "total_dv") return s.total_dv_m_s;
  if (key.name == "propellant") return s.propellant_kg.value_or(0.0);
  if (key.name == "fleet_dv") return s.fleet_dv_m_s;
  return s.fleet_propellant_kg.value_or(0.0);
}

}  // namespace

const SpreadFigure* ShellSpread::find(std::string_view figure) const {
  for (const auto& f : figures)
    if (f.name == figure) return &f;
  return nullptr;
}

BudgetDraw draw_budget_sample(const BudgetSpec& spec, unsigned long long seed, unsigned long long index,
                              size_t shell_index) {
  SampleRandom rng(seed, index);
  BudgetDraw d;
  const double u = rng.uniform();
  d.phase_shift_cycles = (2.0 * u - 1.0) * spec.spread.solar_minimum_years / solar_cycle_years;
  d.solar_amplitude = 1.0 + spec.spread.solar_amplitude * clipped_normal(rng, 3.0);
  d.drag_coefficient_factor = 1.0 + spec.spread.drag_coefficient * clipped_normal(rng, 3.0);
  d.drag_area_factor = 1.0 + spec.spread.drag_area * clipped_normal(rng, 3.0);
  for (size_t s = 0; s < shell_index; ++s) {  // earlier shells' injection draws
    rng.normal();
    rng.normal();
  }
  d.injection_altitude_error_km = spec.injection_sigma_altitude_km * clipped_normal(rng, 6.0);
  d.injection_inclination_error_deg = spec.injection_sigma_inclination_deg * clipped_normal(rng, 6.0);
  return d;
}

void check_monte_carlo_options(const MonteCarloOptions& opt) {
  if (opt.samples < monte_carlo_min_samples || opt.samples > monte_carlo_max_samples)
    throw InputError(fmt::format("budget.samples = {}: expected {} to {} Monte Carlo samples (fewer leave under 5 "
                                 "samples beyond P95; more would run for hours)",
                                 opt.samples, monte_carlo_min_samples, monte_carlo_max_samples));
  if (opt.seed > (1ULL << 53))  // monte_carlo_max_seed, compared as an integer
    throw InputError(fmt::format("budget.seed = {}: expected a seed from 0 to 2^53 = {:.0f}", opt.seed,
                                 monte_carlo_max_seed));
}

BudgetSpreadResult compute_budget_spread(const Design& design, const BudgetResult& det, const MonteCarloOptions& opt) {
  check_monte_carlo_options(opt);
  assert(det.shells.size() == design.shells.size());
  const BudgetSpec& spec = design.budget;
  BudgetSpreadResult out;
  out.samples = opt.samples;
  out.seed = opt.seed;
  out.spread = spec.spread;
  out.injection_sigma_altitude_km = spec.injection_sigma_altitude_km;
  out.injection_sigma_inclination_deg = spec.injection_sigma_inclination_deg;
  out.solar = det.solar;
  const size_t n = static_cast<size_t>(opt.samples);

  BudgetOptions bo = opt.budget;
  bo.level_curves = false;
  bo.keep_curves = false;

  std::vector<std::vector<FigureKey>> keys;
  for (size_t s = 0; s < design.shells.size(); ++s) {
    keys.push_back(figure_keys(det.shells[s]));
    ShellSpread sh;
    sh.name = det.shells[s].name;
    for (const auto& k : keys.back()) {
      SpreadFigure f;
      f.name = k.name;
      f.unit = k.unit;
      f.deterministic = figure_value(det.shells[s], k);
      f.values.assign(n, 0.0);
      sh.figures.push_back(std::move(f));
    }
    out.shells.push_back(std::move(sh));
  }
  std::vector<unsigned char> lower_bound(n * design.shells.size(), 0), grounded(n * design.shells.size(), 0);

  // A refused sample: the lowest index wins (parallel_items), so the message does not depend on the thread count.
  parallel_items(n, [&](size_t i) {
    for (size_t s = 0; s < design.shells.size(); ++s) {
      BudgetDraw d = draw_budget_sample(spec, opt.seed, i, s);
      d.bulge_weight = det.shells[s].bulge_weight;
      try {
        const ShellBudget b =
            shell_budget_drawn(design, design.shells[s], det.solar, det.solar_cycle_phase_at_epoch, bo, d);
        for (size_t k = 0; k < keys[s].size(); ++k) out.shells[s].figures[k].values[i] = figure_value(b, keys[s][k]);
        lower_bound[i * design.shells.size() + s] = b.lifetime_lower_bound;
        grounded[i * design.shells.size() + s] = !b.flyable();
      } catch (const InputError& e) {
        throw InputError(fmt::format("{}: shell {}: Monte Carlo sample {} (seed {}; phase shift {:.4f} cycles, solar "
                                     "amplitude {:.4f}, Cd x {:.4f}, area x {:.4f}): {}",
                                     design.file, design.shells[s].name, i, opt.seed, d.phase_shift_cycles,
                                     d.solar_amplitude, d.drag_coefficient_factor, d.drag_area_factor, e.what()));
      }
    }
  });

  // Reduce in index order.
  std::vector<double> fleet_dv(n, 0.0), fleet_prop(n, 0.0);
  bool all_propellant = det.fleet_propellant_kg.has_value();
  for (size_t s = 0; s < out.shells.size(); ++s) {
    ShellSpread& sh = out.shells[s];
    for (auto& f : sh.figures) f.summary = summarise_samples(f.values);
    const SpreadFigure* fd = sh.find("fleet_dv");
    const SpreadFigure* fp = sh.find("fleet_propellant");
    for (size_t i = 0; i < n; ++i) {
      fleet_dv[i] += fd->values[i];
      if (fp) fleet_prop[i] += fp->values[i];
      sh.lifetime_lower_bounds += lower_bound[i * out.shells.size() + s];
      sh.cannot_fly += grounded[i * out.shells.size() + s];
    }
    if (sh.lifetime_lower_bounds > 0)
      out.warnings.push_back(fmt::format("shell {}: {} of {} samples outlive the {:.0f}-year horizon: the lifetime "
                                         "percentiles they reach are lower bounds",
                                         sh.name, sh.lifetime_lower_bounds, n, opt.budget.lifetime_horizon_years));
    if (sh.cannot_fly > 0)
      out.warnings.push_back(fmt::format("shell {}: {} of {} samples give a budget that cannot be flown", sh.name,
                                         sh.cannot_fly, n));
  }
  SpreadFigure total{"fleet_dv", "m/s", det.fleet_dv_m_s, summarise_samples(fleet_dv), std::move(fleet_dv)};
  out.fleet.push_back(std::move(total));
  if (all_propellant) {
    SpreadFigure prop{"fleet_propellant", "kg", *det.fleet_propellant_kg, summarise_samples(fleet_prop),
                      std::move(fleet_prop)};
    out.fleet.push_back(std::move(prop));
  }

  out.notes.push_back(fmt::format(
      "drawn per sample: the date of the solar-cycle minimum within +-{} years (uniform; {}), the activity swing x "
      "(1 + {} z), Cd x (1 + {} z), area x (1 + {} z) (z standard normal clipped at +-3; one draw for every shell), "
      "and per shell the injection errors {} km and {} deg (1 sigma, clipped at +-6 sigma), removed by the node line",
      spec.spread.solar_minimum_years,
      det.solar == SolarLevel::cycle ? "shifts the phase" : "no effect under a fixed solar level",
      spec.spread.solar_amplitude, spec.spread.drag_coefficient, spec.spread.drag_area,
      spec.injection_sigma_altitude_km, spec.injection_sigma_inclination_deg));
  out.notes.push_back("held at the design values: raising, sso_inclination, slot_keeping, collision_avoidance "
                      "(no spread is stated for them); the deterministic node line is at k sigma, the samples remove "
                      "each sample's own errors");
  out.notes.push_back("percentiles: linear between order statistics (rank (n-1)p); P95 standard error: the width of the "
                      "distribution-free 95 % order-statistic interval (binomial count below the quantile) over 2 x 1.96");
  out.notes.push_back("fleet figures: every satellite of a shell takes its sample's draw (a bound: separate injection "
                      "errors would partly average over the fleet)");
  return out;
}

}  // namespace skein
