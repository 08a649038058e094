// Forecast effect: does the fill change how well the series can be forecast?
// The last `holdout` points are never masked. The forecaster is fitted twice
// on the training part (all but the holdout), once on the filled series and
// once on the complete series, and each forecasts the first `horizon` points
// of the holdout. Both are scored by MASE with ONE scale: the in-sample
// seasonal naive MAE of the complete training series, so the two numbers and
// their difference are on the same footing.
//
// Where the complete series has its own gaps (points nobody knows), both
// training parts get the same stand-in values there: linear interpolation
// between the nearest observed neighbours, the nearest observed value at the
// ends. The method's own guesses at those points are not used, so the two
// fits differ only at the masked points, mase_complete is the same for every
// method of a trial, and a perfect fill costs exactly 0. Holdout points
// missing in the complete series are skipped when scoring.
//
// Not applicable (NaN, never an error): no holdout, a training part shorter
// than two seasons (two points without a period), a filled training part
// with points left empty, holt-winters without a period of at least 2, a
// zero scale (a training part that repeats exactly), or a failed fit.
#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "gapmark/forecast/holt_winters.hpp"
#include "gapmark/forecast/mase.hpp"
#include "gapmark/forecast/seasonal_naive.hpp"
#include "gapmark/score/metric.hpp"
#include "gapmark/score/metric_names.hpp"

namespace gapmark {
namespace {

enum class Model { SeasonalNaive, HoltWinters };

/// Positions of the NaNs in `x`, and `x` with them replaced by linear
/// interpolation (nearest observed value beyond the first or last observed
/// point). False when nothing in `x` is observed.
bool bridge_gaps(std::vector<double>& x, std::vector<std::size_t>& gaps) {
  gaps.clear();
  std::size_t last = x.size();  // last observed position seen, x.size() = none yet
  for (std::size_t t = 0; t < x.size(); ++t) {
    if (std::isnan(x[t])) {
      gaps.push_back(t);
      continue;
    }
    const std::size_t from = last == x.size() ? 0 : last + 1;
    for (std::size_t g = from; g < t; ++g)
      x[g] = last == x.size() ? x[t] : x[last] + (x[t] - x[last]) * double(g - last) / double(t - last);
    last = t;
  }
  if (last == x.size()) return false;
  for (std::size_t g = last + 1; g < x.size(); ++g) x[g] = x[last];
  return true;
}

std::vector<double> forecast_with(Model model, std::span<const double> train, std::size_t period,
                                  std::size_t horizon) {
  if (model == Model::SeasonalNaive) return forecast::seasonal_naive_forecast(train, period, horizon);
  const auto fit = forecast::holt_winters_fit(train, period);
  if (!fit) return {};
  return forecast::holt_winters_forecast(fit->run.final_state, horizon);
}

class ForecastEffect final : public Metric {
public:
  ForecastEffect(Model model, std::size_t horizon) : model_(model), horizon_(horizon) {}

  std::vector<MetricColumn> columns() const override {
    return {{metric_names::forecast::kMaseFilled, "scaled error", Direction::Lower,
             "MASE on the holdout of the forecaster trained on the filled series"},
            {metric_names::forecast::kMaseComplete, "scaled error", Direction::Lower,
             "MASE on the holdout of the forecaster trained on the complete series"},
            {metric_names::forecast::kMaseCost, "scaled error", Direction::Lower,
             "mase_filled minus mase_complete: positive when the fill hurt the forecast"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    std::fill(out.begin(), out.end(), std::numeric_limits<double>::quiet_NaN());
    const std::size_t n = in.truth.size();
    if (in.filled.size() != n || in.holdout == 0 || in.holdout >= n) return;
    const std::size_t train_n = n - in.holdout;
    const std::size_t m = forecast::naive_lag(in.period);
    if (model_ == Model::HoltWinters && in.period < 2) return;
    if (train_n < 2 * m) return;

    std::vector<double> complete(in.truth.begin(), in.truth.begin() + static_cast<std::ptrdiff_t>(train_n));
    std::vector<std::size_t> own_gaps;
    if (!bridge_gaps(complete, own_gaps)) return;
    std::vector<double> filled(in.filled.begin(), in.filled.begin() + static_cast<std::ptrdiff_t>(train_n));
    for (std::size_t t : own_gaps) filled[t] = complete[t];
    for (double v : filled)
      if (!std::isfinite(v)) return;  // a masked point left unfilled

    const std::size_t horizon = horizon_ ? std::min(horizon_, in.holdout) : in.holdout;
    std::vector<double> actual(in.truth.begin() + static_cast<std::ptrdiff_t>(train_n),
                               in.truth.begin() + static_cast<std::ptrdiff_t>(train_n + horizon));
    // Squares of values beyond ~1e154 overflow in the fit and below ~1e-154
    // vanish. MASE does not depend on the unit, so such series are first
    // multiplied by a power of two (exact) that brings the largest magnitude
    // near 1.
    double largest = 0;
    for (const auto* part : {&complete, &filled, &actual})
      for (double v : *part)
        if (std::isfinite(v)) largest = std::max(largest, std::abs(v));
    if (largest > 1e100 || (largest > 0 && largest < 1e-100)) {
      const int exponent = std::ilogb(largest);
      for (auto* part : {&complete, &filled, &actual})
        for (double& v : *part) v = std::ldexp(v, -exponent);
    }
    const double scale = forecast::seasonal_naive_scale(complete, in.period);

    const auto from_filled = forecast_with(model_, filled, in.period, horizon);
    const auto from_complete = forecast_with(model_, complete, in.period, horizon);
    if (from_filled.size() == horizon) out[0] = forecast::mase(actual, from_filled, scale);
    if (from_complete.size() == horizon) out[1] = forecast::mase(actual, from_complete, scale);
    out[2] = out[0] - out[1];  // NaN when either is
  }

private:
  Model model_;
  std::size_t horizon_;
};

const Registration<Metric> registration{{
    .name = metric_names::forecast::kName,
    .summary = "forecast effect on the holdout: mase_filled, mase_complete, mase_cost",
    .params = {{.name = metric_names::forecast::kModel,
                .type = ParamType::Choice,
                .default_value = metric_names::forecast::kHoltWinters,
                .min = 0,
                .max = 0,
                .choices = {metric_names::forecast::kHoltWinters, metric_names::forecast::kSeasonalNaive},
                .help = "forecaster: additive Holt-Winters (needs a period) or seasonal naive"},
               {.name = "horizon",
                .type = ParamType::Integer,
                .default_value = "0",
                .min = 0,
                .max = 1e9,
                .choices = {},
                .help = "points forecast, at most the holdout; 0 = the whole holdout"}},
    .make = [](const ParamValues& p) {
      const Model model = p.text(metric_names::forecast::kModel) == metric_names::forecast::kSeasonalNaive ? Model::SeasonalNaive : Model::HoltWinters;
      return std::make_unique<ForecastEffect>(model, static_cast<std::size_t>(p.integer("horizon")));
    },
}};

}  // namespace
}  // namespace gapmark
