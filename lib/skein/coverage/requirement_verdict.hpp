#pragma once
// The verdict of a coverage result against a requirement (judged in requirement_check.hpp).
#include <string>
#include <vector>

#include "skein/design/requirement.hpp"

namespace skein {

struct ThresholdVerdict {
  Threshold threshold;
  // The figure compared with the threshold: the whole-grid figure, or with every_site (for a figure with a
  // per-site value) the worst site's value.
  double value = 0.0;
  bool met = false;
  bool per_site = false;                   // judged site by site
  std::vector<std::string> failing_sites;  // per_site: the sites that fail, in grid order
};

struct RequirementVerdict {
  int fold = 1;
  bool every_site = false;
  bool met = false;                        // every threshold met
  std::vector<ThresholdVerdict> checks;    // in the requirement's order
  std::vector<std::string> failing_sites;  // every_site: the sites failing any threshold, in grid order
};

}  // namespace skein
