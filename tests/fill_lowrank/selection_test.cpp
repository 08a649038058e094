// Choosing lambda by hold-out validation, and the method's needs and
// failures. The selection has no outside reference value (it depends on
// gapmark's own random stream); these tests check its properties: it is
// deterministic, it holds out the documented share of cells, and on noisy
// low-rank data its fill is close to that of the best of several fixed
// lambdas (judged on the truth, which the choice never sees).
#include <doctest/doctest.h>

#include <Eigen/Dense>
#include <cstring>

#include "gapmark/error.hpp"
#include "gapmark/fill/soft_impute.hpp"
#include "lowrank_helpers.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

const std::vector<double> kLevel{4.0, 20.0, -1.0, 0.0, 9.0};
const std::vector<double> kA{1.0, -3.0, 0.5, 2.0, 1.5};
const std::vector<double> kB{2.0, 1.0, -2.0, 0.5, -4.0};

std::string failure_of(const std::string& call, const Columns& cols) {
  try {
    run_low_rank(call, cols);
  } catch (const MethodFailure& e) {
    return e.what();
  }
  return "(no failure)";
}

}  // namespace

TEST_CASE("with neither rank nor lambda, the chosen lambda fills about as well as the best fixed one") {
  const Columns full = factor_matrix(300, kLevel, kA, kB, 0.05, 21);
  const Columns holed = with_gaps(full, 0.2, 2, 22);
  const auto chosen = run_low_rank("low-rank", holed);
  const double e_chosen = gap_rmse(chosen, holed[0], full[0]);
  // The best of a few fixed lambdas, judged on the truth (which the choice never sees).
  double e_best = 1e300;
  for (const char* f : {"0.3", "0.1", "0.03", "0.01", "0.003"})
    e_best = std::min(e_best, gap_rmse(run_low_rank(std::string("low-rank:lambda=") + f, holed), holed[0], full[0]));
  const auto mean = bind_method("mean");
  const TimeAxis axis = TimeAxis::index(300);
  FillRequest request;
  request.values = holed[0];
  request.axis = &axis;
  const double e_mean = gap_rmse(mean.impl->fill(request).values, holed[0], full[0]);
  MESSAGE("gap RMSE: chosen lambda " << e_chosen << ", best fixed lambda " << e_best << ", column mean " << e_mean);
  CHECK(e_chosen < 1.5 * e_best);
  CHECK(e_chosen < 0.5 * e_mean);

  SUBCASE("the chosen lambda and rank are on record") {
    const FillResult r = fill_low_rank("low-rank", holed);
    REQUIRE(r.fit.parameters.size() == 2);
    const double lambda = r.fit.parameters[0].second, rank = r.fit.parameters[1].second;
    MESSAGE("chosen lambda " << lambda << " of lambda_max, rank " << rank);
    // On these nearly exactly low-rank data the held-out error keeps falling
    // down to the grid's smallest lambda (1/1000 of the training matrix's
    // lambda_max, a little below 1/1000 of the whole matrix's): the choice is
    // at the end of the grid, and the record says so.
    CHECK(lambda > 0);
    CHECK(lambda < 1.1e-3);
    CHECK(r.fit.at_bound);
    // five noisy series built from a level and two factors: at least the two
    // factors survive the threshold, and never more components than series
    CHECK(rank >= 2);
    CHECK(rank <= 5);
    CHECK(r.fit.converged);
  }

  SUBCASE("a lambda chosen inside the grid is not flagged") {
    // much noisier data: the held-out error turns up before the grid's end
    const Columns noisy = factor_matrix(300, kLevel, kA, kB, 1.5, 23);
    const FillResult r = fill_low_rank("low-rank", with_gaps(noisy, 0.2, 2, 24));
    REQUIRE(r.fit.parameters.size() == 2);
    MESSAGE("noisy data: chosen lambda " << r.fit.parameters[0].second << ", rank " << r.fit.parameters[1].second);
    CHECK(r.fit.parameters[0].second > 1.1e-3);
    CHECK_FALSE(r.fit.at_bound);
  }

  SUBCASE("the same data give the same bytes") {
    const auto again = run_low_rank("low-rank", holed);
    CHECK(std::memcmp(again.data(), chosen.data(), chosen.size() * sizeof(double)) == 0);
  }
}

