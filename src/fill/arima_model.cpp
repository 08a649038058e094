// ARIMA state-space form, augmented Kalman filter and smoother (see
// arima_model.hpp for the model and the treatment of the diffuse part).
#include "gapmark/fill/arima_model.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>

#include <Eigen/Cholesky>
#include <Eigen/LU>

namespace gapmark::arima {

std::string Order::text() const {
  std::string s = "(" + std::to_string(p) + "," + std::to_string(d) + "," + std::to_string(q) + ")";
  if (period > 1 && (seasonal_p || seasonal_d || seasonal_q))
    s += "(" + std::to_string(seasonal_p) + "," + std::to_string(seasonal_d) + "," + std::to_string(seasonal_q) +
         ")" + std::to_string(period);
  if (constant) s += d + seasonal_d == 0 ? " with mean" : " with drift";
  return s;
}

namespace {

/// (1 + a_1 B + ...)(1 + b_1 B^s + ...) without the leading 1; `sign` -1
/// for polynomials written 1 - a_1 B - ... (coefficients stored as a_i).
std::vector<double> multiply(const std::vector<double>& a, const std::vector<double>& b, std::size_t s,
                             double sign) {
  const std::size_t n = a.size() + s * b.size();
  std::vector<double> full(n + 1, 0.0), pa(a.size() + 1, 0.0);
  pa[0] = 1;
  for (std::size_t i = 0; i < a.size(); ++i) pa[i + 1] = sign * a[i];
  for (std::size_t j = 0; j <= b.size(); ++j) {
    const double bj = j == 0 ? 1.0 : sign * b[j - 1];
    for (std::size_t i = 0; i < pa.size(); ++i) full[i + s * j] += pa[i] * bj;
  }
  std::vector<double> out(n);
  for (std::size_t i = 0; i < n; ++i) out[i] = sign * full[i + 1];
  return out;
}

}  // namespace

Polynomials expand(const Order& order, const Coefficients& c) {
  const std::size_t s = order.period > 1 ? order.period : 1;
  Polynomials poly;
  poly.phi = multiply(c.ar, c.seasonal_ar, s, -1.0);
  poly.theta = multiply(c.ma, c.seasonal_ma, s, 1.0);
  // (1 - B)^d (1 - B^s)^D as 1 - delta_1 B - ...
  std::vector<double> diff{1.0};
  auto times = [&](std::size_t lag) {
    std::vector<double> next(diff.size() + lag, 0.0);
    for (std::size_t i = 0; i < diff.size(); ++i) {
      next[i] += diff[i];
      next[i + lag] -= diff[i];
    }
    diff = std::move(next);
  };
  for (int i = 0; i < order.d; ++i) times(1);
  for (int i = 0; i < order.seasonal_d; ++i) times(s);
  poly.delta.assign(diff.size() - 1, 0.0);
  for (std::size_t i = 1; i < diff.size(); ++i) poly.delta[i - 1] = -diff[i];
  return poly;
}

std::vector<double> constant_regressor(const Order& order, std::size_t n) {
  if (!order.constant) return {};
  std::vector<double> x(n, 1.0);
  if (order.d + order.seasonal_d >= 1)
    for (std::size_t t = 0; t < n; ++t) x[t] = static_cast<double>(t + 1) / static_cast<double>(n);
  return x;
}

StateSpace::StateSpace(const Polynomials& poly) {
  r_ = std::max(poly.phi.size(), poly.theta.size() + 1);
  nd_ = poly.delta.size();
  phi_.assign(r_, 0.0);
  for (std::size_t i = 0; i < poly.phi.size(); ++i) phi_[i] = poly.phi[i];
  delta_ = poly.delta;
  z_.emplace_back(0, 1.0);
  for (std::size_t j = 0; j < nd_; ++j)
    if (delta_[j] != 0) z_.emplace_back(r_ + j, delta_[j]);
  Eigen::VectorXd rvec = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(r_));
  rvec(0) = 1;
  for (std::size_t i = 0; i < poly.theta.size(); ++i) rvec(static_cast<Eigen::Index>(i + 1)) = poly.theta[i];
  rr_ = rvec * rvec.transpose();
}

// Both transitions work column by column on contiguous storage, each value
// computed by the same operations in the same order as the row form in the
// comments (so the results do not depend on the layout).

