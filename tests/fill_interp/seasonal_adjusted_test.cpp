// Seasonal adjustment: the classical decomposition against statsmodels, and
// the method's recovery of a series that is exactly linear trend + seasonal.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "../reference_json.hpp"
#include "fill_helpers.hpp"
#include "gapmark/fill/seasonal_decomposition.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

std::vector<double> from_json(const nlohmann::json& a) {
  std::vector<double> v;
  for (const auto& e : a) v.push_back(e.is_null() ? NA : e.get<double>());
  return v;
}

/// 20 + 0.3 t + shape[t mod period], the shape summing to zero.
std::vector<double> trend_plus_season(std::size_t n, const std::vector<double>& shape) {
  std::vector<double> v(n);
  for (std::size_t t = 0; t < n; ++t) v[t] = 20.0 + 0.3 * static_cast<double>(t) + shape[t % shape.size()];
  return v;
}

}  // namespace

TEST_CASE("classical decomposition agrees with statsmodels seasonal_decompose(model='additive')") {
  // Source: statsmodels 0.13.5 (Debian), stored by reference/interpolation/make_reference.py.
  const auto doc = gapmark::test::reference_json("interpolation/seasonal_decomposition.json");
  REQUIRE(doc["cases"].size() == 2);  // an even (12) and an odd (7) period
  for (const auto& c : doc["cases"]) {
    CAPTURE(c["name"].get<std::string>());
    const auto x = from_json(c["values"]);
    const auto trend = from_json(c["trend"]);
    const auto seasonal = from_json(c["seasonal"]);
    const auto got = classical_decomposition(x, c["period"].get<std::size_t>());
    REQUIRE(got.trend.size() == x.size());
    for (std::size_t i = 0; i < x.size(); ++i) {
      CAPTURE(i);
      CHECK(std::isnan(got.trend[i]) == std::isnan(trend[i]));
      if (!std::isnan(trend[i])) CHECK(close(got.trend[i], trend[i], 1e-12, 1.0));
      CHECK(close(got.seasonal[i], seasonal[i], 1e-9, 1.0));
    }
  }
}

TEST_CASE("STL without robustness agrees with statsmodels STL(robust=False)") {
  // Source: statsmodels 0.13.5 (Debian) STL defaults, stored by
  // reference/interpolation/make_reference.py with the configuration used.
  const auto doc = gapmark::test::reference_json("interpolation/seasonal_decomposition.json");
  for (const auto& c : doc["cases"]) {
    CAPTURE(c["name"].get<std::string>());
    REQUIRE(c["stl_config"]["seasonal"] == 7);
    REQUIRE(c["stl_config"]["robust"] == false);
    const auto x = from_json(c["values"]);
    const auto trend = from_json(c["stl_trend"]);
    const auto seasonal = from_json(c["stl_seasonal"]);
    const auto got = stl_decomposition(x, c["period"].get<std::size_t>());
    REQUIRE(got.trend.size() == x.size());
    REQUIRE(got.seasonal.size() == x.size());
    for (std::size_t i = 0; i < x.size(); ++i) {
      CAPTURE(i);
      CHECK(close(got.trend[i], trend[i], 1e-9, 1.0));
      CHECK(close(got.seasonal[i], seasonal[i], 1e-9, 1.0));
    }
  }
}

TEST_CASE("classical decomposition refuses less than two full periods") {
  const std::vector<double> x(23, 1.0);
  CHECK_THROWS_AS(classical_decomposition(x, 12), MethodFailure);
  CHECK_THROWS_AS(classical_decomposition(x, 1), MethodFailure);
  CHECK(classical_decomposition(x, 11).seasonal.size() == 23);
}

