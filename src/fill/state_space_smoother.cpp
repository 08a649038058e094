// The exactly diffuse Kalman filter's likelihood pass (Durbin & Koopman 2012,
// sections 4.3 and 5.2; the diffuse likelihood of sec. 7.2.2). The smoother
// is in state_space_augmented.cpp.
//
// The filter runs from the first observed time t0 with a_t0 = 0, P*_t0 = 0,
// P_inf,t0 = I. Each observation whose F_inf = Z P_inf Z' is positive removes
// one rank from P_inf; after m of them P_inf is exactly zero and the
// ordinary filter takes over. Counting ranks (rather than testing P_inf
// against a tolerance) keeps rounding residue from prolonging that phase.
// When the first m observations are nearly collinear in the state (a
// trigonometric season seen over a few hours) F_inf gets small and the
// likelihood keeps fewer digits (about 1e-4 absolute in the worst stored
// reference case, see reference/kalman/README.md); the smoother avoids this.
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

/// What the forward pass can record, for steps t0 .. n-1; with a record the
/// pass takes the general step throughout (filter_likelihood_general).
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

  const StructuralModel& model;
  std::span<const double> variances;
  Eigen::Index m = static_cast<Eigen::Index>(model.state_dim());
  std::size_t design_count = model.design_count();

  /// out <- X Z' for a square X: the sum of the columns that Z picks.
  void times_design(const Mat& x, Vec& out) const {
    out = x.col(0);
    for (std::size_t i = 1; i < design_count; ++i) out += x.col(model.design_index(i));
  }

  /// X <- T X T', through the structure.
  void predict_cov(Mat& x) const { model.predict_covariance(x); }
  /// The diagonal of Q: each state's disturbance variance (0 for the undisturbed).
  Vec noise = [this] {
    Vec q = Vec::Zero(m);
    for (std::size_t k = 1; k < variances.size(); ++k) {
      const auto first = static_cast<Eigen::Index>(model.disturbed_state(k));
      const auto count = static_cast<Eigen::Index>(model.disturbed_count(k));
      for (Eigen::Index j = first; j < first + count; ++j) q(j) = variances[k];
    }
    return q;
  }();
  void add_state_noise(Mat& x) const { x.diagonal() += noise; }

  /// The state of a forward pass: a and P*, the diffuse part while it lasts
  /// (P_inf and the rank it has left), M* = P* Z' and M_inf = P_inf Z' of the
  /// step, and the sums of the likelihood.
  struct Pass {
    Vec a, ms, mi, scaled;  // scaled: ms / F, formed once
    Mat p, p_inf;
    Eigen::Index rank;
    bool diffuse = true;
    LikelihoodParts parts;
    LogSum log_f, log_f_inf;
  };

  void start_record(Record* rec, std::size_t steps) const {
    if (!rec) return;
    rec->kind.assign(steps, StepKind::Missing);
    rec->za.assign(steps, 0.0);
    rec->zpz.assign(steps, 0.0);
    rec->v.assign(steps, 0.0);
    rec->f.assign(steps, 0.0);
    rec->f_inf.assign(steps, 0.0);
    rec->m_star.resize(m, static_cast<Eigen::Index>(steps));
    rec->m_inf.clear();
  }

  /// The ordinary filter's update with innovation v and its variance f
  /// (also a diffuse-phase observation with F_inf = 0). False when f is not
  /// positive and finite.
  static bool ordinary_update(double v, double f, Pass& s) {
    if (!(f > 0) || !std::isfinite(f)) {
      s.parts.finite = false;
      return false;
    }
    s.log_f.add(f);
    s.parts.sum_v2_over_f += v * v / f;
    s.a += s.ms * (v / f);
    s.scaled = s.ms / f;
    s.p.noalias() -= s.scaled * s.ms.transpose();
    return true;
  }

  /// Step i of the diffuse phase (sec. 5.2.1): an observation with F_inf > 0
  /// absorbs one rank of the flat prior, one with F_inf = 0 updates as the
  /// ordinary filter does; then P_inf is predicted. False when F is not
  /// positive and finite.
  bool diffuse_step(std::size_t i, double yt, double za, double zps, Pass& s, Record* rec) const {
    const double h = variances[0];
    times_design(s.p_inf, s.mi);
    const double zpi = model.signal_of(s.mi);
    if (rec) rec->m_inf.insert(rec->m_inf.end(), s.mi.data(), s.mi.data() + m);
    if (!std::isnan(yt)) {
      ++s.parts.observed;
      const double v = yt - za;
      const double fs = zps + h;
      if (zpi > kDiffuseTolerance * s.p_inf.diagonal().maxCoeff()) {
        ++s.parts.diffuse;
        s.log_f_inf.add(zpi);
        s.a += s.mi * (v / zpi);
        s.p.noalias() += (s.mi * (fs / (zpi * zpi)) - s.ms / zpi) * s.mi.transpose();
        s.p.noalias() -= (s.mi / zpi) * s.ms.transpose();
        s.p_inf.noalias() -= (s.mi / zpi) * s.mi.transpose();
        if (--s.rank == 0) {
          s.p_inf.setZero();
          s.diffuse = false;
        }
        if (rec) rec->kind[i] = StepKind::Diffuse;
      } else {
        if (!ordinary_update(v, fs, s)) return false;
        if (rec) rec->kind[i] = StepKind::DiffuseFlat;
      }
      if (rec) {
        rec->v[i] = v;
        rec->f[i] = fs;
        rec->f_inf[i] = zpi;
      }
    }
    if (rec) rec->diffuse_steps = i + 1;
    if (s.diffuse) predict_cov(s.p_inf);
    return true;
  }

  /// Step i of the ordinary filter with an observation. False when F is not
  /// positive and finite.
  bool regular_step(std::size_t i, double yt, double za, double zps, Pass& s, Record* rec) const {
    ++s.parts.observed;
    const double v = yt - za;
    const double f = zps + variances[0];
    if (!ordinary_update(v, f, s)) return false;
    if (rec) {
      rec->kind[i] = StepKind::Regular;
      rec->v[i] = v;
      rec->f[i] = f;
    }
    return true;
  }

  LikelihoodParts forward(std::span<const double> y, Record* rec) const {
    const std::size_t n = y.size();
    const std::size_t t0 = first_observed(y);
    if (t0 == n) {
      LikelihoodParts parts;
      parts.prior_resolved = false;
      return parts;
    }
    const std::size_t steps = n - t0;
    start_record(rec, steps);
    Pass s{.a = Vec::Zero(m), .ms = Vec::Zero(m), .mi = Vec::Zero(m), .scaled = Vec::Zero(m), .p = Mat::Zero(m, m),
           .p_inf = Mat::Identity(m, m), .rank = m, .diffuse = true, .parts = {}, .log_f = {}, .log_f_inf = {}};
    for (std::size_t i = 0; i < steps; ++i) {
      const double yt = y[t0 + i];
      const double za = model.signal_of(s.a);
      times_design(s.p, s.ms);
      const double zps = model.signal_of(s.ms);
      if (rec) {
        rec->za[i] = za;
        rec->zpz[i] = zps;
        std::copy_n(s.ms.data(), m, rec->m_star.col(static_cast<Eigen::Index>(i)).data());
      }
      if (s.diffuse) {
        if (!diffuse_step(i, yt, za, zps, s, rec)) return s.parts;
      } else if (!std::isnan(yt)) {
        if (!regular_step(i, yt, za, zps, s, rec)) return s.parts;
      }
      model.transition(s.a);
      predict_cov(s.p);
      add_state_noise(s.p);
      if constexpr (M == 1) {  // the local level model: the rest on scalars when nothing is recorded
        if (!rec && !s.diffuse) {
          if (!level_likelihood_tail(y.subspan(t0 + i + 1), s.a(0), s.p(0, 0), variances[0], variances[1], s.parts,
                                     s.log_f))
            return s.parts;
          break;
        }
      }
    }
    s.parts.prior_resolved = !s.diffuse;
    s.parts.sum_log_f = s.log_f.total();
    s.parts.sum_log_f_inf = s.log_f_inf.total();
    if (!std::isfinite(s.parts.sum_log_f) || !std::isfinite(s.parts.sum_v2_over_f) ||
        !std::isfinite(s.parts.sum_log_f_inf))
      s.parts.finite = false;
    return s.parts;
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
  switch (model.state_dim()) {  // fixed sizes for the level, trend and 1-5 harmonics (or periods 3, 5, 7, 9, 11)
    case 1: return Kernel<1>{model, variances}.forward(y, nullptr);
    case 2: return Kernel<2>{model, variances}.forward(y, nullptr);
    case 4: return Kernel<4>{model, variances}.forward(y, nullptr);
    case 6: return Kernel<6>{model, variances}.forward(y, nullptr);
    case 8: return Kernel<8>{model, variances}.forward(y, nullptr);
    case 10: return Kernel<10>{model, variances}.forward(y, nullptr);
    case 12: return Kernel<12>{model, variances}.forward(y, nullptr);
    default: return Kernel<Eigen::Dynamic>{model, variances}.forward(y, nullptr);
  }
}

LikelihoodParts filter_likelihood_general(const StructuralModel& model, std::span<const double> y,
                                          std::span<const double> variances) {
  check_variances(model, variances);
  Record scratch;
  switch (model.state_dim()) {
    case 1: return Kernel<1>{model, variances}.forward(y, &scratch);
    case 2: return Kernel<2>{model, variances}.forward(y, &scratch);
    default: return Kernel<Eigen::Dynamic>{model, variances}.forward(y, &scratch);
  }
}

}  // namespace gapmark::state_space
