// An exactly low-rank matrix (400 x 6, rank 2) with 30 % of its cells
// missing is recovered to 1e-6. Recovery needs the hard rank cap with no
// shrinkage (rank given, lambda 0): any lambda > 0 biases the singular
// values, and so the fill, by lambda. Each row loses one or two cells (30 %
// of the cells on average), so every row keeps at least 4 observed cells
// and is determined; rows with only as many observed cells as the rank are
// determined too but make the iteration converge very slowly.
#include <doctest/doctest.h>

#include <Eigen/Dense>

#include "gapmark/fill/soft_impute.hpp"
#include "lowrank_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {
constexpr std::size_t kRows = 400;
const std::vector<double> kLevel{10.0, -3.0, 5.0, 0.5, 100.0, 7.0};
const std::vector<double> kA{2.0, 1.0, -4.0, 0.3, 15.0, -1.0};
const std::vector<double> kB{-1.0, 3.0, 0.5, 2.0, -6.0, 4.0};
const std::vector<double> kNone(6, 0.0);
constexpr double kTwoShare = 0.8;  // 1.8 of 6 cells per row: 30 %
constexpr const char* kTight = ",tolerance=1e-12,max_iterations=100000";
}  // namespace

TEST_CASE("the gap mask has about 30 % missing cells and gaps in every column") {
  const Columns full = factor_matrix(kRows, kLevel, kA, kNone);
  const Columns holed = row_gaps(full, kTwoShare, 7);
  std::size_t missing = 0;
  for (const auto& c : holed) {
    std::size_t col_missing = 0;
    for (double v : c) col_missing += std::isnan(v) ? 1 : 0;
    CHECK(col_missing > 50);
    missing += col_missing;
  }
  const double share = static_cast<double>(missing) / static_cast<double>(kRows * 6);
  CHECK(share > 0.28);
  CHECK(share < 0.32);
}

TEST_CASE("rank 2 with a level per series: rank=2 recovers each series to 1e-6") {
  // level + a f: rank 2, and the constant is in its column space, so the
  // centred matrix is still of rank 2.
  const Columns full = factor_matrix(kRows, kLevel, kA, kNone);
  const Columns holed = row_gaps(full, kTwoShare, 7);
  for (std::size_t j : {0, 3, 4}) {
    CAPTURE(j);
    const auto filled = run_low_rank(std::string("low-rank:rank=2") + kTight, holed, j);
    CHECK(max_gap_error(filled, holed[j], full[j]) < 1e-6);
  }
}

TEST_CASE("rank 2 without a shared level: the centred matrix has rank 3") {
  const Columns full = factor_matrix(kRows, kNone, kA, kB);
  const Columns holed = row_gaps(full, kTwoShare, 11);
  SUBCASE("soft_impute on the raw matrix with max_rank 2 recovers it") {
    Eigen::MatrixXd x(kRows, 6), truth(kRows, 6);
    for (Eigen::Index j = 0; j < 6; ++j)
      for (Eigen::Index i = 0; i < static_cast<Eigen::Index>(kRows); ++i) {
        x(i, j) = holed[j][i];
        truth(i, j) = full[j][i];
      }
    const SoftImputeFit fit =
        soft_impute(x, {.lambda = 0.0, .max_rank = 2, .tolerance = 1e-12, .max_iterations = 100000},
                    Eigen::MatrixXd::Zero(kRows, 6));
    CHECK(fit.converged);
    CHECK(fit.rank == 2);
    CHECK((fill_missing(x, fit.z) - truth).cwiseAbs().maxCoeff() < 1e-6);
  }
  SUBCASE("the method needs rank=3, since it centres each column first") {
    const auto filled3 = run_low_rank(std::string("low-rank:rank=3") + kTight, holed);
    CHECK(max_gap_error(filled3, holed[0], full[0]) < 1e-6);
    const auto filled2 = run_low_rank(std::string("low-rank:rank=2") + kTight, holed);
    CHECK(max_gap_error(filled2, holed[0], full[0]) > 1e-3);
  }
}

TEST_CASE("observed values come back unchanged, bit for bit") {
  const Columns full = factor_matrix(kRows, kLevel, kA, kB, 0.05, 3);
  const Columns holed = row_gaps(full, kTwoShare, 5);
  const auto filled = run_low_rank("low-rank:rank=2,lambda=0.05", holed);
  REQUIRE(filled.size() == kRows);
  for (std::size_t i = 0; i < kRows; ++i) {
    CAPTURE(i);
    if (std::isnan(holed[0][i])) CHECK(std::isfinite(filled[i]));
    else CHECK(filled[i] == holed[0][i]);
  }
}
