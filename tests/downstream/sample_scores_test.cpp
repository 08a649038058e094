// Scores of draws: the sample CRPS (energy form, Gneiting & Raftery 2007)
// against scipy.integrate.quad of the defining integral over the draws'
// empirical CDF (reference/downstream/sample_crps_scipy.py), and against the
// Gaussian closed form as the number of draws grows; the `sample` metric's
// coverages on hand-worked cases.
#include <doctest/doctest.h>

#include <cmath>

#include <boost/math/distributions/normal.hpp>
#include <vector>

#include "gapmark/params.hpp"
#include "gapmark/rng.hpp"
#include "gapmark/score/metric.hpp"
#include "gapmark/stats/crps.hpp"
#include "gapmark/stats/sample_crps.hpp"
#include "reference_values.hpp"

using namespace gapmark;

TEST_CASE("sample CRPS equals scipy's integral of the empirical CDF's definition") {
  const auto ref = test::read_reference("values/sample_crps_scipy.json");
  REQUIRE(ref["cases"].size() >= 8);
  for (const auto& c : ref["cases"]) {
    const std::string name = c["name"];
    CAPTURE(name);
    const std::vector<double> draws = c["draws"].get<std::vector<double>>();
    const double y = c["y"];
    CHECK(stats::sample_crps(draws, y) == doctest::Approx(c["crps"].get<double>()).epsilon(1e-12));
    std::vector<double> sorted = draws;
    std::sort(sorted.begin(), sorted.end());
    const auto iv = stats::sorted_central_interval(sorted, 0.9);
    CHECK(iv.low == doctest::Approx(c["q05"].get<double>()).epsilon(1e-13));
    CHECK(iv.high == doctest::Approx(c["q95"].get<double>()).epsilon(1e-13));
  }
  CHECK(std::isnan(stats::sample_crps(std::vector<double>{}, 1.0)));
  CHECK(std::isnan(stats::sample_crps(std::vector<double>{1.0, NAN}, 1.0)));
}

TEST_CASE("sample CRPS tends to the Gaussian closed form as the draws grow") {
  const double mu = 1.5, sigma = 2.0;
  const boost::math::normal_distribution<double> standard;
  for (const double y : {1.5, 3.0, -4.0}) {
    CAPTURE(y);
    const double exact = stats::gaussian_crps(mu, sigma, y);
    // Draws at the normal's quantiles (i - 1/2)/M: no sampling noise, so the
    // error of the empirical distribution falls steadily with M.
    double last_error = 1e300;
    for (const std::size_t m : {10u, 100u, 1000u, 10000u}) {
      std::vector<double> draws(m);
      for (std::size_t i = 0; i < m; ++i)
        draws[i] = mu + sigma * boost::math::quantile(standard, (static_cast<double>(i) + 0.5) / static_cast<double>(m));
      const double error = std::abs(stats::sample_crps(draws, y) - exact);
      MESSAGE("quantile draws, y = " << y << ", M = " << m << ": |sample - closed form| = " << error);
      CHECK(error < last_error);
      last_error = error;
    }
    CHECK(last_error < 1e-4 * sigma);
    // Random draws from gapmark's normal generator: |X - y| is 1-Lipschitz in
    // X, so each term's standard deviation is at most sigma and the sample
    // CRPS's Monte Carlo error at most about 2 sigma / sqrt(M) (both terms);
    // its bias is sigma / (sqrt(pi) M). Allowed: 4 of those standard errors.
    for (const std::size_t m : {200u, 20000u, 200000u}) {
      Rng rng(99);
      std::vector<double> draws(m);
      for (auto& d : draws) d = mu + sigma * rng.normal();
      const double error = std::abs(stats::sample_crps(draws, y) - exact);
      const double dm = static_cast<double>(m);
      MESSAGE("random draws, y = " << y << ", M = " << m << ": |sample - closed form| = " << error);
      CHECK(error < 4 * 2 * sigma / std::sqrt(dm) + sigma / std::sqrt(std::acos(-1.0)) / dm);
    }
  }
}

