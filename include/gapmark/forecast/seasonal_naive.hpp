#pragma once
// The seasonal naive forecast: each future point repeats the last observed
// point of the same season,
//   yhat_{n+h} = y_{n+h-m(k+1)},  k = floor((h-1)/m)
// (Hyndman & Athanasopoulos, Forecasting: Principles and Practice, section
// on simple forecasting methods). A period below 2 means no season: the
// naive forecast (repeat the last point, m = 1).
#include <cstddef>
#include <span>
#include <vector>

namespace gapmark::forecast {

/// The season length actually used: `period`, or 1 when period < 2.
std::size_t naive_lag(std::size_t period);

/// Forecasts `horizon` points after `train`. Empty when train holds fewer
/// than one full season (train.size() < naive_lag(period)).
std::vector<double> seasonal_naive_forecast(std::span<const double> train, std::size_t period,
                                            std::size_t horizon);

}  // namespace gapmark::forecast
