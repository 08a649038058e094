// Missing not at random (MNAR): the chance that a point is hidden rises
// (direction=high) or falls (direction=low) with its value, like a sensor that
// saturates on peaks or drops out when readings are low.
//
// Each eligible point (observed, before the holdout) gets its empirical
// quantile q among the eligible values: (mid-rank − 1) / (m − 1), so the
// smallest is 0, the largest 1 and tied values share one quantile. Its weight
// is w = exp(strength × q) for high, exp(strength × (1 − q)) for low; the
// heaviest point weighs e^strength times the lightest (about 20 for the
// default 3), and strength=0 is plain uniform sampling.
//
// Exactly target_count points are drawn by weighted sampling without
// replacement, Efraimidis–Spirakis style: each point draws E ~ Exp(1) and the
// points with the smallest E / w are hidden (ties broken by position). Each
// successive pick chooses among the points left with probability ∝ w; so
// when the rate is small the chance of being hidden is close to proportional to
// w, and as the rate grows the heaviest points saturate and it flattens.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "gapmark/mask/scheme.hpp"

namespace gapmark {
namespace {

/// Quantile of each value among `values`: (mid-rank − 1) / (m − 1); 0.5 when m = 1.
std::vector<double> mid_rank_quantiles(const std::vector<double>& values) {
  const std::size_t m = values.size();
  std::vector<std::size_t> order(m);
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
  std::vector<double> q(m, 0.5);
  if (m < 2) return q;
  for (std::size_t i = 0; i < m;) {
    std::size_t j = i;
    while (j + 1 < m && values[order[j + 1]] == values[order[i]]) ++j;
    const double mid_rank0 = 0.5 * static_cast<double>(i + j);  // 0-based mid-rank of the tie group
    for (std::size_t t = i; t <= j; ++t) q[order[t]] = mid_rank0 / static_cast<double>(m - 1);
    i = j + 1;
  }
  return q;
}

class ValueDependentScheme final : public MaskScheme {
public:
  ValueDependentScheme(bool high, double strength) : high_(high), strength_(strength) {}

  Mask draw(const MaskRequest& request, Rng& rng) const override {
    const auto [eligible, limit, target] = draw_basis(request);
    const std::size_t m = eligible.size();
    std::vector<double> values(m);
    for (std::size_t j = 0; j < m; ++j) values[j] = request.values[eligible[j]];
    const auto q = mid_rank_quantiles(values);

    std::vector<std::pair<double, std::size_t>> keys(m);  // (E / w, position)
    for (std::size_t j = 0; j < m; ++j) {
      const double w = std::exp(strength_ * (high_ ? q[j] : 1.0 - q[j]));
      const double e = -std::log1p(-rng.uniform());  // Exp(1); uniform() < 1 keeps it finite
      keys[j] = {e / w, eligible[j]};
    }
    std::nth_element(keys.begin(), keys.begin() + static_cast<std::ptrdiff_t>(target - 1), keys.end());
    Mask mask(request.values.size(), 0);
    for (std::size_t j = 0; j < target; ++j) mask[keys[j].second] = 1;
    return mask;
  }

private:
  bool high_;
  double strength_;
};

const Registration<MaskScheme> registration{{
    .name = "value-dependent",
    .summary = "missing not at random: hides exactly rate × eligible points, favouring high (or low) values",
    .params = {{.name = "direction",
                .type = ParamType::Choice,
                .default_value = "high",
                .choices = {"high", "low"},
                .help = "which values are more likely to be hidden"},
               {.name = "strength",
                .type = ParamType::Real,
                .default_value = "3",
                .min = 0,
                .max = 50,
                .choices = {},
                .help = "weight exp(strength × quantile): the extreme value weighs e^strength times the other "
                        "extreme; 0 = uniform"}},
    .make =
        [](const ParamValues& p) {
          return std::make_unique<ValueDependentScheme>(p.text("direction") == "high", p.real("strength"));
        },
}};

}  // namespace
}  // namespace gapmark
