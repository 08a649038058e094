#pragma once
// Univariate structural time-series models in state-space form, with an
// exactly diffuse Kalman filter, a fixed-interval smoother of the signal and
// maximum-likelihood estimation of the variances.
//
//   y_t       = Z a_t + e_t,          e_t ~ N(0, H)            (observation)
//   a_{t+1}   = T a_t + R n_t,        n_t ~ N(0, diag(Q))      (state)
//
// Four models, nested:
//   local level          state (level);                    variances H, level
//   local linear trend   state (level, slope);             variances H, level, slope
//   basic structural     state (level, slope, g_1..g_{s-1}), dummy seasonal of
//                        period s: g_1,t+1 = -(g_1,t + ... + g_{s-1},t) + w_t;
//                        variances H, level, slope, seasonal
//   trigonometric        state (level, slope, c_1, c*_1, ..., c_k, c*_k): k
//                        harmonics of period s (Durbin & Koopman 2012, sec.
//                        3.2; Harvey 1989), each pair rotating by
//                        l_j = 2 pi j / s per step:
//                          c_j,t+1  =  cos(l_j) c_j,t + sin(l_j) c*_j,t + w_j,t
//                          c*_j,t+1 = -sin(l_j) c_j,t + cos(l_j) c*_j,t + w*_j,t
//                        all 2k disturbances with one seasonal variance;
//                        1 <= k < s/2 (variances H, level, slope, seasonal)
// The signal is Z a_t: level, plus the current seasonal effect (g_1 in the
// dummy form, c_1 + ... + c_k in the trigonometric one). Its smoothed value
// is what a gap is filled with.
//
// Initial state: exactly diffuse (Durbin & Koopman 2012, ch. 5): a_1 has a
// flat prior, carried as a separate "infinite" covariance P_inf that the
// filter removes one rank at a time. The likelihood is the diffuse
// likelihood: the first observations that absorb the flat prior add only
// log F_inf (free of the variances). The filter starts at the first observed
// value; times before it are back-cast from the smoothed state there (with a
// flat prior the result is the same, and a long leading gap cannot spoil the
// conditioning of P_inf). Missing values (NaN) skip the update.
//
// The transition matrices are applied through their structure (O(m^2) per
// step for state dimension m, no dense m x m products in the main loop), so
// a filter pass is O(n m^2), and O(n) for the level and trend models.
#include <algorithm>
#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include <Eigen/Core>

namespace gapmark::state_space {

class StructuralModel {
public:
  static StructuralModel local_level();
  static StructuralModel local_linear_trend();
  /// Local linear trend plus a dummy seasonal of `period` (>= 2). Throws
  /// std::invalid_argument for a smaller period.
  static StructuralModel basic_structural(std::size_t period);
  /// Local linear trend plus `harmonics` trigonometric terms of `period`.
  /// Throws std::invalid_argument unless 1 <= harmonics < period / 2.
  static StructuralModel trigonometric(std::size_t period, std::size_t harmonics);

  bool has_slope() const { return slope_; }
  /// The seasonal period, 0 without a season.
  std::size_t period() const { return period_; }
  /// Number of trigonometric harmonics; 0 for the dummy seasonal (and without a season).
  std::size_t harmonics() const { return harmonics_; }
  /// Number of seasonal states: period - 1 (dummy), 2 x harmonics, or 0.
  std::size_t seasonal_states() const { return seasonal_; }
  /// Dimension m of the state vector: 1, 2, period + 1 or 2 + 2 x harmonics.
  std::size_t state_dim() const { return 1 + (slope_ ? 1 : 0) + seasonal_; }
  /// Index of the first seasonal state (g_1 or c_1); only meaningful with a period.
  std::size_t seasonal_start() const { return slope_ ? 2 : 1; }
  /// Number of variances: irregular first, then one per disturbed component.
  std::size_t variance_count() const { return 2 + (slope_ ? 1 : 0) + (seasonal_ ? 1 : 0); }
  /// "irregular", "level", then "slope" and "seasonal" where present.
  std::vector<std::string> variance_names() const;
  /// The first state disturbed by variance k (k >= 1): level 0, slope 1, seasonal g_1 or c_1...
  std::size_t disturbed_state(std::size_t k) const;
  /// ...and how many consecutive states it disturbs: 1, or 2 x harmonics for
  /// the trigonometric seasonal (each with the same variance, independently).
  std::size_t disturbed_count(std::size_t k) const;
  /// Short name: "level", "trend", "seasonal(s)" or "seasonal(s, k harmonics)".
  std::string name() const;

