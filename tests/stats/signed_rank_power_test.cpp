// The fewest pairs at which an exact signed-rank test can reach alpha, by
// hand (the smallest two-sided p with n pairs is 2 / 2^n), and the bound
// checked against the test itself, whose exact p-values agree with
// scipy.stats.wilcoxon on the stored cases of wilcoxon_test.cpp.
#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "gapmark/stats/signed_rank_power.hpp"
#include "gapmark/stats/wilcoxon.hpp"

using namespace gapmark::stats;

TEST_CASE("fewest pairs for the exact signed-rank test, alone and after Holm") {
  CHECK(fewest_signed_rank_pairs(1, 0.05) == 6);   // 2/32 = 0.0625, 2/64 = 0.031
  CHECK(fewest_signed_rank_pairs(6, 0.05) == 8);   // 6 * 2/256 = 0.047
  CHECK(fewest_signed_rank_pairs(36, 0.05) == 11); // 36 * 2/1024 = 0.070, 36 * 2/2048 = 0.035
  CHECK(fewest_signed_rank_pairs(0, 0.05) == 6);   // no test counts as one
  CHECK(fewest_signed_rank_pairs(1, 0.01) == 8);   // 2/128 = 0.0156, 2/256 = 0.0078
  // The bound is what the test itself attains: all differences positive.
  for (std::size_t n : {5u, 6u, 8u}) {
    std::vector<double> d;
    for (std::size_t i = 0; i < n; ++i) d.push_back(1.0 + static_cast<double>(i));
    CHECK(wilcoxon_signed_rank(d).p == doctest::Approx(std::ldexp(2.0, -static_cast<int>(n))));
  }
}
