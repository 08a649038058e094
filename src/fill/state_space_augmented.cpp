// The fixed-interval smoother of the signal under an exactly diffuse initial
// state, in the augmented form (de Jong 1991; Durbin & Koopman 2012, sec.
// 5.7): the initial state is an unknown vector d with a flat prior,
//   a_t = a0_t + A_t d + (an error with covariance P_t),
// where a0_t, A_t and P_t come from the ordinary Kalman filter started at the
// first observation with a0 = 0, A = I and P = 0. Each observation adds one
// row (e_t, v_t) / sqrt(F_t), e_t = Z A_t, to a least-squares problem for d;
// d's posterior is N(S^-1 s, S^-1) with S = sum e'e/F, s = sum e'v/F, kept as
// the triangular factor of a QR decomposition updated by Givens rotations.
// The backward pass carries r_t, N_t and R_t (how r depends on d):
//   r_{t-1} = Z'(v_t - e_t d^)/F_t + L_t' r_t,   R_{t-1} = Z'e_t/F_t + L_t' R_t,
//   N_{t-1} = Z'Z/F_t + L_t' N_t L_t,            L_t = T (I - P_t Z'Z / F_t),
// and the smoothed signal is
//   mean  Z a0_t + e_t d^ + Z P_t r_{t-1},
//   var   Z P_t Z' - Z P_t N_{t-1} P_t Z' + w S^-1 w',   w = e_t - Z P_t R_{t-1}.
//
// Why this form rather than the filter that removes the flat prior one rank
// at a time: that filter resolves the prior with the first m observations,
// and when those are nearly collinear (a trigonometric season over a few
// hours of a day) the state variance it carries is huge and later updates
// cancel, so the smoothed variances near the start lose all their digits.
// Here the covariances stay those of a filter with a known start, and the
// collinearity is confined to S, which is solved once with all the data.
#include <cmath>
#include <limits>
#include <stdexcept>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"
#include "gapmark/fill/state_space_level.hpp"

namespace gapmark::state_space {
namespace {

using Eigen::Index;
using Eigen::MatrixXd;
using Eigen::VectorXd;

/// A column of S's triangular factor whose own part is below this share of
/// its length leaves d (the initial state) unidentified.
constexpr double kIdentified = 1e-10;

class Augmented {
public:
  Augmented(const StructuralModel& model, std::span<const double> variances)
      : model_(model), variances_(variances), m_(static_cast<Index>(model.state_dim())) {
    for (std::size_t i = 0; i < model.design_count(); ++i) design_.push_back(model.design_index(i));
  }

  SmoothedSignal smooth(std::span<const double> y) {
    const std::size_t n = y.size();
    SmoothedSignal out;
    out.mean.assign(n, std::numeric_limits<double>::quiet_NaN());
    out.variance.assign(n, std::numeric_limits<double>::quiet_NaN());
    const std::size_t t0 = filter_from_first_observed(y);
    const Index m = m_;
    const auto r_d = u_.topLeftCorner(m, m).triangularView<Eigen::Upper>();
    const VectorXd d = r_d.solve(u_.col(m).head(m));  // posterior mean of the initial state
    backward(y.subspan(t0), d, out.mean, out.variance, t0);

    // Before t0: at t0 the state is d exactly (A = I, P = 0): mean d^, variance
    // S^-1. With a flat prior the state one step earlier is T^{-1}(a_{t+1} -
    // n_t), n_t independent of the data: mean T^{-1} a, variance T^{-1} (V + Q) T^{-T}.
    VectorXd state = d;
    MatrixXd cov = r_d.solve(r_d.transpose().solve(MatrixXd::Identity(m, m)));
    VectorXd cz(m);
    for (std::size_t t = t0; t-- > 0;) {
      model_.transition_inverse(state);
      add_state_noise(cov);
      model_.transition_inverse(cov);
      auto ct = cov.transpose();
      model_.transition_inverse(ct);
      out.mean[t] = model_.signal_of(state);
      times_design(cov, cz);
      out.variance[t] = std::max(0.0, model_.signal_of(cz));
    }
    return out;
  }

