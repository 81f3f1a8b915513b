#pragma once
// A layout search: the space (a sweep over the same axes, so the search and a full sweep of that space number
// the same layouts and judge them the same way) and the search's own settings. Read from a search file by
// input/search_file.hpp (the format is in the README, "Layout search"); these types carry no YAML positions.
#include <cstddef>

#include "skein/sweep/sweep_spec.hpp"

namespace skein {

// The coarse-to-fine screen (coarse_screen.hpp): on by default (its skips are proven one-sided bounds, so the
// answer is the same with it or without it); `screen: {enabled: false}` turns it off.
struct ScreenSettings {
  bool enabled = true;
  double span_share = 0.25;  // the prefix span: this share of the span, rounded down to whole steps (0: none)
  int grid_stride = 3;       // the sub-grid: every grid_stride-th row and column of cells (odd; 1: none)
};

struct SearchSettings {
  // Layouts evaluated together, in cost order (in parallel over threads and MPI ranks). The batches are fixed
  // by the file, not by the thread or rank count, so the layouts evaluated, and so the record, do not depend on
  // them; a larger batch evaluates more layouts past the optimum.
  size_t batch = 4;
  // Meeting layouts listed after the optimum: the search goes on in cost order until it has found them, so they
  // are the next ones of the sweep's order over the whole space (each costs evaluations past the optimum).
  size_t runners_up = 3;
  ScreenSettings screen;
};

struct Search {
  Sweep space;  // base design, axes, requirement, costs: exactly what the equivalent sweep file reads to
  SearchSettings settings;
};

}  // namespace skein
