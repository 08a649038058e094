// The by_gap_length metric: RMSE on the masked points by the length of the
// gap they sit in. Expected values worked out by hand below.
#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "gapmark/score/metric.hpp"

using namespace gapmark;

namespace {

std::vector<double> compute(const std::string& call, const std::vector<double>& truth,
                            const std::vector<double>& filled, const Mask& mask) {
  const auto metric = MetricRegistry::global().bind(CallSpec::parse(call, "test"), "test");
  ScoreInput in{truth, filled, {}, &mask, nullptr, 0, 0, {}};
  std::vector<double> out(metric.impl->columns().size());
  metric.impl->compute(in, out);
  return out;
}

}  // namespace

TEST_CASE("gaps are classed by length; the series' own missing values lengthen a gap") {
  const double nan = std::nan("");
  // index:              0  1  2  3  4  5  6  7  8  9 10 11 12 13 14 15 16 17 18 19
  std::vector<double> truth{0, 0, 0, 0, 0, 0, nan, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0};
  Mask mask{0, 1, 0, 1, 1, 1, 0, 0, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 1};
  std::vector<double> filled(truth.size(), 0.0);
  // Errors: isolated point 1 -> 3 (short); points 3..5 plus the own gap at 6
  // make a gap of 4 (medium) with errors 1, 2, 2; points 8..14 make a gap of
  // 7 (long) with errors 1 each; point 19 is isolated (short) with error 4.
  filled[1] = 3;
  filled[3] = 1, filled[4] = 2, filled[5] = 2;
  for (int i = 8; i <= 14; ++i) filled[i] = 1;
  filled[19] = 4;
  const auto out = compute("by_gap_length", truth, filled, mask);
  REQUIRE(out.size() == 3);
  CHECK(out[0] == doctest::Approx(std::sqrt((9.0 + 16.0) / 2)));  // short: 3 and 4
  CHECK(out[1] == doctest::Approx(std::sqrt((1.0 + 4 + 4) / 3)));  // medium: 1, 2, 2
  CHECK(out[2] == doctest::Approx(1.0));                           // long: seven errors of 1

  SUBCASE("other bounds move the classes") {
    // short_max = 4 makes the gap of 4 short; long_min = 5 leaves medium empty.
    const auto o = compute("by_gap_length:short_max=4,long_min=5", truth, filled, mask);
    CHECK(o[0] == doctest::Approx(std::sqrt((9.0 + 1 + 4 + 4 + 16) / 5)));
    CHECK(std::isnan(o[1]));
    CHECK(o[2] == doctest::Approx(1.0));
  }
  SUBCASE("a class without scored points is n/a, and unfilled points are not scored") {
    filled[19] = nan;
    filled[1] = nan;
    const auto o = compute("by_gap_length", truth, filled, mask);
    CHECK(std::isnan(o[0]));
    CHECK(o[1] == doctest::Approx(std::sqrt(3.0)));
  }
}

TEST_CASE("the columns describe their classes") {
  const auto metric = MetricRegistry::global().bind(CallSpec::parse("by_gap_length", "test"), "test");
  const auto cols = metric.impl->columns();
  REQUIRE(cols.size() == 3);
  CHECK(cols[0].name == "rmse_gap_short");
  CHECK(cols[0].summary.find("length 1") != std::string::npos);
  CHECK(cols[1].summary.find("length 2..6") != std::string::npos);
  CHECK(cols[2].summary.find("length 7 or more") != std::string::npos);
  for (const auto& c : cols) CHECK(c.direction == Direction::Lower);
}
