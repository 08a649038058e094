// Conditional draws from the simulation smoother (Durbin & Koopman 2002):
// for many draws their mean tends to the smoothed fill and their pointwise
// variance to the smoother's, within Monte Carlo error; the same seed gives
// the same draws; on data simulated from the fitted model, the draws'
// intervals for gap totals and points cover at about the nominal rate.
#include <doctest/doctest.h>

#include <cmath>
#include <cstring>
#include <string>
#include <vector>

#include "gapmark/params.hpp"
#include "gapmark/score/metric.hpp"
#include "kalman_helpers.hpp"

using namespace kalman_test;
using namespace gapmark;

namespace {

std::shared_ptr<const FillMethod> method(const std::string& call) {
  return MethodRegistry::global().bind(CallSpec::parse(call, "test"), "test").impl;
}

FillResult run(const std::string& call, const std::vector<double>& y, std::uint64_t seed, std::size_t period = 0) {
  const TimeAxis axis = TimeAxis::index(y.size());
  FillRequest req;
  req.values = y;
  req.axis = &axis;
  req.period = period;
  req.seed = seed;
  return method(call)->fill(req);
}

/// Draw mean and variance against the fill and its variance at every
/// filled point. With M draws the mean's standard error is sqrt(var / M) and
/// the sample variance's relative standard error sqrt(2 / (M - 1)); each
/// point is allowed 5 of them (a deterministic seed; over ~100 points a
/// 5-sigma miss has a chance near 6e-5 if the draws are right).
void check_moments(const FillResult& r, const std::vector<double>& y) {
  const std::size_t m = r.draws.size();
  REQUIRE(m >= 1000);
  std::size_t checked = 0;
  for (std::size_t t = 0; t < y.size(); ++t) {
    if (!std::isnan(y[t])) {
      for (const auto& d : r.draws) REQUIRE(d[t] == y[t]);
      continue;
    }
    double sum = 0, sum2 = 0;
    for (const auto& d : r.draws) sum += d[t];
    const double mean = sum / static_cast<double>(m);
    for (const auto& d : r.draws) sum2 += (d[t] - mean) * (d[t] - mean);
    const double var = sum2 / static_cast<double>(m - 1), want = r.variance[t];
    CAPTURE(t);
    CHECK(std::abs(mean - r.values[t]) <= 5 * std::sqrt(want / static_cast<double>(m)));
    CHECK(std::abs(var / want - 1) <= 5 * std::sqrt(2.0 / static_cast<double>(m - 1)));
    ++checked;
  }
  CHECK(checked >= 16);
}

}  // namespace

TEST_CASE("kalman draws: mean -> the smoothed fill, variance -> the smoother's, every model") {
  std::vector<double> y = with_random_gaps(invented_series(240, 31, 0.3, 0.8, 12, 2.0), 0.15, 32);
  for (std::size_t t = 100; t < 115; ++t) y[t] = kNaN;  // a block too
  for (const std::string args : {"", "model=trend", "model=seasonal,harmonics=2", "model=seasonal",
                                 "variance=signal"}) {
    CAPTURE(args);
    const FillResult r = run("kalman:draws=4000" + (args.empty() ? "" : "," + args), y, 7, 12);
    REQUIRE(r.draws.size() == 4000);
    check_moments(r, y);
  }
}

TEST_CASE("arima draws: mean -> the smoothed fill, variance -> the smoother's") {
  // Nile (R datasets) with two stretches removed; models without a constant,
  // whose draws and smoother treat the coefficients alike (with a mean or
  // drift the draws also carry its estimation uncertainty, which the
  // smoother's variance leaves out)
  std::vector<double> y;
  {
    std::ifstream in(kReferenceDir + "nile_fit/nile_gaps.csv");
    std::string line;
    std::getline(in, line);
    while (std::getline(in, line)) {
      const std::string v = line.substr(line.find(',') + 1);
      y.push_back(v.empty() ? kNaN : std::stod(v));
    }
  }
  REQUIRE(y.size() == 100);
  for (const std::string order : {"1,0,1", "0,1,1", "1,1,0"}) {
    CAPTURE(order);
    const FillResult r = run("arima:order=" + order + ",constant=no,draws=4000", y, 11);
    check_moments(r, y);
  }
}

