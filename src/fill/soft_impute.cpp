#include "gapmark/fill/soft_impute.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/rng.hpp"

namespace gapmark {

Eigen::MatrixXd soft_threshold_svd(const Eigen::MatrixXd& w, double lambda, std::size_t max_rank,
                                   std::size_t* rank_kept) {
  // W = U D V' gives W'W = V D^2 V': V and D from the k x k eigenproblem
  // (eigenvalues in increasing order), and U D_lambda V' = W V diag(f) V'
  // with f = (d - lambda) / d on the components kept.
  const Eigen::MatrixXd gram = w.transpose() * w;
  const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(gram);
  if (eig.info() != Eigen::Success)
    return Eigen::MatrixXd::Constant(w.rows(), w.cols(), std::numeric_limits<double>::quiet_NaN());
  const Eigen::Index k = gram.cols();
  const std::size_t cap = max_rank == 0 ? static_cast<std::size_t>(k) : max_rank;
  Eigen::MatrixXd v(k, k);
  Eigen::VectorXd factor(k);
  std::size_t kept = 0;
  for (Eigen::Index i = k - 1; i >= 0; --i) {
    const double d = std::sqrt(std::max(eig.eigenvalues()(i), 0.0));
    if (kept >= cap || !(d > lambda) || d == 0.0) break;
    v.col(static_cast<Eigen::Index>(kept)) = eig.eigenvectors().col(i);
    factor(static_cast<Eigen::Index>(kept)) = (d - lambda) / d;
    ++kept;
  }
  if (rank_kept) *rank_kept = kept;
  if (kept == 0) return Eigen::MatrixXd::Zero(w.rows(), w.cols());
  const auto r = static_cast<Eigen::Index>(kept);
  const Eigen::MatrixXd m = v.leftCols(r) * factor.head(r).asDiagonal() * v.leftCols(r).transpose();
  return w * m;
}

Eigen::MatrixXd fill_missing(const Eigen::MatrixXd& x, const Eigen::MatrixXd& z) {
  return x.array().isNaN().select(z, x);
}

SoftImputeFit soft_impute(const Eigen::MatrixXd& x, const SoftImputeOptions& options,
                          const Eigen::MatrixXd& start) {
  SoftImputeFit fit;
  fit.z = start;
  const auto missing = x.array().isNaN().eval();
  Eigen::MatrixXd w(x.rows(), x.cols());
  while (fit.iterations < options.max_iterations) {
    w = missing.select(fit.z, x);
    Eigen::MatrixXd next = soft_threshold_svd(w, options.lambda, options.max_rank, &fit.rank);
    const double change = (next - fit.z).norm();
    const double size = fit.z.norm();
    fit.z = std::move(next);
    ++fit.iterations;
    if (!std::isfinite(change)) break;
    if (change <= options.tolerance * size) {
      fit.converged = true;
      break;
    }
  }
  return fit;
}

double lambda_max(const Eigen::MatrixXd& x) {
  const Eigen::MatrixXd zeroed = x.array().isNaN().select(0.0, x);
  if (zeroed.size() == 0) return 0.0;
  const Eigen::JacobiSVD<Eigen::MatrixXd> svd(zeroed);
  return svd.singularValues()(0);
}

SoftImputeFit soft_impute_path(const Eigen::MatrixXd& x, const std::vector<double>& lambdas,
                               const SoftImputeOptions& base) {
  SoftImputeFit fit;
  fit.z = Eigen::MatrixXd::Zero(x.rows(), x.cols());
  std::size_t steps = 0;
  for (double lambda : lambdas) {
    SoftImputeOptions options = base;
    options.lambda = lambda;
    fit = soft_impute(x, options, fit.z);
    steps += fit.iterations;
  }
  fit.iterations = steps;
  return fit;
}

std::vector<double> lambda_grid(double top, std::size_t count, double smallest_ratio) {
  std::vector<double> grid;
  if (count == 0) return grid;
  if (count == 1) return {top};
  const double log_step = std::log(smallest_ratio) / static_cast<double>(count - 1);
  for (std::size_t i = 0; i < count; ++i) grid.push_back(top * std::exp(log_step * static_cast<double>(i)));
  return grid;
}

LambdaSelection select_lambda(const Eigen::MatrixXd& x, std::size_t grid_size, double smallest_ratio,
                              double holdout_fraction, std::uint64_t seed,
                              const SoftImputeOptions& base, std::size_t patience) {
  // Observed cells in column-major order; a partial Fisher-Yates shuffle
  // moves the held-out ones to the front.
  std::vector<Eigen::Index> cells;
  for (Eigen::Index i = 0; i < x.size(); ++i)
    if (!std::isnan(x.data()[i])) cells.push_back(i);
  LambdaSelection out;
  if (cells.empty()) return out;
  const auto wanted = static_cast<std::size_t>(std::llround(holdout_fraction * static_cast<double>(cells.size())));
  out.held_out = std::clamp<std::size_t>(wanted, 1, cells.size());
  Rng rng(seed);
  for (std::size_t i = 0; i < out.held_out; ++i) {
    const std::size_t j = i + static_cast<std::size_t>(rng.below(cells.size() - i));
    std::swap(cells[i], cells[j]);
  }
  cells.resize(out.held_out);
  Eigen::MatrixXd train = x;
  for (Eigen::Index c : cells) train.data()[c] = std::numeric_limits<double>::quiet_NaN();

  Eigen::MatrixXd z = Eigen::MatrixXd::Zero(x.rows(), x.cols());
  double best_error = std::numeric_limits<double>::infinity();
  std::size_t rising = 0;
  for (double lambda : lambda_grid(lambda_max(train), grid_size, smallest_ratio)) {
    SoftImputeOptions options = base;
    options.lambda = lambda;
    z = soft_impute(train, options, z).z;
    double sum = 0.0;
    for (Eigen::Index c : cells) {
      const double e = z.data()[c] - x.data()[c];
      sum += e * e;
    }
    const double error = sum / static_cast<double>(cells.size());
    out.lambdas.push_back(lambda);
    out.errors.push_back(error);
    if (error < best_error) {
      best_error = error;
      out.best = out.lambdas.size() - 1;
      out.best_z = z;
      rising = 0;
    } else if (patience > 0 && ++rising >= patience) {
      break;
    }
  }
  if (out.best_z.size() == 0) out.best_z = Eigen::MatrixXd::Zero(x.rows(), x.cols());
  return out;
}

}  // namespace gapmark
