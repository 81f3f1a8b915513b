#include "skein/search/search_outputs.hpp"

#include <cassert>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "skein/sweep/results_rows.hpp"
#include "skein/sweep/sweep_outputs.hpp"

namespace skein {
namespace {

nlohmann::ordered_json costs_json(const Sweep& space, const std::vector<double>& costs) {
  nlohmann::ordered_json j = nlohmann::ordered_json::object();
  for (size_t k = 0; k < space.costs.size() && k < costs.size(); ++k) j[std::string(to_string(space.costs[k]))] = costs[k];
  return j;
}

std::string costs_text(const Sweep& space, const std::vector<double>& costs) {
  std::string t;
  for (size_t k = 0; k < space.costs.size() && k < costs.size(); ++k)
    t += fmt::format("{}{} {}", k ? ", " : "", to_string(space.costs[k]),
                     space.costs[k] == CostFigure::satellites || space.costs[k] == CostFigure::planes
                         ? fmt::format("{:.0f}", costs[k])
                         : fmt::format("{:.2f}", costs[k]));
  return t;
}

}  // namespace

SearchOutputs assemble_search_outputs(const Search& search, const LayoutSet& set, const SearchPlan& plan,
                                      const std::map<size_t, std::string>& rows, const SearchAnswer& answer,
                                      const std::map<size_t, ScreenOutcome>& screened) {
  const Sweep& space = search.space;
  const std::vector<Column> cols = sweep_columns(space);
  SearchOutputs out;
  SearchCounts& n = out.counts;
  n.layouts = set.layouts.size();
  n.combinations = static_cast<double>(set.layouts.size() + static_cast<size_t>(set.skipped.total()));
  n.evaluated = rows.size();
  n.skipped_budget = plan.skipped_budget;
  n.skipped_cap_area = plan.skipped_cap_area;
  n.skipped_screen = static_cast<long>(screened.size());

  std::map<size_t, RowSummary> sums;
  Table evaluated;
  evaluated.title = fmt::format("Search {}: evaluated layouts", space.name);
  evaluated.columns = cols;
  for (const auto& [i, text] : rows) {
    auto cells = decode_row(text, cols.size());
    assert(cells);
    sums.emplace(i, summarize_row(space, *cells));
    if (sums.at(i).evaluated && sums.at(i).meets) ++n.meeting;
    evaluated.add_row(std::move(*cells));
  }
  out.evaluated_csv = render_csv(evaluated);
  for (const auto& j : rows_to_json(evaluated)) out.evaluated_jsonl += j.dump() + "\n";

  const std::vector<size_t> ranked = meeting_in_rank_order(search, sums);
  out.optimum = answer.optimum;
  if (answer.optimum) {
    out.optimum_costs = plan.layouts[*answer.optimum].costs;
    out.optimum_figure = sums.at(*answer.optimum).figure;
  }
  assert(!answer.optimum || (!ranked.empty() && ranked.front() == *answer.optimum));
  out.runners_up = answer.runners_up;
  for (size_t k = 0; k < out.runners_up.size(); ++k) assert(ranked.at(k + 1) == out.runners_up[k]);

  // The record: one line per layout.
  const std::vector<double>* optimum_costs = answer.optimum ? &plan.layouts[*answer.optimum].costs : nullptr;
  std::vector<long> position(set.layouts.size(), -1);
  for (size_t p = 0; p < plan.order.size(); ++p) position[plan.order[p]] = static_cast<long>(p);
  for (const PlannedLayout& p : plan.layouts) {
    nlohmann::ordered_json j;
    j["layout"] = p.layout;
    j["walker"] = walker_label(set.layouts[p.layout]);
    j["costs"] = costs_json(space, p.costs);
    if (position[p.layout] >= 0) j["cost_rank"] = position[p.layout];
    const auto s = sums.find(p.layout);
    const auto c = screened.find(p.layout);
    if (c != screened.end()) {
      j["outcome"] = "skipped";
      j["reason"] = c->second.reason;
      j["bound"] = c->second.bound;
      j["coarse"] = {{"figure", c->second.figure}, {"value", c->second.coarse_value}};
    } else if (s != sums.end()) {
      j["outcome"] = "evaluated";
      j["status"] = s->second.evaluated ? "ok" : "error";
      j["meets"] = s->second.meets;
      if (s->second.evaluated) j[std::string(to_string(space.requirement.figure))] = s->second.figure;
      if (answer.optimum && *answer.optimum == p.layout) j["optimum"] = true;
    } else if (p.skip != SkipReason::none) {
      j["outcome"] = "skipped";
      j["reason"] = std::string(to_string(p.skip));
      j["bound"] = p.bound;
    } else {
      assert(optimum_costs && "a candidate is left only after an answer");
      ++n.skipped_cost_order;
      j["outcome"] = "skipped";
      j["reason"] = std::string(to_string(SkipReason::cost_order));
      j["bound"] = fmt::format("costs ({}) rank after the optimum's ({}, layout {})", costs_text(space, p.costs),
                               costs_text(space, *optimum_costs), *answer.optimum);
    }
    out.record_jsonl += j.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace) + "\n";
  }

