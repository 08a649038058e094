// The exactly diffuse Kalman filter and the fixed-interval smoother of the
// signal (Durbin & Koopman 2012, sections 4.3-4.4 and 5.2-5.3, backward
// recursions for r_t and N_t, in their "diffuse" form r^(0), r^(1), N^(0),
// N^(1), N^(2) while the flat prior is being removed).
//
// The filter runs from the first observed time t0 with a_t0 = 0, P*_t0 = 0,
// P_inf,t0 = I. Each observation whose F_inf = Z P_inf Z' is positive removes
// one rank from P_inf; after m of them P_inf is exactly zero and the
// ordinary filter takes over. Counting ranks (rather than testing P_inf
// against a tolerance) keeps rounding residue from prolonging that phase.
//
// Per step the smoother needs only Z a_t, Z P_t Z', P_t Z' (and P_inf,t Z'
// in the diffuse phase), v_t and F_t, so storage is O(n m), not O(n m^2).
#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"

namespace gapmark::state_space {
namespace {

constexpr double kLog2Pi = 1.8378770664093453;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
/// F_inf below this share of the largest diagonal of P_inf counts as zero.
constexpr double kDiffuseTolerance = 1e-9;

enum class StepKind : unsigned char {
  Missing,
  Diffuse,      ///< observed, F_inf > 0: absorbs one rank of the flat prior
  DiffuseFlat,  ///< observed in the diffuse phase with F_inf = 0
  Regular,      ///< observed after the diffuse phase
};

/// What the forward pass keeps for the backward pass, for steps t0 .. n-1.
struct Record {
  std::vector<StepKind> kind;
  std::vector<double> za, zpz, v, f, f_inf;  ///< Z a, Z P* Z', innovation, F (or F*), F_inf
  Eigen::MatrixXd m_star;                    ///< column i: P*_t Z' at t = t0 + i
  std::vector<double> m_inf;                 ///< P_inf,t Z' for the diffuse steps, m values each
  std::size_t diffuse_steps = 0;             ///< steps 0 .. diffuse_steps-1 were in the diffuse phase
};

/// Sum of logs of positive numbers with one log call per ~1e150 of range
/// rather than one per term (the filter's F_t are O(1) on standardised data).
class LogSum {
public:
  void add(double x) {
    product_ *= x;
    if (product_ > 1e150 || product_ < 1e-150) flush();
  }
  double total() {
    flush();
    return sum_;
  }

private:
  void flush() {
    sum_ += std::log(product_);
    product_ = 1;
  }
  double product_ = 1;
  double sum_ = 0;
};

/// The rest of a likelihood pass for the local level model once its flat
/// prior is gone (state a, variance p after the prediction into y[0]; h and q
/// the irregular and level variances). It performs the general step's
/// operations in the same order on plain scalars, so every sum comes out bit
/// for bit the same, without 1 x 1 matrices going through memory at each
/// step. Returns false (parts.finite cleared) when a variance F is not
/// positive or not finite, as the general step does.
bool level_likelihood_tail(std::span<const double> y, double a, double p, double h, double q,
                           LikelihoodParts& parts, LogSum& log_f) {
  std::size_t observed = 0;
  double sum_v2_over_f = parts.sum_v2_over_f;
  for (const double yt : y) {
    if (!std::isnan(yt)) {
      ++observed;
      const double v = yt - a;
      const double f = p + h;
      if (!(f > 0) || !std::isfinite(f)) {
        parts.observed += observed;
        parts.sum_v2_over_f = sum_v2_over_f;
        parts.finite = false;
        return false;
      }
      log_f.add(f);
      sum_v2_over_f += v * v / f;
      a += p * (v / f);
      p -= (p / f) * p;
    }
    p += q;
  }
  parts.observed += observed;
  parts.sum_v2_over_f = sum_v2_over_f;
  return true;
}

std::size_t first_observed(std::span<const double> y) {
  std::size_t t = 0;
  while (t < y.size() && std::isnan(y[t])) ++t;
  return t;
}

template <int M>
struct Kernel {
  using Vec = Eigen::Matrix<double, M, 1>;
  using Mat = Eigen::Matrix<double, M, M>;
  using Row = Eigen::Matrix<double, 1, M>;

  const StructuralModel& model;
  std::span<const double> variances;
  Eigen::Index m = static_cast<Eigen::Index>(model.state_dim());
  bool seasonal = model.period() != 0;
  Eigen::Index s0 = static_cast<Eigen::Index>(model.seasonal_start());

  /// out <- X Z' for a square X: column 0, plus column s0 with a period.
  void times_design(const Mat& x, Vec& out) const {
    out = x.col(0);
    if (seasonal) out += x.col(s0);
  }

