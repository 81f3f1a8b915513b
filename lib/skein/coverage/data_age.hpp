#pragma once
// Age of the data: for each point of the coverage grid (sites, or the cells of a global, band or region grid),
// the time from each observation opportunity to the first following contact of the same satellite with any
// ground station.
//
// Observation opportunity: a pass of one satellite over the point (at or above the coverage mask), cut to the
// point's daylight when coverage.min_sun_elevation_deg is set (each lit piece of a pass is one opportunity).
// Observation instant: the START of the (lit) pass. It is the earliest picture the pass can give, so its age is
// the longest of that pass (the figure errs on the safe side by at most the pass length, a few minutes, against
// a picture taken later in the pass); it needs no per-pass storage (common practice for a requirement figure:
// the conservative end).
// Age: 0 when the satellite is in contact with a station at that instant; else the time to the start of its
// next contact. No contact before the span's end: the observation is CENSORED; it is counted (`censored`) and
// left out of the mean and the p95 (so the figures describe the data that reached the ground within the span;
// observations near the span's end are the likely censored ones).
//
// Passes: sites are searched one at a time with the contact search (the site as the one station); cells all
// together, satellite by satellite, with culling (grid_passes.hpp). Both place rises within 0.5 ms (cells: of a
// path within about 0.3 m of the orbit model's) and find every pass longer than 1 ms (cells: but a pass or gap
// under 2 s within 2 s of another crossing may merge with it), so a cell and a site at the same place give the
// same figures (test: counts equal, mean and max within 0.01 s). Daylight: sites cut their passes with the lit
// intervals of the whole span; cells find each pass's lit pieces from its rise (nothing kept per cell).
//
// Memory: per satellite, its contacts with all stations merged into sorted disjoint intervals (16 bytes each,
// a few per orbit); per point, streaming sums (count, censored, sum and largest age: 32 bytes) and a histogram
// for the p95; no list of passes or ages is kept per point. The p95 is the upper edge of the histogram bin that
// holds the nearest-rank 95th percentile, capped at the largest age seen, so never below the true figure:
//   - sites: data_age_bins = 4096 bins of 4 bytes (16 KiB a site), linear, `bin_s` = max(10 s, span / 4096)
//     wide: the p95 errs upward by less than bin_s;
//   - cells: cell_data_age_bins = 256 bins of 4 bytes (1 KiB a point: 16.6 MB for the 16,200 points of a 2 deg
//     global grid, 66 MB for 64,800 at 1 deg), log-spaced: the first [0, bin_s) with bin_s = 30 s, each later
//     one `bin_ratio` times as wide as the one before it, the last ending at the span: bin_ratio =
//     (span / 30 s)^(1/255), 1.032 for a day, 1.045 for 30 days. The p95 errs upward by less than
//     max(bin_s, (bin_ratio - 1) x p95): 3.2 % over a day (115 s on a one-hour p95).
#include <cstdint>
#include <optional>
#include <vector>

#include "skein/coverage/grid.hpp"
#include "skein/design/design.hpp"

namespace skein {

constexpr int data_age_bins = 4096;       // sites: linear bins
constexpr int cell_data_age_bins = 256;   // cells: log-spaced bins
constexpr double cell_data_age_first_bin_s = 30.0;

// A histogram's bins: linear (ratio 1, `count` bins of width_s) or log-spaced (ratio > 1: [0, width_s), then
// each bin's upper edge `ratio` times the one before it).
struct DataAgeBins {
  int count = data_age_bins;
  double width_s = 10.0;
  double ratio = 1.0;
  static DataAgeBins linear(double width_s) { return {data_age_bins, width_s, 1.0}; }
  // cell_data_age_bins log-spaced bins from cell_data_age_first_bin_s, the last ending at span_s.
  static DataAgeBins log_spaced(double span_s);
  int bin_of(double age_s) const;
  double upper_edge_s(int bin) const;
  // The p95's upward error bound at a p95 of p95_s.
  double error_bound_s(double p95_s) const;
};

struct DataAgeFigures {
  long observations = 0;  // observation opportunities (lit passes), censored ones included
  long censored = 0;      // no contact of that satellite before the span's end
  double mean_s = 0.0;    // over the uncensored observations; 0 when there is none
  double p95_s = 0.0;     // nearest-rank 95th percentile (histogram, see above); 0 when there is none
  double max_s = 0.0;     // largest uncensored age
};

struct DataAgeResult {
  double bin_s = 0.0;       // histogram bin width (log-spaced: the first bin's): the p95's error bound (upward)
  double bin_ratio = 1.0;   // 1: linear bins (sites); else log-spaced (cells), the bound is max(bin_s, (ratio - 1) p95)
  std::vector<DataAgeFigures> per_point;   // in grid order
  DataAgeFigures total;                    // area-weighted (sites: equal weights) over the grid
};

// Streaming per-point accumulator: count, censored, sum and the fixed-bin histogram.
class DataAgeAccumulator {
 public:
  explicit DataAgeAccumulator(double bin_s) : DataAgeAccumulator(DataAgeBins::linear(bin_s)) {}
  explicit DataAgeAccumulator(const DataAgeBins& bins)
      : bins_(bins), counts_(static_cast<std::size_t>(bins.count), 0) {}
  void add(double age_s);
  void add_censored() { ++observations_; ++censored_; }
  DataAgeFigures figures() const;
  // The figures of several points together, each observation weighted by its point's weight (area share).
  static DataAgeFigures weighted(const std::vector<DataAgeAccumulator>& acc, const std::vector<double>& weight);

 private:
  DataAgeBins bins_;
  std::vector<std::uint32_t> counts_;
  long observations_ = 0, censored_ = 0;
  double sum_ = 0.0, max_ = 0.0;
};

// The next contact after t of a satellite whose merged contacts are `contacts` (sorted, disjoint): the age
// (0 when in contact at t), or none when no contact begins or lasts after t.
struct ContactSpan {
  double start_s, end_s;
};
std::optional<double> age_to_next_contact(const std::vector<ContactSpan>& contacts, double t);

// Whether data age can be computed for this design: ground stations and no payload cone (the passes are found
// with the elevation mask only). Any grid kind.
bool data_age_applies(const Design& design);

// Data age of every point of `grid` over the design's coverage span, with the design's coverage
// mask and daylight threshold. Requires data_age_applies(design).
DataAgeResult compute_data_age(const Design& design, const Grid& grid);

}  // namespace skein
