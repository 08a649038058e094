// The simulation smoother for ARIMA fits (see simulation_smoother.hpp). The
// ARMA part of the unconditional draw starts from its stationary
// distribution, the differencing's starting values from zero.
#include <cmath>
#include <limits>

#include <Eigen/Eigenvalues>

#include "gapmark/error.hpp"
#include "gapmark/fill/simulation_smoother.hpp"

namespace gapmark::arima {

std::vector<std::vector<double>> conditional_draws(const Fit& fit, std::span<const double> y, std::size_t draws,
                                                   Rng& rng) {
  const std::size_t n = y.size();
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const StateSpace model(expand(fit.order, fit.coefficients));
  const auto m = static_cast<Eigen::Index>(model.dim());
  const auto r = static_cast<Eigen::Index>(model.arma_dim());
  const std::vector<double> regressor = constant_regressor(fit.order, n);
  // in the standardised units the fit works in
  const double sigma2 = fit.sigma2 / (fit.scale * fit.scale), sigma = std::sqrt(sigma2);
  std::vector<double> z(n);
  for (std::size_t t = 0; t < n; ++t) z[t] = (y[t] - fit.centre) / fit.scale;
  // a square root of the stationary covariance (symmetric, possibly singular)
  const Eigen::MatrixXd p0 = model.initial_covariance() * sigma2;
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(p0);
  const Eigen::MatrixXd root =
      eig.eigenvectors() * eig.eigenvalues().cwiseMax(0.0).cwiseSqrt().asDiagonal();
  const Eigen::VectorXd disturbance = model.disturbance().col(0);  // R: R R' e_1 = R, as R_1 = 1

  std::vector<std::vector<double>> out(draws);
  std::vector<double> plus(n), w(n);
  Eigen::MatrixXd a(m, 1);
  Eigen::VectorXd u(m);
  for (std::size_t k = 0; k < draws; ++k) {
    for (Eigen::Index i = 0; i < m; ++i) u(i) = rng.normal();
    a.col(0) = root * u;
    for (std::size_t t = 0; t < n; ++t) {
      plus[t] = model.design(a.col(0));
      w[t] = std::isnan(z[t]) ? nan : z[t] - plus[t];
      model.transition(a);
      a.col(0).head(r) += disturbance * (sigma * rng.normal());
    }
    Smoothed s;
    try {
      s = smooth(model, w, regressor);
    } catch (const std::exception& e) {
      throw MethodFailure(std::string("the simulation smoother failed: ") + e.what());
    }
    out[k].resize(n);
    for (std::size_t t = 0; t < n; ++t)
      out[k][t] = std::isnan(y[t]) ? fit.centre + fit.scale * (s.mean[t] + plus[t]) : y[t];
  }
  return out;
}

}  // namespace gapmark::arima