  /// X <- T X T', through the structure.
  void predict_cov(Mat& x) const {
    model.transition(x);
    model.times_transition_transposed(x);
  }
  /// X <- T' X T.
  void backward_cov(Mat& x) const {
    model.transition_transposed(x);
    model.times_transition(x);
  }
  void add_state_noise(Mat& x) const {
    for (std::size_t k = 1; k < variances.size(); ++k) {
      const auto j = static_cast<Eigen::Index>(model.disturbed_state(k));
      x(j, j) += variances[k];
    }
  }
  /// x <- x + c Z' (adds c at the positions Z selects).
  void add_design(Vec& x, double c) const {
    x(0) += c;
    if (seasonal) x(s0) += c;
  }

  LikelihoodParts forward(std::span<const double> y, Record* rec) const {
    LikelihoodParts parts;
    const std::size_t n = y.size();
    const std::size_t t0 = first_observed(y);
    if (t0 == n) {
      parts.prior_resolved = false;
      return parts;
    }
    const double h = variances[0];
    const std::size_t steps = n - t0;
    if (rec) {
      rec->kind.assign(steps, StepKind::Missing);
      rec->za.assign(steps, 0.0);
      rec->zpz.assign(steps, 0.0);
      rec->v.assign(steps, 0.0);
      rec->f.assign(steps, 0.0);
      rec->f_inf.assign(steps, 0.0);
      rec->m_star.resize(m, static_cast<Eigen::Index>(steps));
      rec->m_inf.clear();
    }
    Vec a = Vec::Zero(m);
    Mat p = Mat::Zero(m, m);
    Mat p_inf = Mat::Identity(m, m);
    Eigen::Index rank = m;
    bool diffuse = true;
    Vec ms = Vec::Zero(m), mi = Vec::Zero(m);
    LogSum log_f, log_f_inf;

    for (std::size_t i = 0; i < steps; ++i) {
      const double yt = y[t0 + i];
      const bool observed = !std::isnan(yt);
      const double za = model.signal_of(a);
      times_design(p, ms);
      const double zps = model.signal_of(ms);
      if (rec) {
        rec->za[i] = za;
        rec->zpz[i] = zps;
        rec->m_star.col(static_cast<Eigen::Index>(i)) = ms;
      }
      if (diffuse) {
        times_design(p_inf, mi);
        const double zpi = model.signal_of(mi);
        if (rec) rec->m_inf.insert(rec->m_inf.end(), mi.data(), mi.data() + m);
        if (observed) {
          ++parts.observed;
          const double v = yt - za;
          const double fs = zps + h;
          if (zpi > kDiffuseTolerance * p_inf.diagonal().maxCoeff()) {
            ++parts.diffuse;
            log_f_inf.add(zpi);
            a += mi * (v / zpi);
            p.noalias() += (mi * (fs / (zpi * zpi)) - ms / zpi) * mi.transpose();
            p.noalias() -= (mi / zpi) * ms.transpose();
            p_inf.noalias() -= (mi / zpi) * mi.transpose();
            if (--rank == 0) {
              p_inf.setZero();
              diffuse = false;
            }
            if (rec) rec->kind[i] = StepKind::Diffuse;
          } else {
            if (!(fs > 0) || !std::isfinite(fs)) {
              parts.finite = false;
              return parts;
            }
            log_f.add(fs);
            parts.sum_v2_over_f += v * v / fs;
            a += ms * (v / fs);
            p.noalias() -= (ms / fs) * ms.transpose();
            if (rec) rec->kind[i] = StepKind::DiffuseFlat;
          }
          if (rec) {
            rec->v[i] = v;
            rec->f[i] = fs;
            rec->f_inf[i] = zpi;
          }
        }
        if (rec) rec->diffuse_steps = i + 1;
        if (diffuse) predict_cov(p_inf);
      } else if (observed) {
        ++parts.observed;
        const double v = yt - za;
        const double f = zps + h;
        if (!(f > 0) || !std::isfinite(f)) {
          parts.finite = false;
          return parts;
        }
        log_f.add(f);
        parts.sum_v2_over_f += v * v / f;
        a += ms * (v / f);
        p.noalias() -= (ms / f) * ms.transpose();
        if (rec) {
          rec->kind[i] = StepKind::Regular;
          rec->v[i] = v;
          rec->f[i] = f;
        }
      }
      model.transition(a);
      predict_cov(p);
      add_state_noise(p);
      if constexpr (M == 1) {  // the local level model: the rest on scalars when nothing is recorded
        if (!rec && !diffuse) {
          if (!level_likelihood_tail(y.subspan(t0 + i + 1), a(0), p(0, 0), h, variances[1], parts, log_f))
            return parts;
          break;
        }
      }
    }
    parts.prior_resolved = !diffuse;
    parts.sum_log_f = log_f.total();
    parts.sum_log_f_inf = log_f_inf.total();
    if (!std::isfinite(parts.sum_log_f) || !std::isfinite(parts.sum_v2_over_f) ||
        !std::isfinite(parts.sum_log_f_inf))
      parts.finite = false;
    return parts;
  }

