// The likelihood pass of the local level model takes a scalar path once the
// flat prior is gone; the general matrix step (filter_likelihood_general)
// must give the same bits. The local level's scalar smoother must give the
// general matrix smoother's moments and likelihood (to rounding).
#include <doctest/doctest.h>

#include <cmath>
#include <algorithm>
#include <cstring>
#include <limits>
#include <vector>

#include "gapmark/fill/state_space.hpp"
#include "gapmark/rng.hpp"

namespace ss = gapmark::state_space;

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

bool same_bits(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

/// Random-walk level plus noise, with a share missing at random, a missing
/// stretch in the middle and missing values at both ends (three points
/// always observed).
std::vector<double> invented(std::size_t n, double missing, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  std::vector<double> y(n);
  double level = 5;
  for (std::size_t t = 0; t < n; ++t) {
    level += rng.uniform() - 0.5;
    y[t] = level + 2.0 * (rng.uniform() - 0.5);
    if (rng.bernoulli(missing) && t != 2 && t != n / 3 && t != n - 2) y[t] = kNaN;
  }
  for (std::size_t t = n / 2 + 1; t < n / 2 + n / 10; ++t) y[t] = kNaN;
  y[0] = y[1] = y[n - 1] = kNaN;
  return y;
}

/// Every case the two comparisons below cover: 3 lengths x 3 missing shares x
/// 5 variance pairs (45 cases), the data invented from the length's seed.
template <class Compare>
int for_each_case(Compare compare) {
  int compared = 0;
  for (std::size_t n : {8, 50, 2000})
    for (double missing : {0.0, 0.2, 0.6})
      for (const std::vector<double>& variances :
           {std::vector<double>{1.0, 1.0}, {0.3, 1e-10}, {1e-10, 0.7}, {2.5, 0.01}, {1e-300, 1e-300}}) {
        CAPTURE(n);
        CAPTURE(missing);
        CAPTURE(variances[0]);
        compare(n, invented(n, missing, 17 + n), variances);
        ++compared;
      }
  return compared;
}

}  // namespace

TEST_CASE("local level: the likelihood pass equals the general matrix pass bit for bit") {
  const auto model = ss::StructuralModel::local_level();
  const int compared = for_each_case([&](std::size_t, const std::vector<double>& y,
                                        const std::vector<double>& variances) {
    const ss::LikelihoodParts fast = ss::filter_likelihood(model, y, variances);
    const ss::LikelihoodParts general = ss::filter_likelihood_general(model, y, variances);
    CHECK(fast.observed == general.observed);
    CHECK(fast.diffuse == general.diffuse);
    CHECK(fast.finite == general.finite);
    CHECK(same_bits(fast.sum_v2_over_f, general.sum_v2_over_f));
    CHECK(same_bits(fast.sum_log_f, general.sum_log_f));
    CHECK(same_bits(fast.sum_log_f_inf, general.sum_log_f_inf));
    CHECK(same_bits(fast.concentrated_log_likelihood(), general.concentrated_log_likelihood()));
  });
  CHECK(compared == 45);
}

TEST_CASE("local level: the scalar smoother gives the general smoother's moments and likelihood") {
  // smooth_signal takes the scalar path for the local level; smooth_signal_general
  // runs the matrix filter and smoother (state_space_augmented.cpp) on the same data.
  const auto model = ss::StructuralModel::local_level();
  const int compared = for_each_case([&](std::size_t n, const std::vector<double>& y,
                                        const std::vector<double>& variances) {
    const ss::SmoothedSignal fast = ss::smooth_signal(model, y, variances);
    const ss::SmoothedSignal general = ss::smooth_signal_general(model, y, variances);
    REQUIRE(fast.mean.size() == n);
    REQUIRE(fast.variance.size() == n);
    CHECK(fast.likelihood.observed == general.likelihood.observed);
    CHECK(fast.likelihood.diffuse == general.likelihood.diffuse);
    CHECK(fast.likelihood.effective() == general.likelihood.effective());
    CHECK(fast.likelihood.finite);
    CHECK(fast.likelihood.prior_resolved);
    CHECK(fast.likelihood.sum_v2_over_f ==
          doctest::Approx(general.likelihood.sum_v2_over_f).epsilon(1e-11));
    CHECK(fast.likelihood.sum_log_f - general.likelihood.sum_log_f ==
          doctest::Approx(0.0).scale(1.0).epsilon(1e-9 * (1 + std::abs(general.likelihood.sum_log_f))));
    double worst_mean = 0, worst_variance = 0;
    for (std::size_t t = 0; t < n; ++t) {
      // in smoothed standard deviations, or relative where those vanish (variances 1e-300)
      const double sd = std::sqrt(general.variance[t]) + 1e-6 * (1 + std::abs(general.mean[t]));
      worst_mean = std::max(worst_mean, std::abs(fast.mean[t] - general.mean[t]) / sd);
      worst_variance =
          std::max(worst_variance, std::abs(fast.variance[t] - general.variance[t]) / general.variance[t]);
    }
    CAPTURE(worst_mean);
    CAPTURE(worst_variance);
    CHECK(worst_mean < 1e-7);
    CHECK(worst_variance < 1e-7);  // relative
  });
  CHECK(compared == 45);
}

TEST_CASE("local level: a zero variance F stops the likelihood pass as not finite") {
  // Both variances zero: after the first observation P = 0, so F = 0 at the next one.
  const std::vector<double> y{1.0, 2.0, kNaN, 3.0};
  const auto parts = ss::filter_likelihood(ss::StructuralModel::local_level(), y, std::vector<double>{0.0, 0.0});
  CHECK_FALSE(parts.finite);
  CHECK(parts.observed == 2);
}