  /// The smoothed signal's mean (no variances) for each of `ys`, which share
  /// one pattern of missing values: the filter's covariances, gains and the
  /// factor of S do not depend on the data, so they are computed once (from
  /// ys[0]) and each series costs only the O(n m) mean recursions.
  std::vector<std::vector<double>> means(const std::vector<std::vector<double>>& ys) {
    std::vector<std::vector<double>> out;
    if (ys.empty()) return out;
    const std::size_t n = ys[0].size();
    const std::size_t t0 = filter_from_first_observed(ys[0]);
    const Index m = m_;
    const auto r_d = u_.topLeftCorner(m, m).triangularView<Eigen::Upper>();
    const std::size_t steps = n - t0;
    std::vector<double> za(steps), v(steps);
    VectorXd a(m), s(m), r(m), state(m);
    for (const auto& y : ys) {
      if (y.size() != n) throw std::invalid_argument("smoothed means: series of different lengths");
      // forward: the state mean and innovations of this series, with the stored gains
      a.setZero();
      s.setZero();
      for (std::size_t i = 0; i < steps; ++i) {
        const auto ii = static_cast<Index>(i);
        za[i] = model_.signal_of(a);
        const double yt = y[t0 + i];
        if (std::isnan(yt) != !(f_[i] > 0)) throw std::invalid_argument("smoothed means: another missing pattern");
        if (f_[i] > 0) {
          v[i] = yt - za[i];
          a += ms_.col(ii) * (v[i] / f_[i]);
          s += e_.col(ii) * (v[i] / f_[i]);
        }
        model_.transition(a);
      }
      const VectorXd d = r_d.solve(r_d.transpose().solve(s));
      std::vector<double> mean(n);
      r.setZero();
      for (std::size_t i = steps; i-- > 0;) {
        const auto ii = static_cast<Index>(i);
        const auto ms = ms_.col(ii);
        const auto e = e_.col(ii);
        if (f_[i] > 0) {
          const double u = (v[i] - e.dot(d)) / f_[i];
          times_l_transposed(r, ms, f_[i]);
          for (Index p : design_) r(p) += u;
        } else {
          model_.transition_transposed(r);
        }
        mean[t0 + i] = za[i] + e.dot(d) + ms.dot(r);
      }
      state = d;
      for (std::size_t t = t0; t-- > 0;) {
        model_.transition_inverse(state);
        mean[t] = model_.signal_of(state);
      }
      out.push_back(std::move(mean));
    }
    return out;
  }

private:
  /// out <- X Z' (the sum of the columns Z picks).
  void times_design(const MatrixXd& x, VectorXd& out) const {
    out = x.col(design_[0]);
    for (std::size_t i = 1; i < design_.size(); ++i) out += x.col(design_[i]);
  }
  /// out <- (Z X)' (the sum of the rows Z picks).
  void design_times(const MatrixXd& x, VectorXd& out) const {
    out = x.row(design_[0]).transpose();
    for (std::size_t i = 1; i < design_.size(); ++i) out += x.row(design_[i]).transpose();
  }
  void add_state_noise(MatrixXd& x) const {
    for (std::size_t k = 1; k < variances_.size(); ++k) {
      const auto first = static_cast<Index>(model_.disturbed_state(k));
      const auto count = static_cast<Index>(model_.disturbed_count(k));
      for (Index j = first; j < first + count; ++j) x(j, j) += variances_[k];
    }
  }
  /// x <- L' x = T'x - Z'(ms' T'x) / f, for x with m rows. Column by
  /// column, without temporaries (this runs at every step of the backward pass).
  template <class D, class V>
  void times_l_transposed(Eigen::MatrixBase<D>& x, const Eigen::MatrixBase<V>& ms, double f) const {
    model_.transition_transposed(x);
    for (Index j = 0; j < x.cols(); ++j) {
      const double c = ms.dot(x.col(j)) / f;
      for (Index p : design_) x(p, j) -= c;
    }
  }
  /// x <- x L = x T - (x T ms / f) Z, for x with m columns; row by row.
  template <class V>
  void times_l(MatrixXd& x, const Eigen::MatrixBase<V>& ms, double f) const {
    model_.times_transition(x);
    for (Index i = 0; i < x.rows(); ++i) {
      const double g = x.row(i).dot(ms.transpose()) / f;
      for (Index p : design_) x(i, p) -= g;
    }
  }
  /// Adds the row `x` to the upper triangular factor u_ by Givens rotations.
  void add_row(VectorXd& x) {
    for (Index j = 0; j < x.size(); ++j) {
      if (x(j) == 0) continue;
      const double r = std::hypot(u_(j, j), x(j));
      const double c = u_(j, j) / r, s = x(j) / r;
      u_(j, j) = r;
      for (Index k = j + 1; k < x.size(); ++k) {
        const double uk = u_(j, k);
        u_(j, k) = c * uk + s * x(k);
        x(k) = c * x(k) - s * uk;
      }
      x(j) = 0;
    }
  }

  /// Filter from the first observation; keeps per step Z a0, Z P Z', P Z', Z A, v and F.
  /// Runs the filter from the first observed value of `y` and checks that
  /// the observations identify the initial state; returns that first index.
  std::size_t filter_from_first_observed(std::span<const double> y) {
    std::size_t t0 = 0;
    while (t0 < y.size() && std::isnan(y[t0])) ++t0;
    if (t0 == y.size()) throw MethodFailure("no observed value to smooth");
    forward(y.subspan(t0));
    const Index m = m_;
    for (Index j = 0; j < m; ++j)
      if (!(std::abs(u_(j, j)) > kIdentified * u_.col(j).head(j + 1).norm()))
        throw MethodFailure("too few observations to identify the " + model_.name() + " model's initial state (" +
                            std::to_string(observed_) + " observed, " + std::to_string(m) + " states)");
    return t0;
  }

