// Modified Akima: properties that follow from the definition, and values
// worked by hand from it (Akima 1970, J. ACM 17(4), with the modified weights
// w1 = |m[i+1] - m[i]| + |m[i+1] + m[i]|/2, w2 = |m[i-1] - m[i-2]| + |m[i-1] + m[i-2]|/2
// and Akima's end rule m[-1] = 2 m[0] - m[1], m[-2] = 2 m[-1] - m[0]).
#include <doctest/doctest.h>

#include <cmath>

#include "fill_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

TEST_CASE("akima-weighted: hand-worked values from the published definition") {
  // Knots x = 0 1 3 4 6, y = 0 1 2 2 4; missing x = 2 and 5 (interval midpoints).
  // Secants m0..m3 = 1, 1/2, 0, 1; end rule: m[-1] = 3/2, m[-2] = 2, m4 = 2, m5 = 3.
  // Slope at x=1: w1 = |0 - 1/2| + 1/4 = 3/4, w2 = |1 - 3/2| + 5/4 = 7/4,
  //               s = (3/4 * 1 + 7/4 * 1/2) / (10/4) = 13/20.
  // Slope at x=3: w1 = |1 - 0| + 1/2 = 3/2, w2 = |1/2 - 1| + 3/4 = 5/4,
  //               s = (3/2 * 1/2 + 5/4 * 0) / (11/4) = 3/11.
  // Slope at x=4: w1 = |2 - 1| + 3/2 = 5/2, w2 = |0 - 1/2| + 1/4 = 3/4,
  //               s = (5/2 * 0 + 3/4 * 1) / (13/4) = 3/13.
  // Slope at x=6: w1 = |3 - 2| + 5/2 = 7/2, w2 = |1 - 0| + 1/2 = 3/2,
  //               s = (7/2 * 1 + 3/2 * 2) / 5 = 13/10.
  // A cubic Hermite piece at its midpoint: (y0 + y1)/2 + h (s0 - s1)/8, h = 2:
  //   x=2: 3/2 + (13/20 - 3/11)/4 = 1403/880;   x=5: 3 + (3/13 - 13/10)/4 = 1421/520.
  const auto got = run_fill("akima-weighted", {0, 1, NA, 2, 2, NA, 4});
  CHECK(got[2] == doctest::Approx(1403.0 / 880.0).epsilon(1e-14));
  CHECK(got[5] == doctest::Approx(1421.0 / 520.0).epsilon(1e-14));
  CHECK(got[0] == 0);
  CHECK(got[6] == 4);
}

TEST_CASE("akima-weighted reproduces linear data exactly") {
  // Equal secants give equal weights, so every knot slope is the line's slope.
  std::vector<double> v;
  for (int i = 0; i < 30; ++i) v.push_back(3.0 - 0.7 * i);
  std::vector<double> truth = v;
  for (int i : {1, 2, 3, 7, 12, 13, 20, 21, 22, 23, 24, 28}) v[i] = NA;
  const auto got = run_fill("akima-weighted", v);
  for (std::size_t i = 0; i < v.size(); ++i) CHECK(got[i] == doctest::Approx(truth[i]).epsilon(1e-13));
  // A constant is linear too: the weights are all zero there and the slope is 0.
  const auto flat = run_fill("akima-weighted", {5, NA, 5, 5, NA, NA, 5});
  for (double f : flat) CHECK(f == 5.0);
}

TEST_CASE("akima-weighted does not overshoot on step data") {
  //                       0  1  2   3  4   5  6  7   8  9
  const std::vector<double> v{0, 0, NA, 0, NA, NA, 1, 1, NA, 1};
  const auto got = run_fill("akima-weighted", v);
  for (double g : got) {
    CHECK(g >= 0.0);
    CHECK(g <= 1.0);
  }
  CHECK(got[2] == 0.0);  // flat stretches stay flat
  CHECK(got[8] == 1.0);
  CHECK(got[4] < got[5]);  // and the step rises monotonically
}

TEST_CASE("akima-weighted needs four observed points and says so") {
  CHECK_THROWS_AS(run_fill("akima-weighted", {1, NA, 2, NA, 3}), MethodFailure);
  try {
    run_fill("akima-weighted", {1, NA, 2, NA, 3});
  } catch (const MethodFailure& e) {
    CHECK(std::string(e.what()).find("at least 4") != std::string::npos);
  }
  CHECK(run_fill("akima-weighted", {1, NA, 2, NA, 3, 4}).size() == 6);
}
