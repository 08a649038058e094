#pragma once
// Soft-Impute: completion of a matrix with missing cells by iterated
// soft-thresholded SVD (Mazumder, Hastie & Tibshirani 2010, "Spectral
// regularization algorithms for learning large incomplete matrices",
// JMLR 11:2287-2322, Algorithm 1). One step is
//
//   W     = observed cells of X, the current estimate Z elsewhere
//   Z_new = U diag(max(d_i - lambda, 0)) V'   where W = U diag(d) V'
//
// optionally keeping only the `max_rank` largest components. With lambda = 0
// and a rank cap the step is a rank-r truncated SVD (iterative hard
// thresholding). Missing cells of X are NaN.
//
// The matrices here are tall and thin (time x a few series): the SVD of the
// n x k matrix W comes from the k x k eigenproblem of W'W (Eigen's
// SelfAdjointEigenSolver: V its eigenvectors, d the square roots of its
// eigenvalues), O(n k^2) per step; U is never formed, since
// U diag(s) V' = W V diag(s / d) V'. Squaring loses the relative accuracy
// of singular values far below the largest (about 1e-16 (d_1 / d_i)^2),
// which is far below what a fill needs.
#include <cstddef>
#include <cstdint>
#include <vector>

#include <Eigen/Dense>

namespace gapmark {

struct SoftImputeOptions {
  double lambda = 0.0;               ///< soft threshold on the singular values, >= 0
  std::size_t max_rank = 0;          ///< keep at most this many components; 0 = no cap
  /// Stop when ||Z_new - Z_old||_F <= tolerance * ||Z_old||_F (the paper's
  /// criterion compares the squared ratio with its epsilon = tolerance^2).
  /// 0 runs exactly max_iterations steps unless a step changes nothing.
  double tolerance = 1e-5;
  std::size_t max_iterations = 1000;
};

struct SoftImputeFit {
  Eigen::MatrixXd z;             ///< the low-rank estimate at every cell
  std::size_t iterations = 0;    ///< steps taken
  bool converged = false;        ///< the tolerance was met before max_iterations
  std::size_t rank = 0;          ///< components kept by the last step
};

/// Runs soft-impute on `x` (NaN = missing) from `start` (same shape; a zero
/// matrix is the paper's start, the previous fit a warm start).
SoftImputeFit soft_impute(const Eigen::MatrixXd& x, const SoftImputeOptions& options,
                          const Eigen::MatrixXd& start);

/// One step: soft-thresholds the SVD of `w` (no missing cells).
Eigen::MatrixXd soft_threshold_svd(const Eigen::MatrixXd& w, double lambda, std::size_t max_rank,
                                   std::size_t* rank_kept = nullptr);

/// Runs soft-impute along a path of lambdas (usually decreasing), each fit
/// starting from the previous one (warm starts), the first from zero.
/// Returns the last fit; `iterations` counts the steps of the whole path.
SoftImputeFit soft_impute_path(const Eigen::MatrixXd& x, const std::vector<double>& lambdas,
                               const SoftImputeOptions& base);

/// The observed cells of `x` with `z` in the missing ones.
Eigen::MatrixXd fill_missing(const Eigen::MatrixXd& x, const Eigen::MatrixXd& z);

/// The largest singular value of `x` with its missing cells set to 0: from
/// a zero start, every lambda at or above it gives the zero matrix.
double lambda_max(const Eigen::MatrixXd& x);

/// `count` values decreasing geometrically from `top` to `top * smallest_ratio`.
std::vector<double> lambda_grid(double top, std::size_t count, double smallest_ratio);

struct LambdaSelection {
  std::vector<double> lambdas;   ///< the grid points visited, decreasing
  std::vector<double> errors;    ///< mean squared error on the held-out cells, per lambda
  std::size_t best = 0;          ///< index of the chosen lambda
  std::size_t held_out = 0;      ///< cells held out
  Eigen::MatrixXd best_z;        ///< the fit at the chosen lambda (a warm start for the refit)
};

/// Chooses lambda on a decreasing grid by hold-out validation: a fraction of
/// the observed cells, drawn with gapmark::Rng from `seed`, is set missing;
/// the path is fitted with warm starts from zero; the lambda with the least
/// mean squared error on the held-out cells wins (ties: the larger lambda).
/// The path stops early once the error has risen above the best for
/// `patience` grid points in a row (0 = visit the whole grid). `base`
/// supplies rank cap, tolerance and iteration limit.
/// The grid's top is lambda_max of the training matrix.
LambdaSelection select_lambda(const Eigen::MatrixXd& x, std::size_t grid_size, double smallest_ratio,
                              double holdout_fraction, std::uint64_t seed,
                              const SoftImputeOptions& base, std::size_t patience);

}  // namespace gapmark
