// Predictive intervals: for methods that return a variance for each filled
// point, how often the central Gaussian interval at `level` holds the true
// value on the masked points, and the mean CRPS of the Gaussian predictive
// distribution N(filled, variance) there (stats/crps.hpp). A zero variance
// is a point forecast: its CRPS is the absolute error and its interval holds
// only the filled value itself.
//
// Methods without a variance get n/a, never zero. So does a trial where a
// masked point has no finite filled value or no finite, non-negative
// variance, and a trial with no masked point.
#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/score/metric.hpp"
#include "gapmark/score/metric_names.hpp"
#include "gapmark/stats/crps.hpp"

namespace gapmark {
namespace {

class IntervalScore final : public Metric {
public:
  explicit IntervalScore(double level) : level_(level), half_width_(stats::gaussian_central_half_width(level)) {}

  std::vector<MetricColumn> columns() const override {
    return {{metric_names::interval::kCoverage, "probability", Direction::None,
             "share of masked points inside the central predictive interval; best equal to the level"},
            {metric_names::interval::kCoverageError, "probability", Direction::ZeroBest,
             "coverage minus the nominal level: below zero the intervals are too narrow"},
            {metric_names::interval::kCrps, "value", Direction::Lower,
             "mean continuous ranked probability score of the Gaussian predictive distribution"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    std::fill(out.begin(), out.end(), std::numeric_limits<double>::quiet_NaN());
    const std::size_t n = in.truth.size();
    if (in.variance.empty() || in.mask == nullptr || in.variance.size() != n || in.filled.size() != n ||
        in.mask->size() != n || !std::isfinite(half_width_))
      return;
    std::size_t scored = 0, inside = 0;
    double crps_sum = 0;
    for (std::size_t t = 0; t < n; ++t) {
      if (!(*in.mask)[t] || std::isnan(in.truth[t])) continue;
      const double mu = in.filled[t], var = in.variance[t], y = in.truth[t];
      if (!std::isfinite(mu) || !std::isfinite(var) || var < 0) return;
      const double sigma = std::sqrt(var);
      crps_sum += stats::gaussian_crps(mu, sigma, y);
      if (std::abs(y - mu) <= half_width_ * sigma) ++inside;
      ++scored;
    }
    if (scored == 0) return;
    const double dn = static_cast<double>(scored);
    out[0] = static_cast<double>(inside) / dn;
    out[1] = out[0] - level_;
    out[2] = crps_sum / dn;
  }

private:
  double level_;
  double half_width_;
};

const Registration<Metric> registration{{
    .name = "interval",
    .summary = "predictive intervals on the masked points (methods with a variance): coverage, coverage_error, crps",
    .params = {interval_level_param("probability of the central interval")},
    .make = [](const ParamValues& p) { return std::make_unique<IntervalScore>(p.real("level")); },
}};

}  // namespace
}  // namespace gapmark
