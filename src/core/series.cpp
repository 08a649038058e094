// A series' label and its observed (non-missing) values.
#include "gapmark/series.hpp"

#include <algorithm>
#include <cmath>

namespace gapmark {

std::string Series::label() const {
  if (groups.empty()) return name;
  std::string out = name + "[";
  for (std::size_t g = 0; g < groups.size(); ++g) {
    if (g > 0) out += ",";
    out += groups[g].first + "=" + groups[g].second;
  }
  return out + "]";
}

std::size_t Series::observed_count() const { return count_observed(values); }

std::size_t count_observed(std::span<const double> values) {
  return static_cast<std::size_t>(
      std::count_if(values.begin(), values.end(), [](double v) { return !std::isnan(v); }));
}

}  // namespace gapmark
