#pragma once
// ARIMA(p,d,q)(P,D,Q)s in state-space form, its exact Gaussian likelihood
// with missing observations skipped, and the smoothed values at the gaps.
//
// The model: phi(B) Phi(B^s) (1-B)^d (1-B^s)^D (y_t - x_t' beta) =
// theta(B) Theta(B^s) e_t, e_t ~ N(0, sigma^2), with
//   phi(B) = 1 - phi_1 B - ... - phi_p B^p, theta(B) = 1 + theta_1 B + ... ,
// the seasonal polynomials alike in B^s, and x_t an optional mean (d + D = 0)
// or drift (d + D = 1) regressor.
//
// State (dimension m = r + nd): the ARMA part of the differenced series in
// Harvey's form (r = max(p + sP, q + sQ + 1) states; T has the AR
// coefficients in its first column and ones above the diagonal, R = (1,
// theta_1, ..., theta_{r-1})'), followed by the nd = d + sD previous values
// of the series, from which the differencing polynomial 1 - delta_1 B - ...
// - delta_nd B^nd rebuilds y:
//   y_t = alpha_t,0 + delta_1 y_{t-1} + ... + delta_nd y_{t-nd}.
// The ARMA part starts from its stationary distribution; the nd starting
// values are diffuse (unknown constants with a flat prior), as are none of
// the regression coefficients, which are profiled out by generalised least
// squares. Both are handled by augmenting the Kalman filter with one column
// per unknown (de Jong 1991; Durbin & Koopman 2012, sec. 5.7 and 6.2), so
// the filter runs on a proper covariance throughout and the diffuse
// likelihood is exact. Missing values (NaN) skip the update (Jones 1980).
//
// Scale: sigma^2 is concentrated out. The reported log-likelihood leaves out
// the parameter-free term of the diffuse steps (sum of log F_inf), so it is
// the value R's arima() and statsmodels' SARIMAX report for the same data.
#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include <Eigen/Core>

namespace gapmark::arima {

struct Order {
  int p = 0, d = 0, q = 0;
  int seasonal_p = 0, seasonal_d = 0, seasonal_q = 0;
  std::size_t period = 0;   ///< s; 0 or 1 without a season
  bool constant = false;    ///< a mean (d + D = 0) or a drift (d + D = 1)

  std::size_t arma_count() const {
    return static_cast<std::size_t>(p + q + seasonal_p + seasonal_q);
  }
  /// nd = d + s D: the number of diffuse starting values.
  std::size_t differencing_lags() const {
    return static_cast<std::size_t>(d) + period * static_cast<std::size_t>(seasonal_d);
  }
  /// "(p,d,q)", then "(P,D,Q)s" with a seasonal part, then " with mean/drift".
  std::string text() const;
  bool operator==(const Order&) const = default;
};

/// The ARMA coefficients of one model, in the sign conventions above.
struct Coefficients {
  std::vector<double> ar, ma, seasonal_ar, seasonal_ma;
};

/// The multiplied-out polynomials: phi_full (length p + sP) and theta_full
/// (length q + sQ), both without the leading 1, and the differencing
/// coefficients delta (length nd).
struct Polynomials {
  std::vector<double> phi, theta, delta;
};
Polynomials expand(const Order& order, const Coefficients& c);

/// The regressor column x_t of the mean or drift, t = 0..n-1: ones for a
/// mean, (t + 1) / n for a drift (scaled so its coefficient is of the
/// data's size per series length). Empty without a constant.
std::vector<double> constant_regressor(const Order& order, std::size_t n);

class StateSpace {
public:
  StateSpace(const Polynomials& poly);

  std::size_t arma_dim() const { return r_; }
  std::size_t diff_dim() const { return nd_; }
  std::size_t dim() const { return r_ + nd_; }

  /// X <- T X (row operations; X has dim() rows).
  void transition(Eigen::Ref<Eigen::MatrixXd> x) const;
  /// X <- T' X.
  void transition_transposed(Eigen::Ref<Eigen::MatrixXd> x) const;
  /// Z x for one column.
  double design(const Eigen::Ref<const Eigen::VectorXd>& x) const;
  /// Z' w added to row-wise: X.row(i) += Z_i * w for the states in Z.
  void add_design_transposed(Eigen::Ref<Eigen::MatrixXd> x, const Eigen::Ref<const Eigen::RowVectorXd>& w) const;
  /// R R' (arma_dim square), the state disturbance covariance in sigma^2 units.
  const Eigen::MatrixXd& disturbance() const { return rr_; }
  /// The differencing coefficients delta_1..delta_nd.
  const std::vector<double>& delta() const { return delta_; }
  /// Stationary covariance of the ARMA states (sigma^2 units), with the
  /// differencing block zero: the proper part of the initial covariance.
  Eigen::MatrixXd initial_covariance() const;

private:
  std::size_t r_ = 1, nd_ = 0;
  std::vector<double> phi_;                     ///< length r (padded with zeros)
  std::vector<double> delta_;                   ///< length nd
  std::vector<std::pair<std::size_t, double>> z_;  ///< nonzero entries of Z
  Eigen::MatrixXd rr_;
};

/// What one pass of the augmented filter gives, in the units of `y`.
struct Likelihood {
  bool finite = true;          ///< false when the pass could not be evaluated
  std::size_t observed = 0;    ///< observed values
  std::size_t effective = 0;   ///< observed minus the diffuse starting values
  double log_likelihood = 0;   ///< concentrated over sigma^2 and the regression
  double sigma2 = 0;           ///< its estimate
  std::vector<double> beta;    ///< GLS regression coefficients (mean or drift)
};

/// The augmented filter over `y` (NaN = missing) with the given regressor
/// column (empty or one per point).
Likelihood likelihood(const StateSpace& model, std::span<const double> y, std::span<const double> regressor);

/// Smoothed values at every point (observed points keep y) and their
/// variances (0 at observed points), with the likelihood of the same pass.
/// The variance of a filled value includes the uncertainty of the diffuse
/// starting values; the regression coefficients are taken as known at their
/// estimates, like the ARMA coefficients (plug-in).
struct Smoothed {
  std::vector<double> mean;
  std::vector<double> variance;
  Likelihood likelihood;
};
Smoothed smooth(const StateSpace& model, std::span<const double> y, std::span<const double> regressor);

/// The parameter-free part of the diffuse likelihood: sum over the diffuse
/// steps of log F_inf, from the diffuse covariance of the nd starting values
/// alone (the missing pattern decides which steps are diffuse).
double diffuse_log_determinant(std::span<const double> delta, std::span<const double> y);

}  // namespace gapmark::arima