  SmoothedSignal smooth(std::span<const double> y) const {
    SmoothedSignal out;
    Record rec;
    out.likelihood = forward(y, &rec);
    if (!out.likelihood.finite)
      throw MethodFailure("the Kalman filter met a non-positive or non-finite variance");
    if (!out.likelihood.prior_resolved)
      throw MethodFailure("too few observations to identify the " + model.name() +
                          " model's initial state (" + std::to_string(out.likelihood.observed) + " observed, " +
                          std::to_string(model.state_dim()) + " states)");
    const std::size_t n = y.size();
    const std::size_t t0 = first_observed(y);
    const std::size_t steps = n - t0;
    out.mean.assign(n, kNaN);
    out.variance.assign(n, kNaN);

    // Ordinary phase: r_{t-1} = Z'v/F + L'r, N_{t-1} = Z'Z/F + L'NL, L = T - K Z.
    Vec r = Vec::Zero(m);
    Mat nn = Mat::Zero(m, m);
    Vec tmp = Vec::Zero(m), k = Vec::Zero(m), g = Vec::Zero(m);
    for (std::size_t i = steps; i-- > rec.diffuse_steps;) {
      const auto ms = rec.m_star.col(static_cast<Eigen::Index>(i));
      if (rec.kind[i] == StepKind::Regular) {
        const double f = rec.f[i];
        k = ms / f;
        model.transition(k);  // K = T P Z' / F
        const double kr = k.dot(r);
        model.transition_transposed(r);
        add_design(r, rec.v[i] / f - kr);
        // L'NL = T'NT - gZ - Z'g' + (K'NK) Z'Z with g = T'NK.
        tmp.noalias() = nn * k;
        const double c = k.dot(tmp);
        g = tmp;
        model.transition_transposed(g);
        backward_cov(nn);
        subtract_design_outer(nn, g);
        add_design_design(nn, c + 1.0 / f);
      } else {
        model.transition_transposed(r);
        backward_cov(nn);
      }
      tmp.noalias() = nn * ms;
      out.mean[t0 + i] = rec.za[i] + ms.dot(r);
      out.variance[t0 + i] = std::max(0.0, rec.zpz[i] - ms.dot(tmp));
    }

    // Diffuse phase, dense (it lasts a few observations).
    const Mat tm = model.transition_matrix();
    const Row zr = model.design_row();
    Vec r0 = r, r1 = Vec::Zero(m);
    Mat n0 = nn, n1 = Mat::Zero(m, m), n2 = Mat::Zero(m, m);
    for (std::size_t i = rec.diffuse_steps; i-- > 0;) {
      const auto col = static_cast<Eigen::Index>(i);
      const Vec ms = rec.m_star.col(col);
      const Vec mi = Eigen::Map<const Eigen::VectorXd>(rec.m_inf.data() + col * m, m);
      if (rec.kind[i] == StepKind::Diffuse) {
        const double fi = rec.f_inf[i], fs = rec.f[i], v = rec.v[i];
        const Vec k0 = tm * mi / fi;
        const Vec k1 = tm * (ms / fi - mi * (fs / (fi * fi)));
        const Mat l0 = tm - k0 * zr;
        const Mat l1 = -k1 * zr;
        const Mat zz = zr.transpose() * zr;
        const Vec r0n = l0.transpose() * r0;
        const Vec r1n = zr.transpose() * (v / fi) + l0.transpose() * r1 + l1.transpose() * r0;
        const Mat n0n = l0.transpose() * n0 * l0;
        const Mat n1n = zz / fi + l0.transpose() * n1 * l0 + l1.transpose() * n0 * l0 + l0.transpose() * n0 * l1;
        const Mat n2n = zz * (-fs / (fi * fi)) + l0.transpose() * n2 * l0 + l0.transpose() * n1 * l1 +
                        l1.transpose() * n1 * l0 + l1.transpose() * n0 * l1;
        r0 = r0n;
        r1 = r1n;
        n0 = n0n;
        n1 = n1n;
        n2 = n2n;
      } else if (rec.kind[i] == StepKind::DiffuseFlat) {
        // F_inf = 0: P_inf Z' = 0, so K and L are exactly those of the ordinary filter.
        const double fs = rec.f[i];
        const Vec k0 = tm * ms / fs;
        const Mat l0 = tm - k0 * zr;
        const Vec r0n = zr.transpose() * (rec.v[i] / fs) + l0.transpose() * r0;
        r1 = (l0.transpose() * r1).eval();
        r0 = r0n;
        n0 = (zr.transpose() * zr / fs + l0.transpose() * n0 * l0).eval();
        n1 = (l0.transpose() * n1 * l0).eval();
        n2 = (l0.transpose() * n2 * l0).eval();
      } else {
        model.transition_transposed(r0);
        model.transition_transposed(r1);
        backward_cov(n0);
        backward_cov(n1);
        backward_cov(n2);
      }
      out.mean[t0 + i] = rec.za[i] + ms.dot(r0) + mi.dot(r1);
      const double var = rec.zpz[i] - ms.dot(n0 * ms) - 2.0 * mi.dot(n1 * ms) - mi.dot(n2 * mi);
      out.variance[t0 + i] = std::max(0.0, var);
    }

    // Before t0: at t0 the state had a = 0, P* = 0, P_inf = I, so its
    // smoothed mean is r^(1) and its variance -N^(2). With a flat prior the
    // state one step earlier is T^{-1}(a_{t+1} - n_t), n_t independent of
    // the data: mean T^{-1} a, variance T^{-1} (V + Q) T^{-T}.
    Vec state = r1;
    Mat cov = -n2;
    for (std::size_t t = t0; t-- > 0;) {
      model.transition_inverse(state);
      add_state_noise(cov);
      model.transition_inverse(cov);
      auto ct = cov.transpose();
      model.transition_inverse(ct);
      out.mean[t] = model.signal_of(state);
      Vec cz = Vec::Zero(m);
      times_design(cov, cz);
      out.variance[t] = std::max(0.0, model.signal_of(cz));
    }
    return out;
  }