TEST_CASE("gapmark's normal draws: mean, variance and tails of a standard normal") {
  // 100,000 draws: the mean within 4 standard errors (4 / sqrt(n)), the
  // variance within 4 of its standard errors (sqrt(2 / n)), and the share
  // beyond 1.959964 (two-sided 5%, standard normal table) within 4 binomial
  // standard errors.
  Rng rng(20261202);
  const std::size_t n = 100000;
  double sum = 0, sum2 = 0;
  std::size_t tails = 0;
  for (std::size_t i = 0; i < n; ++i) {
    const double z = rng.normal();
    sum += z;
    sum2 += z * z;
    tails += std::abs(z) > 1.959964 ? 1 : 0;
  }
  const double dn = static_cast<double>(n), mean = sum / dn, var = sum2 / dn - mean * mean;
  CHECK(std::abs(mean) < 4 / std::sqrt(dn));
  CHECK(std::abs(var - 1) < 4 * std::sqrt(2 / dn));
  CHECK(std::abs(static_cast<double>(tails) / dn - 0.05) < 4 * std::sqrt(0.05 * 0.95 / dn));
  Rng a(5), b(5);
  for (int i = 0; i < 7; ++i) CHECK(a.normal() == b.normal());
}

namespace {

std::vector<double> score(const std::vector<double>& truth, const Mask& mask,
                          const std::vector<std::vector<double>>& draws, double level = 0.5) {
  const auto* entry = MetricRegistry::global().find("sample");
  REQUIRE(entry != nullptr);
  CallSpec call;
  call.name = "sample";
  call.args = {{"level", std::to_string(level)}};
  const auto metric = MetricRegistry::global().bind(call, "test").impl;
  std::vector<double> out(metric->columns().size());
  ScoreInput in;
  in.truth = truth;
  in.filled = truth;
  in.mask = &mask;
  in.draws = draws;
  metric->compute(in, out);
  return out;
}

}  // namespace

TEST_CASE("the sample metric: coverage of points and of gap totals, worked by hand") {
  // 8 points; masked: 1-2 (one gap) and 5 (another). Four draws per point.
  const std::vector<double> truth{0, 1, 2, 3, 4, 5, 6, 7};
  const Mask mask{0, 1, 1, 0, 0, 1, 0, 0};
  std::vector<std::vector<double>> draws(4, truth);
  // point 1 (truth 1): draws 0, 0.5, 1.5, 3 -> 25%..75% interval [0.375, 1.875]: inside
  // point 2 (truth 2): draws 3, 4, 5, 6 -> [3.75, 5.25]: outside
  // point 5 (truth 5): draws 4, 5, 6, 7 -> [4.75, 6.25]: inside
  const double p1[] = {0, 0.5, 1.5, 3}, p2[] = {3, 4, 5, 6}, p5[] = {4, 5, 6, 7};
  for (int k = 0; k < 4; ++k) {
    draws[k][1] = p1[k];
    draws[k][2] = p2[k];
    draws[k][5] = p5[k];
  }
  // gap 1-2: true total 3; draw totals 3, 4.5, 6.5, 9 -> [4.125, 7.125]: outside
  // gap 5: true 5 inside [4.75, 6.25]
  const auto out = score(truth, mask, draws, 0.5);
  std::vector<double> crps;
  for (const auto* p : {p1, p2, p5})
    crps.push_back(stats::sample_crps(std::vector<double>(p, p + 4), p == p1 ? 1.0 : p == p2 ? 2.0 : 5.0));
  CHECK(out[0] == doctest::Approx((crps[0] + crps[1] + crps[2]) / 3).epsilon(1e-14));
  CHECK(out[1] == doctest::Approx(2.0 / 3));
  CHECK(out[2] == doctest::Approx(2.0 / 3 - 0.5));
  CHECK(out[3] == doctest::Approx(0.5));
  CHECK(out[4] == doctest::Approx(0.0));
}

TEST_CASE("the sample metric is n/a without draws or with a missing draw, never zero") {
  const std::vector<double> truth{0, 1, 2, 3};
  const Mask mask{0, 1, 1, 0};
  for (double v : score(truth, mask, {})) CHECK(std::isnan(v));
  std::vector<std::vector<double>> draws(3, truth);
  draws[1][2] = NAN;
  for (double v : score(truth, mask, draws)) CHECK(std::isnan(v));
  draws[1][2] = 2;
  draws[0].pop_back();  // a path of the wrong length
  for (double v : score(truth, mask, draws)) CHECK(std::isnan(v));
}
