// Soft-impute against a short numpy reference iteration
// (reference/low_rank/soft_impute_cases.json, written by
// reference/low_rank/make_reference.py with numpy.linalg.svd; versions in
// the file): the same update from the paper (Mazumder, Hastie & Tibshirani
// 2010, Algorithm 1), the same lambda, the same start (zero) and the same
// number of steps; for a rank alone, the same warm-started path of lambdas. Checked twice: the algorithm on the stored standardised
// matrix, and the method end to end (standardising, lambda as a fraction of
// lambda_max, scaling back). Agreement: 1e-9, absolute on the standardised
// scale, relative to the series' magnitude on the original scale.
#include <doctest/doctest.h>

#include <Eigen/Dense>
#include <fstream>
#include <nlohmann/json.hpp>

#include "../reference_json.hpp"
#include "gapmark/fill/soft_impute.hpp"
#include "gapmark/number_format.hpp"
#include "lowrank_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

nlohmann::json load_reference() {
  return gapmark::test::reference_json("low_rank/soft_impute_cases.json");
}

std::vector<double> vec(const nlohmann::json& a) {
  std::vector<double> v;
  for (const auto& e : a) v.push_back(e.is_null() ? NA : e.get<double>());
  return v;
}

Columns columns(const nlohmann::json& a) {
  Columns c;
  for (const auto& col : a) c.push_back(vec(col));
  return c;
}

Eigen::MatrixXd matrix(const Columns& c) {
  Eigen::MatrixXd m(static_cast<Eigen::Index>(c[0].size()), static_cast<Eigen::Index>(c.size()));
  for (std::size_t j = 0; j < c.size(); ++j)
    for (std::size_t i = 0; i < c[j].size(); ++i)
      m(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) = c[j][i];
  return m;
}

}  // namespace

TEST_CASE("soft-impute steps agree with the numpy reference iteration") {
  const auto ref = load_reference();
  REQUIRE(ref["cases"].size() >= 4);
  for (const auto& c : ref["cases"]) {
    const std::string name = c["name"];
    CAPTURE(name);
    const Eigen::MatrixXd x = matrix(columns(c["standardised"]));
    const Eigen::MatrixXd expected = matrix(columns(c["z"]));
    CHECK(lambda_max(x) == doctest::Approx(c["lambda_max"].get<double>()).epsilon(1e-12));
    const SoftImputeOptions options{.lambda = 0.0,
                                    .max_rank = c["rank"].get<std::size_t>(),
                                    .tolerance = 0.0,
                                    .max_iterations = c["iterations"].get<std::size_t>()};
    const SoftImputeFit fit = soft_impute_path(x, c["lambdas"].get<std::vector<double>>(), options);
    CHECK((fit.z - expected).cwiseAbs().maxCoeff() < 1e-9);
  }
}

TEST_CASE("the low-rank method agrees with the numpy reference end to end") {
  const auto ref = load_reference();
  for (const auto& c : ref["cases"]) {
    const std::string name = c["name"];
    CAPTURE(name);
    const Columns cols = columns(c["values"]);
    const std::vector<double> expected = vec(c["filled"]);
    std::string call = "low-rank:tolerance=0,max_iterations=" + std::to_string(c["iterations"].get<int>());
    if (c["rank"].get<int>() > 0) call += ",rank=" + std::to_string(c["rank"].get<int>());
    if (c["lambda_fraction"].get<double>() > 0) call += ",lambda=" + format_double(c["lambda_fraction"].get<double>());
    const FillResult result = fill_low_rank(call, cols);
    const auto& got = result.values;
    REQUIRE(got.size() == expected.size());
    // the fit on record: the lambda given (as a fraction of lambda_max; 0 on
    // the rank-only path's last step) and the components the last step kept,
    // as the numpy iteration counts them
    CHECK(result.fit.model == "soft-thresholded SVD, " + std::to_string(cols.size()) + " series");
    REQUIRE(result.fit.parameters.size() == 2);
    CHECK(result.fit.parameters[0].first == "lambda");
    CHECK(result.fit.parameters[0].second == doctest::Approx(c["lambda_fraction"].get<double>()).epsilon(1e-12));
    CHECK(result.fit.parameters[1].first == "rank");
    CHECK(result.fit.parameters[1].second == c["rank_kept"].get<double>());
    CHECK(result.fit.iterations > 0);
    CHECK_FALSE(result.fit.at_bound);
    double scale = 0.0;
    for (double v : expected) scale = std::max(scale, std::abs(v));
    std::size_t gaps = 0;
    for (std::size_t i = 0; i < got.size(); ++i) {
      CAPTURE(i);
      CHECK(std::abs(got[i] - expected[i]) <= 1e-9 * scale);
      gaps += std::isnan(cols[0][i]) ? 1 : 0;
    }
    CHECK(gaps >= 10);
  }
}
