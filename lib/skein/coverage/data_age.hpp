#pragma once
// Age of the data: for each site of a sites grid, the time from each observation opportunity to the first
// following contact of the same satellite with any ground station.
//
// Observation opportunity: a pass of one satellite over the site (at or above the coverage mask), cut to the
// site's daylight when coverage.min_sun_elevation_deg is set (each lit piece of a pass is one opportunity).
// Observation instant: the START of the (lit) pass. It is the earliest picture the pass can give, so its age is
// the longest of that pass (the figure errs on the safe side by at most the pass length, a few minutes, against
// a picture taken later in the pass); it needs no per-pass storage (common practice for a requirement figure:
// the conservative end).
// Age: 0 when the satellite is in contact with a station at that instant; else the time to the start of its
// next contact. No contact before the span's end: the observation is CENSORED; it is counted (`censored`) and
// left out of the mean and the p95 (so the figures describe the data that reached the ground within the span;
// observations near the span's end are the likely censored ones).
//
// Memory: per satellite, its contacts with all stations merged into sorted disjoint intervals (16 bytes each,
// a few per orbit); per site, streaming sums (count, censored, sum of ages) and a fixed-bin histogram of
// data_age_bins counts (4 bytes each, 16 KiB a site) for the p95. The sites are searched one at a time, so only
// one site's passes are held at once; no list of passes or ages is kept per site. The p95 is the upper
// edge of the histogram bin that holds the nearest-rank 95th percentile, capped at the largest age seen: it
// errs upward by less than one bin width (`bin_s` = max(10 s, span / data_age_bins)).
#include <cstdint>
#include <optional>
#include <vector>

#include "skein/coverage/grid.hpp"
#include "skein/design/design.hpp"

namespace skein {

constexpr int data_age_bins = 4096;

struct DataAgeFigures {
  long observations = 0;  // observation opportunities (lit passes), censored ones included
  long censored = 0;      // no contact of that satellite before the span's end
  double mean_s = 0.0;    // over the uncensored observations; 0 when there is none
  double p95_s = 0.0;     // nearest-rank 95th percentile (histogram, see above); 0 when there is none
  double max_s = 0.0;     // largest uncensored age
};

struct DataAgeResult {
  double bin_s = 0.0;                      // histogram bin width: the p95's error bound (upward)
  std::vector<DataAgeFigures> per_point;   // in grid order
  DataAgeFigures total;                    // area-weighted (sites: equal weights) over the grid
};

// Streaming per-point accumulator: count, censored, sum and the fixed-bin histogram.
class DataAgeAccumulator {
 public:
  explicit DataAgeAccumulator(double bin_s) : bin_s_(bin_s), counts_(data_age_bins, 0) {}
  void add(double age_s);
  void add_censored() { ++observations_; ++censored_; }
  DataAgeFigures figures() const;
  // The figures of several points together, each observation weighted by its point's weight (area share).
  static DataAgeFigures weighted(const std::vector<DataAgeAccumulator>& acc, const std::vector<double>& weight);

 private:
  double bin_s_;
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

// Whether data age can be computed for this design: a sites grid, ground stations, and no payload cone (the
// passes are found by the contact search, which knows the elevation mask only).
bool data_age_applies(const Design& design);

// Data age of every site of `grid` (a sites grid) over the design's coverage span, with the design's coverage
// mask and daylight threshold. Requires data_age_applies(design).
DataAgeResult compute_data_age(const Design& design, const Grid& grid);

}  // namespace skein
