// The value-dependent (MNAR) scheme. Reference for the skew: when the share
// hidden is small, weighted sampling without replacement picks each point
// with probability close to proportional to its weight, so with weights
// exp(s q) and quantiles q spread evenly on [0, 1] the share of hidden points
// whose quantile lies in [a, b] is (e^{s b} - e^{s a}) / (e^s - 1) (the
// integral of the weight; calculus). The chance of being picked is about
// 1 - exp(-t w) with t near k / sum(w) (k points hidden), so the relative
// departure from proportional is below k w_max / sum(w): 1.3% for s = 3,
// 2.4% for s = 6 here. The shares are counted over many independent draws;
// their spread is at most binomial (the variance formula Np(1 - p), common
// statistics; sampling without replacement only narrows it). Tolerances are
// 4 standard deviations (common practice, no source) plus that bound.
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/error.hpp"
#include "mask_test_support.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

struct Shares {
  double top = 0, bottom = 0, hidden = 0;
};

/// Shares of hidden points in the top and bottom quartiles of the values
/// 0..m-1 (observed_series), pooled over `draws` replicates.
Shares quartile_shares(const Bound<MaskScheme>& s, std::size_t m, double rate, int draws) {
  const auto values = observed_series(m);
  const MaskRequest request{.values = values, .rate = rate};
  Shares out;
  for (int r = 0; r < draws; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    for (std::size_t i = 0; i < m; ++i) {
      if (!mask[i]) continue;
      const double q = values[i] / static_cast<double>(m - 1);
      out.hidden += 1;
      out.top += q >= 0.75 ? 1 : 0;
      out.bottom += q < 0.25 ? 1 : 0;
    }
  }
  out.top /= out.hidden;
  out.bottom /= out.hidden;
  return out;
}

double share(double s, double a, double b) { return (std::exp(s * b) - std::exp(s * a)) / (std::exp(s) - 1); }

constexpr std::size_t kSize = 5000;  // values 0..kSize-1
constexpr double kRate = 0.004;      // 20 hidden per draw
constexpr int kDraws = 500;

/// 4 binomial sd of a share p over n hidden points, plus the bound on the
/// departure from proportional sampling for strength s: k w_max / sum(w),
/// with sum(w) = m (e^s - 1) / s for evenly spread quantiles.
double tolerance(double p, double n, double s) {
  const double k = kRate * kSize;
  const double bound = s == 0 ? k / kSize : k * std::exp(s) * s / (kSize * (std::exp(s) - 1));
  return 4 * binomial_sd(n, p) / n + bound * p;
}

}  // namespace

TEST_CASE("value-dependent: direction=high skews the hidden points to high values") {
  const Shares got = quartile_shares(scheme("value-dependent"), kSize, kRate, kDraws);
  const double top = share(3, 0.75, 1), bottom = share(3, 0, 0.25);  // 0.5553 and 0.0585
  CHECK(std::abs(got.top - top) <= tolerance(top, got.hidden, 3));
  CHECK(std::abs(got.bottom - bottom) <= tolerance(bottom, got.hidden, 3));
}

TEST_CASE("value-dependent: direction=low mirrors it; strength sets the skew") {
  const Shares low = quartile_shares(scheme("value-dependent:direction=low"), kSize, kRate, kDraws);
  CHECK(std::abs(low.bottom - share(3, 0.75, 1)) <= tolerance(share(3, 0.75, 1), low.hidden, 3));
  CHECK(std::abs(low.top - share(3, 0, 0.25)) <= tolerance(share(3, 0, 0.25), low.hidden, 3));

  const Shares strong = quartile_shares(scheme("value-dependent:strength=6"), kSize, kRate, kDraws);
  CHECK(std::abs(strong.top - share(6, 0.75, 1)) <= tolerance(share(6, 0.75, 1), strong.hidden, 6));

  // strength 0: uniform, a quarter in each quartile.
  const Shares flat = quartile_shares(scheme("value-dependent:strength=0"), kSize, kRate, kDraws);
  CHECK(std::abs(flat.top - 0.25) <= tolerance(0.25, flat.hidden, 0));
  CHECK(std::abs(flat.bottom - 0.25) <= tolerance(0.25, flat.hidden, 0));
}

TEST_CASE("value-dependent: exact count, eligibility, and skew at a high rate") {
  const auto values = gappy_series(3000);
  const std::size_t holdout = 300;
  std::size_t eligible = 0;
  double eligible_sum = 0;
  for (std::size_t i = 0; i + holdout < values.size(); ++i) {
    if (std::isnan(values[i])) continue;
    ++eligible;
    eligible_sum += values[i];
  }
  for (const char* dir : {"high", "low"}) {
    const auto s = scheme(std::string("value-dependent:direction=") + dir);
    const MaskRequest request{.values = values, .holdout = holdout, .rate = 0.4};
    const auto target = static_cast<std::size_t>(std::llround(0.4 * static_cast<double>(eligible)));
    for (int r = 0; r < 5; ++r) {
      const Mask mask = draw(s, request, replicate_seed(r));
      CHECK(hidden_count(mask) == target);
      CHECK(respects_eligibility(mask, values, holdout));
      double sum = 0;
      for (std::size_t i = 0; i < mask.size(); ++i) sum += mask[i] ? values[i] : 0;
      // Mean hidden value against the mean eligible value: clearly above for
      // high, below for low (a direction check, not a calibrated size).
      const double ratio = (sum / static_cast<double>(target)) / (eligible_sum / static_cast<double>(eligible));
      if (std::string(dir) == "high") CHECK(ratio > 1.2);
      else CHECK(ratio < 0.8);
    }
  }
}

TEST_CASE("value-dependent: tied values share a quantile, so position does not matter") {
  // A constant series: all quantiles tie at 0.5 and every point is equally
  // likely, however strong the skew. Binomial-bounded check on the first half.
  const std::vector<double> values(2000, 5.0);
  const auto s = scheme("value-dependent:strength=20");
  const MaskRequest request{.values = values, .rate = 0.1};
  double first_half = 0, total = 0;
  for (int r = 0; r < 100; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    for (std::size_t i = 0; i < mask.size(); ++i) {
      total += mask[i];
      first_half += i < 1000 ? mask[i] : 0;
    }
  }
  CHECK(std::abs(first_half / total - 0.5) <= 4 * binomial_sd(total, 0.5) / total);
}

TEST_CASE("value-dependent: same seed gives the same mask, other replicates differ") {
  const auto s = scheme("value-dependent:direction=low,strength=2");
  const auto values = observed_series(800);
  const MaskRequest request{.values = values, .rate = 0.1};
  CHECK(draw(s, request, replicate_seed(9)) == draw(s, request, replicate_seed(9)));
  CHECK(draw(s, request, replicate_seed(9)) != draw(s, request, replicate_seed(10)));
}

TEST_CASE("value-dependent: bad rates and parameters are input errors") {
  const auto values = observed_series(100);
  CHECK_THROWS_AS(draw(scheme("value-dependent"), MaskRequest{.values = values, .rate = 1.0}, 1), InputError);
  CHECK_THROWS_AS(scheme("value-dependent:direction=up"), InputError);
  CHECK_THROWS_AS(scheme("value-dependent:strength=-1"), InputError);
}
