// Window mean: values worked by hand from the definition in window_mean.cpp.
#include <doctest/doctest.h>

#include <cmath>

#include "fill_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

//                                   0   1  2   3   4   5
static const std::vector<double> kSeries{1, NA, 3, NA, NA, 10};

TEST_CASE("window-mean, equal weights, reach=2") {
  const auto got = run_fill("window-mean:reach=2", kSeries);
  CHECK(got[1] == doctest::Approx((1.0 + 3.0) / 2));   // neighbours 0, 2 (3 missing)
  CHECK(got[3] == doctest::Approx((3.0 + 10.0) / 2));  // neighbours 2, 5
  CHECK(got[4] == doctest::Approx((3.0 + 10.0) / 2));  // neighbours 2, 5
  CHECK(got[0] == 1.0);
  CHECK(got[5] == 10.0);
}

TEST_CASE("window-mean, triangular weights reach+1-d") {
  const auto got = run_fill("window-mean:reach=2,weights=triangular", kSeries);
  CHECK(got[1] == doctest::Approx((2 * 1.0 + 2 * 3.0) / 4));   // both at d=1: weight 2
  CHECK(got[3] == doctest::Approx((2 * 3.0 + 1 * 10.0) / 3));  // 3 at d=1, 10 at d=2
  CHECK(got[4] == doctest::Approx((1 * 3.0 + 2 * 10.0) / 3));  // 3 at d=2, 10 at d=1
}

TEST_CASE("window-mean, geometric weights decay^d") {
  const auto got = run_fill("window-mean:reach=2,weights=geometric,decay=0.25", kSeries);
  CHECK(got[3] == doctest::Approx((0.25 * 3.0 + 0.0625 * 10.0) / (0.25 + 0.0625)));
  CHECK(got[4] == doctest::Approx((0.0625 * 3.0 + 0.25 * 10.0) / (0.25 + 0.0625)));
  // Far neighbours only: weights relative to the nearest one, no underflow.
  std::vector<double> v(600, NA);
  v[0] = 2.0;
  const auto far = run_fill("window-mean:reach=1000,weights=geometric,decay=0.01", v);
  CHECK(far[599] == 2.0);
}

TEST_CASE("window-mean leaves a point with no observed neighbour in the window unfilled") {
  const auto got = run_fill("window-mean:reach=1", {1, NA, NA, NA, 5});
  CHECK(got[1] == 1.0);
  CHECK(std::isnan(got[2]));
  CHECK(got[3] == 5.0);
}

TEST_CASE("window-mean checks its parameters") {
  CHECK_THROWS_AS(bind_method("window-mean:reach=0"), InputError);
  CHECK_THROWS_AS(bind_method("window-mean:weights=cosine"), InputError);
}
