#include "gapmark/stats/bootstrap.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "gapmark/rng.hpp"

namespace gapmark::stats {

double sorted_quantile(std::span<const double> sorted, double q) {
  if (sorted.empty()) return std::numeric_limits<double>::quiet_NaN();
  const double position = q * static_cast<double>(sorted.size() - 1);
  const auto below = static_cast<std::size_t>(std::floor(position));
  const std::size_t above = std::min(below + 1, sorted.size() - 1);
  const double fraction = position - static_cast<double>(below);
  return sorted[below] + fraction * (sorted[above] - sorted[below]);
}

Interval bootstrap_mean_interval(std::span<const double> x, double level, std::uint64_t seed,
                                 std::size_t resamples) {
  if (!(level > 0 && level < 1)) throw std::invalid_argument("bootstrap_mean_interval: level outside (0, 1)");
  if (resamples == 0) throw std::invalid_argument("bootstrap_mean_interval: no resamples");
  for (double v : x)
    if (std::isnan(v)) throw std::invalid_argument("bootstrap_mean_interval: NaN in input");
  const double nan = std::numeric_limits<double>::quiet_NaN();
  if (x.size() < 2) return {nan, nan};
  Rng rng(seed);
  const std::size_t n = x.size();
  std::vector<double> means(resamples);
  for (auto& m : means) {
    double sum = 0;
    for (std::size_t i = 0; i < n; ++i) sum += x[rng.below(n)];
    m = sum / static_cast<double>(n);
  }
  std::sort(means.begin(), means.end());
  // Guard the ends against rounding in the sums: a mean of values all >= 0
  // stays >= min(x).
  const auto [lo, hi] = std::minmax_element(x.begin(), x.end());
  const double low = std::clamp(sorted_quantile(means, (1 - level) / 2), *lo, *hi);
  const double high = std::clamp(sorted_quantile(means, (1 + level) / 2), *lo, *hi);
  return {low, high};
}

}  // namespace gapmark::stats
