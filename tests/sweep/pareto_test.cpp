// Evidence for lib/skein/sweep/pareto: the non-dominated set, by the definition (Deb 2001, def. 2.5),
// on a hand-worked example and against a brute-force check of the definition on random points.
#include <doctest/doctest.h>

#include <random>
#include <vector>

#include "skein/sweep/pareto.hpp"

using namespace skein;

TEST_CASE("sweep: Pareto front of a hand-worked example") {
  // (satellites, -percent covered), both minimised.
  //  0: (12, -60)  1: (18, -70)  2: (18, -65) dominated by 1   3: (24, -70) dominated by 1
  //  4: (24, -90)  5: (12, -55) dominated by 0   6: (12, -60) equal to 0: neither dominates, both kept
  const std::vector<std::vector<double>> p = {{12, -60}, {18, -70}, {18, -65}, {24, -70}, {24, -90}, {12, -55}, {12, -60}};
  CHECK(pareto_front(p) == std::vector<size_t>{0, 1, 4, 6});
  CHECK(pareto_front({}).empty());
  CHECK(pareto_front({{1, 2, 3}}) == std::vector<size_t>{0});
}

TEST_CASE("sweep: Pareto front equals the brute-force definition on random points") {
  std::mt19937 rng(12345);
  std::uniform_int_distribution<int> d(0, 9);  // small range: many ties
  for (int trial = 0; trial < 20; ++trial) {
    std::vector<std::vector<double>> p(60, std::vector<double>(3));
    for (auto& v : p)
      for (auto& x : v) x = d(rng);
    std::vector<size_t> expected;
    for (size_t i = 0; i < p.size(); ++i) {
      bool dominated = false;
      for (size_t j = 0; j < p.size() && !dominated; ++j) {
        bool no_worse = true, better = false;
        for (size_t k = 0; k < 3; ++k) {
          no_worse = no_worse && p[j][k] <= p[i][k];
          better = better || p[j][k] < p[i][k];
        }
        dominated = no_worse && better;
      }
      if (!dominated) expected.push_back(i);
    }
    CHECK(pareto_front(p) == expected);
  }
}