  /// Number of states the design Z picks (sums into the signal)...
  std::size_t design_count() const { return 1 + (seasonal_ == 0 ? 0 : harmonics_ ? harmonics_ : 1); }
  /// ...and the i-th of them: the level, then g_1 or c_1, c_2, ... (every other state).
  Eigen::Index design_index(std::size_t i) const {
    return i == 0 ? 0 : static_cast<Eigen::Index>(seasonal_start() + 2 * (i - 1));
  }

  /// Dense forms, built from the definitions (for checks and inspection).
  Eigen::MatrixXd transition_matrix() const;
  Eigen::RowVectorXd design_row() const;

  /// a <- T a, applied through the structure (a: m rows, any number of columns).
  template <class D>
  void transition(Eigen::MatrixBase<D>& a) const;
  /// a <- T' a.
  template <class D>
  void transition_transposed(Eigen::MatrixBase<D>& a) const;
  /// a <- T^{-1} a (every model here has an invertible T).
  template <class D>
  void transition_inverse(Eigen::MatrixBase<D>& a) const;
  /// x <- x T' (x: m columns), through whole-column operations.
  template <class D>
  void times_transition_transposed(Eigen::MatrixBase<D>& x) const;
  /// x <- x T.
  template <class D>
  void times_transition(Eigen::MatrixBase<D>& x) const;
  /// x <- T x T' (a state covariance's prediction): transition(x), then
  /// times_transition_transposed(x), with the same result to the bit. The
  /// dummy seasonal's T shifts its states by one and puts minus their sum in
  /// front, so T x T' is x shifted one place down the diagonal with a new row
  /// and column built from x's row and column sums: three passes over x where
  /// the two products take five or six (moving columns one swap at a time).
  template <class D>
  void predict_covariance(Eigen::MatrixBase<D>& x) const;

  /// Z a: the level, plus the current seasonal effect with a period.
  template <class D>
  double signal_of(const Eigen::MatrixBase<D>& a) const {
    // a state of one value is the level alone (said at compile time, so that
    // the compiler sees no read past it)
    if constexpr (D::SizeAtCompileTime == 1) return a(0);
    if (seasonal_ == 0) return a(0);
    if (harmonics_ == 0) return a(0) + a(seasonal_start());
    double sum = a(0);
    for (std::size_t i = 1; i <= harmonics_; ++i) sum += a(design_index(i));
    return sum;
  }

private:
  StructuralModel(bool slope, std::size_t period, std::size_t harmonics);
  /// Each (c_j, c*_j) pair of rows of x: (u, w) <- (cos u + sign sin w,
  /// cos w - sign sin u); sign -1 turns back.
  template <class D>
  void rotate_row_pairs(Eigen::MatrixBase<D>& x, double sign) const;
  /// The same on each pair of columns of x.
  template <class D>
  void rotate_column_pairs(Eigen::MatrixBase<D>& x, double sign) const;
  /// predict_covariance for the dummy seasonal (period >= 3, at most 127 states).
  template <class D>
  void predict_dummy_covariance(Eigen::MatrixBase<D>& x) const;

