// The local level model's scalar paths (state_space_level.hpp).
//
// Likelihood and slope. With irregular variance h and level variance q (one
// of them 1, see ratio_variances), the first observation absorbs the flat
// prior (F_inf = 1, so it adds nothing but its count), leaving a = y_t0 and
// P = h + q after the prediction. Each later observation gives
//   F = P + h,  v = y - a,  K = P / F,  a <- a + K v,  P <- P h / F + q
// (a missing one only P <- P + q), and the concentrated log-likelihood is
//   -1/2 [n log 2 pi + sum log F + n_e log(S / n_e) + n_e],  S = sum v^2 / F,
// with n_e the observations after the first. Its derivatives in x carry the
// derivatives of a and P along the same recursion (forward differentiation),
// with h' = -h, h'' = h, q' = q'' = 0 for x > 0 and h' = h'' = 0, q' = q'' = q
// otherwise. Writing g = 1 / F, K = P g, 1 - K = h g and w = (1 - K) P' - K h':
//   K' = g w,   K'' = g ((1 - K) P'' - K h'') - 2 g K' F',
//   P' <- (1 - K)^2 P' + K^2 h' + q',
//   P'' <- (1 - K)^2 P'' + K^2 h'' - 2 g w^2 + q'',
//   a' <- (1 - K) a' + K' v,   a'' <- (1 - K) a'' + K'' v - 2 K' a',
// (the recursions of P' and P'' are the derivatives of P h / (P + h) in P and
// h; written this way each depends on its own past through one product and
// one sum, so only P's recursion, through the division, sets the pace), and
//   slope = -1/2 [sum F'/F + n_e S'/S],  S' = sum (2 v v' / F - v^2 F' / F^2),
// the curvature likewise from F'' and S''. Several
// ratios go through the data together: their recursions do not depend on
// one another, so the processor overlaps them (one ratio alone waits on the
// division at every step). The sum of log F is kept as a running product,
// renormalised by its binary exponent every 16 observations (F >= 1 here,
// because P >= q and one of h, q is 1), and takes one log at the end.
//
// Smoothing: the augmented filter and smoother of state_space_augmented.cpp
// with a state of one value (T = Z = 1): a0, A and P are scalars, the least
// squares problem for the initial level d reduces to d = s / S with
// S = sum A^2 / F and s = sum A v / F, and d's variance is 1 / S.
#include "gapmark/fill/state_space_level.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "gapmark/error.hpp"

