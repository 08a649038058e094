#include "gapmark/fill/seasonal_decomposition.hpp"

#include <cmath>
#include <limits>
#include <string>

#include "gapmark/error.hpp"

namespace gapmark {

SeasonalDecomposition classical_decomposition(std::span<const double> series, std::size_t period,
                                              std::span<const bool> stand_in) {
  const std::size_t n = series.size(), p = period;
  if (p < 2) throw MethodFailure("seasonal decomposition needs a period of at least 2");
  if (n < 2 * p)
    throw MethodFailure("seasonal decomposition needs at least two full periods (period " + std::to_string(p) +
                        ", " + std::to_string(n) + " points)");
  const bool flagged = !stand_in.empty();

  // Prefix sums (extended precision) give every window sum in O(1).
  std::vector<long double> sum(n + 1, 0.0L);
  std::vector<std::size_t> stand_ins(n + 1, 0);
  for (std::size_t i = 0; i < n; ++i) {
    sum[i + 1] = sum[i] + static_cast<long double>(series[i]);
    stand_ins[i + 1] = stand_ins[i] + (flagged && stand_in[i] ? 1 : 0);
  }
  const std::size_t half = p / 2;  // even p: p + 1 points, ends at half weight; odd p: p points
  const bool even = p % 2 == 0;

  SeasonalDecomposition out;
  out.trend.assign(n, std::numeric_limits<double>::quiet_NaN());
  for (std::size_t t = half; t + half < n; ++t) {
    long double s = sum[t + half + 1] - sum[t - half];
    if (even) s -= 0.5L * (static_cast<long double>(series[t - half]) + static_cast<long double>(series[t + half]));
    out.trend[t] = static_cast<double>(s / static_cast<long double>(p));
  }

  // Phase means of the detrended values: clean windows first, all as fallback.
  std::vector<double> clean_sum(p, 0.0), all_sum(p, 0.0);
  std::vector<std::size_t> clean_count(p, 0), all_count(p, 0);
  for (std::size_t t = half; t + half < n; ++t) {
    const double d = series[t] - out.trend[t];
    all_sum[t % p] += d;
    ++all_count[t % p];
    if (stand_ins[t + half + 1] == stand_ins[t - half]) {
      clean_sum[t % p] += d;
      ++clean_count[t % p];
    }
  }
  std::vector<double> phase(p);
  double centre = 0.0;
  for (std::size_t r = 0; r < p; ++r) {
    phase[r] = clean_count[r] > 0 ? clean_sum[r] / static_cast<double>(clean_count[r])
                                  : all_sum[r] / static_cast<double>(all_count[r]);
    centre += phase[r];
  }
  centre /= static_cast<double>(p);
  for (double& v : phase) v -= centre;

  out.seasonal.resize(n);
  for (std::size_t t = 0; t < n; ++t) out.seasonal[t] = phase[t % p];
  return out;
}

}  // namespace gapmark
