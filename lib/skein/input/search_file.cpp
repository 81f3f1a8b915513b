#include "skein/input/search_file.hpp"

#include <filesystem>

#include <fmt/format.h>

#include "skein/input/sweep_file.hpp"
#include "skein/input/yaml_reader.hpp"

namespace skein {
namespace {

SearchSettings read_settings(const std::string& path, const YAML::Node& root) {
  SearchSettings s;
  if (!root.IsMap() || !root["search"]) return s;
  const yaml::MapReader top(path, root, "", {"name", "base", "shell", "coverage", "axes", "requirement", "cost", "search"});
  const yaml::MapReader m = top.map("search", {"batch", "runners_up", "screen"});
  if (m.has("batch"))
    s.batch = static_cast<size_t>(m.integer("batch", 1, 10000, "the layouts evaluated together"));
  if (m.has("runners_up"))
    s.runners_up = static_cast<size_t>(m.integer("runners_up", 0, 1000, "the runners-up to list"));
  if (m.has("screen")) {
    const yaml::MapReader c = m.map("screen", {"enabled", "span_share", "grid_stride"});
    if (c.has("enabled")) s.screen.enabled = c.boolean("enabled");
    if (c.has("span_share"))
      s.screen.span_share = c.number("span_share", 0.0, 0.9, "the share of the span screened first (0: no prefix)");
    if (c.has("grid_stride")) {
      s.screen.grid_stride = static_cast<int>(c.integer("grid_stride", 1, 15, "the sub-grid's stride (1: none)"));
      if (s.screen.grid_stride % 2 == 0)
        c.fail(c.node("grid_stride"), c.path_of("grid_stride"),
               fmt::format("{} is even; expected an odd stride (1, 3, 5 ...): the sub-grid's cells are the middle "
                           "ones of each stride by stride block", s.screen.grid_stride));
    }
  }
  return s;
}

}  // namespace

Search read_search_file(const std::string& path, const SearchReadOptions& options) {
  Search s;
  SweepReadOptions ro;
  ro.max_layouts = options.max_layouts;
  ro.extra_keys = {"search"};
  s.space = read_sweep_file(path, ro);
  const std::string text = yaml::read_text_file(path);
  s.settings = read_settings(path, yaml::load_text(text, path));
  return s;
}

std::string equivalent_sweep_text(const std::string& path, const SearchReadOptions& options) {
  const Search s = read_search_file(path, options);
  const YAML::Node root = yaml::load_text(yaml::read_text_file(path), path);
  YAML::Node out(YAML::NodeType::Map);
  for (const auto& kv : root) {
    const std::string key = kv.first.Scalar();
    if (key == "search") continue;
    if (key == "base")
      out[key] = std::filesystem::absolute(s.space.base_file).lexically_normal().string();
    else
      out[key] = kv.second;
  }
  YAML::Emitter e;
  e << out;
  return fmt::format("# The full sweep over the space of {} (skein search --as-sweep).\n{}\n", path, e.c_str());
}

}  // namespace skein
