// Window mean: each missing point gets the weighted mean of the observed
// values at most `reach` steps before or after it. Weights by distance d
// (1..reach):
//   equal        1
//   triangular   reach + 1 - d      (the nearest counts reach times the farthest)
//   geometric    decay^d
// Only originally observed values count, never values filled earlier. A
// missing point with no observed value within `reach` steps is left unfilled
// (NaN; the scorer counts it as unfilled) rather than widening the window.
// Cost: O(n reach), with reach at most 1000.
#include <cmath>
#include <cstddef>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{};

enum class Weighting { Equal, Triangular, Geometric };

class WindowMean final : public FillMethod {
public:
  WindowMean(std::size_t reach, Weighting weighting, double decay) : reach_(reach), weighting_(weighting), decay_(decay) {}

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
      for (std::size_t d = 1; d <= reach_ && nearest == 0; ++d)
        if (observed(i, d, true) || observed(i, d, false)) nearest = d;
      if (nearest == 0) continue;  // nothing observed within reach: left unfilled
      double sum = 0.0, weight = 0.0;
      for (std::size_t d = nearest; d <= reach_; ++d) {
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
      case Weighting::Triangular: return static_cast<double>(reach_ + 1 - d);
      case Weighting::Geometric: return std::pow(decay_, static_cast<double>(d - nearest));
      case Weighting::Equal: break;
    }
    return 1.0;
  }

  std::size_t reach_;
  Weighting weighting_;
  double decay_;
};

Weighting parse_weighting(const std::string& name) {
  if (name == "triangular") return Weighting::Triangular;
  if (name == "geometric") return Weighting::Geometric;
  return Weighting::Equal;
}

const Registration<FillMethod> registration{{
    .name = "window-mean",
    .summary = "weighted mean of the observed values within `reach` steps on each side (else left empty)",
    .params = {{.name = "reach", .type = ParamType::Integer, .default_value = "3", .min = 1, .max = 1000, .choices = {},
                .help = "how many steps the window reaches on each side of a missing point"},
               {.name = "weights", .type = ParamType::Choice, .default_value = "equal",
                .choices = {"equal", "triangular", "geometric"},
                .help = "weight by distance d: equal (1), triangular (reach+1-d), or geometric (decay^d)"},
               {.name = "decay", .type = ParamType::Real, .default_value = "0.5", .min = 0.01, .max = 1, .choices = {},
                .help = "ratio of weights one step apart, for weights=geometric"}},
    .needs = kNeeds,
    .make = [](const ParamValues& p) {
      return std::make_unique<WindowMean>(static_cast<std::size_t>(p.integer("reach")),
                                          parse_weighting(p.text("weights")), p.real("decay"));
    },
}};

}  // namespace
}  // namespace gapmark