  /// X <- X - g Z - Z' g'.
  void subtract_design_outer(Mat& x, const Vec& g) const {
    x.col(0) -= g;
    x.row(0) -= g.transpose();
    if (seasonal) {
      x.col(s0) -= g;
      x.row(s0) -= g.transpose();
    }
  }
  /// X <- X + c Z'Z.
  void add_design_design(Mat& x, double c) const {
    x(0, 0) += c;
    if (seasonal) {
      x(0, s0) += c;
      x(s0, 0) += c;
      x(s0, s0) += c;
    }
  }
};

void check_variances(const StructuralModel& model, std::span<const double> variances) {
  if (variances.size() != model.variance_count())
    throw std::invalid_argument("the " + model.name() + " model takes " + std::to_string(model.variance_count()) +
                                " variances, got " + std::to_string(variances.size()));
}

}  // namespace

double LikelihoodParts::log_likelihood() const {
  return -0.5 * (static_cast<double>(observed) * kLog2Pi + sum_log_f_inf + sum_log_f + sum_v2_over_f);
}

double LikelihoodParts::best_scale() const {
  const std::size_t n = effective();
  return n == 0 ? kNaN : sum_v2_over_f / static_cast<double>(n);
}

double LikelihoodParts::concentrated_log_likelihood() const {
  const double scale = best_scale();
  if (!finite || !(scale > 0) || !std::isfinite(scale)) return kNaN;
  const double ne = static_cast<double>(effective());
  return -0.5 * (static_cast<double>(observed) * kLog2Pi + sum_log_f_inf + sum_log_f + ne * std::log(scale) + ne);
}

LikelihoodParts filter_likelihood(const StructuralModel& model, std::span<const double> y,
                                  std::span<const double> variances) {
  check_variances(model, variances);
  switch (model.state_dim()) {
    case 1: return Kernel<1>{model, variances}.forward(y, nullptr);
    case 2: return Kernel<2>{model, variances}.forward(y, nullptr);
    default: return Kernel<Eigen::Dynamic>{model, variances}.forward(y, nullptr);
  }
}

SmoothedSignal smooth_signal(const StructuralModel& model, std::span<const double> y,
                             std::span<const double> variances) {
  check_variances(model, variances);
  switch (model.state_dim()) {
    case 1: return Kernel<1>{model, variances}.smooth(y);
    case 2: return Kernel<2>{model, variances}.smooth(y);
    default: return Kernel<Eigen::Dynamic>{model, variances}.smooth(y);
  }
}

}  // namespace gapmark::state_space