TEST_CASE("select_lambda holds out 10 % of the observed cells and stops past the best lambda") {
  const Columns full = factor_matrix(300, kLevel, kA, kB, 0.05, 21);
  const Columns holed = with_gaps(full, 0.2, 2, 22);
  Eigen::MatrixXd x(300, 5);
  for (Eigen::Index j = 0; j < 5; ++j) {
    double sum = 0, count = 0;
    for (double v : holed[j])
      if (!std::isnan(v)) { sum += v; ++count; }
    for (Eigen::Index i = 0; i < 300; ++i) x(i, j) = holed[j][i] - sum / count;
  }
  const auto observed = static_cast<double>((!x.array().isNaN()).count());
  const LambdaSelection sel = select_lambda(x, 20, 1e-3, 0.1, 99, {}, 3);
  CHECK(sel.held_out == static_cast<std::size_t>(std::llround(0.1 * observed)));
  REQUIRE(sel.lambdas.size() == sel.errors.size());
  REQUIRE(sel.lambdas.size() >= 4);
  for (std::size_t i = 1; i < sel.lambdas.size(); ++i) CHECK(sel.lambdas[i] < sel.lambdas[i - 1]);
  CHECK(sel.best > 0);  // not the zero fit at lambda_max
  CHECK(sel.errors[sel.best] < 0.1 * sel.errors[0]);
  // Early stop: the path ends at most `patience` points past the best.
  CHECK(sel.lambdas.size() <= sel.best + 4);
  // Another seed holds out other cells but should land near the same lambda.
  const LambdaSelection other = select_lambda(x, 20, 1e-3, 0.1, 100, {}, 3);
  CHECK(other.errors != sel.errors);
  CHECK(std::abs(static_cast<int>(other.best) - static_cast<int>(sel.best)) <= 2);
}

TEST_CASE("needs and failures are stated") {
  const Columns full = factor_matrix(60, kLevel, kA, kB, 0.05, 5);
  const Columns holed = with_gaps(full, 0.2, 2, 6);
  SUBCASE("no siblings") {
    CHECK(failure_of("low-rank", {holed[0]}) == "needs sibling series on the same time axis");
  }
  SUBCASE("siblings of another length or with nothing observed are left out") {
    Columns odd{holed[0], std::vector<double>(59, 1.0), std::vector<double>(60, NA)};
    CHECK(failure_of("low-rank", odd) ==
          "needs at least one sibling series of the same length with observed values");
  }
  SUBCASE("a rank as large as the number of series, with no shrinkage, leaves nothing to learn") {
    CHECK(failure_of("low-rank:rank=5", holed) ==
          "rank 5 leaves nothing to complete with 5 series; choose a rank below the number of series");
  }
  SUBCASE("too few observed cells to choose lambda") {
    Columns sparse(2, std::vector<double>(12, NA));
    for (std::size_t i = 0; i < 12; i += 2) { sparse[0][i] = 1.0 + static_cast<double>(i); sparse[1][i] = 2.0; }
    CHECK(failure_of("low-rank", sparse) ==
          "only 12 observed cells, too few to choose lambda by hold-out (needs 20); give rank or lambda");
    CHECK(failure_of("low-rank:lambda=0.1", sparse) == "(no failure)");
  }
  SUBCASE("parameters out of range are input errors") {
    CHECK_THROWS_AS(bind_method("low-rank:lambda=1.5"), InputError);
    CHECK_THROWS_AS(bind_method("low-rank:rank=-1"), InputError);
  }
}

TEST_CASE("a row missing in every series is filled with the column's mean") {
  Columns full = factor_matrix(80, kLevel, kA, kB, 0.05, 8);
  Columns holed = with_gaps(full, 0.1, 2, 9);
  for (auto& c : holed) c[40] = NA;
  const auto filled = run_low_rank("low-rank:rank=2", holed);
  double sum = 0, count = 0;
  for (double v : holed[0])
    if (!std::isnan(v)) { sum += v; ++count; }
  CHECK(filled[40] == doctest::Approx(sum / count).epsilon(1e-9));
}
