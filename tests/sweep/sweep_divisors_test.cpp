// Evidence for `planes: divisors` (lib/skein/sweep/layouts, input/sweep_file): the layouts are exactly the
// (T, P, F) triples of a brute-force enumeration written here (every P from 1 to T that divides T, ascending,
// and every F from 0 to P-1 with phasing: all), in the documented nesting order, and the combination count
// equals the layout count (no P is skipped for not dividing T). Hand check: T = 12 has the divisors 1, 2, 3, 4,
// 6, 12 (sum 28 phasings), T = 14 has 1, 2, 7, 14 (sum 24), 52 layouts in all.
#include <doctest/doctest.h>

#include <string>
#include <tuple>
#include <vector>

#include "skein/input/sweep_file.hpp"
#include "skein/sweep/layouts.hpp"

using namespace skein;

TEST_CASE("sweep: planes: divisors expands to every divisor of each T, in order") {
  const std::string folder = std::string(SKEIN_SOURCE_DIR) + "/designs/sweeps";
  const std::string text =
      "name: t\nbase: ../demo.yaml\nshell: imaging\ncoverage:\n  grid:\n    spacing_deg: 10\n  span_h: 6\n  step_s: 120\n"
      "axes:\n  satellites: [12, 14]\n  planes: divisors\n  phasing: all\nrequirement:\n  min_percent_covered: 50\n";
  const Sweep s = read_sweep_text(text, "s.yaml", folder);
  const LayoutSet set = expand_layouts(s);
  std::vector<std::tuple<int, int, int>> want;
  for (int t : {12, 14})
    for (int p = 1; p <= t; ++p)
      if (t % p == 0)
        for (int f = 0; f < p; ++f) want.emplace_back(t, p, f);
  std::vector<std::tuple<int, int, int>> got;
  for (const Layout& l : set.layouts) got.emplace_back(l.shells[0].satellites, l.shells[0].planes, l.shells[0].phasing);
  CHECK(got == want);
  CHECK(want.size() == 52);
  CHECK(set.skipped.total() == 0);
  CHECK(combination_count(s) == 52.0);
}
