// Evidence for the search's answer (lib/skein/search/search_answer, search_plan): walking the candidates in
// cost order and stopping at the first cost tie that holds a meeting layout names the same layout as the
// sweep's rule (cheapest_meeting in sweep/ranking.hpp, itself checked against a brute force in
// tests/sweep/ranking_test.cpp) over ALL the rows, while needing only the rows up to that tie. Random rows with
// many exact cost ties (costs drawn from 3 values each), some failing and some refused (not evaluated). The
// runners-up are checked the same way: the next meeting rows of the sweep's order over all rows.
#include <doctest/doctest.h>

#include <algorithm>
#include <map>
#include <random>
#include <vector>

#include "skein/search/search_answer.hpp"
#include "skein/search/search_plan.hpp"
#include "skein/sweep/ranking.hpp"

using namespace skein;

namespace {

Search two_cost_search(RequirementFigure figure, size_t runners_up) {
  Search s;
  s.settings.runners_up = runners_up;
  s.space.costs = {CostFigure::satellites, CostFigure::fleet_dv_m_s};
  s.space.requirement.figure = figure;
  return s;
}

}  // namespace

TEST_CASE("search answer: a cost tie is decided by the figure, then the layout index, as the sweep does") {
  const Search s = two_cost_search(RequirementFigure::percent_covered, 0);
  SearchPlan plan;
  // Layouts 0..3: 0 and 2 cost (12, 100), 1 costs (12, 90) and fails, 3 costs (14, 50).
  const std::vector<std::vector<double>> costs = {{12, 100}, {12, 90}, {12, 100}, {14, 50}};
  for (size_t i = 0; i < costs.size(); ++i) plan.layouts.push_back({i, costs[i], SkipReason::none, ""});
  plan.order = {0, 1, 2, 3};
  std::sort(plan.order.begin(), plan.order.end(),
            [&](size_t a, size_t b) { return cost_before(plan.layouts[a], plan.layouts[b]); });
  CHECK(plan.order == std::vector<size_t>{1, 0, 2, 3});
  auto r = [&](size_t i, bool meets, double fig) {
    RowSummary x;
    x.layout = i;
    x.evaluated = true;
    x.meets = meets;
    x.figure = fig;
    x.costs = costs[i];
    return x;
  };
  std::map<size_t, RowSummary> rows = {{1, r(1, false, 50)}, {0, r(0, true, 80)}};
  // Layout 2 shares layout 0's costs and is not evaluated: the answer stays open.
  CHECK_FALSE(settle_answer(s, plan, rows).settled);
  rows.emplace(2, r(2, true, 85));  // higher percent: ranks before layout 0 although its index is larger
  const SearchAnswer a = settle_answer(s, plan, rows);
  REQUIRE(a.settled);
  CHECK(*a.optimum == 2);
  CHECK(a.decided_through == 3);  // layout 3 costs more and is not needed
  // With one runner-up wanted, layout 0 (same costs, lower percent) is it, from the same tie.
  const SearchAnswer b = settle_answer(two_cost_search(RequirementFigure::percent_covered, 1), plan, rows);
  REQUIRE(b.settled);
  CHECK(b.runners_up == std::vector<size_t>{0});
  CHECK(b.decided_through == 3);
}

TEST_CASE("search answer: random rows with ties agree with the sweep's cheapest layout over all rows") {
  std::mt19937 rng(20261202);
  std::uniform_int_distribution<int> pick(0, 2), coin(0, 3);
  for (RequirementFigure figure : {RequirementFigure::percent_covered, RequirementFigure::max_gap_s})
  for (size_t runners : {size_t{0}, size_t{2}}) {
    const Search s = two_cost_search(figure, runners);
    for (int trial = 0; trial < 300; ++trial) {
      const size_t n = 1 + static_cast<size_t>(trial % 40);
      SearchPlan plan;
      std::vector<RowSummary> all;
      std::map<size_t, RowSummary> rows;
      for (size_t i = 0; i < n; ++i) {
        const std::vector<double> c = {static_cast<double>(10 + 2 * pick(rng)), 100.0 + 5.0 * pick(rng)};
        plan.layouts.push_back({i, c, SkipReason::none, ""});
        RowSummary x;
        x.layout = i;
        x.evaluated = coin(rng) != 0;  // a quarter refused by an evaluator
        x.meets = x.evaluated && coin(rng) >= 2;
        x.figure = static_cast<double>(pick(rng));  // ties in the figure too
        x.costs = c;
        all.push_back(x);
        rows.emplace(i, x);
        plan.order.push_back(i);
      }
      std::sort(plan.order.begin(), plan.order.end(),
                [&](size_t a, size_t b) { return cost_before(plan.layouts[a], plan.layouts[b]); });
      const auto brute = cheapest_meeting(all, figure);
      const SearchAnswer full = settle_answer(s, plan, rows);
      REQUIRE(full.settled);
      REQUIRE(full.optimum.has_value() == brute.has_value());
      if (!brute) continue;
      CHECK(*full.optimum == all[*brute].layout);
      // The runners-up: the next meeting rows of the sweep's order over all rows (a brute-force sort).
      std::vector<RowSummary> meeting;
      for (const RowSummary& x : all)
        if (x.evaluated && x.meets) meeting.push_back(x);
      std::sort(meeting.begin(), meeting.end(),
                [&](const RowSummary& x, const RowSummary& y) { return ranks_before(x, y, figure); });
      std::vector<size_t> want;
      for (size_t k = 1; k < meeting.size() && want.size() < runners; ++k) want.push_back(meeting[k].layout);
      CHECK(full.runners_up == want);
      // Only the rows up to the answer's tie are needed: the same answer from them alone.
      std::map<size_t, RowSummary> needed;
      for (size_t p = 0; p < full.decided_through; ++p) needed.emplace(plan.order[p], rows.at(plan.order[p]));
      const SearchAnswer part = settle_answer(s, plan, needed);
      REQUIRE(part.settled);
      CHECK(*part.optimum == *full.optimum);
      CHECK(part.runners_up == full.runners_up);
      CHECK(meeting_in_rank_order(s, rows).front() == *full.optimum);
    }
  }
}
