// Point errors on the masked points: MAE, RMSE, bias, and how many points
// were scored. A masked point the method left empty is not scored here; the
// runner counts it as unfilled and marks the trial.
#include <cmath>

#include "gapmark/score/metric.hpp"

namespace gapmark {
namespace {

class ErrorMetrics final : public Metric {
public:
  std::vector<MetricColumn> columns() const override {
    return {{"mae", "value", Direction::Lower, "mean absolute error on the masked points"},
            {"rmse", "value", Direction::Lower, "root mean squared error on the masked points"},
            {"bias", "value", Direction::ZeroBest, "mean of filled minus true on the masked points"},
            {"scored", "count", Direction::None, "masked points that were filled and scored"}};
  }

  void compute(const ScoreInput& in, std::span<double> out) const override {
    double abs_sum = 0, sq_sum = 0, sum = 0;
    std::size_t n = 0;
    for (std::size_t i = 0; i < in.truth.size(); ++i) {
      if (!(*in.mask)[i] || std::isnan(in.filled[i])) continue;
      const double e = in.filled[i] - in.truth[i];
      abs_sum += std::abs(e);
      sq_sum += e * e;
      sum += e;
      ++n;
    }
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const double dn = static_cast<double>(n);
    out[0] = n ? abs_sum / dn : nan;
    out[1] = n ? std::sqrt(sq_sum / dn) : nan;
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