  // The answer table: the optimum, then the runners-up.
  std::vector<RowSummary> list;
  std::vector<size_t> members;
  if (answer.optimum) {
    list.push_back(sums.at(*answer.optimum));
    for (size_t i : out.runners_up) list.push_back(sums.at(i));
    for (size_t k = 0; k < list.size(); ++k) members.push_back(k);
  }
  out.answer_table = front_table(space, set, list, members, "optimum and runners-up", false);
  out.answer_table.title = fmt::format("Search {}: the optimum, then the runners-up (the next meeting layouts by cost)",
                                       space.name);

  nlohmann::ordered_json a;
  a["search"] = space.name;
  a["combinations"] = n.combinations;
  a["layouts"] = n.layouts;
  a["evaluated"] = n.evaluated;
  a["skipped"] = {{"budget", n.skipped_budget}, {"cap_area", n.skipped_cap_area}};
  if (search.settings.screen.enabled) a["skipped"]["screen"] = n.skipped_screen;  // only with a screen: block
  a["skipped"]["cost_order"] = n.skipped_cost_order;
  a["meeting_evaluated"] = n.meeting;
  auto layout_json = [&](size_t i) {
    nlohmann::ordered_json l;
    l["layout"] = i;
    l["walker"] = walker_label(set.layouts[i]);
    l["costs"] = costs_json(space, plan.layouts[i].costs);
    l[std::string(to_string(space.requirement.figure))] = sums.at(i).figure;
    return l;
  };
  a["optimum"] = answer.optimum ? layout_json(*answer.optimum) : nlohmann::ordered_json();
  a["runners_up"] = nlohmann::ordered_json::array();
  for (size_t i : out.runners_up) a["runners_up"].push_back(layout_json(i));
  a["runners_up_note"] = "the next meeting layouts in cost order over the whole space";
  out.answer_json = a.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n";
  return out;
}

std::string search_summary_text(const Search& search, const LayoutSet& set, const SearchOutputs& o, long resumed,
                                const std::string& dir, const std::vector<std::string>& written) {
  const Sweep& space = search.space;
  const SearchCounts& n = o.counts;
  std::string t = fmt::format(
      "search {}: {} layouts in the space ({} axis combinations), {} evaluated ({} resumed from the journal), "
      "{} skipped: {} by the budget, {} by the cap-area bound, {}{} by cost order after the optimum\n",
      space.name, n.layouts, n.combinations, n.evaluated, resumed,
      n.skipped_budget + n.skipped_cap_area + n.skipped_screen + n.skipped_cost_order, n.skipped_budget,
      n.skipped_cap_area,
      search.settings.screen.enabled ? fmt::format("{} by the coarse screen, ", n.skipped_screen) : std::string(),
      n.skipped_cost_order);
  if (o.optimum) {
    t += fmt::format("optimum: layout {} ({}): {}, {} {:.3f}\n", *o.optimum, walker_label(set.layouts[*o.optimum]),
                     costs_text(space, o.optimum_costs), to_string(space.requirement.figure), o.optimum_figure);
    t += fmt::format("runners-up (the next meeting layouts by cost): {}\n", [&] {
      std::string r;
      for (size_t i : o.runners_up) r += fmt::format("{}{} ({})", r.empty() ? "" : ", ", i, walker_label(set.layouts[i]));
      return r.empty() ? std::string("none") : r;
    }());
  } else {
    t += "no layout of the space meets the requirement (every candidate was evaluated)\n";
  }
  std::string files;
  for (size_t k = 0; k < written.size(); ++k) files += (k == 0 ? dir + "/" : ", ") + written[k];
  t += fmt::format("written: {}\n", files);
  return t;
}

}  // namespace skein
