// The value-dependence screen: Mann-Whitney U against SciPy's values
// (reference/profile/mann_whitney.json, made by make_reference.py there), and
// which values count as neighbours of gaps.
#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "data_helpers.hpp"
#include "gapmark/data/value_screen.hpp"

using gapmark::data::mann_whitney;
using gapmark::data::screen_values;

TEST_CASE("Mann-Whitney U and p match scipy.stats.mannwhitneyu (asymptotic, continuity, ties)") {
  const auto ref = data_test::reference("profile/mann_whitney.json");
  REQUIRE(ref["cases"].size() == 5);
  for (const auto& c : ref["cases"]) {
    const auto x = c["x"].get<std::vector<double>>();
    const auto y = c["y"].get<std::vector<double>>();
    const auto r = mann_whitney(x, y);
    CHECK(r.u == doctest::Approx(c["u"].get<double>()).epsilon(1e-12));
    // Source: SciPy 1.10; the normal tail comes from Boost.Math, so allow
    // a relative 1e-9.
    CHECK(r.p == doctest::Approx(c["p"].get<double>()).epsilon(1e-9));
  }
}

TEST_CASE("the sign of z says which sample tends to be larger") {
  const std::vector<double> low{1, 2, 3, 4, 5}, high{6, 7, 8, 9, 10};
  CHECK(mann_whitney(low, high).z < 0);
  CHECK(mann_whitney(high, low).z > 0);
  CHECK(mann_whitney(high, low).p == doctest::Approx(mann_whitney(low, high).p));
}

TEST_CASE("neighbours of gaps are the last value before and the first after each gap") {
  const double n = std::nan("");
  // gaps at 2 and 6-7; neighbours: 1, 3, 5, 8 (values 10, 11, 12, 13)
  std::vector<double> v{1, 10, n, 11, 2, 12, n, n, 13, 3, 4, 2, 3, 1, 2};
  const auto s = screen_values(v, 3);
  REQUIRE(s.applicable);
  CHECK(s.near_count == 4);
  CHECK(s.rest_count == 8);
  CHECK(s.near_median == doctest::Approx(11.5));
  CHECK(s.rest_median == doctest::Approx(2.0));
  CHECK(s.test.z > 0);
}

TEST_CASE("the screen says why it does not apply") {
  const double n = std::nan("");
  CHECK(screen_values(std::vector<double>{1, 2, 3, 4}).reason == "no gaps");
  const auto few = screen_values(std::vector<double>{1, n, 2, 3, 4, 5, 6, 7});
  CHECK_FALSE(few.applicable);
  CHECK(few.reason.find("too few values: 2 next to gaps") != std::string::npos);
}
