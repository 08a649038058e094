// The Wilcoxon signed-rank test (two-sided, zeros dropped).
#include <cmath>
#include <doctest/doctest.h>
#include <stdexcept>
#include <vector>

#include "gapmark/stats/wilcoxon.hpp"
#include "reference_values.hpp"

namespace gs = gapmark::stats;

// Source: scipy.stats.wilcoxon and R wilcox.test, the exact call of each
// stored per case in reference/stats/wilcoxon.json:
//  - exact cases (n <= 50, no zeros, no tied |d|): scipy wilcoxon(d) (default
//    mode "auto" selects exact) and R wilcox.test(d, exact = TRUE, correct = FALSE);
//  - normal cases (ties, zeros, n > 50): scipy wilcoxon(d, mode="approx",
//    correction=False) and R wilcox.test(d, exact = FALSE, correct = FALSE).
// Tolerance: statistics exact to 1e-10 relative, p-values 1e-8 relative.
TEST_CASE("Wilcoxon signed-rank against scipy.stats.wilcoxon and R wilcox.test") {
  const auto ref = stats_test::load_reference("wilcoxon.json");
  REQUIRE(ref["cases"].size() >= 10);
  bool saw_exact = false, saw_normal = false, saw_zeros = false, saw_ties = false, saw_big = false;
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto d = stats_test::numbers(c["differences"]);
    const auto r = gs::wilcoxon_signed_rank(d);
    const bool exact = c["method"] == "exact";
    CHECK(r.method == (exact ? gs::PValueMethod::Exact : gs::PValueMethod::Normal));
    CHECK(r.zeros == c["zeros"].get<std::size_t>());
    CHECK(r.ties == c["ties"].get<bool>());
    CHECK(r.n == d.size() - r.zeros);
    CHECK_CLOSE(r.statistic, c["scipy"]["statistic"].get<double>(), 1e-10, 0);
    CHECK_CLOSE(r.w_plus, c["r"]["V"].get<double>(), 1e-10, 0);
    CHECK_CLOSE(r.p, c["scipy"]["p"].get<double>(), 1e-8, 0);
    CHECK_CLOSE(r.p, c["r"]["p"].get<double>(), 1e-8, 0);
    saw_exact |= exact;
    saw_normal |= !exact;
    saw_zeros |= r.zeros > 0;
    saw_ties |= r.ties;
    saw_big |= r.n > 50;
  }
  CHECK(saw_exact);
  CHECK(saw_normal);
  CHECK(saw_zeros);
  CHECK(saw_ties);
  CHECK(saw_big);
}

// scipy 1.10.1's default ("auto") keeps the exact distribution when |d| has
// ties and n <= 50, truncating a half-integer W+; this library (like R) uses
// the normal approximation there. The stored scipy_auto value shows the two
// differ for case ties_n15, so the choice is visible, not accidental.
TEST_CASE("tied differences use the normal approximation, not scipy 1.10's default") {
  const auto ref = stats_test::load_reference("wilcoxon.json");
  bool found = false;
  for (const auto& c : ref["cases"]) {
    if (c["name"] != "ties_n15") continue;
    found = true;
    const auto r = gs::wilcoxon_signed_rank(stats_test::numbers(c["differences"]));
    CHECK(c["scipy_auto"]["mode"] == "exact");
    CHECK(r.method == gs::PValueMethod::Normal);
    CHECK(std::abs(r.p - c["scipy_auto"]["p"].get<double>()) > 1e-3);
  }
  CHECK(found);
}

TEST_CASE("exact p-values worked by hand") {
  // n = 7, all positive: W+ = 28, P = 2 * 2^-7 = 1/64.
  CHECK(gs::wilcoxon_exact_p(28, 7) == doctest::Approx(1.0 / 64));
  CHECK(gs::wilcoxon_exact_p(0, 7) == doctest::Approx(1.0 / 64));
  // n = 3: W+ in {0,1,2,3,3,4,5,6}; P(W+ <= 1) = 2/8, two-sided 0.5.
  CHECK(gs::wilcoxon_exact_p(1, 3) == doctest::Approx(0.5));
  CHECK(gs::wilcoxon_exact_p(3, 3) == 1.0);  // the centre
  CHECK_THROWS_AS(gs::wilcoxon_exact_p(2.5, 3), std::invalid_argument);
}

TEST_CASE("no non-zero differences: p = 1 (no evidence of a difference)") {
  const auto empty = gs::wilcoxon_signed_rank(std::vector<double>{});
  CHECK(empty.n == 0);
  CHECK(empty.p == 1.0);
  CHECK(empty.method == gs::PValueMethod::None);
  const std::vector<double> x{1.0, 2.0, 3.0};
  const auto same = gs::wilcoxon_signed_rank(x, x);
  CHECK(same.n == 0);
  CHECK(same.zeros == 3);
  CHECK(same.p == 1.0);
  CHECK(same.statistic == 0.0);
}

TEST_CASE("pairs are x - y; mismatched lengths and NaN are refused") {
  const std::vector<double> x{5, 6, 7, 8, 9}, y{1, 1, 1, 1, 1};
  const auto r = gs::wilcoxon_signed_rank(x, y);
  CHECK(r.w_plus == 15.0);
  CHECK(r.statistic == 0.0);
  CHECK(r.p == doctest::Approx(2.0 / 32));
  const auto swapped = gs::wilcoxon_signed_rank(y, x);
  CHECK(swapped.w_plus == 0.0);
  CHECK(swapped.p == r.p);
  CHECK_THROWS_AS(gs::wilcoxon_signed_rank(x, std::vector<double>{1, 2}), std::invalid_argument);
  CHECK_THROWS_AS(gs::wilcoxon_signed_rank(std::vector<double>{1.0, std::nan("")}),
                  std::invalid_argument);
}
