// Mean, sample sd and the Student-t interval for the mean.
#include <cmath>
#include <doctest/doctest.h>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/descriptive.hpp"
#include "reference_values.hpp"

namespace gs = gapmark::stats;

// Source: scipy.stats.t.interval(level, n-1, loc=mean, scale=scipy.stats.sem(x)),
// numpy mean/std(ddof=1) and R t.test(x, conf.level)$conf.int, stored in
// reference/stats/t_interval.json. Tolerance: 1e-12 relative against R;
// 1e-9 relative against scipy, whose t.ppf in scipy 1.10.1 is off by ~2e-11
// relative at df = 1 (checked against the closed form tan(pi (p - 1/2)) with
// mpmath; R's qt and Boost's students_t agree with it), which shifts the
// interval ends by up to ~1e-10.
TEST_CASE("t interval against scipy.stats.t.interval and R t.test") {
  const auto ref = stats_test::load_reference("t_interval.json");
  REQUIRE(ref["cases"].size() >= 10);
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto x = stats_test::numbers(c["x"]);
    const double level = c["level"].get<double>();
    const auto d = gs::describe(x, level);
    CHECK(d.n == x.size());
    CHECK_CLOSE(d.mean, c["scipy"]["mean"].get<double>(), 1e-12, 0);
    CHECK_CLOSE(d.sd, c["scipy"]["sd"].get<double>(), 1e-12, 0);
    CHECK_CLOSE(d.ci.low, c["scipy"]["low"].get<double>(), 1e-9, 1e-12);
    CHECK_CLOSE(d.ci.high, c["scipy"]["high"].get<double>(), 1e-9, 1e-12);
    CHECK_CLOSE(d.ci.low, c["r"]["low"].get<double>(), 1e-12, 1e-14);
    CHECK_CLOSE(d.ci.high, c["r"]["high"].get<double>(), 1e-12, 1e-14);
  }
}

TEST_CASE("small samples: n = 1 gives a mean only, n = 0 gives NaN throughout") {
  const std::vector<double> one{3.5};
  const auto d1 = gs::describe(one, 0.95);
  CHECK(d1.mean == 3.5);
  CHECK(std::isnan(d1.sd));
  CHECK(std::isnan(d1.ci.low));
  CHECK(std::isnan(d1.ci.high));
  const std::vector<double> none;
  const auto d0 = gs::describe(none, 0.95);
  CHECK(d0.n == 0);
  CHECK(std::isnan(d0.mean));
  CHECK(std::isnan(d0.sd));
  CHECK(std::isnan(d0.ci.low));
  CHECK(std::isnan(d0.ci.high));
}

TEST_CASE("constant sample: sd 0 and an interval of zero width") {
  const std::vector<double> x{2.0, 2.0, 2.0, 2.0};
  const auto d = gs::describe(x, 0.9);
  CHECK(d.sd == 0.0);
  CHECK(d.ci.low == 2.0);
  CHECK(d.ci.high == 2.0);
}

TEST_CASE("NaN is not skipped: it reaches the result") {
  const std::vector<double> x{1.0, std::nan(""), 3.0};
  CHECK(std::isnan(gs::mean(x)));
  CHECK(std::isnan(gs::sample_sd(x)));
  CHECK(std::isnan(gs::t_interval(x, 0.95).low));
}

TEST_CASE("level outside (0, 1) is refused") {
  const std::vector<double> x{1.0, 2.0};
  CHECK_THROWS_AS(gs::t_interval(x, 1.0), std::invalid_argument);
  CHECK_THROWS_AS(gs::t_interval(x, 0.0), std::invalid_argument);
  CHECK_THROWS_AS(gs::t_interval(x, 95.0), std::invalid_argument);
}
