#pragma once
// The sweep's output files, assembled from the finished rows in layout order (so they are the same, byte for
// byte, whatever the order the rows finished in, the thread count or the MPI rank count): the results table
// (CSV and JSON lines, with a front column), the best front as a table and an SVG scatter plot.
#include <cstddef>
#include <map>
#include <optional>
#include <string>

#include "skein/report/table.hpp"
#include "skein/sweep/layouts.hpp"
#include "skein/sweep/sweep_spec.hpp"

namespace skein {

struct SweepSummary {
  size_t layouts = 0;
  size_t evaluated = 0;     // status ok
  size_t errors = 0;        // refused by an evaluator (kept, status error)
  size_t meeting = 0;       // meet the requirement
  size_t front = 0;         // on the best front
  SkippedCounts skipped;
  std::optional<size_t> cheapest_meeting;  // the front layout meeting the requirement at the lowest first cost
};

struct SweepOutputs {
  Table results;            // every layout, in layout order
  Table front;              // the best front, by first cost then figure
  std::string results_csv;
  std::string results_jsonl;  // one JSON object per line
  std::string front_csv;
  std::string front_svg;
  SweepSummary summary;
};

// `rows` holds the encoded row of every layout of `set` (asserted). The front is the Pareto set of the
// evaluated layouts on (requirement figure, every cost): layouts failing the requirement stay in the results,
// marked meets_requirement = no, and may sit on the front (marked there too).
SweepOutputs assemble_outputs(const Sweep& sweep, const LayoutSet& set, const std::map<size_t, std::string>& rows);

}  // namespace skein