namespace gapmark::state_space::level {
namespace {

constexpr double kLog2Pi = 1.8378770664093453;
constexpr double kLn2 = 0.6931471805599453;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
/// Observations between two renormalisations of the running product of F.
constexpr int kRenormalise = 16;

std::size_t first_observed(std::span<const double> y) {
  std::size_t t = 0;
  while (t < y.size() && std::isnan(y[t])) ++t;
  return t;
}

/// The pass for B ratios at once (spare lanes repeat the last one); with
/// `Second`, the second derivative too.
// long: the lanes' recursion (header comment) kept in one loop over local arrays; moving the lanes into a struct
// with start and finish steps measured 12% slower per level fill (bench_kalman: 0.195 -> 0.22 ms).
template <std::size_t B, bool Second>
void batch(std::span<const double> y, std::span<RatioPoint> points) {
  const std::size_t t0 = first_observed(y);
  if (t0 == y.size()) {
    for (auto& pt : points) pt.log_likelihood = pt.slope = pt.curvature = kNaN;
    return;
  }
  std::array<double, B> h{}, q{}, dh{}, dq{}, a{}, da{}, p{}, dp{}, product{}, s{}, ds{}, dlog{};
  std::array<double, B> d2a{}, d2p{}, d2s{}, d2log{};  // second derivatives (with Second)
  std::array<int, B> exponent{};
  for (std::size_t b = 0; b < B; ++b) {
    const double x = points[std::min(b, points.size() - 1)].x;
    ratio_variances(x, h[b], q[b]);
    dh[b] = x > 0 ? -h[b] : 0.0;  // h'' = -h' and q'' = q'
    dq[b] = x > 0 ? 0.0 : q[b];
    a[b] = y[t0];
    p[b] = h[b] + q[b];
    dp[b] = dh[b] + dq[b];
    d2p[b] = -dh[b] + dq[b];
    product[b] = 1;
  }
  std::size_t effective = 0;
  int since = 0;
  for (std::size_t t = t0 + 1; t < y.size(); ++t) {
    const double yt = y[t];
    if (std::isnan(yt)) {
      for (std::size_t b = 0; b < B; ++b) {
        p[b] += q[b];
        dp[b] += dq[b];
        if constexpr (Second) d2p[b] += dq[b];
      }
      continue;
    }
    ++effective;
    for (std::size_t b = 0; b < B; ++b) {
      const double f = p[b] + h[b], df = dp[b] + dh[b];
      const double g = 1.0 / f;
      const double k = p[b] * g, keep = h[b] * g;  // K and 1 - K
      const double v = yt - a[b];
      const double vg = v * g;
      const double dfg = df * g;
      const double w = keep * dp[b] - k * dh[b];  // K' = g w
      const double dk = g * w;
      product[b] *= f;
      s[b] += v * vg;
      ds[b] -= (2.0 * da[b] + vg * df) * vg;
      dlog[b] += dfg;
      if constexpr (Second) {
        const double d2h = -dh[b];  // h'' = -h' (both 0 where h = 1)
        const double d2f = d2p[b] + d2h;
        const double dg = -dfg * g, d2g = (2.0 * dfg * dfg - d2f * g) * g;
        const double dv = -da[b], d2v = -d2a[b];
        const double d2k = g * (keep * d2p[b] - k * d2h) - 2.0 * g * dk * df;
        d2log[b] += d2f * g - dfg * dfg;
        d2s[b] += 2.0 * dv * dv * g + 2.0 * v * d2v * g + 4.0 * v * dv * dg + v * v * d2g;
        d2a[b] = d2a[b] * keep + d2k * v - 2.0 * dk * da[b];
        d2p[b] = keep * keep * d2p[b] + (k * k * d2h - 2.0 * g * w * w + dq[b]);
      }
      a[b] += k * v;
      da[b] = da[b] * keep + dk * v;
      dp[b] = keep * keep * dp[b] + (k * k * dh[b] + dq[b]);
      p[b] = p[b] * keep + q[b];
    }
    if (++since == kRenormalise) {
      since = 0;
      for (std::size_t b = 0; b < B; ++b) {
        int e = 0;
        product[b] = std::frexp(product[b], &e);
        exponent[b] += e;
      }
    }
  }
  const double ne = static_cast<double>(effective);
  const double observed = ne + 1;
  for (std::size_t b = 0; b < points.size(); ++b) {
    const double sum_log_f = std::log(product[b]) + kLn2 * exponent[b];
    const double scale = s[b] / ne;
    if (effective == 0 || !(scale > 0) || !std::isfinite(scale) || !std::isfinite(sum_log_f)) {
      points[b].log_likelihood = points[b].slope = points[b].curvature = kNaN;
      continue;
    }
    points[b].scale = scale;
    points[b].effective = effective;
    points[b].log_likelihood = -0.5 * (observed * kLog2Pi + sum_log_f + ne * std::log(scale) + ne);
    const double ratio = ds[b] / s[b];
    points[b].slope = -0.5 * (dlog[b] + ne * ratio);
    points[b].curvature = Second ? -0.5 * (d2log[b] + ne * (d2s[b] / s[b] - ratio * ratio)) : kNaN;
  }
}

}  // namespace

void ratio_variances(double x, double& irregular, double& level) {
  if (x > 0) {
    irregular = std::exp(-x);
    level = 1;
  } else {
    irregular = 1;
    level = std::exp(x);
  }
}

void concentrated_with_slope(std::span<const double> y, std::span<RatioPoint> points) {
  if (points.empty()) return;
  if (points.size() <= 4) return batch<4, false>(y, points);
  if (points.size() <= 10) return batch<10, false>(y, points);
  if (points.size() <= 16) return batch<16, false>(y, points);
  throw std::invalid_argument("local level: at most 16 ratios per pass");
}

RatioPoint concentrated_with_curvature(std::span<const double> y, double x) {
  std::array<RatioPoint, 1> point{};
  point[0].x = x;
  batch<1, true>(y, point);
  return point[0];
}

namespace {

/// The forward pass from the first observation t0: per step Z a0 (= a0),
/// P, Z A (= A), v and F (0 where missing), and the sums S = sum A^2 / F
/// and s = sum A v / F of the initial level's least squares problem.
struct ForwardPass {
  std::vector<double> a0s, ps, es, vs, fs;
  double s_sum = 0, s_cross = 0;
};

/// Beside the pass, the exactly diffuse filter for the likelihood (fa, fp:
/// its state and variance once the first observation has absorbed the flat
/// prior) fills `parts`.
ForwardPass filter_forward(std::span<const double> y, std::size_t t0, double h, double q, LikelihoodParts& parts) {
  const std::size_t steps = y.size() - t0;
  ForwardPass out{.a0s = std::vector<double>(steps), .ps = std::vector<double>(steps),
                  .es = std::vector<double>(steps), .vs = std::vector<double>(steps, 0.0),
                  .fs = std::vector<double>(steps, 0.0), .s_sum = 0, .s_cross = 0};
  double a0 = 0, big_a = 1, p = 0;
  double fa = y[t0], fp = h, product = 1;
  int exponent = 0;
  parts.observed = parts.diffuse = 1;  // the first observation: F_inf = 1, log F_inf = 0
  for (std::size_t i = 0; i < steps; ++i) {
    out.a0s[i] = a0;
    out.ps[i] = p;
    out.es[i] = big_a;
    const double yt = y[t0 + i];
    if (!std::isnan(yt)) {
      const double v = yt - a0, f = p + h;
      if (!(f > 0) || !std::isfinite(f)) throw MethodFailure("the Kalman filter met a non-positive or non-finite variance");
      out.vs[i] = v;
      out.fs[i] = f;
      const double k = p / f;
      a0 += k * v;
      big_a -= k * big_a;
      p -= k * p;
      out.s_sum += out.es[i] * out.es[i] / f;
      out.s_cross += out.es[i] * v / f;
      if (i > 0) {
        const double fv = yt - fa, ff = fp + h;
        if (!(ff > 0) || !std::isfinite(ff))
          throw MethodFailure("the Kalman filter met a non-positive or non-finite variance");
        ++parts.observed;
        product *= ff;
        if (!(product < 1e150 && product > 1e-150)) {
          int e = 0;
          product = std::frexp(product, &e);
          exponent += e;
        }
        parts.sum_v2_over_f += fv * fv / ff;
        fa += fp * (fv / ff);
        fp -= (fp / ff) * fp;
      }
    }
    p += q;
    fp += q;
  }
  parts.sum_log_f = std::log(product) + kLn2 * exponent;
  parts.finite = std::isfinite(parts.sum_log_f) && std::isfinite(parts.sum_v2_over_f);
  return out;
}

}  // namespace

SmoothedSignal smooth(std::span<const double> y, std::span<const double> variances) {
  const std::size_t n = y.size();
  const std::size_t t0 = first_observed(y);
  if (t0 == n) throw MethodFailure("no observed value to smooth");
  const double h = variances[0], q = variances[1];
  SmoothedSignal out;
  out.mean.assign(n, kNaN);
  out.variance.assign(n, kNaN);
  const ForwardPass fw = filter_forward(y, t0, h, q, out.likelihood);
  if (!(fw.s_sum > 0) || !std::isfinite(fw.s_sum))
    throw MethodFailure("too few observations to identify the level model's initial state");
  const double d = fw.s_cross / fw.s_sum;   // posterior mean of the initial level
  const double d_sd = std::sqrt(fw.s_sum);  // triangular factor of S

  // Backward: r, R (how r depends on d) and N, all scalars; L = 1 - P / F.
  double r = 0, big_r = 0, nn = 0;
  for (std::size_t i = n - t0; i-- > 0;) {
    const double f = fw.fs[i], ms = fw.ps[i], e = fw.es[i];
    if (f > 0) {
      const double l = 1.0 - ms / f;
      r = r * l + (fw.vs[i] - e * d) / f;
      big_r = big_r * l + e / f;
      nn = nn * l * l + 1.0 / f;
    }
    out.mean[t0 + i] = fw.a0s[i] + e * d + ms * r;
    const double w = (e - big_r * ms) / d_sd;
    out.variance[t0 + i] = std::max(0.0, ms - ms * nn * ms + w * w);
  }
  // Before t0: the level is d with variance 1/S, plus q per step back.
  double cov = 1.0 / fw.s_sum;
  for (std::size_t t = t0; t-- > 0;) {
    cov += q;
    out.mean[t] = d;
    out.variance[t] = cov;
  }
  return out;
}

}  // namespace gapmark::state_space::level
