// Seasonal mean: each missing point gets the mean (or median) of the observed
// values at the same phase, phase = index mod period. A phase with no observed
// value falls back to the same statistic over all observed values. Cost: O(n)
// (medians by selection).
#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.period = true};

/// Mean or median of a non-empty sample; reorders it.
double statistic(std::vector<double>& sample, bool median) {
  if (!median) {
    double sum = 0.0;
    for (double v : sample) sum += v;
    return sum / static_cast<double>(sample.size());
  }
  const std::size_t mid = sample.size() / 2;
  std::nth_element(sample.begin(), sample.begin() + static_cast<std::ptrdiff_t>(mid), sample.end());
  const double upper = sample[mid];
  if (sample.size() % 2 == 1) return upper;
  const double lower = *std::max_element(sample.begin(), sample.begin() + static_cast<std::ptrdiff_t>(mid));
  return lower + (upper - lower) / 2.0;
}

class SeasonalMean final : public FillMethod {
public:
  explicit SeasonalMean(bool median) : median_(median) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const auto& x = request.values;
    const std::size_t p = request.period;
    std::vector<std::vector<double>> by_phase(p);
    std::vector<double> all;
    for (std::size_t i = 0; i < x.size(); ++i)
      if (!std::isnan(x[i])) { by_phase[i % p].push_back(x[i]); all.push_back(x[i]); }
    const double overall = statistic(all, median_);
    std::vector<double> level(p);
    for (std::size_t r = 0; r < p; ++r) level[r] = by_phase[r].empty() ? overall : statistic(by_phase[r], median_);
    FillResult result;
    result.values.assign(x.begin(), x.end());
    for (std::size_t i = 0; i < x.size(); ++i)
      if (std::isnan(x[i])) result.values[i] = level[i % p];
    return result;
  }

private:
  bool median_;
};

const Registration<FillMethod> registration{{
    .name = "seasonal-mean",
    .summary = "mean (or median) of the observed values at the same phase of the period",
    .params = {{.name = "statistic", .type = ParamType::Choice, .default_value = "mean",
                .choices = {"mean", "median"},
                .help = "what summarises a phase; an empty phase takes it over all observed values"}},
    .needs = kNeeds,
    .make = [](const ParamValues& p) { return std::make_unique<SeasonalMean>(p.text("statistic") == "median"); },
}};

}  // namespace
}  // namespace gapmark
