// The Friedman test on a blocks x treatments matrix, and its mean-rank form
// with the Iman-Davenport F.
#include <cmath>
#include <doctest/doctest.h>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/friedman.hpp"
#include "reference_values.hpp"

namespace gs = gapmark::stats;

// Tolerances used throughout: 1e-10 relative for statistics, 1e-8 relative
// for p-values (plus 1e-14 absolute for statistics near zero).

// Source: scipy.stats.friedmanchisquare(*columns) (k >= 3) and R
// friedman.test(matrix), stored in reference/stats/friedman.json; cases with
// no ties, ties within blocks, a block tied throughout, and k = 2 (R only).
TEST_CASE("Friedman test against scipy.stats.friedmanchisquare and R friedman.test") {
  const auto ref = stats_test::load_reference("friedman.json");
  REQUIRE(ref["cases"].size() >= 6);
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto values = stats_test::numbers(c["values"]);
    const auto blocks = c["blocks"].get<std::size_t>();
    const auto k = c["treatments"].get<std::size_t>();
    const auto r = gs::friedman(values, blocks, k);
    CHECK(r.df == static_cast<double>(k - 1));
    CHECK(r.df == c["r"]["df"].get<double>());
    CHECK_CLOSE(r.statistic, c["r"]["statistic"].get<double>(), 1e-10, 1e-14);
    CHECK_CLOSE(r.p, c["r"]["p"].get<double>(), 1e-8, 0);
    if (!c["scipy"].is_null()) {
      CHECK_CLOSE(r.statistic, c["scipy"]["statistic"].get<double>(), 1e-10, 1e-14);
      CHECK_CLOSE(r.p, c["scipy"]["p"].get<double>(), 1e-8, 0);
    }
  }
}

// Source: the mean-rank formulas of Demsar (2006) evaluated with numpy on
// scipy.stats.rankdata ranks, p-values from scipy.stats.chi2.sf and
// scipy.stats.f.sf (reference/stats/friedman.json, "from_mean_ranks").
TEST_CASE("chi2_F and Iman-Davenport F from mean ranks against scipy distributions") {
  const auto ref = stats_test::load_reference("friedman.json");
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto mean_ranks = stats_test::numbers(c["scipy_mean_ranks"]);
    const auto blocks = c["blocks"].get<std::size_t>();
    const auto& e = c["from_mean_ranks"];
    const auto r = gs::friedman_from_mean_ranks(mean_ranks, blocks);
    CHECK_CLOSE(r.chi2, e["chi2"].get<double>(), 1e-10, 1e-12);
    CHECK_CLOSE(r.chi2_p, e["chi2_p"].get<double>(), 1e-8, 0);
    CHECK(r.f_df1 == e["f_df1"].get<double>());
    CHECK(r.f_df2 == e["f_df2"].get<double>());
    CHECK_CLOSE(r.f, e["f"].get<double>(), 1e-10, 1e-12);
    CHECK_CLOSE(r.f_p, e["f_p"].get<double>(), 1e-8, 0);
  }
}

TEST_CASE("without ties the mean-rank form equals the full Friedman statistic") {
  // Source for the equality: reference/stats/friedman.json, case no_ties_12x4
  // (scipy.stats.friedmanchisquare statistic).
  const auto ref = stats_test::load_reference("friedman.json");
  for (const auto& c : ref["cases"]) {
    if (c["name"] != "no_ties_12x4") continue;
    const auto r = gs::friedman_from_mean_ranks(stats_test::numbers(c["scipy_mean_ranks"]),
                                                c["blocks"].get<std::size_t>());
    CHECK_CLOSE(r.chi2, c["scipy"]["statistic"].get<double>(), 1e-10, 1e-14);
  }
}

// Source: Demsar (2006), "Statistical comparisons of classifiers over multiple
// data sets", JMLR 7, worked example: four methods on fourteen data sets with
// mean ranks 3.143, 2.000, 2.893, 1.964 give chi2_F = 9.28 and F_F = 3.69,
// F with (3, 39) degrees of freedom, significant at 0.05 (the critical value
// 2.85 is quoted from memory). Rank sums over 14 data sets are multiples of
// 0.5, so the published three-decimal means are 44/14, 28/14, 40.5/14, 27.5/14.
TEST_CASE("Demsar (2006) worked example") {
  const std::vector<double> exact{44.0 / 14, 28.0 / 14, 40.5 / 14, 27.5 / 14};
  const auto r = gs::friedman_from_mean_ranks(exact, 14);
  CHECK(std::round(r.chi2 * 100) / 100 == doctest::Approx(9.28));
  CHECK(std::round(r.f * 100) / 100 == doctest::Approx(3.69));
  CHECK(r.chi2_df == 3);
  CHECK(r.f_df1 == 3);
  CHECK(r.f_df2 == 39);
  CHECK(r.f_p < 0.05);
  CHECK(r.f_p > 0.01);
  // The same from the rounded means as printed:
  const std::vector<double> printed{3.143, 2.000, 2.893, 1.964};
  const auto p = gs::friedman_from_mean_ranks(printed, 14);
  CHECK(p.chi2 == doctest::Approx(9.28).epsilon(0.002));
  CHECK(p.f == doctest::Approx(3.69).epsilon(0.002));
}

TEST_CASE("edge cases") {
  // Every block ranks the treatments alike: chi2_F = N (k - 1), F_F infinite.
  const std::vector<double> agree{1, 2, 3, 1, 2, 3, 1, 2, 3};  // 3 blocks x 3
  const auto full = gs::friedman(agree, 3, 3);
  CHECK(full.statistic == doctest::Approx(6.0));  // N (k - 1)
  const auto mr = gs::friedman_from_mean_ranks(std::vector<double>{1, 2, 3}, 3);
  CHECK(mr.chi2 == doctest::Approx(6.0));
  CHECK(std::isinf(mr.f));
  CHECK(mr.f_p == 0.0);
  // All blocks tied throughout: no information, NaN.
  const std::vector<double> tied{5, 5, 5, 2, 2, 2};
  const auto t = gs::friedman(tied, 2, 3);
  CHECK(std::isnan(t.statistic));
  CHECK(std::isnan(t.p));
  // Too small.
  CHECK(std::isnan(gs::friedman(std::vector<double>{1, 2}, 2, 1).p));
  CHECK(std::isnan(gs::friedman(std::vector<double>{}, 0, 3).p));
  CHECK(std::isnan(gs::friedman_from_mean_ranks(std::vector<double>{1.0}, 5).chi2));
  const auto one_block = gs::friedman_from_mean_ranks(std::vector<double>{1, 2, 3}, 1);
  CHECK(one_block.chi2 == doctest::Approx(2.0));
  CHECK(std::isnan(one_block.f));
  CHECK_THROWS_AS(gs::friedman(std::vector<double>{1, 2, 3}, 2, 2), std::invalid_argument);
}
