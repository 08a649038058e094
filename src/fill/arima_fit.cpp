// Maximum-likelihood ARIMA fit (see arima_fit.hpp).
#include "gapmark/fill/arima_fit.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <nlopt.hpp>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"

namespace gapmark::arima {

std::vector<double> coefficients_from_partials(std::span<const double> partials) {
  std::vector<double> phi, previous;
  for (std::size_t k = 0; k < partials.size(); ++k) {
    previous = phi;
    phi.assign(k + 1, 0.0);
    phi[k] = partials[k];
    for (std::size_t j = 0; j < k; ++j) phi[j] = previous[j] - partials[k] * previous[k - 1 - j];
  }
  return phi;
}

namespace {

constexpr double kBound = 7.0;  // |x| limit: tanh(7) = 0.9999983
constexpr double kInitialStep = 0.2;  // BOBYQA's first steps from zero

Coefficients coefficients_of(const Order& o, const std::vector<double>& x) {
  std::size_t at = 0;
  auto block = [&](int count, double sign) {
    std::vector<double> r(static_cast<std::size_t>(count));
    for (auto& v : r) v = std::tanh(x[at++]);
    auto c = coefficients_from_partials(r);
    for (auto& v : c) v *= sign;
    return c;
  };
  Coefficients c;
  c.ar = block(o.p, 1.0);
  c.ma = block(o.q, -1.0);  // 1 + theta B = 1 - phi B
  c.seasonal_ar = block(o.seasonal_p, 1.0);
  c.seasonal_ma = block(o.seasonal_q, -1.0);
  return c;
}

struct Objective {
  const Order* order;
  std::span<const double> y;
  std::span<const double> regressor;
  std::size_t evaluations = 0;
};

double objective(unsigned n, const double* x, double* grad, void* data) {
  (void)grad;
  auto& obj = *static_cast<Objective*>(data);
  ++obj.evaluations;
  const std::vector<double> xv(x, x + n);
  const StateSpace model(expand(*obj.order, coefficients_of(*obj.order, xv)));
  const Likelihood lik = likelihood(model, obj.y, obj.regressor);
  return lik.finite ? -lik.log_likelihood : 1e12;
}

}  // namespace

std::vector<double> warm_start(const Fit& from, const Order& to) {
  const Order& o = from.order;
  std::vector<double> x;
  std::size_t at = 0;
  auto block = [&](int had, int wanted) {
    for (int i = 0; i < wanted; ++i)
      x.push_back(i < had && at + static_cast<std::size_t>(i) < from.parameters.size()
                      ? from.parameters[at + static_cast<std::size_t>(i)]
                      : 0.0);
    at += static_cast<std::size_t>(had);
  };
  block(o.p, to.p);
  block(o.q, to.q);
  block(o.seasonal_p, to.seasonal_p);
  block(o.seasonal_q, to.seasonal_q);
  return x;
}

Fit fit(const Order& order, std::span<const double> y, const FitTolerance& tolerance) {
  return fit_from(order, y, {}, kInitialStep, tolerance);
}

Fit fit_from(const Order& order, std::span<const double> y, std::span<const double> start, double step,
             const FitTolerance& tolerance) {
  state_space::Standardised data = state_space::standardise(y);
  if (order.d + order.seasonal_d == 0 && !order.constant && data.scale > 0) {
    // a zero-mean model: scaled, not centred (differencing would remove a centre)
    for (std::size_t t = 0; t < y.size(); ++t) data.z[t] = y[t] / data.scale;
    data.centre = 0;
  }
  const std::size_t nd = order.differencing_lags();
  const std::size_t k = order.arma_count() + (order.constant ? 1 : 0) + 1;
  if (data.observed < nd + k + 2)
    throw MethodFailure("ARIMA" + order.text() + " needs at least " + std::to_string(nd + k + 2) +
                        " observed values, found " + std::to_string(data.observed));
  if (data.scale == 0) throw MethodFailure("the observed values are constant");
  const std::vector<double> regressor = constant_regressor(order, y.size());

  Objective obj{&order, data.z, regressor};
  std::vector<double> x(order.arma_count(), 0.0);
  for (std::size_t i = 0; i < x.size() && i < start.size(); ++i) x[i] = std::clamp(start[i], -kBound, kBound);
  Fit out;
  out.order = order;
  if (!x.empty()) {
    nlopt::opt opt(nlopt::LN_BOBYQA, static_cast<unsigned>(x.size()));
    opt.set_lower_bounds(std::vector<double>(x.size(), -kBound));
    opt.set_upper_bounds(std::vector<double>(x.size(), kBound));
    opt.set_min_objective(objective, &obj);
    opt.set_xtol_abs(tolerance.x);
    opt.set_ftol_abs(tolerance.log_likelihood);
    opt.set_maxeval(static_cast<int>(tolerance.max_evaluations));
    opt.set_initial_step(step);
    double value = 0;
    try {
      const nlopt::result res = opt.optimize(x, value);
      out.converged = res != nlopt::MAXEVAL_REACHED && res != nlopt::MAXTIME_REACHED;
    } catch (const std::exception&) {
      out.converged = false;
    }
    for (double v : x)
      if (std::abs(v) >= kBound - 1e-3) out.at_bound = true;
  }
  out.coefficients = coefficients_of(order, x);
  out.parameters = x;
  const StateSpace model(expand(order, out.coefficients));
  const Likelihood lik = likelihood(model, data.z, regressor);
  out.evaluations = obj.evaluations + 1;
  if (!lik.finite) throw MethodFailure("the ARIMA" + order.text() + " likelihood could not be evaluated");
  out.centre = data.centre;
  out.scale = data.scale;
  out.effective = lik.effective;
  out.sigma2 = lik.sigma2 * data.scale * data.scale;
  out.log_likelihood = lik.log_likelihood - static_cast<double>(lik.effective) * std::log(data.scale);
  for (double b : lik.beta)
    out.beta.push_back(order.d + order.seasonal_d == 0 ? data.centre + data.scale * b
                                                       : data.scale * b / static_cast<double>(y.size()));
  const double n = static_cast<double>(lik.effective), kk = static_cast<double>(k);
  out.aicc = n - kk - 1 > 0 ? -2 * out.log_likelihood + 2 * kk + 2 * kk * (kk + 1) / (n - kk - 1)
                            : std::numeric_limits<double>::infinity();
  return out;
}

Smoothed smooth_fit(const Fit& fit, std::span<const double> y) {
  std::vector<double> z(y.size());
  for (std::size_t t = 0; t < y.size(); ++t) z[t] = (y[t] - fit.centre) / fit.scale;
  const StateSpace model(expand(fit.order, fit.coefficients));
  Smoothed s = smooth(model, z, constant_regressor(fit.order, y.size()));
  for (std::size_t t = 0; t < y.size(); ++t) {
    if (!std::isnan(y[t])) {
      s.mean[t] = y[t];
      continue;
    }
    s.mean[t] = fit.centre + fit.scale * s.mean[t];
    // a variance that is no normal double in data units (data beyond ~1e154
    // or below ~1e-154) is NaN: no interval, rather than an infinite or zero one
    const double v = s.variance[t] * fit.scale * fit.scale;
    s.variance[t] = s.variance[t] > 0 && !std::isnormal(v) ? std::numeric_limits<double>::quiet_NaN() : v;
  }
  return s;
}

}  // namespace gapmark::arima
