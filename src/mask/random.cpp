// Missing completely at random (MCAR): every eligible point (observed and
// before the holdout) is hidden on its own with probability `rate`, so the
// number hidden is binomial with mean rate × eligible. If a draw hides
// nothing at all (possible on short series at low rates), one eligible point
// chosen uniformly is hidden, so every trial has something to score.
#include "gapmark/mask/scheme.hpp"

namespace gapmark {
namespace {

class RandomScheme final : public MaskScheme {
public:
  Mask draw(const MaskRequest& request, Rng& rng) const override {
    const auto eligible = draw_basis(request).eligible;
    Mask mask(request.values.size(), 0);
    std::size_t hidden = 0;
    for (std::size_t i : eligible) {
      if (rng.bernoulli(request.rate)) {
        mask[i] = 1;
        ++hidden;
      }
    }
    if (hidden == 0) mask[eligible[rng.below(eligible.size())]] = 1;
    return mask;
  }
};

const Registration<MaskScheme> registration{{
    .name = "random",
    .summary = "hides each observed point independently with probability = rate (MCAR)",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<RandomScheme>(); },
}};

}  // namespace
}  // namespace gapmark