void StateSpace::transition(Eigen::Ref<Eigen::MatrixXd> x) const {
  // row r: x_0 + sum_j delta_j x_{r+j}; rows r+j: x_{r+j-1}; rows i < r-1:
  // phi_i x_0 + x_{i+1}; row r-1: phi_{r-1} x_0.
  const std::size_t r = r_, nd = nd_;
  for (Eigen::Index c = 0; c < x.cols(); ++c) {
    double* col = x.col(c).data();
    const double first = col[0];
    if (nd > 0) {
      double lag0 = first;
      for (std::size_t j = 0; j < nd; ++j)
        if (delta_[j] != 0) lag0 += delta_[j] * col[r + j];
      for (std::size_t j = nd - 1; j >= 1; --j) col[r + j] = col[r + j - 1];
      col[r] = lag0;
    }
    for (std::size_t i = 0; i + 1 < r; ++i) col[i] = phi_[i] * first + col[i + 1];
    col[r - 1] = phi_[r - 1] * first;
  }
}

void StateSpace::transition_transposed(Eigen::Ref<Eigen::MatrixXd> x) const {
  // row 0: sum_i phi_i x_i (+ x_r); rows k = 1..r-1: x_{k-1}; rows r+j:
  // x_{r+j+1} (0 for the last) + delta_j x_r.
  const std::size_t r = r_, nd = nd_;
  for (Eigen::Index c = 0; c < x.cols(); ++c) {
    double* col = x.col(c).data();
    double first = phi_[0] * col[0];
    for (std::size_t i = 1; i < r; ++i)
      if (phi_[i] != 0) first += phi_[i] * col[i];
    if (nd > 0) {
      first += col[r];
      const double lag0 = col[r];
      for (std::size_t j = 0; j < nd; ++j) {
        const double dj = delta_[j];
        col[r + j] = j + 1 < nd ? col[r + j + 1] : 0.0;
        if (dj != 0) col[r + j] += dj * lag0;
      }
    }
    for (std::size_t k = r - 1; k >= 1; --k) col[k] = col[k - 1];
    col[0] = first;
  }
}

double StateSpace::design(const Eigen::Ref<const Eigen::VectorXd>& x) const {
  double sum = 0;
  for (const auto& [i, w] : z_) sum += w * x(static_cast<Eigen::Index>(i));
  return sum;
}

void StateSpace::add_design_transposed(Eigen::Ref<Eigen::MatrixXd> x,
                                       const Eigen::Ref<const Eigen::RowVectorXd>& w) const {
  for (const auto& [i, zi] : z_) x.row(static_cast<Eigen::Index>(i)) += zi * w;
}

Eigen::MatrixXd StateSpace::initial_covariance() const {
  // P = sum_k T^k RR' T'^k over the ARMA block, by doubling:
  // P <- P + A P A', A <- A A, until the added term is negligible.
  const Eigen::Index r = static_cast<Eigen::Index>(r_);
  Eigen::MatrixXd a = Eigen::MatrixXd::Zero(r, r);
  for (Eigen::Index i = 0; i < r; ++i) {
    a(i, 0) = phi_[static_cast<std::size_t>(i)];
    if (i + 1 < r) a(i, i + 1) = 1;
  }
  Eigen::MatrixXd p = rr_;
  for (int iter = 0; iter < 80; ++iter) {
    const Eigen::MatrixXd add = a * p * a.transpose();
    p += add;
    if (add.cwiseAbs().maxCoeff() <= 1e-15 * p.cwiseAbs().maxCoeff()) break;
    a = a * a;
  }
  Eigen::MatrixXd full = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(dim()), static_cast<Eigen::Index>(dim()));
  full.topLeftCorner(r, r) = 0.5 * (p + p.transpose());
  return full;
}

