#pragma once
// The search's output files, from the plan, the evaluated rows and the answer (so the same, byte for byte,
// whatever the thread or rank count and across a kill and resume):
//   record.jsonl    one line per layout of the space, in layout order: its costs and what became of it
//                   (evaluated, meets or not; or skipped, with the reason and the bound it cites: the budget,
//                   the cap-area bound, the coarse screen, or cost order after the answer)
//   evaluated.csv   the evaluated layouts' rows, the sweep's columns (results_rows.hpp), in layout order
//   evaluated.jsonl the same as JSON lines
//   answer.json     the optimum, the runners-up (the next meeting layouts by cost) and the counts
#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "skein/report/table.hpp"
#include "skein/search/coarse_screen.hpp"
#include "skein/search/search_answer.hpp"
#include "skein/search/search_plan.hpp"
#include "skein/search/search_spec.hpp"
#include "skein/sweep/layouts.hpp"

namespace skein {

struct SearchCounts {
  double combinations = 0;       // axis combinations (the layouts plus those the expansion skips)
  size_t layouts = 0;            // the space: layouts a full sweep of the same axes evaluates
  size_t evaluated = 0;
  long skipped_budget = 0, skipped_cap_area = 0, skipped_screen = 0, skipped_cost_order = 0;
  long meeting = 0;              // evaluated layouts meeting the requirement
};

struct SearchOutputs {
  SearchCounts counts;
  std::optional<size_t> optimum;
  std::vector<double> optimum_costs;  // the optimum's costs and requirement figure (when there is one)
  double optimum_figure = 0.0;
  std::vector<size_t> runners_up;  // the next meeting layouts in the sweep's order over the whole space
  Table answer_table;              // the optimum and the runners-up (front-table form)
  std::string record_jsonl, evaluated_csv, evaluated_jsonl, answer_json;
  std::vector<std::pair<std::string, const std::string*>> files() const {
    return {{"record.jsonl", &record_jsonl}, {"evaluated.csv", &evaluated_csv},
            {"evaluated.jsonl", &evaluated_jsonl}, {"answer.json", &answer_json}};
  }
};

// `rows`: the encoded rows of exactly the evaluated layouts; `screened`: the layouts the coarse screen ruled out.
SearchOutputs assemble_search_outputs(const Search& search, const LayoutSet& set, const SearchPlan& plan,
                                      const std::map<size_t, std::string>& rows, const SearchAnswer& answer,
                                      const std::map<size_t, ScreenOutcome>& screened = {});

// The summary for the user (lines ending in newlines): the answer, the counts and each bound's skips.
std::string search_summary_text(const Search& search, const LayoutSet& set, const SearchOutputs& outputs,
                                long resumed, const std::string& dir, const std::vector<std::string>& written);

}  // namespace skein
