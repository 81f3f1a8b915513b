#pragma once
// The random numbers of one Monte Carlo sample, derived from (seed, sample index) alone, so a sample draws the
// same numbers whichever thread runs it and in whatever order.
//
// Generator: SplitMix64 (G.L. Steele, D. Lea, C.H. Flood, "Fast splittable pseudorandom number generators",
// OOPSLA 2014): a state advanced by the odd constant 0x9E3779B97F4A7C15 and a 64-bit finaliser (mix64). A
// sample's starting state is mix64(mix64(seed) + index), so neighbouring indices start far apart. The normal
// deviate is Box-Muller from two uniforms (G.E.P. Box, M.E. Muller, Ann. Math. Statist. 29 (1958) 610), written
// out here so the draws do not depend on a standard library's distribution classes.
#include <cmath>
#include <cstdint>

#include "skein/constants.hpp"

namespace skein {

inline std::uint64_t mix64(std::uint64_t z) {
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

class SampleRandom {
 public:
  SampleRandom(std::uint64_t seed, std::uint64_t index) : state_(mix64(mix64(seed) + index)) {}
  std::uint64_t next() {
    state_ += 0x9E3779B97F4A7C15ULL;
    return mix64(state_);
  }
  // Uniform in (0, 1): the top 53 bits, offset by half a unit so neither end is reached.
  double uniform() { return (static_cast<double>(next() >> 11) + 0.5) * 0x1.0p-53; }
  // Standard normal (Box-Muller, the cosine branch; two uniforms per deviate).
  double normal() {
    const double u1 = uniform(), u2 = uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(two_pi * u2);
  }

 private:
  std::uint64_t state_;
};

}  // namespace skein