namespace {

constexpr double kLog2Pi = 1.8378770664093454836;  // log(2 pi)

/// Per-step quantities the smoother needs.
struct Step {
  bool observed = false;
  double f = 0;
  Eigen::VectorXd m;        ///< P_t Z'
  Eigen::RowVectorXd v;     ///< innovations per column
  Eigen::RowVectorXd za;    ///< Z a_t per column
};

struct Pass {
  Likelihood lik;
  Eigen::MatrixXd s_full;   ///< sum V'V/F over the columns
  std::vector<Step> steps;  ///< filled only when smoothing
  Eigen::VectorXd b;        ///< regression then diffuse coefficients (GLS)
  Eigen::MatrixXd s_inv;    ///< inverse of the diffuse block of s_full (sigma^2 units)
};

/// p <- p' for a square p, by swaps (small matrices: no blocking).
void transpose_square(Eigen::MatrixXd& p) {
  const Eigen::Index m = p.rows();
  for (Eigen::Index j = 1; j < m; ++j)
    for (Eigen::Index i = 0; i < j; ++i) std::swap(p(i, j), p(j, i));
}

/// Whether p moved from `before` by at most 1e-13 of its largest magnitude.
bool unchanged(const Eigen::MatrixXd& p, const Eigen::MatrixXd& before) {
  double moved = 0, largest = 0;
  const double* a = p.data();
  const double* b = before.data();
  for (Eigen::Index i = 0; i < p.size(); ++i) {
    moved = std::max(moved, std::abs(a[i] - b[i]));
    largest = std::max(largest, std::abs(a[i]));
  }
  return moved <= 1e-13 * largest;
}

/// After the filter: the regression and diffuse coefficients by generalised
/// least squares on S = sum V'V/F (columns: the data, k regressors, nd
/// diffuse starting values), then sigma^2 and the concentrated likelihood;
/// lik.finite is false where S is singular or the residual sum not positive.
void conclude(Pass& pass, Eigen::MatrixXd s_full, double sum_log_f, Eigen::Index k, Eigen::Index nd) {
  Likelihood& lik = pass.lik;
  lik.effective = lik.observed >= static_cast<std::size_t>(nd) ? lik.observed - static_cast<std::size_t>(nd) : 0;
  const Eigen::Index nb = k + nd;
  double quad = s_full(0, 0);
  double log_det = 0;
  if (nb > 0) {
    const Eigen::MatrixXd s = s_full.bottomRightCorner(nb, nb);
    Eigen::LDLT<Eigen::MatrixXd> ldlt(s);
    if (ldlt.info() != Eigen::Success || !ldlt.isPositive() ||
        ldlt.vectorD().minCoeff() <= 1e-12 * std::max(1.0, ldlt.vectorD().maxCoeff())) {
      lik.finite = false;
      return;
    }
    pass.b = ldlt.solve(s_full.col(0).tail(nb));
    if (nd > 0) pass.s_inv = s.bottomRightCorner(nd, nd).ldlt().solve(Eigen::MatrixXd::Identity(nd, nd));
    quad -= s_full.col(0).tail(nb).dot(pass.b);
    if (nd > 0) {
      Eigen::LDLT<Eigen::MatrixXd> diffuse(s.bottomRightCorner(nd, nd));
      log_det = diffuse.vectorD().array().log().sum();
    }
  }
  if (lik.effective == 0 || !(quad > 0) || !std::isfinite(quad)) {
    lik.finite = false;
    return;
  }
  lik.sigma2 = quad / static_cast<double>(lik.effective);
  for (Eigen::Index i = 0; i < k; ++i) lik.beta.push_back(pass.b(i));
  const double ne = static_cast<double>(lik.effective);
  lik.log_likelihood = -0.5 * (ne * (kLog2Pi + std::log(lik.sigma2) + 1.0) + sum_log_f + log_det);
  lik.finite = std::isfinite(lik.log_likelihood);
  pass.s_full = std::move(s_full);
}

/// The filter of a pass. A has one column per right-hand side: 0 the data,
/// 1..k the regressor, then one per diffuse starting value. In the steady
/// state (a run of observed steps left the predicted P unchanged to 1e-13
/// of its size) P, M and F stay as they are until the next missing value.
struct Filter {
  const StateSpace& model;
  Eigen::Index m, k, cols, r;
  Eigen::MatrixXd a, p;
  Eigen::MatrixXd s_full;  ///< sum V'V/F
  Eigen::RowVectorXd data, v, za, v_over_f;  ///< v: the step's innovations; za: Z A
  Eigen::VectorXd mvec;                      ///< M = P Z'
  Eigen::MatrixXd outer, p_outer, p_before;  // products formed here, not in temporaries
  double f = 0, sum_log_f = 0;
  bool steady = false;