TEST_CASE("draws are reproducible from the seed, and differ with it") {
  const std::vector<double> y = with_random_gaps(invented_series(150, 5, 0.2, 0.5), 0.2, 6);
  for (const std::string call : {"kalman:model=trend,draws=20", "arima:order=1,1,1,draws=20"}) {
    CAPTURE(call);
    const FillResult a = run(call, y, 123), b = run(call, y, 123), c = run(call, y, 124);
    REQUIRE(a.draws.size() == 20);
    bool same = true, differ = false;
    for (std::size_t k = 0; k < 20; ++k) {
      same = same && std::memcmp(a.draws[k].data(), b.draws[k].data(), y.size() * sizeof(double)) == 0;
      differ = differ || a.draws[k] != c.draws[k];
    }
    CHECK(same);
    CHECK(differ);
    CHECK(a.values == c.values);  // the fill itself does not depend on the seed
  }
}

TEST_CASE("draws follow the edge policy, transform=log and bounds") {
  std::vector<double> y = invented_series(120, 8, 0.2, 0.3);
  for (std::size_t t = 0; t < 6; ++t) y[t] = kNaN;  // a leading gap
  y[50] = y[51] = kNaN;
  const FillResult near = run("kalman:draws=3000", y, 1);
  for (std::size_t t = 0; t < 6; ++t) {  // centred on the nearest value, the fill there
    double sum = 0;
    for (const auto& d : near.draws) sum += d[t];
    CHECK(std::abs(sum / 3000 - near.values[t]) < 5 * std::sqrt(near.variance[t] / 3000));
  }
  const FillResult leave = run("kalman:draws=5,edges=leave", y, 1);
  for (const auto& d : leave.draws) {
    CHECK(std::isnan(d[0]));
    CHECK(std::isfinite(d[50]));
  }
  const FillResult logged = run("kalman:draws=200,transform=log", y, 1);
  const FillResult bounded = run("kalman:draws=200,bounds=9.9,10.1", y, 1);
  for (std::size_t k = 0; k < 200; ++k) {
    CHECK(logged.draws[k][50] > 0);
    CHECK(logged.draws[k][10] == y[10]);
    CHECK(bounded.draws[k][50] >= 9.9);
    CHECK(bounded.draws[k][50] <= 10.1);
  }
}

TEST_CASE("gap-total and point coverage near nominal on data simulated from the fitted model") {
  // The local level fitted to the full Nile flow (R datasets; variances
  // 15099 and 1469.1, Durbin & Koopman 2012) generates 200 invented series of
  // 100 points (fixed seed); in each, three 5-point gaps are hidden and
  // filled by kalman with 200 draws, and the `sample` metric (level 0.9)
  // scores the draws. 600 gap totals: a binomial standard error of 0.012 at
  // 0.9; the tolerance 0.04 adds to 2 standard errors an allowance for the
  // plug-in variances, estimated anew from 85 points each time (their
  // uncertainty is not in the draws, which makes intervals a little narrow).
  const double h = 15099, q = 1469.1;
  Rng rng(20261202);
  const auto* entry = MetricRegistry::global().find("sample");
  REQUIRE(entry != nullptr);
  const auto metric = MetricRegistry::global().bind(CallSpec::parse("sample:level=0.9", "test"), "test").impl;
  double total_inside = 0, point_inside = 0;
  std::size_t gaps = 0, points = 0;
  for (int s = 0; s < 200; ++s) {
    std::vector<double> truth(100);
    double level = 1000;
    for (auto& v : truth) {
      v = level + std::sqrt(h) * rng.normal();
      level += std::sqrt(q) * rng.normal();
    }
    Mask mask(100, 0);
    for (std::size_t start : {20u, 50u, 80u})
      for (std::size_t t = start; t < start + 5; ++t) mask[t] = 1;
    std::vector<double> holed = truth;
    for (std::size_t t = 0; t < 100; ++t)
      if (mask[t]) holed[t] = kNaN;
    const FillResult r = run("kalman:draws=200", holed, 1000 + static_cast<std::uint64_t>(s));
    std::vector<double> out(metric->columns().size());
    ScoreInput in;
    in.truth = truth;
    in.filled = r.values;
    in.mask = &mask;
    in.draws = r.draws;
    metric->compute(in, out);
    point_inside += out[1] * 15;
    total_inside += out[3] * 3;
    points += 15;
    gaps += 3;
  }
  const double gap_coverage = total_inside / static_cast<double>(gaps);
  const double point_coverage = point_inside / static_cast<double>(points);
  MESSAGE("gap-total coverage " << gap_coverage << " over " << gaps << " gaps; point coverage " << point_coverage
                                << " over " << points << " points (nominal 0.9)");
  CHECK(std::abs(gap_coverage - 0.9) <= 0.04);
  CHECK(std::abs(point_coverage - 0.9) <= 0.04);
}
