// Average ranks (ascending, 1-based, ties averaged) and mean ranks by row.
#include <cmath>
#include <doctest/doctest.h>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/ranks.hpp"
#include "reference_values.hpp"

namespace gs = gapmark::stats;

// Source: scipy.stats.rankdata(x, method="average"), stored in
// reference/stats/ranks.json. Ranks are sums of small integers halved, so
// they must match exactly.
TEST_CASE("average ranks against scipy.stats.rankdata") {
  const auto ref = stats_test::load_reference("ranks.json");
  REQUIRE(ref["cases"].size() >= 4);
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto x = stats_test::numbers(c["x"]);
    const auto expected = stats_test::numbers(c["scipy_rankdata_average"]);
    const auto ranks = gs::average_ranks(x);
    REQUIRE(ranks.size() == expected.size());
    for (std::size_t i = 0; i < ranks.size(); ++i) CHECK(ranks[i] == expected[i]);
  }
}

TEST_CASE("ties share the average of the ranks they span") {
  // Worked by hand: sorted 1, 2, 2, 2, 5, 7 -> ranks 1, 3, 3, 3, 5, 6.
  const std::vector<double> x{7.0, 2.0, 5.0, 2.0, 1.0, 2.0};
  const auto r = gs::average_ranks(x);
  CHECK(r == std::vector<double>{6.0, 3.0, 5.0, 3.0, 1.0, 3.0});
  CHECK(gs::average_ranks(std::vector<double>{}).empty());
}

TEST_CASE("NaN is refused") {
  const std::vector<double> x{1.0, std::nan("")};
  CHECK_THROWS_AS(gs::average_ranks(x), std::invalid_argument);
}

// Source: mean of scipy.stats.rankdata per row, stored in reference/stats/friedman.json.
TEST_CASE("mean row ranks against scipy.stats.rankdata per row") {
  const auto ref = stats_test::load_reference("friedman.json");
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto values = stats_test::numbers(c["values"]);
    const auto expected = stats_test::numbers(c["scipy_mean_ranks"]);
    const auto got = gs::mean_row_ranks(values, c["blocks"].get<std::size_t>(),
                                        c["treatments"].get<std::size_t>());
    REQUIRE(got.size() == expected.size());
    for (std::size_t j = 0; j < got.size(); ++j) CHECK_CLOSE(got[j], expected[j], 1e-14, 0);
  }
}

TEST_CASE("mean row ranks: shape is checked, no rows gives NaN") {
  const std::vector<double> v{1, 2, 3};
  CHECK_THROWS_AS(gs::mean_row_ranks(v, 2, 2), std::invalid_argument);
  const auto none = gs::mean_row_ranks(std::vector<double>{}, 0, 3);
  REQUIRE(none.size() == 3);
  CHECK(std::isnan(none[0]));
}