  Filter(const StateSpace& state_space, Eigen::Index regressors)
      : model(state_space), m(static_cast<Eigen::Index>(model.dim())), k(regressors),
        cols(1 + k + static_cast<Eigen::Index>(model.diff_dim())), r(static_cast<Eigen::Index>(model.arma_dim())),
        a(Eigen::MatrixXd::Zero(m, cols)), p(model.initial_covariance()), s_full(Eigen::MatrixXd::Zero(cols, cols)),
        data(cols), v(cols), za(cols), v_over_f(cols), mvec(m), outer(cols, cols), p_outer(m, m), p_before(m, m) {
    for (Eigen::Index j = 0; j < cols - 1 - k; ++j) a(r + j, 1 + k + j) = -1.0;
  }

  /// M = P Z' and F = Z M (kept in the steady state), and Z A.
  void predict_signal(bool observed) {
    if (!observed) steady = false;
    if (!steady) {
      for (Eigen::Index c = 0; c < m; ++c) mvec(c) = model.design(p.col(c));  // P Z' (P symmetric)
      f = model.design(mvec);
    }
    for (Eigen::Index c = 0; c < cols; ++c) za(c) = model.design(a.col(c));
  }

  /// The update by an observation y (x: the regressor's value); false
  /// when F is not positive and finite.
  bool observe(double y, double x) {
    if (!(f > 0) || !std::isfinite(f)) return false;
    data.setZero();
    data(0) = y;
    if (k) data(1) = x;
    v = data - za;
    outer.noalias() = v.transpose() * v;
    s_full += outer / f;
    sum_log_f += std::log(f);
    v_over_f = v / f;
    a.noalias() += mvec * v_over_f;
    return true;
  }

  /// A and, unless steady, P into the next step: P <- T (P - M M'/F) T' + R Q R'.
  void predict_state(bool observed) {
    model.transition(a);
    if (steady) return;
    if (observed) {
      p_before = p;
      p_outer.noalias() = mvec * mvec.transpose();
      p -= p_outer / f;
    }
    model.transition(p);
    transpose_square(p);
    model.transition(p);
    p.topLeftCorner(r, r) += model.disturbance();
    if (observed) steady = unchanged(p, p_before);
  }
};

/// Columns: 0 the data; 1..k the regressor; then one per diffuse starting value.
Pass run(const StateSpace& model, std::span<const double> y, std::span<const double> regressor, bool keep) {
  const std::size_t n = y.size();
  const Eigen::Index k = regressor.empty() ? 0 : 1;
  Pass pass;
  if (keep) pass.steps.resize(n);
  Filter filter(model, k);
  for (std::size_t t = 0; t < n; ++t) {
    const bool observed = !std::isnan(y[t]);
    filter.predict_signal(observed);
    if (observed) {
      if (!filter.observe(y[t], k ? regressor[t] : 0.0)) {
        pass.lik.finite = false;
        return pass;
      }
      ++pass.lik.observed;
    }
    if (keep) {
      Step& st = pass.steps[t];
      st.observed = observed;
      st.f = filter.f;
      st.m = filter.mvec;
      st.za = filter.za;
      if (observed) st.v = filter.v;
    }
    filter.predict_state(observed);
  }
  conclude(pass, std::move(filter.s_full), filter.sum_log_f, k, static_cast<Eigen::Index>(model.diff_dim()));
  return pass;
}

/// Z' as a vector of the state's size.
Eigen::VectorXd design_vector(const StateSpace& model) {
  Eigen::MatrixXd unit = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(model.dim()), 1);
  Eigen::RowVectorXd one(1);
  one(0) = 1;
  model.add_design_transposed(unit, one);
  return unit.col(0);
}

}  // namespace

Likelihood likelihood(const StateSpace& model, std::span<const double> y, std::span<const double> regressor) {
  Likelihood lik = run(model, y, regressor, false).lik;
  if (lik.finite && model.diff_dim() > 0) lik.log_likelihood += 0.5 * diffuse_log_determinant(model.delta(), y);
  return lik;
}

