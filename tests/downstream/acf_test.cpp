// Sample autocorrelation against R's stats::acf and statsmodels' acf on open
// series from R's datasets package (values stored by
// reference/downstream/acf_r.R and acf_statsmodels.py).
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/stats/acf.hpp"
#include "reference_values.hpp"

using gapmark::stats::sample_autocorrelation;
using gapmark::stats::sample_autocovariance;
using gapmark::test::r_series;
using gapmark::test::read_reference;

namespace {

void check_close(const std::vector<double>& ours, const std::vector<double>& theirs, double tol) {
  REQUIRE(ours.size() == theirs.size());
  for (std::size_t k = 0; k < ours.size(); ++k) {
    INFO("lag " << k);
    CHECK(std::abs(ours[k] - theirs[k]) <= tol);
  }
}

}  // namespace

TEST_CASE("acf matches R stats::acf on LakeHuron and lynx (R datasets)") {
  const auto ref = read_reference("values/acf_r.json");
  const std::size_t max_lag = ref.at("max_lag");
  for (const char* name : {"LakeHuron", "lynx"}) {
    INFO(name);
    check_close(sample_autocorrelation(r_series(name), max_lag),
                ref.at("acf").at(name).get<std::vector<double>>(), 1e-12);
  }
}

TEST_CASE("acf matches statsmodels acf(adjusted=False, fft=False) on LakeHuron and lynx") {
  const auto ref = read_reference("values/acf_statsmodels.json");
  const std::size_t max_lag = ref.at("max_lag");
  for (const char* name : {"LakeHuron", "lynx"}) {
    INFO(name);
    check_close(sample_autocorrelation(r_series(name), max_lag),
                ref.at("acf").at(name).get<std::vector<double>>(), 1e-12);
  }
}

TEST_CASE("acf with missing points matches statsmodels acf(missing=\"conservative\")") {
  const auto ref = read_reference("values/acf_statsmodels.json");
  const auto& gappy = ref.at("lynx_with_gaps");
  auto x = r_series("lynx");
  for (std::size_t i : gappy.at("gaps").get<std::vector<std::size_t>>())
    x[i] = std::numeric_limits<double>::quiet_NaN();
  check_close(sample_autocorrelation(x, ref.at("max_lag")), gappy.at("acf").get<std::vector<double>>(),
              1e-12);
}

TEST_CASE("acf: denominator n, by hand on a short series") {
  // x = 1, 2, 3, 4: mean 2.5, centred -1.5 -0.5 0.5 1.5.
  // c0 = (2.25 + 0.25 + 0.25 + 2.25) / 4 = 1.25
  // c1 = (0.75 - 0.25 + 0.75) / 4 = 0.3125        -> r1 = 0.25
  // c2 = (-0.75 - 0.75) / 4 = -0.375              -> r2 = -0.3
  // c3 = -2.25 / 4 = -0.5625                      -> r3 = -0.45
  const std::vector<double> x{1, 2, 3, 4};
  const auto c = sample_autocovariance(x, 5);
  CHECK(c[0] == doctest::Approx(1.25).epsilon(1e-15));
  CHECK(c[1] == doctest::Approx(0.3125).epsilon(1e-15));
  const auto r = sample_autocorrelation(x, 5);
  CHECK(r[0] == 1.0);
  CHECK(r[1] == doctest::Approx(0.25).epsilon(1e-15));
  CHECK(r[2] == doctest::Approx(-0.3).epsilon(1e-15));
  CHECK(r[3] == doctest::Approx(-0.45).epsilon(1e-15));
  CHECK(r[4] == 0.0);  // no pairs at lags beyond the length
  CHECK(r[5] == 0.0);
}

TEST_CASE("acf is NaN for a constant series or fewer than two observed points") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  for (const auto& x : {std::vector<double>{3, 3, 3, 3}, std::vector<double>{nan, 1, nan},
                        std::vector<double>{}}) {
    const auto r = sample_autocorrelation(x, 2);
    REQUIRE(r.size() == 3);
    for (double v : r) CHECK(std::isnan(v));
  }
}
