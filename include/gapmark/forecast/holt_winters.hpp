#pragma once
// Additive Holt-Winters: level, additive trend and additive season of period
// m >= 2, in the error-correction form of Hyndman et al. (Forecasting with
// Exponential Smoothing, 2008, ETS(A,A,A)):
//   yhat_t = l_{t-1} + b_{t-1} + s_{t-m}                      (one step ahead)
//   l_t = alpha (y_t - s_{t-m}) + (1 - alpha)(l_{t-1} + b_{t-1})
//   b_t = beta (l_t - l_{t-1}) + (1 - beta) b_{t-1}
//   s_t = gamma (y_t - l_{t-1} - b_{t-1}) + (1 - gamma) s_{t-m}
//   yhat_{n+h} = l_n + h b_n + s_{n+h-m(k+1)},  k = floor((h-1)/m).
// Initial states by the simple heuristic of Hyndman & Athanasopoulos
// (Forecasting: Principles and Practice, 1st ed., section 7.6), which needs
// two full seasons:
//   l_0 = mean of the first season,
//   b_0 = (mean of the second season - mean of the first) / m,
//   s_{j-m} = y_j - l_0 for j = 0 .. m-1 (0-based).
// The smoothing parameters, each in [0, 1], minimise the sum of squared
// one-step errors (NLopt, BOBYQA, started from the best point of a small
// fixed grid, so the fit is deterministic). Every step is O(n).
#include <cstddef>
#include <optional>
#include <span>
#include <vector>

namespace gapmark::forecast {

struct HoltWintersSmoothing {
  double alpha = 0;  ///< level
  double beta = 0;   ///< trend
  double gamma = 0;  ///< season
};

/// The state after some point t: level l_t, trend b_t, and the seasonal
/// terms in the order they will be used: season[k] serves step t+1+k.
struct HoltWintersState {
  double level = 0;
  double trend = 0;
  std::vector<double> season;
};

struct HoltWintersRun {
  std::vector<double> fitted;  ///< one-step-ahead value for each point
  double sse = 0;              ///< sum of squared one-step errors
  HoltWintersState final_state;
};

struct HoltWintersModel {
  HoltWintersSmoothing smoothing;
  HoltWintersState initial;
  HoltWintersRun run;
};

/// The heuristic initial state; nullopt when period < 2, y holds fewer than
/// two full seasons, or a value among the first two seasons is not finite.
std::optional<HoltWintersState> holt_winters_initial_state(std::span<const double> y,
                                                           std::size_t period);

/// Runs the recursions over y from `initial` (season length = initial.season.size()).
HoltWintersRun holt_winters_filter(std::span<const double> y, const HoltWintersSmoothing& smoothing,
                                   const HoltWintersState& initial);

/// Forecasts `horizon` points after the point that `state` follows.
std::vector<double> holt_winters_forecast(const HoltWintersState& state, std::size_t horizon);

/// Fits the smoothing parameters to y from the heuristic initial state.
/// nullopt when the initial state cannot be formed, y holds a non-finite
/// value, or the optimiser finds no finite fit. Never throws for numerical
/// trouble.
std::optional<HoltWintersModel> holt_winters_fit(std::span<const double> y, std::size_t period);

}  // namespace gapmark::forecast
