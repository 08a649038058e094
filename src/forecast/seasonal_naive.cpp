#include "gapmark/forecast/seasonal_naive.hpp"

namespace gapmark::forecast {

std::size_t naive_lag(std::size_t period) { return period < 2 ? 1 : period; }

std::vector<double> seasonal_naive_forecast(std::span<const double> train, std::size_t period,
                                            std::size_t horizon) {
  const std::size_t m = naive_lag(period);
  const std::size_t n = train.size();
  if (n < m) return {};
  std::vector<double> out(horizon);
  // Step h (1-based) repeats the point (h-1) mod m into the last season.
  for (std::size_t h = 0; h < horizon; ++h) out[h] = train[n - m + h % m];
  return out;
}

}  // namespace gapmark::forecast