  bool slope_ = false;
  std::size_t period_ = 0;
  std::size_t harmonics_ = 0;
  std::size_t seasonal_ = 0;  ///< number of seasonal states
  std::vector<double> cos_, sin_;  ///< cos(l_j), sin(l_j) of the harmonics
};

/// The pieces of the diffuse log-likelihood from one filter pass.
struct LikelihoodParts {
  std::size_t observed = 0;   ///< observed values used
  std::size_t diffuse = 0;    ///< of which absorbed by the flat prior (F_inf > 0)
  double sum_log_f_inf = 0;   ///< sum of log F_inf over those
  double sum_log_f = 0;       ///< sum of log F over the others
  double sum_v2_over_f = 0;   ///< sum of v^2 / F over the others
  bool finite = true;         ///< false when a variance F was not positive or not finite
  bool prior_resolved = true; ///< false when too few observations to remove the flat prior

  /// Observations that carry information on the variances.
  std::size_t effective() const { return observed - diffuse; }
  /// Diffuse Gaussian log-likelihood at the variances used.
  double log_likelihood() const;
  /// With all variances multiplied by a common scale c, the scale that
  /// maximises the likelihood (sum v^2/F / effective())...
  double best_scale() const;
  /// ...and the log-likelihood there (the scale concentrated out).
  double concentrated_log_likelihood() const;
};

/// One filter pass over `y` (NaN = missing) with the given variances
/// (irregular first, model.variance_count() of them).
LikelihoodParts filter_likelihood(const StructuralModel& model, std::span<const double> y,
                                  std::span<const double> variances);
/// The same pass through the general matrix step at every time (no scalar
/// shortcuts): the likelihood that smooth_signal_general reports (the same
/// bits as filter_likelihood, which smooth_signal reports for the local level).
LikelihoodParts filter_likelihood_general(const StructuralModel& model, std::span<const double> y,
                                          std::span<const double> variances);

/// Smoothed signal Z a_t given all of `y`: mean and variance at every t
/// (including before the first and after the last observation), by the
/// augmented filter and smoother (de Jong 1991; Durbin & Koopman 2012, sec.
/// 5.7), which keeps its digits where the first observations barely
/// separate the states (for the local level, the same in scalars:
/// state_space_level.hpp); with the diffuse log-likelihood of the filter.
struct SmoothedSignal {
  std::vector<double> mean;
  std::vector<double> variance;
  LikelihoodParts likelihood;
};
/// Throws MethodFailure when the filter fails or the observations are too
/// few to remove the flat prior (the signal is then not identified).
SmoothedSignal smooth_signal(const StructuralModel& model, std::span<const double> y,
                             std::span<const double> variances);
/// The same through the general matrix filter and smoother whatever the
/// model (smooth_signal takes scalar paths for the local level): for checks.
SmoothedSignal smooth_signal_general(const StructuralModel& model, std::span<const double> y,
                                     std::span<const double> variances);

/// The smoothed signal's mean alone for several series that share one
/// pattern of missing values (the same pass as smooth_signal, with the
/// covariances computed once): what the simulation smoother needs. Throws
/// MethodFailure as smooth_signal does, std::invalid_argument when the
/// series differ in length or missing pattern.
std::vector<std::vector<double>> smoothed_signal_means(const StructuralModel& model,
                                                       const std::vector<std::vector<double>>& ys,
                                                       std::span<const double> variances);

/// Observed values centred and scaled to unit (population) variance, without
/// overflow for huge magnitudes: z = (y - centre) / scale, NaN kept. A
/// constant or all-missing series has scale 0 and z all NaN.
struct Standardised {
  double centre = 0;
  double scale = 0;
  std::size_t observed = 0;
  std::vector<double> z;
};
Standardised standardise(std::span<const double> y);

struct FitOptions {
  std::size_t max_evaluations = 600;  ///< per local search
  double x_tolerance = 1e-5;          ///< on log variance ratios
  double f_tolerance = 1e-8;          ///< on the log-likelihood
};

struct FitResult {
  std::vector<double> variances;  ///< maximum-likelihood estimates, irregular first, in data units
  double log_likelihood = 0;      ///< diffuse log-likelihood there
  std::size_t evaluations = 0;    ///< filter passes used
  std::size_t starts = 0;         ///< local searches run
  bool converged = true;          ///< the final search stopped on its tolerances, not its budget
  bool at_bound = false;          ///< a variance ratio ended on its search bound (a variance at about zero)
};

/// Maximum-likelihood variances. The common scale is concentrated out; the
/// free parameters are the logs of the other variances relative to the
/// reference one, searched by BOBYQA (NLopt) from a fixed grid of starting
/// shares (see fit_starts); with two variances (the local level), the one
/// log ratio is screened on a grid and polished by Brent's method (Boost.Math).
/// Deterministic. Throws MethodFailure when the
/// likelihood cannot be evaluated anywhere or too few observations remain.
/// Data that the model follows exactly (no innovation at all) get every
/// variance set to 1e-12 of the data variance and a log-likelihood of +inf.
FitResult fit_variances(const StructuralModel& model, std::span<const double> y,
                        const FitOptions& options = {});

/// The starting shares of the total variance (irregular first), each row
/// summing to one: all equal; each component in turn holding 70%; and, for
/// models with a slope, the irregular and level sharing nearly all of it
/// with the slope (and seasonal) near zero, where such fits often end.
std::vector<std::vector<double>> fit_starts(const StructuralModel& model);

// ---------------------------------------------------------------- templates

template <class D>
void StructuralModel::rotate_row_pairs(Eigen::MatrixBase<D>& x, double sign) const {
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  for (std::size_t j = 0; j < harmonics_; ++j) {
    const Eigen::Index p = s0 + 2 * static_cast<Eigen::Index>(j);
    const double c = cos_[j], s = sign * sin_[j];
    for (Eigen::Index i = 0; i < x.cols(); ++i) {
      const double u = x(p, i), w = x(p + 1, i);
      x(p, i) = c * u + s * w;
      x(p + 1, i) = c * w - s * u;
    }
  }
}

template <class D>
void StructuralModel::rotate_column_pairs(Eigen::MatrixBase<D>& x, double sign) const {
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  for (std::size_t j = 0; j < harmonics_; ++j) {
    const Eigen::Index p = s0 + 2 * static_cast<Eigen::Index>(j);
    const double c = cos_[j], s = sign * sin_[j];
    for (Eigen::Index i = 0; i < x.rows(); ++i) {
      const double u = x(i, p), w = x(i, p + 1);
      x(i, p) = c * u + s * w;
      x(i, p + 1) = c * w - s * u;
    }
  }
}

template <class D>
void StructuralModel::transition(Eigen::MatrixBase<D>& a) const {
  if (slope_) a.row(0) += a.row(1);
  if (seasonal_ == 0) return;
  if (harmonics_) return rotate_row_pairs(a, 1.0);
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  const Eigen::Index k = static_cast<Eigen::Index>(seasonal_);
  for (Eigen::Index c = 0; c < a.cols(); ++c) {
    double sum = 0;
    for (Eigen::Index j = 0; j < k; ++j) sum += a(s0 + j, c);
    for (Eigen::Index j = k - 1; j >= 1; --j) a(s0 + j, c) = a(s0 + j - 1, c);
    a(s0, c) = -sum;
  }
}

template <class D>
void StructuralModel::transition_transposed(Eigen::MatrixBase<D>& a) const {
  if (slope_) a.row(1) += a.row(0);
  if (seasonal_ == 0) return;
  if (harmonics_) return rotate_row_pairs(a, -1.0);  // a rotation's transpose turns back
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  const Eigen::Index k = static_cast<Eigen::Index>(seasonal_);
  for (Eigen::Index c = 0; c < a.cols(); ++c) {
    const double first = a(s0, c);
    for (Eigen::Index j = 0; j + 1 < k; ++j) a(s0 + j, c) = a(s0 + j + 1, c) - first;
    a(s0 + k - 1, c) = -first;
  }
}

template <class D>
void StructuralModel::transition_inverse(Eigen::MatrixBase<D>& a) const {
  if (slope_) a.row(0) -= a.row(1);
  if (seasonal_ == 0) return;
  if (harmonics_) return rotate_row_pairs(a, -1.0);  // a rotation's inverse is its transpose
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  const Eigen::Index k = static_cast<Eigen::Index>(seasonal_);
  for (Eigen::Index c = 0; c < a.cols(); ++c) {
    double sum = 0;
    for (Eigen::Index j = 0; j < k; ++j) sum += a(s0 + j, c);
    for (Eigen::Index j = 0; j + 1 < k; ++j) a(s0 + j, c) = a(s0 + j + 1, c);
    a(s0 + k - 1, c) = -sum;
  }
}

template <class D>
void StructuralModel::times_transition_transposed(Eigen::MatrixBase<D>& x) const {
  // Column j of x T' is the sum over i of T(j, i) times column i of x.
  if (slope_) x.col(0) += x.col(1);
  if (seasonal_ == 0) return;
  if (harmonics_) return rotate_column_pairs(x, 1.0);
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  const Eigen::Index k = static_cast<Eigen::Index>(seasonal_);
  // New g_1 column: minus the sum of all; the others shift right by one.
  // The sum goes into the last column (whose old value is not needed), then
  // a rotation brings it to the front.
  for (Eigen::Index j = 0; j + 1 < k; ++j) x.col(s0 + k - 1) += x.col(s0 + j);
  for (Eigen::Index j = k - 1; j >= 1; --j) x.col(s0 + j).swap(x.col(s0 + j - 1));
  x.col(s0) = -x.col(s0);
}

template <class D>
void StructuralModel::times_transition(Eigen::MatrixBase<D>& x) const {
  // Column j of x T is the sum over i of T(i, j) times column i of x.
  if (slope_) x.col(1) += x.col(0);
  if (seasonal_ == 0) return;
  if (harmonics_) return rotate_column_pairs(x, -1.0);
  const Eigen::Index s0 = static_cast<Eigen::Index>(seasonal_start());
  const Eigen::Index k = static_cast<Eigen::Index>(seasonal_);
  // New column j: old column j + 1 minus old column 0; the last: minus old
  // column 0. Rotate old column 0 to the back first, then subtract it.
  for (Eigen::Index j = 0; j + 1 < k; ++j) x.col(s0 + j).swap(x.col(s0 + j + 1));
  for (Eigen::Index j = 0; j + 1 < k; ++j) x.col(s0 + j) -= x.col(s0 + k - 1);
  x.col(s0 + k - 1) = -x.col(s0 + k - 1);
}

template <class D>
void StructuralModel::predict_covariance(Eigen::MatrixBase<D>& x) const {
  constexpr int rows = D::RowsAtCompileTime;
  if constexpr (rows != Eigen::Dynamic && rows < 4) {  // no dummy seasonal of period 3 or more fits
    transition(x);
    times_transition_transposed(x);
    return;
  } else {
    if (seasonal_ == 0 || harmonics_ > 0 || seasonal_ < 2 || x.rows() > 128) {  // 128: the scratch below
      transition(x);
      times_transition_transposed(x);
      return;
    }
    predict_dummy_covariance(x);
  }
}

template <class D>
void StructuralModel::predict_dummy_covariance(Eigen::MatrixBase<D>& x) const {
  // U = T X T' written out entry by entry, each computed by the same
  // operations in the same order as transition(x) followed by
  // times_transition_transposed(x) (so the filter's results do not change
  // by a bit; X need not be exactly symmetric). With A = T X:
  //   A row s0 = minus each seasonal column's sum, A row s0+i = X row s0+i-1,
  //   A row 0 = X row 0 + X row 1 (with a slope);
  // and U = A T': U column s0 = minus the sum of A's seasonal columns (last
  // first, then s0, s0+1, ...), U column s0+j = A column s0+j-1, U column 0 =
  // A column 0 + A column 1 (with a slope).
  using Eigen::Index;
  const Index m = x.rows(), k = static_cast<Index>(seasonal_), s0 = static_cast<Index>(seasonal_start());
  const Index last = s0 + k - 1;
  Eigen::Matrix<double, Eigen::Dynamic, 1, 0, 128, 1> sums(m), rows(m), level_row(k), slope_row(k);
  // each column's sum over the seasonal rows, in row order (all columns side
  // by side: one chain of additions per column, none waiting on another)
  sums.setZero();
  for (Index j = 0; j < k; ++j)
    for (Index c = 0; c < m; ++c) sums(c) += x(s0 + j, c);
  rows = x.col(last);  // each row's sum over the seasonal columns, last column first
  for (Index j = 0; j + 1 < k; ++j) rows += x.col(s0 + j);
  double total = sums(last);  // A row s0 summed the same way (the negations cancel exactly)
  for (Index j = 0; j + 1 < k; ++j) total += sums(s0 + j);
  double level_total = 0;  // A row 0 (level plus slope) summed the same way
  if (slope_) {
    level_total = x(0, last) + x(1, last);
    for (Index j = 0; j + 1 < k; ++j) level_total += x(0, s0 + j) + x(1, s0 + j);
  } else {
    level_total = rows(0);
  }
  for (Index j = 0; j < k; ++j) {
    level_row(j) = x(0, s0 + j);
    slope_row(j) = slope_ ? x(1, s0 + j) : 0.0;
  }
  // the level and slope columns of the seasonal rows, before the shift
  Eigen::Matrix<double, Eigen::Dynamic, 1, 0, 128, 1> level_col(k), slope_col(k);
  for (Index i = 0; i < k; ++i) {
    level_col(i) = x(s0 + i, 0);
    slope_col(i) = slope_ ? x(s0 + i, 1) : 0.0;
  }
  // seasonal block: U(s0+i, s0+j) = X(s0+i-1, s0+j-1), last column first
  for (Index j = k - 1; j >= 1; --j) x.col(s0 + j).segment(s0 + 1, k - 1) = x.col(s0 + j - 1).segment(s0, k - 1);
  // g_1's row and column
  x(s0, s0) = total;
  for (Index j = 1; j < k; ++j) {
    x(s0, s0 + j) = -sums(s0 + j - 1);
    x(s0 + j, s0) = -rows(s0 + j - 1);
  }
  if (slope_) {
    const double p00 = x(0, 0), p01 = x(0, 1), p10 = x(1, 0), p11 = x(1, 1);
    x(0, s0) = -level_total;
    x(1, s0) = -rows(1);
    x(s0, 0) = -sums(0) + -sums(1);
    x(s0, 1) = -sums(1);
    for (Index j = 1; j < k; ++j) {
      x(0, s0 + j) = level_row(j - 1) + slope_row(j - 1);
      x(1, s0 + j) = slope_row(j - 1);
      x(s0 + j, 0) = level_col(j - 1) + slope_col(j - 1);
      x(s0 + j, 1) = slope_col(j - 1);
    }
    x(0, 0) = (p00 + p10) + (p01 + p11);
    x(0, 1) = p01 + p11;
    x(1, 0) = p10 + p11;
    x(1, 1) = p11;
  } else {
    x(0, s0) = -level_total;
    x(s0, 0) = -sums(0);
    for (Index j = 1; j < k; ++j) {
      x(0, s0 + j) = level_row(j - 1);
      x(s0 + j, 0) = level_col(j - 1);
    }
  }
}

}  // namespace gapmark::state_space
