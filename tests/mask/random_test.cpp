// The random (MCAR) scheme. Statistical checks use the binomial distribution:
// a count of independent hides with probability p among N points has mean Np
// and variance Np(1 - p) (the binomial variance formula, common statistics).
// Tolerances are 4 standard deviations (common practice, no source); the
// seeds are fixed, so each check passes or fails the same way every run.
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/error.hpp"
#include "mask_test_support.hpp"

using namespace gapmark;
using namespace gapmark::test;

TEST_CASE("random: hides each point with probability = rate (binomial checks)") {
  const auto s = scheme("random");
  const auto values = observed_series(5000);
  const MaskRequest request{.values = values, .rate = 0.1};
  const int draws = 200;
  double total = 0, first_half = 0, sum_sq = 0;
  for (int r = 0; r < draws; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    const auto k = static_cast<double>(hidden_count(mask));
    total += k;
    sum_sq += k * k;
    for (std::size_t i = 0; i < 2500; ++i) first_half += mask[i];
  }
  // Binomial: the pooled count over draws × 5000 points.
  const double n_all = draws * 5000.0;
  CHECK(std::abs(total - 0.1 * n_all) <= 4 * binomial_sd(n_all, 0.1));
  // Binomial: each half of the series gets its share (positions are uniform).
  CHECK(std::abs(first_half - 0.1 * n_all / 2) <= 4 * binomial_sd(n_all / 2, 0.1));
  // The spread of the per-draw count is binomial, not fixed: sample variance
  // over Np(1-p) is near 1 (its sd is about sqrt(2 / (draws - 1)) = 0.1 for
  // normal-like counts; common statistics).
  const double mean = total / draws;
  const double var = (sum_sq - draws * mean * mean) / (draws - 1);
  const double ratio = var / (5000 * 0.1 * 0.9);
  CHECK(ratio > 0.6);
  CHECK(ratio < 1.4);
}

TEST_CASE("random: never hides missing or holdout points; rate is of the eligible points") {
  const auto s = scheme("random");
  const auto values = gappy_series(1000);
  const std::size_t holdout = 100;
  const MaskRequest request{.values = values, .holdout = holdout, .rate = 0.5};
  std::size_t eligible = 0;
  for (std::size_t i = 0; i + holdout < values.size(); ++i) eligible += std::isnan(values[i]) ? 0 : 1;
  const int draws = 50;
  double total = 0;
  for (int r = 0; r < draws; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    REQUIRE(respects_eligibility(mask, values, holdout));
    total += static_cast<double>(hidden_count(mask));
  }
  // Binomial: pooled over draws × eligible points.
  const double n_all = draws * static_cast<double>(eligible);
  CHECK(std::abs(total - 0.5 * n_all) <= 4 * binomial_sd(n_all, 0.5));
}

TEST_CASE("random: same seed gives the same mask, other replicates differ") {
  const auto s = scheme("random");
  const auto values = observed_series(500);
  const MaskRequest request{.values = values, .rate = 0.2};
  CHECK(draw(s, request, replicate_seed(3)) == draw(s, request, replicate_seed(3)));
  CHECK(draw(s, request, replicate_seed(3)) != draw(s, request, replicate_seed(4)));
}

TEST_CASE("random: a draw always hides at least one point") {
  const auto s = scheme("random");
  const std::vector<double> values(10, 1.0);
  const MaskRequest request{.values = values, .rate = 0.01};
  // Without the guard about 90% of these draws (0.99^10) would hide nothing.
  for (int r = 0; r < 100; ++r) CHECK(hidden_count(draw(s, request, replicate_seed(r))) >= 1);
}

TEST_CASE("random: bad rates and empty requests are input errors") {
  const auto s = scheme("random");
  const auto values = observed_series(100);
  for (double rate : {0.0, 1.0, -0.1, 1.5, std::nan("")}) {
    const MaskRequest request{.values = values, .rate = rate, .where = "spec.json: /schemes/0"};
    CHECK_THROWS_WITH_AS(draw(s, request, 1), doctest::Contains("spec.json: /schemes/0: rate"), InputError);
  }
  const std::vector<double> missing(20, kNaN);
  CHECK_THROWS_AS(draw(s, MaskRequest{.values = missing, .rate = 0.1}, 1), InputError);
  CHECK_THROWS_AS(draw(s, MaskRequest{.values = values, .holdout = 100, .rate = 0.1}, 1), InputError);
}
