// Contiguous gaps: blocks of consecutive time steps, like an outage.
//
// A block's length L (in time steps) is geometric on {1, 2, ...} with mean
// `length_mean`, or fixed when `length` > 0. A block starts at an eligible
// point (observed, before the holdout), must end before the holdout, and
// hides the eligible points it covers; already-missing points inside it stay
// missing and do not count. Blocks never overlap and never touch: the step
// before and the step after a block are not hidden by another block, so on a
// fully observed series every run of hidden points is exactly one block.
// Blocks are added until exactly target_count points are hidden; the last
// block is cut short to hit the count.
//
// Placement: the start is uniform over the valid starts for the drawn length.
// A few random tries come first (cheap while there is room); after that every
// valid start is listed. When no start fits the drawn length a new length is
// drawn; after many such failures in a row (or one, for a fixed length) the
// rate cannot be reached and an InputError says so. When room is tight those
// redraws favour short blocks, so at high rates the mean length falls below
// `length_mean`.
#include <cmath>
#include <optional>

#include "gapmark/error.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/number_format.hpp"
#include "block_placement.hpp"

namespace gapmark {
namespace {

constexpr int kRandomTries = 32;          // random starts tried before listing all
constexpr int kMaxLengthFailures = 200;   // consecutive lengths with no room, then give up

class BlocksScheme final : public MaskScheme {
public:
  BlocksScheme(double length_mean, std::size_t length) : length_mean_(length_mean), length_(length) {}

  Mask draw(const MaskRequest& request, Rng& rng) const override {
    const auto [eligible, limit, target] = draw_basis(request);
    Mask mask(request.values.size(), 0);
    const mask::BlockRoom room{request.values, mask, eligible, limit, /*inside_observed=*/false};
    std::size_t hidden = 0;
    int failures = 0;
    while (hidden < target) {
      const std::size_t len = length_ > 0 ? length_ : static_cast<std::size_t>(rng.geometric(length_mean_));
      const auto start =
          len > limit ? std::nullopt : mask::place_block(room, len, kRandomTries, rng);
      if (!start) {
        if (length_ > 0 || ++failures >= kMaxLengthFailures) throw unreachable(request, hidden, target);
        continue;
      }
      failures = 0;
      for (std::size_t i = *start; i < *start + len && hidden < target; ++i) {
        if (std::isnan(request.values[i])) continue;
        mask[i] = 1;
        ++hidden;
      }
    }
    return mask;
  }

private:
  InputError unreachable(const MaskRequest& request, std::size_t hidden, std::size_t target) const {
    const std::string blocks = length_ > 0 ? "blocks of length " + std::to_string(length_)
                                           : "blocks of mean length " + format_double(length_mean_);
    return InputError(request.where, "rate " + format_double(request.rate) + " cannot be reached with " +
                                         blocks + ": no room left after hiding " + std::to_string(hidden) +
                                         " of " + std::to_string(target) +
                                         " points (blocks may not touch); lower the rate or the block length");
  }

  double length_mean_;
  std::size_t length_;
};

const Registration<MaskScheme> registration{{
    .name = "blocks",
    .summary = "contiguous gaps of geometric (or fixed) length at random places, hiding exactly rate × eligible points",
    .params = {{.name = "length_mean",
                .type = ParamType::Real,
                .default_value = "6",
                .min = 1,
                .max = 1e6,
                .choices = {},
                .help = "mean block length in time steps (geometric lengths); ignored when length > 0"},
               {.name = "length",
                .type = ParamType::Integer,
                .default_value = "0",
                .min = 0,
                .max = 1e6,
                .choices = {},
                .help = "fixed block length in time steps; 0 = geometric lengths with mean length_mean"}},
    .make =
        [](const ParamValues& p) {
          return std::make_unique<BlocksScheme>(p.real("length_mean"),
                                                static_cast<std::size_t>(p.integer("length")));
        },
}};

}  // namespace
}  // namespace gapmark
