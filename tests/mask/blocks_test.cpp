// The blocks scheme: exact counts, block lengths, no touching, eligibility,
// determinism and the unreachable-rate guard. Length checks use the
// geometric distribution on {1, 2, ...} with p = 1 / mean: P(L = 1) = p and
// Var(L) = (1 - p) / p^2 = mean (mean - 1) (common statistics). Tolerances are
// 4 standard deviations (common practice, no source) plus a stated bound on
// the one bias the scheme has by design (the last block of a draw is cut
// short to hit the count exactly).
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/error.hpp"
#include "mask_test_support.hpp"

using namespace gapmark;
using namespace gapmark::test;

TEST_CASE("blocks: hides exactly round(rate × eligible) points") {
  const auto s = scheme("blocks");
  for (const auto& values : {observed_series(2000), gappy_series(2000)}) {
    for (double rate : {0.01, 0.05, 0.2, 0.5}) {
      for (std::size_t holdout : {std::size_t{0}, std::size_t{200}}) {
        const MaskRequest request{.values = values, .holdout = holdout, .rate = rate};
        std::size_t eligible = 0;
        for (std::size_t i = 0; i + holdout < values.size(); ++i) eligible += std::isnan(values[i]) ? 0 : 1;
        const auto expected = static_cast<std::size_t>(std::llround(rate * static_cast<double>(eligible)));
        for (int r = 0; r < 5; ++r) {
          const Mask mask = draw(s, request, replicate_seed(r));
          CHECK(hidden_count(mask) == expected);
          CHECK(respects_eligibility(mask, values, holdout));
        }
      }
    }
  }
}

TEST_CASE("blocks: geometric lengths have the configured mean") {
  // On a fully observed series blocks never touch, so each run of hidden
  // points is one block. Rate 5% leaves ample room, so no length is redrawn.
  const auto s = scheme("blocks:length_mean=6");
  const auto values = observed_series(20000);
  const MaskRequest request{.values = values, .rate = 0.05};
  const int draws = 50;
  double sum = 0, ones = 0, count = 0;
  for (int r = 0; r < draws; ++r) {
    for (std::size_t len : hidden_runs(draw(s, request, replicate_seed(r)))) {
      sum += static_cast<double>(len);
      ones += len == 1 ? 1 : 0;
      count += 1;
    }
  }
  REQUIRE(count > 5000);
  const double mean = 6, p = 1 / mean;
  // Truncating the last block of each draw lowers the mean by at most
  // mean × draws / count (it loses less than a whole block per draw).
  const double truncation = mean * draws / count;
  const double sd_mean = std::sqrt(mean * (mean - 1) / count);
  CHECK(sum / count <= mean + 4 * sd_mean);
  CHECK(sum / count >= mean - 4 * sd_mean - truncation);
  // Binomial on the share of length-1 blocks: P(L = 1) = p.
  CHECK(std::abs(ones / count - p) <= 4 * binomial_sd(count, p) / count + draws / count);
}

TEST_CASE("blocks: fixed length gives blocks of that length, one short block at most") {
  const auto s = scheme("blocks:length=10");
  const auto values = observed_series(2000);
  const MaskRequest request{.values = values, .rate = 0.23};  // 460 points: 46 whole blocks
  const MaskRequest odd{.values = values, .rate = 0.2315};    // 463 points: 46 blocks and one of 3
  for (int r = 0; r < 20; ++r) {
    const auto runs = hidden_runs(draw(s, request, replicate_seed(r)));
    CHECK(runs.size() == 46);
    for (auto len : runs) CHECK(len == 10);
    const auto odd_runs = hidden_runs(draw(s, odd, replicate_seed(r)));
    CHECK(odd_runs.size() == 47);
    std::size_t short_ones = 0;
    for (auto len : odd_runs) short_ones += len == 10 ? 0 : 1;
    CHECK(short_ones == 1);
  }
}

TEST_CASE("blocks: a block spans existing gaps without counting them") {
  // Every other point missing: a block of 4 steps hides 2 observed points.
  std::vector<double> values(400);
  for (std::size_t i = 0; i < values.size(); ++i) values[i] = i % 2 ? kNaN : double(i);
  const auto s = scheme("blocks:length=4");
  const MaskRequest request{.values = values, .rate = 0.1};  // 20 of 200 eligible
  for (int r = 0; r < 10; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    CHECK(hidden_count(mask) == 20);
    CHECK(respects_eligibility(mask, values, 0));
  }
}

TEST_CASE("blocks: same seed gives the same mask, other replicates differ") {
  const auto s = scheme("blocks:length_mean=8");
  const auto values = gappy_series(1000);
  const MaskRequest request{.values = values, .holdout = 50, .rate = 0.2};
  CHECK(draw(s, request, replicate_seed(1)) == draw(s, request, replicate_seed(1)));
  CHECK(draw(s, request, replicate_seed(1)) != draw(s, request, replicate_seed(2)));
}

TEST_CASE("blocks: a rate that cannot be reached is an input error, not an endless loop") {
  const auto values = observed_series(500);
  // Blocks may not touch, so at least one visible step separates any two.
  CHECK_THROWS_WITH_AS(draw(scheme("blocks:length=24"),
                            MaskRequest{.values = values, .rate = 0.95, .where = "demo.json: /schemes/1"}, 1),
                       doctest::Contains("demo.json: /schemes/1: rate 0.95 cannot be reached with blocks of length 24"),
                       InputError);
  CHECK_THROWS_WITH_AS(draw(scheme("blocks:length_mean=24"), MaskRequest{.values = values, .rate = 0.99}, 1),
                       doctest::Contains("cannot be reached with blocks of mean length 24"), InputError);
  // A block longer than the room before the holdout never fits.
  CHECK_THROWS_AS(draw(scheme("blocks:length=60"), MaskRequest{.values = values, .holdout = 450, .rate = 0.1}, 1),
                  InputError);
}

TEST_CASE("blocks: parameters are checked") {
  CHECK_THROWS_AS(scheme("blocks:length_mean=0.5"), InputError);
  CHECK_THROWS_AS(scheme("blocks:length=-1"), InputError);
  CHECK_THROWS_AS(scheme("blocks:size=3"), InputError);
  CHECK(scheme("blocks:length_mean=12").label == "blocks:length_mean=12");
}
