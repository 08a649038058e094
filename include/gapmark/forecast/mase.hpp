#pragma once
// Mean absolute scaled error (Hyndman & Koehler 2006, "Another look at
// measures of forecast accuracy", Int. J. Forecasting 22, 679-688): each
// forecast error is divided by the in-sample mean absolute error of a
// benchmark forecast on the training series, here the seasonal naive one,
//   scale = (1/(n-m)) * sum_{t=m}^{n-1} |y_t - y_{t-m}|   (0-based t),
//   MASE  = mean_h |y_{n+h} - yhat_{n+h}| / scale.
// The seasonal form of the scale is the one given by Hyndman & Athanasopoulos
// (Forecasting: Principles and Practice); m = 1 gives the paper's naive scale.
#include <cstddef>
#include <span>

namespace gapmark::forecast {

/// In-sample MAE of the seasonal naive forecast with lag naive_lag(period).
/// NaN when train has no more than m points or holds a NaN.
double seasonal_naive_scale(std::span<const double> train, std::size_t period);

/// MASE of `forecast` against `actual` (same length) with the given scale.
/// Pairs whose actual value is NaN are skipped (a real gap in the truth).
/// NaN when no pair is left, a forecast is not finite, or scale is not a
/// positive finite number.
double mase(std::span<const double> actual, std::span<const double> forecast, double scale);

}  // namespace gapmark::forecast
