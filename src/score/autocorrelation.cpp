// Autocorrelation distortion: how far the filled series' sample ACF moves
// from the complete series' ACF at lags 1..L, and how the fill changes the
// variance.
//
// Points where the complete series has its own gaps are left out of both
// series (set missing in both), so the two ACFs are taken over the same
// points and differ only through the values at the masked points. The
// estimator skips missing points pairwise (see stats/acf.hpp). The whole
// series is used, holdout included: the holdout is never masked, so it is
// the same in both. A masked point the method left empty makes every column
// n/a: a partial fill has no ACF to compare.
#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/score/metric.hpp"
#include "gapmark/score/metric_names.hpp"
#include "gapmark/stats/acf.hpp"

namespace gapmark {
namespace {

constexpr std::size_t lags_without_period = 24;

class AutocorrelationDistortion final : public Metric {
public:
  explicit AutocorrelationDistortion(std::size_t lags) : lags_(lags) {}

  std::vector<MetricColumn> columns() const override {
    return {{metric_names::acf::kRms, "correlation", Direction::Lower,
             "root mean square of filled minus complete autocorrelation over lags 1..L"},
            {metric_names::acf::kMax, "correlation", Direction::Lower,
             "largest absolute difference of filled and complete autocorrelation over lags 1..L"},
            {metric_names::acf::kVarRatio, "ratio", Direction::OneBest,
             "variance of the filled series over that of the complete series"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    std::fill(out.begin(), out.end(), std::numeric_limits<double>::quiet_NaN());
    const std::size_t n = in.truth.size();
    if (in.filled.size() != n || n < 3) return;

    std::vector<double> complete(in.truth.begin(), in.truth.end());
    std::vector<double> filled(n);
    for (std::size_t t = 0; t < n; ++t) {
      if (std::isnan(complete[t])) {
        filled[t] = complete[t];
        continue;
      }
      if (!std::isfinite(in.filled[t])) return;  // left unfilled
      filled[t] = in.filled[t];
    }
    // Products of values beyond ~1e154 overflow and below ~1e-154 vanish.
    // Neither the ACF nor the variance ratio depends on the unit, so such
    // series are first multiplied by a power of two (exact) that brings the
    // largest magnitude near 1.
    double magnitude = 0;
    for (std::size_t t = 0; t < n; ++t)
      if (!std::isnan(complete[t])) magnitude = std::max({magnitude, std::abs(complete[t]), std::abs(filled[t])});
    if (magnitude > 1e100 || (magnitude > 0 && magnitude < 1e-100)) {
      const int exponent = std::ilogb(magnitude);
      for (std::size_t t = 0; t < n; ++t) {
        complete[t] = std::ldexp(complete[t], -exponent);
        filled[t] = std::ldexp(filled[t], -exponent);
      }
    }

    std::size_t lags = lags_ ? lags_ : (in.period >= 2 ? 2 * in.period : lags_without_period);
    lags = std::min(lags, n - 1);
    const auto cov_complete = stats::sample_autocovariance(complete, lags);
    const auto cov_filled = stats::sample_autocovariance(filled, lags);
    const double c0 = cov_complete[0], f0 = cov_filled[0];
    if (!(c0 > 0) || !std::isfinite(c0) || !std::isfinite(f0)) return;

    out[2] = f0 / c0;
    if (!(f0 > 0)) return;  // a constant fill has no autocorrelation
    double sq = 0, largest = 0;
    for (std::size_t k = 1; k <= lags; ++k) {
      const double d = cov_filled[k] / f0 - cov_complete[k] / c0;
      sq += d * d;
      largest = std::max(largest, std::abs(d));
    }
    out[0] = std::sqrt(sq / static_cast<double>(lags));
    out[1] = largest;
  }

private:
  std::size_t lags_;
};

const Registration<Metric> registration{{
    .name = metric_names::acf::kName,
    .summary = "autocorrelation distortion at lags 1..L: acf_rms, acf_max, var_ratio",
    .params = {{.name = metric_names::acf::kLags,
                .type = ParamType::Integer,
                .default_value = "0",
                .min = 0,
                .max = 100000,
                .choices = {},
                .help = "largest lag L; 0 = twice the period, or 24 without a period"}},
    .make = [](const ParamValues& p) {
      return std::make_unique<AutocorrelationDistortion>(static_cast<std::size_t>(p.integer(metric_names::acf::kLags)));
    },
}};

}  // namespace
}  // namespace gapmark
