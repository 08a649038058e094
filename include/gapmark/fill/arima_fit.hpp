#pragma once
// Maximum-likelihood fit of an ARIMA model of given order (arima_model.hpp).
//
// The data are centred and scaled to unit variance first; results are in
// data units. sigma^2 and the mean or drift are concentrated out, so the
// search runs over the ARMA coefficients only. Each polynomial (AR, MA,
// seasonal AR, seasonal MA) is parametrised by its partial autocorrelations
// r_k = tanh(x_k) in (-1, 1), turned into coefficients by the Durbin-Levinson
// recursion (Barndorff-Nielsen & Schou 1973; Jones 1980; Monahan 1984 for
// the MA side), so every x gives a stationary AR and an invertible MA part.
// The x are searched by BOBYQA (NLopt) from zero (or from a neighbouring
// model's end point, fit_from), within |x| <= 7 (|r| below 0.999998); a fit
// whose x reaches that bound lies on the edge of stationarity or
// invertibility and says so (at_bound).
#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "gapmark/fill/arima_model.hpp"

namespace gapmark::arima {

struct Fit {
  Order order;
  Coefficients coefficients;
  std::vector<double> beta;      ///< mean (data units) or drift per step, when order.constant
  double sigma2 = 0;             ///< innovation variance, data units
  double log_likelihood = 0;     ///< data units, as R's arima() reports it
  double aicc = 0;               ///< -2 logL + 2k + 2k(k + 1)/(n - k - 1); +inf when n - k - 1 <= 0
  std::size_t effective = 0;     ///< n: observed values minus the diffuse starting values
  std::size_t evaluations = 0;   ///< likelihood passes
  bool converged = true;         ///< the optimiser stopped on its tolerances, not on its budget
  bool at_bound = false;         ///< a partial autocorrelation ended at the search bound
  double centre = 0, scale = 1;  ///< the standardisation used internally
  /// The searched parameters x (partial autocorrelations tanh(x): AR, MA,
  /// seasonal AR, seasonal MA blocks in turn), for a warm start.
  std::vector<double> parameters;
};

/// Partial autocorrelations -> coefficients of 1 - phi_1 B - ... (Durbin-Levinson).
std::vector<double> coefficients_from_partials(std::span<const double> partials);

/// Stopping rules of the search.
struct FitTolerance {
  double x = 1e-7;                  ///< on the parameters x
  double log_likelihood = 1e-10;    ///< on the log-likelihood (standardised data)
  std::size_t max_evaluations = 2000;
};
/// Loose rules for comparing candidate orders; the chosen one is refitted tightly.
inline constexpr FitTolerance kScreeningTolerance{1e-3, 1e-4, 300};

/// Fits `order` to `y` (NaN = missing). Throws MethodFailure when the data
/// are too few for the order or the likelihood cannot be evaluated.
Fit fit(const Order& order, std::span<const double> y, const FitTolerance& tolerance = {});
/// The same search started from `start` (one x per ARMA coefficient, as in
/// Fit::parameters; clamped to the bounds) rather than from zero, with
/// initial steps of `step`.
Fit fit_from(const Order& order, std::span<const double> y, std::span<const double> start, double step,
             const FitTolerance& tolerance = {});
/// The parameters of `to` that start where the fit `from` ended: each block
/// of partial autocorrelations keeps its values, truncated or padded with
/// zeros (a zero partial adds nothing, so a larger order starts at exactly
/// the smaller model's likelihood).
std::vector<double> warm_start(const Fit& from, const Order& to);

/// The smoothed values and variances of `y` under a fit (data units; a
/// variance that is no normal double in data units is NaN).
Smoothed smooth_fit(const Fit& fit, std::span<const double> y);

}  // namespace gapmark::arima
