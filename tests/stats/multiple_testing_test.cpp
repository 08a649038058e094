// Holm's step-down adjustment of p-values.
#include <cmath>
#include <doctest/doctest.h>
#include <vector>

#include "gapmark/stats/multiple_testing.hpp"
#include "reference_values.hpp"

namespace gs = gapmark::stats;

// Source: R p.adjust(p, method = "holm") and
// statsmodels.stats.multitest.multipletests(p, method="holm"), stored in
// reference/stats/holm.json (cases with ties, caps at 1, one value, and NaN
// entries, which R keeps as NA and leaves out of m). Tolerance 1e-12 relative.
TEST_CASE("Holm adjustment against R p.adjust and statsmodels multipletests") {
  const auto ref = stats_test::load_reference("holm.json");
  REQUIRE(ref["cases"].size() >= 6);
  for (const auto& c : ref["cases"]) {
    INFO("case " << c["name"].get<std::string>());
    const auto p = stats_test::numbers(c["p"]);
    const auto adjusted = gs::holm_adjust(p);
    const auto r = stats_test::numbers(c["r_p_adjust"]);
    REQUIRE(adjusted.size() == r.size());
    for (std::size_t i = 0; i < r.size(); ++i) CHECK_CLOSE(adjusted[i], r[i], 1e-12, 0);
    if (!c["statsmodels"].is_null()) {
      const auto s = stats_test::numbers(c["statsmodels"]);
      for (std::size_t i = 0; i < s.size(); ++i) CHECK_CLOSE(adjusted[i], s[i], 1e-12, 0);
    }
  }
}

TEST_CASE("Holm: monotone in the order of the raw p-values, capped at 1, never below raw") {
  const std::vector<double> p{0.04, 0.001, 0.03, 0.5, 0.02, 0.3};
  const auto a = gs::holm_adjust(p);
  for (std::size_t i = 0; i < p.size(); ++i) {
    CHECK(a[i] >= p[i]);
    CHECK(a[i] <= 1.0);
    for (std::size_t j = 0; j < p.size(); ++j)
      if (p[i] < p[j]) CHECK(a[i] <= a[j]);
  }
  // Worked by hand: sorted 0.001, 0.02, 0.03, 0.04, 0.3, 0.5 times 6..1
  // = 0.006, 0.1, 0.12, 0.12, 0.6, 0.6 after the running maximum.
  CHECK(a[1] == doctest::Approx(0.006));
  CHECK(a[4] == doctest::Approx(0.10));
  CHECK(a[2] == doctest::Approx(0.12));
  CHECK(a[0] == doctest::Approx(0.12));
  CHECK(a[5] == doctest::Approx(0.6));
  CHECK(a[3] == doctest::Approx(0.6));
  CHECK(gs::holm_adjust(std::vector<double>{}).empty());
}
