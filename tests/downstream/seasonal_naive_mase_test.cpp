// Seasonal naive forecasts against statsmodels' seasonal random walk
// ARIMA(0,0,0)(0,1,0)_m, the MASE scale against pandas' mean absolute
// seasonal difference (both stored by reference/downstream/
// seasonal_naive_statsmodels.py), and MASE on a hand-worked example
// following Hyndman & Koehler (2006).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "gapmark/forecast/mase.hpp"
#include "gapmark/forecast/seasonal_naive.hpp"
#include "reference_values.hpp"

using namespace gapmark::forecast;

TEST_CASE("seasonal naive equals the seasonal random walk forecast of statsmodels") {
  const auto ref = gapmark::test::read_reference("values/seasonal_naive_statsmodels.json");
  const std::size_t horizon = ref.at("horizon");
  for (const auto& item : ref.at("cases").items()) {
    const std::string name = item.key();  // a copy: lambdas in INFO cannot capture a structured binding (clang 14)
    const auto& c = item.value();
    INFO(name);
    auto y = gapmark::test::r_series(name);
    y.resize(c.at("train_n").get<std::size_t>());
    const std::size_t period = c.at("period");
    const auto ours = seasonal_naive_forecast(y, period, horizon);
    const auto theirs = c.at("forecast").get<std::vector<double>>();
    REQUIRE(ours.size() == theirs.size());
    // The forecast copies observed values; statsmodels' state space filter
    // adds and subtracts them, so allow a few ulps of the series' scale.
    for (std::size_t h = 0; h < horizon; ++h) CHECK(std::abs(ours[h] - theirs[h]) <= 1e-9);
    CHECK(seasonal_naive_scale(y, period) == doctest::Approx(c.at("scale").get<double>()).epsilon(1e-13));
  }
}

TEST_CASE("seasonal naive: repeats the last season; empty when shorter than one season") {
  const std::vector<double> y{1, 2, 3, 4, 5, 6, 7};
  CHECK(seasonal_naive_forecast(y, 3, 7) == std::vector<double>{5, 6, 7, 5, 6, 7, 5});
  CHECK(seasonal_naive_forecast(y, 0, 3) == std::vector<double>{7, 7, 7});  // no period: naive
  CHECK(seasonal_naive_forecast(y, 1, 2) == std::vector<double>{7, 7});
  CHECK(seasonal_naive_forecast(std::vector<double>{1, 2}, 3, 2).empty());
}

TEST_CASE("MASE, hand-worked following Hyndman & Koehler (2006)") {
  // Training series, season m = 4:      3 5 7 4 | 4 6 9 5
  // In-sample seasonal naive errors:   |4-3| |6-5| |9-7| |5-4| = 1 1 2 1
  //   scale = 5 / 4 = 1.25
  // Seasonal naive forecast of the next season: 4 6 9 5
  // Actual next season:                          5 6 8 7
  //   absolute errors 1 0 1 2, MAE = 1, MASE = 1 / 1.25 = 0.8
  const std::vector<double> train{3, 5, 7, 4, 4, 6, 9, 5};
  const std::vector<double> actual{5, 6, 8, 7};
  const double scale = seasonal_naive_scale(train, 4);
  CHECK(scale == 1.25);
  const auto fc = seasonal_naive_forecast(train, 4, 4);
  CHECK(mase(actual, fc, scale) == doctest::Approx(0.8).epsilon(1e-15));

  // Without a season (the paper's naive scale, m = 1):
  //   in-sample |diffs| 2 2 3 0 2 3 4, scale = 16 / 7
  //   naive forecast 5 5 5 5, errors 0 1 3 2, MAE = 1.5
  //   MASE = 1.5 / (16/7) = 0.65625
  const double naive_scale = seasonal_naive_scale(train, 0);
  CHECK(naive_scale == doctest::Approx(16.0 / 7.0).epsilon(1e-15));
  CHECK(mase(actual, seasonal_naive_forecast(train, 0, 4), naive_scale) == doctest::Approx(0.65625).epsilon(1e-15));
}

TEST_CASE("MASE skips missing actual values and is NaN when it cannot be formed") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  // Pairs (5,4) and (7,5): errors 1 and 2, mean 1.5, scale 0.5 -> 3
  CHECK(mase(std::vector<double>{5, nan, 7}, std::vector<double>{4, 100, 5}, 0.5) == 3.0);
  CHECK(std::isnan(mase(std::vector<double>{nan}, std::vector<double>{1}, 1)));
  CHECK(std::isnan(mase(std::vector<double>{1}, std::vector<double>{1}, 0)));   // zero scale
  CHECK(std::isnan(mase(std::vector<double>{1}, std::vector<double>{nan}, 1)));  // no forecast
  CHECK(std::isnan(mase(std::vector<double>{1, 2}, std::vector<double>{1}, 1)));
  CHECK(std::isnan(seasonal_naive_scale(std::vector<double>{1, 2, 3}, 3)));      // no in-sample error
  CHECK(std::isnan(seasonal_naive_scale(std::vector<double>{1, nan, 3, 4}, 1)));
}