  void forward(std::span<const double> y) {
    const Index m = m_;
    observed_ = 0;
    const auto steps = static_cast<Index>(y.size());
    za_.assign(y.size(), 0.0);
    zpz_.assign(y.size(), 0.0);
    v_.assign(y.size(), 0.0);
    f_.assign(y.size(), 0.0);
    ms_.resize(m, steps);
    e_.resize(m, steps);
    u_ = MatrixXd::Zero(m + 1, m + 1);
    VectorXd a = VectorXd::Zero(m), ms(m), e(m), ms_over_f(m), row(m + 1);
    MatrixXd big_a = MatrixXd::Identity(m, m), p = MatrixXd::Zero(m, m);
    const double h = variances_[0];
    for (Index i = 0; i < steps; ++i) {
      times_design(p, ms);
      design_times(big_a, e);
      za_[i] = model_.signal_of(a);
      zpz_[i] = model_.signal_of(ms);
      ms_.col(i) = ms;
      e_.col(i) = e;
      const double yt = y[static_cast<std::size_t>(i)];
      if (!std::isnan(yt)) {
        ++observed_;
        const double v = yt - za_[i];
        const double f = zpz_[i] + h;
        if (!(f > 0) || !std::isfinite(f))
          throw MethodFailure("the Kalman filter met a non-positive or non-finite variance");
        v_[i] = v;
        f_[i] = f;
        a += ms * (v / f);
        ms_over_f = ms / f;
        big_a.noalias() -= ms_over_f * e.transpose();
        p.noalias() -= ms_over_f * ms.transpose();
        const double w = 1.0 / std::sqrt(f);
        row.head(m) = e * w;
        row(m) = v * w;
        add_row(row);
      }
      model_.transition(a);
      model_.transition(big_a);
      model_.transition(p);
      model_.times_transition_transposed(p);
      add_state_noise(p);
    }
  }

  void backward(std::span<const double> y, const VectorXd& d, std::vector<double>& mean,
                std::vector<double>& variance, std::size_t t0) const {
    const Index m = m_;
    const auto r_d = u_.topLeftCorner(m, m).triangularView<Eigen::Upper>();
    VectorXd r = VectorXd::Zero(m), w(m), n_ms(m);
    MatrixXd nn = MatrixXd::Zero(m, m), big_r = MatrixXd::Zero(m, m);
    for (auto i = static_cast<Index>(y.size()); i-- > 0;) {
      const auto ms = ms_.col(i);
      const auto e = e_.col(i);
      const auto ui = static_cast<std::size_t>(i);
      if (f_[ui] > 0) {
        const double f = f_[ui];
        const double u = (v_[ui] - e.dot(d)) / f;
        times_l_transposed(r, ms, f);
        for (Index p : design_) r(p) += u;
        times_l_transposed(big_r, ms, f);
        for (Index p : design_) big_r.row(p) += e.transpose() / f;
        times_l_transposed(nn, ms, f);
        times_l(nn, ms, f);
        for (Index p : design_)
          for (Index q : design_) nn(p, q) += 1.0 / f;
      } else {
        model_.transition_transposed(r);
        model_.transition_transposed(big_r);
        model_.transition_transposed(nn);
        model_.times_transition(nn);
      }
      mean[t0 + ui] = za_[ui] + e.dot(d) + ms.dot(r);
      w = e;
      w.noalias() -= big_r.transpose() * ms;
      r_d.transpose().solveInPlace(w);
      n_ms.noalias() = nn * ms;
      variance[t0 + ui] = std::max(0.0, zpz_[ui] - ms.dot(n_ms) + w.squaredNorm());
    }
  }

  const StructuralModel& model_;
  std::span<const double> variances_;
  Index m_;
  std::vector<Index> design_;
  std::size_t observed_ = 0;
  std::vector<double> za_, zpz_, v_, f_;  ///< per step; f = 0 where missing
  MatrixXd ms_, e_;                       ///< columns: P_t Z' and (Z A_t)'
  MatrixXd u_;                            ///< triangular factor of [S s; s' q]
};

}  // namespace

std::vector<std::vector<double>> smoothed_signal_means(const StructuralModel& model,
                                                       const std::vector<std::vector<double>>& ys,
                                                       std::span<const double> variances) {
  return Augmented(model, variances).means(ys);
}

SmoothedSignal smooth_signal_general(const StructuralModel& model, std::span<const double> y,
                                     std::span<const double> variances) {
  SmoothedSignal out;
  out.likelihood = filter_likelihood_general(model, y, variances);
  if (!out.likelihood.finite) throw MethodFailure("the Kalman filter met a non-positive or non-finite variance");
  if (!out.likelihood.prior_resolved)
    throw MethodFailure("too few observations to identify the " + model.name() + " model's initial state (" +
                        std::to_string(out.likelihood.observed) + " observed, " +
                        std::to_string(model.state_dim()) + " states)");
  SmoothedSignal moments = Augmented(model, variances).smooth(y);
  out.mean = std::move(moments.mean);
  out.variance = std::move(moments.variance);
  return out;
}

SmoothedSignal smooth_signal(const StructuralModel& model, std::span<const double> y,
                             std::span<const double> variances) {
  if (model.state_dim() == 1) {
    if (variances.size() != 2) throw std::invalid_argument("the level model takes 2 variances");
    return level::smooth(y, variances);
  }
  return smooth_signal_general(model, y, variances);
}

}  // namespace gapmark::state_space