Smoothed smooth(const StateSpace& model, std::span<const double> y, std::span<const double> regressor) {
  Pass pass = run(model, y, regressor, true);
  if (!pass.lik.finite) throw std::runtime_error("the likelihood could not be evaluated");
  if (model.diff_dim() > 0) pass.lik.log_likelihood += 0.5 * diffuse_log_determinant(model.delta(), y);
  const std::size_t n = y.size();
  const Eigen::Index m = static_cast<Eigen::Index>(model.dim());
  const Eigen::Index k = regressor.empty() ? 0 : 1;
  const Eigen::Index cols = pass.s_full.cols();
  const Eigen::Index nb = cols - 1;
  const Eigen::Index nd = static_cast<Eigen::Index>(model.diff_dim());

  const Eigen::VectorXd zvec = design_vector(model);
  Smoothed out;
  out.mean.assign(y.begin(), y.end());
  out.variance.assign(n, 0.0);
  Eigen::MatrixXd rvec = Eigen::MatrixXd::Zero(m, cols);
  Eigen::MatrixXd nmat = Eigen::MatrixXd::Zero(m, m);
  Eigen::MatrixXd tm(m, 1), u(m, 1);
  Eigen::RowVectorXd g(nb);
  for (std::size_t i = n; i-- > 0;) {
    const Step& st = pass.steps[i];
    if (st.observed) {
      tm.col(0) = st.m;
      model.transition(tm);  // K f = T M
      const Eigen::RowVectorXd kr = (tm.col(0).transpose() * rvec) / st.f;
      u.col(0) = nmat * tm.col(0) / st.f;  // N K
      const double knk = tm.col(0).dot(u.col(0)) / st.f;
      model.transition_transposed(rvec);
      model.add_design_transposed(rvec, st.v / st.f - kr);
      model.transition_transposed(u);  // T' N K
      model.transition_transposed(nmat);
      nmat.transposeInPlace();
      model.transition_transposed(nmat);
      nmat.noalias() -= u.col(0) * zvec.transpose() + zvec * u.col(0).transpose();
      nmat.noalias() += (knk + 1.0 / st.f) * zvec * zvec.transpose();
      continue;
    }
    model.transition_transposed(rvec);
    model.transition_transposed(nmat);
    nmat.transposeInPlace();
    model.transition_transposed(nmat);
    const Eigen::RowVectorXd s = st.za + st.m.transpose() * rvec;
    double mean = s(0);
    for (Eigen::Index c = 1; c < cols; ++c) {
      const double x = c <= k ? regressor[i] : 0.0;
      g(c - 1) = s(c) - x;
      mean -= pass.b(c - 1) * g(c - 1);
    }
    double var = st.f - st.m.dot(nmat * st.m);
    if (nd > 0) var += g.tail(nd) * pass.s_inv * g.tail(nd).transpose();
    out.mean[i] = mean;
    out.variance[i] = pass.lik.sigma2 * std::max(var, 0.0);
  }
  out.likelihood = pass.lik;
  return out;
}

double diffuse_log_determinant(std::span<const double> delta, std::span<const double> y) {
  const Eigen::Index nd = static_cast<Eigen::Index>(delta.size());
  if (nd == 0) return 0;
  Eigen::VectorXd dv(nd);
  for (Eigen::Index j = 0; j < nd; ++j) dv(j) = delta[static_cast<std::size_t>(j)];
  Eigen::MatrixXd p = Eigen::MatrixXd::Identity(nd, nd);
  Eigen::MatrixXd tp(nd, nd);
  double sum = 0;
  std::size_t resolved = 0;
  for (std::size_t t = 0; t < y.size() && resolved < static_cast<std::size_t>(nd); ++t) {
    if (!std::isnan(y[t])) {
      const Eigen::VectorXd g = p * dv;
      const double f = dv.dot(g);
      if (f > 1e-8) {
        sum += std::log(f);
        p -= g * g.transpose() / f;
        ++resolved;
      }
    }
    // T_d P T_d': row 0 of T_d is delta', row i picks lag i - 1.
    for (int pass = 0; pass < 2; ++pass) {
      tp.row(0) = dv.transpose() * p;
      tp.bottomRows(nd - 1) = p.topRows(nd - 1);
      p = tp.transpose();
    }
  }
  return sum;
}

}  // namespace gapmark::arima
