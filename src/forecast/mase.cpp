#include "gapmark/forecast/mase.hpp"

#include <cmath>
#include <limits>

#include "gapmark/forecast/seasonal_naive.hpp"

namespace gapmark::forecast {

namespace {
constexpr double nan = std::numeric_limits<double>::quiet_NaN();
}

double seasonal_naive_scale(std::span<const double> train, std::size_t period) {
  const std::size_t m = naive_lag(period);
  if (train.size() <= m) return nan;
  double sum = 0;
  for (std::size_t t = m; t < train.size(); ++t) sum += std::abs(train[t] - train[t - m]);
  return sum / static_cast<double>(train.size() - m);  // NaN propagates from a NaN in train
}

double mase(std::span<const double> actual, std::span<const double> forecast, double scale) {
  if (actual.size() != forecast.size() || !std::isfinite(scale) || !(scale > 0)) return nan;
  double sum = 0;
  std::size_t n = 0;
  for (std::size_t i = 0; i < actual.size(); ++i) {
    if (std::isnan(actual[i])) continue;
    if (!std::isfinite(forecast[i])) return nan;
    sum += std::abs(actual[i] - forecast[i]);
    ++n;
  }
  return n ? sum / static_cast<double>(n) / scale : nan;
}

}  // namespace gapmark::forecast
