#include "skein/input/coverage_block.hpp"

#include <cmath>

#include <fmt/format.h>

#include "skein/coverage/polygon.hpp"
#include "skein/input/requirement_block.hpp"
#include "skein/input/yaml_reader.hpp"

namespace skein {
namespace {

using yaml::MapReader;

// Whether `spacing_deg` divides `extent_deg` into a whole number of cells (to 1e-9 of a cell).
bool divides(double extent_deg, double spacing_deg) {
  const double n = extent_deg / spacing_deg;
  return std::abs(n - std::round(n)) < 1e-9 && std::round(n) >= 1.0;
}

void read_grid(const MapReader& root, CoverageSpec& spec) {
  const MapReader g = root.map("grid", {"kind", "spacing_deg", "lat_min_deg", "lat_max_deg", "vertices", "sites"});
  if (g.has("kind")) spec.grid = *grid_kind_from_string(g.choice("kind", {"global", "band", "region", "sites"}));
  const auto allowed_only_for = [&](std::string_view key, GridKind kind) {
    if (g.has(key) && spec.grid != kind)
      g.fail_key(key, fmt::format("{} applies only to grid kind {}; this grid is {}", key, to_string(kind),
                                  to_string(spec.grid)));
  };
  allowed_only_for("lat_min_deg", GridKind::band);
  allowed_only_for("lat_max_deg", GridKind::band);
  allowed_only_for("vertices", GridKind::region);
  allowed_only_for("sites", GridKind::sites);
  if (spec.grid == GridKind::sites && g.has("spacing_deg"))
    g.fail_key("spacing_deg", "spacing_deg does not apply to a list of sites");
  if (g.has("spacing_deg")) {
    spec.spacing_deg = g.number("spacing_deg", 0.01, 30.0, "a cell size in degrees (0.01 to 30)");
    if (!divides(180.0, spec.spacing_deg))
      g.fail_key("spacing_deg", fmt::format("{} deg does not divide 180 deg into whole cells; expected e.g. 0.5, 1, 2, 3, 5",
                                            spec.spacing_deg));
  }
  switch (spec.grid) {
    case GridKind::global:
      break;
    case GridKind::band: {
      spec.band_lat_min_deg = g.number("lat_min_deg", -90.0, 90.0, "the band's southern latitude in degrees");
      spec.band_lat_max_deg = g.number("lat_max_deg", -90.0, 90.0, "the band's northern latitude in degrees");
      if (spec.band_lat_max_deg <= spec.band_lat_min_deg)
        g.fail_key("lat_max_deg", fmt::format("lat_max_deg {} is not north of lat_min_deg {}; expected a band of "
                                              "positive width", spec.band_lat_max_deg, spec.band_lat_min_deg));
      if (!divides(spec.band_lat_max_deg - spec.band_lat_min_deg, spec.spacing_deg))
        g.fail_key("lat_max_deg", fmt::format("the band {} to {} deg is not a whole number of {} deg cells",
                                              spec.band_lat_min_deg, spec.band_lat_max_deg, spec.spacing_deg));
      break;
    }
    case GridKind::region: {
      const auto items = g.sequence("vertices");
      for (size_t k = 0; k < items.size(); ++k) {
        const std::string path = fmt::format("{}[{}]", g.path_of("vertices"), k);
        if (!items[k].IsSequence() || items[k].size() != 2)
          yaml::fail_at(g.file(), items[k], path, "expected a vertex [lon_deg, lat_deg]");
        GeoVertex v;
        v.lon_deg = yaml::scalar_number(g.file(), items[k][0], path + "[0]", -180.0, 360.0, "a longitude in degrees");
        v.lat_deg = yaml::scalar_number(g.file(), items[k][1], path + "[1]", -90.0, 90.0, "a latitude in degrees");
        spec.region.push_back(v);
      }
      if (const auto problem = polygon_problem(spec.region)) g.fail_key("vertices", *problem);
      {
        // A region that holds no cell centre of its grid (centres at -90 + (i + 1/2) s, -180 + (j + 1/2) s, as
        // grid.cpp places them) is refused here, at its position; a --spacing override is checked again when the
        // grid is built. Grids of more than 4e6 cells are left to the coverage guard.
        const double sp = spec.spacing_deg;
        const long rows = std::lround(180.0 / sp), cols = std::lround(360.0 / sp);
        if (static_cast<double>(rows) * static_cast<double>(cols) <= 4e6) {
          bool any = false;
          for (long i = 0; i < rows && !any; ++i)
            for (long j = 0; j < cols && !any; ++j)
              any = point_in_polygon(-180.0 + (static_cast<double>(j) + 0.5) * sp,
                                     -90.0 + (static_cast<double>(i) + 0.5) * sp, spec.region);
          if (!any)
            g.fail_key("vertices", fmt::format("the region holds no cell centre of the {} deg grid; expected a larger "
                                               "region or a finer spacing_deg",
                                               sp));
        }
      }
      break;
    }
    case GridKind::sites: {
      const auto items = g.sequence("sites");
      for (size_t k = 0; k < items.size(); ++k) {
        const std::string path = fmt::format("{}[{}]", g.path_of("sites"), k);
        const MapReader s(g.file(), items[k], path, {"name", "lat_deg", "lon_deg", "height_km"});
        Site site;
        site.name = s.name("name", "a site name");
        site.lat_deg = s.number("lat_deg", -90.0, 90.0, "a geodetic latitude in degrees");
        site.lon_deg = s.number("lon_deg", -180.0, 360.0, "a longitude in degrees");
        site.height_km = s.optional_number("height_km", -0.5, 10.0, "a height above the ellipsoid in km").value_or(0.0);
        for (const Site& other : spec.sites)
          if (other.name == site.name) s.fail_key("name", fmt::format("site name \"{}\" is used twice", site.name));
        spec.sites.push_back(site);
      }
      break;
    }
  }
}

}  // namespace

CoverageSpec read_coverage_spec(const yaml::MapReader& root) {
  CoverageSpec spec;
  if (!root.has("coverage")) return spec;
  const MapReader block = root.map("coverage", {"grid", "min_elevation_deg", "nadir_half_angle_deg",
                                                "min_sun_elevation_deg", "span_h", "step_s", "max_fold", "latitude_band_deg", "requirement"});
  spec.present = true;
  if (block.has("grid")) read_grid(block, spec);
  if (block.has("min_elevation_deg"))
    spec.min_elevation_deg = block.number("min_elevation_deg", 0.0, 89.0, "an elevation mask in degrees (0 to 89)");
  spec.nadir_half_angle_deg =
      block.optional_number("nadir_half_angle_deg", 0.1, 90.0, "a payload cone half-angle from nadir in degrees");
  spec.min_sun_elevation_deg = block.optional_number(
      "min_sun_elevation_deg", -18.0, 90.0,
      "a Sun elevation in degrees (-18 is astronomical twilight, 10 typical for optical imaging)");
  if (block.has("span_h"))
    spec.span_s = 3600.0 * block.number("span_h", 1e-6, 24.0 * 366.0, "a time span in hours (above zero, at most a year)");
  if (block.has("step_s")) {
    // A step of zero or less is refused here, with its position, before any work.
    spec.step_s = block.number("step_s", -1e12, 1e12, "a time step in seconds");
    if (!(spec.step_s > 0.0))
      block.fail_key("step_s", fmt::format("a step of {} s is not positive; expected a step above zero, e.g. 30", spec.step_s));
    if (spec.step_s > spec.span_s)
      block.fail_key("step_s", fmt::format("the step {} s is longer than the span {} s", spec.step_s, spec.span_s));
  }
  if (block.has("max_fold")) {
    spec.max_fold = static_cast<int>(block.integer("max_fold", 1, max_fold_limit,
                                                        fmt::format("a coverage fold K from 1 to {}", max_fold_limit)));
  }
  if (block.has("latitude_band_deg")) {
    spec.band_width_deg = block.number("latitude_band_deg", 0.5, 180.0, "a latitude band width in degrees");
    if (!divides(180.0, spec.band_width_deg))
      block.fail_key("latitude_band_deg", "the band width must divide 180 deg, e.g. 5, 10, 15, 30");
  }
  if (block.has("requirement")) {
    RequirementReadOptions ro;
    ro.sites_grid = spec.grid == GridKind::sites;
    ro.has_ground_stations = root.has("ground_stations");
    ro.has_payload_cone = spec.nadir_half_angle_deg.has_value();
    spec.requirement = read_requirement_block(block, "requirement", ro);
  }
  return spec;
}

}  // namespace skein
