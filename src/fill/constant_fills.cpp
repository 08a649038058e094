// Constant fills: every gap gets one number — zero, or the mean or median of
// the observed values. Zero suits counts and event totals where an absent
// record means nothing happened (common practice).
#include <algorithm>
#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

enum class Constant { Zero, Mean, Median };

class ConstantFill final : public FillMethod {
public:
  explicit ConstantFill(Constant kind) : kind_(kind) {}

  FillResult fill(const FillRequest& request) const override {
    std::vector<double> observed;
    observed.reserve(request.values.size());
    for (double v : request.values)
      if (!std::isnan(v)) observed.push_back(v);
    double value = 0.0;
    if (kind_ != Constant::Zero) {
      if (observed.empty()) throw MethodFailure("no observed values to take a " + name() + " of");
      value = kind_ == Constant::Mean ? mean(observed) : median(observed);
    }
    FillResult result;
    result.values.assign(request.values.begin(), request.values.end());
    for (double& v : result.values)
      if (std::isnan(v)) v = value;
    return result;
  }

private:
  std::string name() const { return kind_ == Constant::Mean ? "mean" : "median"; }

  static double mean(const std::vector<double>& xs) {
    // Two-pass mean: exact for a constant series, safe near the double limits.
    double m = 0;
    for (std::size_t i = 0; i < xs.size(); ++i) m += (xs[i] - m) / static_cast<double>(i + 1);
    return m;
  }

  static double median(std::vector<double> xs) {
    const std::size_t mid = xs.size() / 2;
    std::nth_element(xs.begin(), xs.begin() + static_cast<std::ptrdiff_t>(mid), xs.end());
    const double upper = xs[mid];
    if (xs.size() % 2) return upper;
    const double lower = *std::max_element(xs.begin(), xs.begin() + static_cast<std::ptrdiff_t>(mid));
    return lower + (upper - lower) / 2;
  }

  Constant kind_;
};

const Registration<FillMethod> zero_registration{{
    .name = "zero",
    .summary = "fills every gap with 0 (counts and totals where absence means nothing happened)",
    .params = {},
    .needs = {.min_observed = 0},
    .make = [](const ParamValues&) { return std::make_unique<ConstantFill>(Constant::Zero); },
}};

const Registration<FillMethod> mean_registration{{
    .name = "mean",
    .summary = "fills every gap with the mean of the observed values",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<ConstantFill>(Constant::Mean); },
}};

const Registration<FillMethod> median_registration{{
    .name = "median",
    .summary = "fills every gap with the median of the observed values",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<ConstantFill>(Constant::Median); },
}};

}  // namespace
}  // namespace gapmark
