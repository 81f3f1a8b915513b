#include "skein/report/run_record.hpp"

#include <fmt/format.h>

#include "skein/io/checksum.hpp"
#include "skein/time/epoch.hpp"
#include "skein/version.hpp"

namespace skein {

Table run_record_table(const Design& d, const CoverageResult& c, const BudgetResult& b, const RunRecordInputs& in) {
  Table t;
  t.title = "How this report was made";
  t.columns = {{"setting", "setting", "", 0}, {"value", "value", "", 0}};
  const auto row = [&](std::string key, std::string value) { t.add_row({std::move(key), std::move(value)}); };
  row("skein version", SKEIN_VERSION);
  if (!in.command_line.empty()) row("command (FOLDER: this folder)", in.command_line);
  row("design file", d.file);
  if (!in.design_text.empty())
    row("design file FNV-1a 64", fmt::format("{} ({} bytes; a copy is design.yaml in this folder)",
                                             hex64(fnv1a64(in.design_text)), in.design_text.size()));
  row("epoch", format_utc_iso8601(d.epoch, 0));
  row("Earth model", fmt::format("{} ({})", d.earth.name, d.earth.source));
  std::string grid = std::string(to_string(c.grid));
  if (c.grid != GridKind::sites) grid += fmt::format(", {:g} deg cells", c.spacing_deg);
  row("coverage grid", fmt::format("{}, {} points", grid, c.points.size()));
  row("coverage span and step", fmt::format("{:g} h, {:g} s ({} instants)", c.span_s / 3600.0, c.step_s, c.steps));
  row("elevation mask", fmt::format("{:g} deg", c.min_elevation_deg));
  row("payload cone", c.nadir_half_angle_deg ? fmt::format("{:g} deg half-angle from nadir", *c.nadir_half_angle_deg)
                                             : std::string("none"));
  if (c.min_sun_elevation_deg)
    row("daylight at the target", fmt::format("lit coverage only: Sun at least {:g} deg above the point's horizon",
                                              *c.min_sun_elevation_deg));
  row("largest fold", fmt::format("{}", c.max_fold));
  row("coverage mode", std::string(to_string(c.mode)));
  row("atmosphere", std::string(to_string(b.atmosphere)));
  row("solar activity", std::string(to_string(b.solar)));
  row("mission life", fmt::format("{:g} years", b.mission_life_years));
  if (d.budget.samples)
    row("Monte Carlo budget", fmt::format("{} samples, seed {}", *d.budget.samples, d.budget.seed.value_or(1)));
  return t;
}

}  // namespace skein
