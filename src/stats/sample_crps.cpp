// Sample CRPS and central intervals of draws (see sample_crps.hpp).
#include "gapmark/stats/sample_crps.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "gapmark/stats/bootstrap.hpp"

namespace gapmark::stats {

double sorted_sample_crps(std::span<const double> sorted, double y) {
  const std::size_t m = sorted.size();
  if (m == 0 || !std::isfinite(y)) return std::numeric_limits<double>::quiet_NaN();
  double to_outcome = 0, spread = 0;
  for (std::size_t i = 0; i < m; ++i) {
    if (!std::isfinite(sorted[i])) return std::numeric_limits<double>::quiet_NaN();
    to_outcome += std::abs(sorted[i] - y);
    spread += (2.0 * static_cast<double>(i + 1) - static_cast<double>(m) - 1.0) * sorted[i];
  }
  const double dm = static_cast<double>(m);
  return to_outcome / dm - spread / (dm * dm);  // (1/(2M^2)) * 2 * sum (2i - M - 1) x_(i)
}

double sample_crps(std::span<const double> draws, double y) {
  std::vector<double> sorted(draws.begin(), draws.end());
  std::sort(sorted.begin(), sorted.end());
  return sorted_sample_crps(sorted, y);
}

SampleInterval sorted_central_interval(std::span<const double> sorted, double level) {
  return {sorted_quantile(sorted, (1 - level) / 2), sorted_quantile(sorted, (1 + level) / 2)};
}

}  // namespace gapmark::stats
