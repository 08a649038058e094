// Window mean: each missing point gets the weighted mean of the observed
// values at most k steps before or after it. Weights by distance d (1..k):
//   uniform      1
//   linear       k + 1 - d          (triangular: the nearest counts k times the farthest)
//   exponential  decay^d
// Only originally observed values count, never values filled earlier. A
// missing point with no observed value within k steps is left unfilled (NaN;
// the scorer counts it as unfilled) rather than widening the window. Cost:
// O(n k), with k at most 1000.
#include <cmath>
#include <cstddef>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{};

enum class Weighting { Uniform, Linear, Exponential };

class WindowMean final : public FillMethod {
public:
  WindowMean(std::size_t k, Weighting weighting, double decay) : k_(k), weighting_(weighting), decay_(decay) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const auto& x = request.values;
    const std::size_t n = x.size();
    auto observed = [&](std::size_t i, std::size_t d, bool before) {
      return before ? (d <= i && !std::isnan(x[i - d])) : (i + d < n && !std::isnan(x[i + d]));
    };
    FillResult result;
    result.values.assign(x.begin(), x.end());
    for (std::size_t i = 0; i < n; ++i) {
      if (!std::isnan(x[i])) continue;
      std::size_t nearest = 0;  // distance of the nearest observed neighbour; 0 = none
      for (std::size_t d = 1; d <= k_ && nearest == 0; ++d)
        if (observed(i, d, true) || observed(i, d, false)) nearest = d;
      if (nearest == 0) continue;  // nothing observed within k steps: left unfilled
      double sum = 0.0, weight = 0.0;
      for (std::size_t d = nearest; d <= k_; ++d) {
        const double w = weight_at(d, nearest);
        for (bool before : {true, false})
          if (observed(i, d, before)) { sum += w * x[before ? i - d : i + d]; weight += w; }
      }
      result.values[i] = sum / weight;
    }
    return result;
  }

private:
  /// Weight at distance d, scaled so the nearest observed distance has a
  /// weight of order 1 (exponential weights would otherwise underflow).
  double weight_at(std::size_t d, std::size_t nearest) const {
    switch (weighting_) {
      case Weighting::Linear: return static_cast<double>(k_ + 1 - d);
      case Weighting::Exponential: return std::pow(decay_, static_cast<double>(d - nearest));
      case Weighting::Uniform: break;
    }
    return 1.0;
  }

  std::size_t k_;
  Weighting weighting_;
  double decay_;
};

Weighting parse_weighting(const std::string& name) {
  if (name == "linear") return Weighting::Linear;
  if (name == "exponential") return Weighting::Exponential;
  return Weighting::Uniform;
}

const Registration<FillMethod> registration{{
    .name = "window-mean",
    .summary = "weighted mean of the observed values within k steps on each side (else left empty)",
    .params = {{.name = "k", .type = ParamType::Integer, .default_value = "3", .min = 1, .max = 1000, .choices = {},
                .help = "half-width of the window in steps"},
               {.name = "weights", .type = ParamType::Choice, .default_value = "uniform",
                .choices = {"uniform", "linear", "exponential"},
                .help = "weight by distance d: 1, k+1-d, or decay^d"},
               {.name = "decay", .type = ParamType::Real, .default_value = "0.5", .min = 0.01, .max = 1, .choices = {},
                .help = "ratio of weights one step apart, for weights=exponential"}},
    .needs = kNeeds,
    .make = [](const ParamValues& p) {
      return std::make_unique<WindowMean>(static_cast<std::size_t>(p.integer("k")),
                                          parse_weighting(p.text("weights")), p.real("decay"));
    },
}};

}  // namespace
}  // namespace gapmark
