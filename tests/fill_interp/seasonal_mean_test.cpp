// Seasonal mean: values worked by hand from the definition in seasonal_mean.cpp.
#include <doctest/doctest.h>

#include <cmath>

#include "fill_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

// period 3; phases:             0   1   2   0   1   2   0   1   2   0
static const std::vector<double> kSeries{1, 10, NA, 3, NA, NA, 8, 40, NA, NA};

TEST_CASE("seasonal-mean: mean of the observed values at the same phase") {
  const auto got = run_fill("seasonal-mean", kSeries, 3);
  CHECK(got[4] == doctest::Approx((10.0 + 40.0) / 2));  // phase 1: 10, 40
  CHECK(got[9] == doctest::Approx((1.0 + 3.0 + 8.0) / 3));  // phase 0: 1, 3, 8
  // Phase 2 has no observation: the mean of all observed values.
  const double overall = (1.0 + 10 + 3 + 8 + 40) / 5;
  CHECK(got[2] == doctest::Approx(overall));
  CHECK(got[5] == doctest::Approx(overall));
  CHECK(got[8] == doctest::Approx(overall));
  CHECK(got[7] == 40.0);
}

TEST_CASE("seasonal-mean with statistic=median") {
  const auto got = run_fill("seasonal-mean:statistic=median", kSeries, 3);
  CHECK(got[4] == doctest::Approx(25.0));  // median of 10, 40
  CHECK(got[9] == doctest::Approx(3.0));   // median of 1, 3, 8
  CHECK(got[2] == doctest::Approx(8.0));   // median of 1, 3, 8, 10, 40
}

TEST_CASE("seasonal-mean needs a period") {
  CHECK_THROWS_AS(run_fill("seasonal-mean", kSeries, 0), MethodFailure);
}
