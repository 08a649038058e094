// Point errors on the masked points: MAE, RMSE, bias, and how many points
// were scored. A masked point the method left empty is not scored here; the
// runner counts it as unfilled and marks the trial.
#include <algorithm>
#include <cmath>

#include "gapmark/score/metric.hpp"
#include "gapmark/score/metric_names.hpp"

namespace gapmark {
namespace {

class ErrorMetrics final : public Metric {
public:
  std::vector<MetricColumn> columns() const override {
    return {{metric_names::error::kMae, "value", Direction::Lower, "mean absolute error on the masked points"},
            {metric_names::error::kRmse, "value", Direction::Lower, "root mean squared error on the masked points"},
            {metric_names::error::kBias, "value", Direction::ZeroBest, "mean of filled minus true on the masked points"},
            {metric_names::error::kScored, "count", Direction::None, "masked points that were filled and scored"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    double abs_sum = 0, sq_sum = 0, sum = 0, largest = 0;
    std::size_t n = 0;
    for (std::size_t i = 0; i < in.truth.size(); ++i) {
      if (!(*in.mask)[i] || std::isnan(in.filled[i])) continue;
      const double e = in.filled[i] - in.truth[i];
      abs_sum += std::abs(e);
      sq_sum += e * e;
      sum += e;
      largest = std::max(largest, std::abs(e));
      ++n;
    }
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const double dn = static_cast<double>(n);
    out[0] = n ? abs_sum / dn : nan;
    out[1] = n ? std::sqrt(sq_sum / dn) : nan;
    // Squares of errors beyond ~1e154 overflow and below ~1e-154 lose digits
    // or vanish: there the errors are first multiplied by a power of two
    // that brings the largest near 1 (exact), and the root scaled back.
    if (n && std::isfinite(largest) && largest > 0 && (largest > 1e100 || largest < 1e-100)) {
      const int exponent = std::ilogb(largest);
      double scaled_sq_sum = 0;
      for (std::size_t i = 0; i < in.truth.size(); ++i) {
        if (!(*in.mask)[i] || std::isnan(in.filled[i])) continue;
        const double e = std::ldexp(in.filled[i] - in.truth[i], -exponent);
        scaled_sq_sum += e * e;
      }
      out[1] = std::ldexp(std::sqrt(scaled_sq_sum / dn), exponent);
    }
    out[2] = n ? sum / dn : nan;
    out[3] = dn;
  }
};

const Registration<Metric> registration{{
    .name = "error",
    .summary = "point errors on the masked points: mae, rmse, bias, scored",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<ErrorMetrics>(); },
}};

}  // namespace
}  // namespace gapmark