TEST_CASE("seasonal-adjusted recovers linear trend + seasonal across a gap") {
  // Exact algebra, no outside source: the centred moving average of a line
  // plus a zero-sum season is the line, so the season is found exactly from
  // clean windows and the adjusted series is a line that `linear` refills.
  const std::vector<double> shape12{3, 5, 4, 1, -2, -4, -5, -3, -1, 0, 1, 1};
  const std::vector<double> shape7{2.5, -1, -3, 0.5, 4, -2, -1};
  for (const auto* shape : {&shape12, &shape7}) {
    const std::size_t p = shape->size();
    const auto truth = trend_plus_season(6 * p + 3, *shape);
    auto v = truth;
    for (std::size_t t = 2 * p + 1; t < 3 * p + 4; ++t) v[t] = NA;  // a gap longer than a period
    v[5 * p] = NA;
    const auto got = run_fill("seasonal-adjusted", v, p);
    for (std::size_t i = 0; i < v.size(); ++i) {
      CAPTURE(i);
      CHECK(close(got[i], truth[i], 1e-9, 1.0));
    }
    // Linear interpolation alone misses the season inside the gap.
    const auto plain = run_fill("linear", v, p);
    CHECK(std::abs(plain[2 * p + 3] - truth[2 * p + 3]) > 0.5);
  }
}

TEST_CASE("seasonal-adjusted with STL: better than linear inside a gap, better with more rounds") {
  // Properties, not outside values: STL's loess season is bent by the
  // provisional straight line in the gap; later rounds re-estimate it on the
  // previous filling and the error shrinks.
  const std::vector<double> shape{3, 5, 4, 1, -2, -4, -5, -3, -1, 0, 1, 1};
  const auto truth = trend_plus_season(120, shape);
  auto v = truth;
  for (std::size_t t = 50; t < 58; ++t) v[t] = NA;
  auto gap_error = [&](const std::vector<double>& f) {
    double e = 0;
    for (std::size_t t = 50; t < 58; ++t) e += std::abs(f[t] - truth[t]);
    return e;
  };
  const double plain = gap_error(run_fill("linear", v, 12));
  const double one = gap_error(run_fill("seasonal-adjusted:decomposition=stl,rounds=1", v, 12));
  const auto three_filled = run_fill("seasonal-adjusted:decomposition=stl", v, 12);  // rounds=3
  const double three = gap_error(three_filled);
  const double six = gap_error(run_fill("seasonal-adjusted:decomposition=stl,rounds=6", v, 12));
  CHECK(one < 0.5 * plain);
  CHECK(three < 0.3 * one);
  CHECK(six < 0.3 * three);
  for (std::size_t i = 0; i < v.size(); ++i)
    if (!std::isnan(v[i])) CHECK(three_filled[i] == v[i]);
}

TEST_CASE("seasonal-adjusted keeps observed values and uses the inner method") {
  const std::vector<double> shape{1, -1, 2, -2};
  auto v = trend_plus_season(24, shape);
  const auto truth = v;
  v[0] = v[9] = v[10] = v[23] = NA;
  const auto got = run_fill("seasonal-adjusted:inner=pchip", v, 4);
  for (std::size_t i = 0; i < v.size(); ++i)
    if (!std::isnan(v[i])) CHECK(got[i] == v[i]);
  CHECK(close(got[9], truth[9], 1e-9, 1.0));  // a line is also a pchip
  CHECK(close(got[10], truth[10], 1e-9, 1.0));
  // Edges: pchip's nearest value of the adjusted series, plus the season.
  CHECK(close(got[0], (truth[1] - shape[1]) + shape[0], 1e-9, 1.0));
}

TEST_CASE("seasonal-adjusted: inner method errors and unmet needs") {
  CHECK_THROWS_AS(bind_method("seasonal-adjusted:inner=no-such-method"), InputError);
  CHECK_THROWS_AS(bind_method("seasonal-adjusted:inner=seasonal-adjusted"), InputError);
  const std::vector<double> v{1, 2, NA, 4, 5, 6, 7};
  CHECK_THROWS_AS(run_fill("seasonal-adjusted", v, 4), MethodFailure);  // less than two periods
  CHECK_THROWS_AS(run_fill("seasonal-adjusted", v, 0), MethodFailure);  // no period
  // An inner method whose own needs fail is reported through the outer one.
  const std::vector<double> sparse{1, NA, NA, NA, NA, NA, NA, 2, NA};
  CHECK_THROWS_AS(run_fill("seasonal-adjusted:inner=akima-weighted", sparse, 4), MethodFailure);
}
