// The paired TOST and the percentile bootstrap interval against outside
// references stored under reference/analysis/ (made by
// reference/analysis/make_reference.py).
#include <algorithm>
#include <cmath>
#include <doctest/doctest.h>

#include "gapmark/stats/bootstrap.hpp"
#include "gapmark/stats/equivalence.hpp"
#include "reference_values.hpp"

using namespace gapmark::stats;

// Source: statsmodels.stats.weightstats.ttost_paired(x1, x2, low, upp)
// (reference/analysis/tost.json). Tolerance 1e-10 relative on t and p.
TEST_CASE("paired TOST agrees with statsmodels ttost_paired") {
  const auto ref = stats_test::load_reference("../analysis/tost.json")["cases"];
  REQUIRE(ref.size() >= 6);
  for (const auto& c : ref) {
    INFO(c["name"].get<std::string>());
    const auto x1 = stats_test::numbers(c["x1"]), x2 = stats_test::numbers(c["x2"]);
    std::vector<double> d(x1.size());
    for (std::size_t i = 0; i < d.size(); ++i) d[i] = x1[i] - x2[i];
    const auto r = paired_tost(d, c["low"].get<double>(), c["upp"].get<double>());
    CHECK(r.df == c["df"].get<double>());
    CHECK(stats_test::close(r.t_low, c["t_low"].get<double>(), 1e-10));
    CHECK(stats_test::close(r.t_high, c["t_high"].get<double>(), 1e-10));
    CHECK(stats_test::close(r.p_low, c["p_low"].get<double>(), 1e-9, 1e-300));
    CHECK(stats_test::close(r.p_high, c["p_high"].get<double>(), 1e-9, 1e-300));
    CHECK(stats_test::close(r.p, c["p"].get<double>(), 1e-9, 1e-300));
  }
}

TEST_CASE("TOST edge cases: identical pairs are equivalent, one pair decides nothing, bad margins throw") {
  const std::vector<double> zeros(5, 0.0);
  CHECK(paired_tost(zeros, -0.1, 0.1).p == 0.0);
  const std::vector<double> constant(5, 0.2);
  CHECK(paired_tost(constant, -0.1, 0.1).p == 1.0);
  const std::vector<double> one{0.0};
  CHECK(std::isnan(paired_tost(one, -0.1, 0.1).p));
  CHECK_THROWS(paired_tost(zeros, 0.1, 0.1));
  const std::vector<double> inf{0.0, HUGE_VAL};
  CHECK_THROWS(paired_tost(inf, -0.1, 0.1));
}

// Source: numpy.percentile(v, 100 q), method "linear" (reference/analysis/bootstrap.json).
TEST_CASE("the quantile rule is numpy's default linear interpolation") {
  const auto ref = stats_test::load_reference("../analysis/bootstrap.json")["cases"]["quantiles"];
  for (const auto& c : ref) {
    INFO(c["name"].get<std::string>());
    const auto v = stats_test::numbers(c["sorted"]);
    const auto q = stats_test::numbers(c["q"]);
    for (std::size_t i = 0; i < q.size(); ++i)
      CHECK(stats_test::close(sorted_quantile(v, q[i]), c["value"][i].get<double>(), 1e-14, 1e-15));
  }
}

// Source: scipy.stats.bootstrap((x,), np.mean, method="percentile",
// n_resamples=200000) (reference/analysis/bootstrap.json). Both sides are
// Monte Carlo estimates with different random streams. With B = 4000
// resamples the sd of an estimated 2.5% quantile is about
// sqrt(0.025 * 0.975 / B) / f(q), which for a near-normal bootstrap
// distribution with sd s is about 0.043 s; so each end must lie within
// 0.25 s of scipy's (about five such errors).
TEST_CASE("percentile bootstrap interval agrees with scipy.stats.bootstrap within Monte Carlo error") {
  const auto ref = stats_test::load_reference("../analysis/bootstrap.json")["cases"]["intervals"];
  REQUIRE(ref.size() >= 4);
  for (const auto& c : ref) {
    INFO(c["name"].get<std::string>());
    const auto x = stats_test::numbers(c["x"]);
    const auto ci = bootstrap_mean_interval(x, c["level"].get<double>(), 12345);
    const double se = c["bootstrap_sd"].get<double>();
    CHECK(std::abs(ci.low - c["low"].get<double>()) < 0.25 * se);
    CHECK(std::abs(ci.high - c["high"].get<double>()) < 0.25 * se);
    CHECK(ci.low >= *std::min_element(x.begin(), x.end()));
    CHECK(ci.low > 0);  // every sample here is positive: the interval never crosses zero
  }
}

TEST_CASE("bootstrap interval: seeded, inside the data's range, NaN below two values") {
  const std::vector<double> x{0.0, 0.0, 0.0, 0.0, 5.0, 0.1};
  const auto a = bootstrap_mean_interval(x, 0.95, 1), b = bootstrap_mean_interval(x, 0.95, 1);
  CHECK(a.low == b.low);
  CHECK(a.high == b.high);
  CHECK(a.low >= 0.0);
  CHECK(a.high <= 5.0);
  CHECK(a.low < a.high);
  const std::vector<double> one{2.0};
  CHECK(std::isnan(bootstrap_mean_interval(one, 0.95, 1).low));
  CHECK_THROWS(bootstrap_mean_interval(x, 1.0, 1));
}
