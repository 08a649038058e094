// Maximum-likelihood variances of a structural model: the local level by a
// batched grid, Newton and Brent search on its one log ratio; the other
// models by short BOBYQA searches from several starts, the best polished.
// The algorithm, step by step: docs/fill-methods.md, "How kalman fits its
// variances".
#include <algorithm>
#include <array>
#include <optional>
#include <cmath>
#include <cstdint>
#include <exception>
#include <limits>
#include <string>
#include <boost/math/tools/minima.hpp>
#include <boost/math/tools/roots.hpp>
#include <nlopt.hpp>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"
#include "gapmark/fill/state_space_level.hpp"

namespace gapmark::state_space {
namespace {

constexpr double kBound = 23.0;
/// The searches from the grid stop at tolerances this much coarser than the final polish...
constexpr double kScreenFactor = 1000.0;
/// ...or after this many likelihood passes each.
constexpr std::size_t kScreenEvaluations = 20;
/// Innovations below this (sum of v^2/F, unit variances, standardised data) mean an exact fit...
constexpr double kExactFit = 1e-24;
/// ...for which each variance is set to this share of the data variance.
constexpr double kExactFitVariance = 1e-12;
/// Returned to the optimiser where the likelihood cannot be evaluated.
constexpr double kPenalty = 1e100;

struct Search {
  Search(const StructuralModel& m, std::span<const double> data) : model(m), y(data) {}

  const StructuralModel& model;
  std::span<const double> y;
  std::size_t reference = 0;
  std::vector<double> relative;  ///< scratch: variances relative to the reference
  std::size_t evaluations = 0;
  double best = -std::numeric_limits<double>::infinity();  ///< best concentrated log-likelihood seen
  std::vector<double> best_relative;

  void set_relative(const double* x) {
    relative.assign(model.variance_count(), 1.0);
    for (std::size_t j = 0, i = 0; j < relative.size(); ++j)
      if (j != reference) relative[j] = std::exp(x[i++]);
  }

  double negative_log_likelihood(const double* x) {
    set_relative(x);
    ++evaluations;
    const double ll = filter_likelihood(model, y, relative).concentrated_log_likelihood();
    if (!std::isfinite(ll)) return kPenalty;
    if (ll > best) {
      best = ll;
      best_relative = relative;
    }
    return -ll;
  }

  static double callback(unsigned, const double* x, double*, void* data) {
    return static_cast<Search*>(data)->negative_log_likelihood(x);
  }

  /// One local search from `start` (variances in any common unit).
  /// False when it stopped on its budget of passes rather than its tolerances.
  bool run(const std::vector<double>& start, double x_tolerance, double f_tolerance, double step,
           std::size_t max_evaluations) {
    reference = static_cast<std::size_t>(std::max_element(start.begin(), start.end()) - start.begin());
    std::vector<double> x;
    for (std::size_t j = 0; j < start.size(); ++j)
      if (j != reference)
        x.push_back(std::clamp(std::log(start[j] / start[reference]), -kBound, kBound));
    nlopt::opt opt(nlopt::LN_BOBYQA, static_cast<unsigned>(x.size()));
    opt.set_lower_bounds(std::vector<double>(x.size(), -kBound));
    opt.set_upper_bounds(std::vector<double>(x.size(), kBound));
    opt.set_min_objective(&Search::callback, this);
    opt.set_xtol_abs(x_tolerance);
    opt.set_ftol_abs(f_tolerance);
    opt.set_maxeval(static_cast<int>(max_evaluations));
    opt.set_initial_step(step);
    double value = 0;
    try {
      return opt.optimize(x, value) != nlopt::MAXEVAL_REACHED;
    } catch (const std::exception&) {
      // Round-off limits and the like: the best point seen is kept either way.
      return true;
    }
  }
};

/// A variance ratio within this of the search bound counts as on the bound.
constexpr double kAtBound = 0.01;

/// Whether a relative variance (the search's reference is 1) is on the bound
/// of its log ratio: an estimate at zero, or the reference's, as far as the
/// search can tell.
bool ratio_at_bound(const std::vector<double>& relative) {
  for (double r : relative)
    if (!(r > 0) || std::abs(std::log(r)) >= kBound - kAtBound) return true;
  return false;
}

/// Grid of log ratios screened by the one-ratio search...
constexpr std::size_t kRatioGrid = 9;
/// ...points that then narrow the bracket around the maximum...
constexpr std::size_t kInnerPoints = 4;
/// ...and Newton's method stops on a step below this share of the x tolerance.
constexpr double kNewtonStop = 1.0;

/// The relative variances (irregular, level) at log ratio x = log(level /
/// irregular), the larger one 1 so that neither underflows.
std::vector<double> ratio_variances(double x) {
  std::vector<double> v(2);
  level::ratio_variances(x, v[0], v[1]);
  return v;
}

/// Maximum-likelihood log ratio of a two-variance model on standardised data
/// z: the best relative variances and the concentrated log-likelihood there.
struct RatioFit {
  std::vector<double> relative;
  double log_likelihood = -std::numeric_limits<double>::infinity();
  level::RatioPoint best;  ///< the best point seen (its scale and count)
  std::size_t evaluations = 0;
  bool converged = true;  ///< the search stopped on its tolerance within its budget

  /// Keeps `pt` if it is the best point so far.
  void keep(const level::RatioPoint& pt) {
    if (std::isfinite(pt.log_likelihood) && pt.log_likelihood > log_likelihood) {
      log_likelihood = pt.log_likelihood;
      relative = ratio_variances(pt.x);
      best = pt;
    }
  }
};

/// Brent's method (Boost.Math) on the likelihood alone within [lo, hi]: the
/// fallback where the slopes at the grid do not bracket a maximum next to
/// the best grid point.
void brent_within(std::span<const double> z, const FitOptions& options, double lo, double hi, RatioFit& fit) {
  auto negative = [&](double x) {
    std::array<level::RatioPoint, 1> pt{};
    pt[0].x = x;
    level::concentrated_with_slope(z, pt);
    ++fit.evaluations;
    fit.keep(pt[0]);
    return std::isfinite(pt[0].log_likelihood) ? -pt[0].log_likelihood : kPenalty;
  };
  // Brent's relative tolerance 2^(1 - bits) |x| meets the absolute x
  // tolerance over the whole range; Boost allows at most half the digits.
  const int bits = std::clamp(static_cast<int>(std::ceil(std::log2(kBound / options.x_tolerance))) + 1, 8,
                              std::numeric_limits<double>::digits / 2);
  std::uintmax_t iterations = options.max_evaluations;
  boost::math::tools::brent_find_minima(negative, lo, hi, bits, iterations);
  fit.converged = iterations < options.max_evaluations;
}

/// The maximum of the cubic that takes the likelihood and slope of both ends
/// of a bracket (slope > 0 on the left, < 0 on the right), where its slope,
/// a quadratic, changes sign; the secant point of the slopes if rounding
/// leaves no root inside.
double hermite_maximum(const level::RatioPoint& left, const level::RatioPoint& right) {
  const double w = right.x - left.x, l0 = left.log_likelihood, l1 = right.log_likelihood;
  const double s0 = w * left.slope, s1 = w * right.slope;  // slopes in t = (x - left) / w
  // d/dt of the cubic: a t^2 + b t + c, with c = s0 > 0 and a + b + c = s1 < 0
  const double a = 6 * (l0 - l1) + 3 * (s0 + s1), b = 6 * (l1 - l0) - 4 * s0 - 2 * s1, c = s0;
  const double disc = b * b - 4 * a * c;
  double t = -1;
  if (disc >= 0) {
    const double qq = -0.5 * (b + std::copysign(std::sqrt(disc), b));
    for (const double root : {qq != 0 ? c / qq : -1.0, a != 0 ? qq / a : -1.0})
      if (root > 0 && root < 1) t = root;
  }
  if (!(t > 0 && t < 1)) t = left.slope / (left.slope - right.slope);
  return left.x + t * w;
}

/// The grid's points, likelihood and slope at every one in one pass, each
/// kept if best; returns the index of the best finite one (kRatioGrid when none).
std::size_t search_grid(std::span<const double> z, std::array<level::RatioPoint, kRatioGrid>& grid, RatioFit& fit) {
  for (std::size_t i = 0; i < kRatioGrid; ++i)
    grid[i].x = -kBound + 2 * kBound * static_cast<double>(i) / static_cast<double>(kRatioGrid - 1);
  level::concentrated_with_slope(z, grid);
  fit.evaluations += kRatioGrid;
  std::size_t best = kRatioGrid;
  for (std::size_t i = 0; i < kRatioGrid; ++i) {
    fit.keep(grid[i]);
    if (std::isfinite(grid[i].log_likelihood) &&
        (best == kRatioGrid || grid[i].log_likelihood > grid[best].log_likelihood))
      best = i;
  }
  return best;
}

/// Narrows the bracket [left, right] (slope > 0, slope < 0) fivefold with
/// four inner points in one pass (four ratios cost little more than one),
/// keeping the first sign change.
void narrow_bracket(std::span<const double> z, level::RatioPoint& left, level::RatioPoint& right, RatioFit& fit) {
  std::array<level::RatioPoint, kInnerPoints> inner{};
  for (std::size_t i = 0; i < kInnerPoints; ++i)
    inner[i].x = left.x + (right.x - left.x) * static_cast<double>(i + 1) / static_cast<double>(kInnerPoints + 1);
  level::concentrated_with_slope(z, inner);
  fit.evaluations += kInnerPoints;
  for (const auto& pt : inner) {
    fit.keep(pt);
    if (!std::isfinite(pt.slope)) continue;
    if (pt.slope > 0) {
      left = pt;
    } else {
      right = pt;
      break;
    }
  }
}

/// Newton's method on the slope with its curvature (Boost.Math), from the
/// maximum of the cubic through the bracket's ends, within the bracket.
/// Boost stops on a relative step, so x is shifted to x + 3 x bound (46 to
/// 92) and the digits chosen so that it stops once a step is below the x
/// tolerance.
void newton_within(std::span<const double> z, const FitOptions& options, const level::RatioPoint& left,
                   const level::RatioPoint& right, RatioFit& fit) {
  const double shift = 3 * kBound;
  const int digits = static_cast<int>(std::ceil(std::log2(4 * kBound / (kNewtonStop * options.x_tolerance)))) + 1;
  auto slope_and_curvature = [&](double u) {
    const level::RatioPoint pt = level::concentrated_with_curvature(z, u - shift);
    ++fit.evaluations;
    fit.keep(pt);
    if (!std::isfinite(pt.slope) || !std::isfinite(pt.curvature)) return std::pair<double, double>(0.0, 1.0);
    return std::pair<double, double>(pt.slope, pt.curvature);
  };
  const double guess = hermite_maximum(left, right);
  std::uintmax_t iterations = options.max_evaluations;
  try {
    boost::math::tools::newton_raphson_iterate(slope_and_curvature, guess + shift, left.x + shift, right.x + shift,
                                               digits, iterations);
    fit.converged = iterations < options.max_evaluations;
  } catch (const std::exception&) {
    // No zero found where the slopes said (round-off on a flat likelihood):
    // the best point seen stands.
  }
}

RatioFit fit_one_ratio(std::span<const double> z, const FitOptions& options) {
  RatioFit fit;
  std::array<level::RatioPoint, kRatioGrid> grid{};
  const std::size_t best = search_grid(z, grid, fit);
  if (best == kRatioGrid) return fit;
  const double slope = grid[best].slope;
  // A best grid point on a bound is kept when the likelihood falls going inside.
  if ((best == 0 && !(slope > 0)) || (best == kRatioGrid - 1 && !(slope < 0)) || slope == 0) return fit;
  // The maximum lies on the side the slope points to: between the best point
  // and its neighbour there, if the slope changes sign in between.
  const std::size_t lo = slope > 0 ? best : best - 1, hi = lo + 1;
  if (!(grid[lo].slope > 0 && grid[hi].slope < 0)) {
    brent_within(z, options, grid[best == 0 ? 0 : best - 1].x,
                 grid[best + 1 == kRatioGrid ? best : best + 1].x, fit);
    return fit;
  }
  level::RatioPoint left = grid[lo], right = grid[hi];
  narrow_bracket(z, left, right, fit);
  newton_within(z, options, left, right, fit);
  return fit;
}

/// The fit in data units from the best relative variances on data
/// standardised by `scale`: the common scale concentrated out is put back.
FitResult scaled_fit(const StructuralModel& model, std::span<const double> z, const std::vector<double>& relative,
                     double scale) {
  const LikelihoodParts parts = filter_likelihood(model, z, relative);
  const double sigma2 = parts.best_scale();
  if (!(sigma2 > 0) || !std::isfinite(sigma2))
    throw MethodFailure("the " + model.name() + " model's fitted scale is not positive");
  FitResult result;
  result.variances.resize(model.variance_count());
  for (std::size_t j = 0; j < result.variances.size(); ++j)
    result.variances[j] = relative[j] * sigma2 * scale * scale;
  result.log_likelihood =
      parts.concentrated_log_likelihood() - static_cast<double>(parts.effective()) * std::log(scale);
  result.evaluations = 1;
  return result;
}

}  // namespace

Standardised standardise(std::span<const double> y) {
  Standardised out;
  const double nan = std::numeric_limits<double>::quiet_NaN();
  out.z.assign(y.size(), nan);
  double largest = 0;
  for (double v : y)
    if (!std::isnan(v)) {
      largest = std::max(largest, std::abs(v));
      ++out.observed;
    }
  if (out.observed == 0 || !(largest > 0) || !std::isfinite(largest)) return out;
  // Mean and variance of y / largest (all within [-1, 1]), then scaled back.
  double mean = 0;
  std::size_t k = 0;
  for (double v : y)
    if (!std::isnan(v)) mean += (v / largest - mean) / static_cast<double>(++k);
  double ss = 0;
  for (double v : y)
    if (!std::isnan(v)) ss += (v / largest - mean) * (v / largest - mean);
  const double sd = std::sqrt(ss / static_cast<double>(out.observed));
  out.centre = mean * largest;
  if (!(sd > 0)) return out;
  out.scale = sd * largest;
  for (std::size_t t = 0; t < y.size(); ++t)
    if (!std::isnan(y[t])) out.z[t] = (y[t] / largest - mean) / sd;
  return out;
}

namespace {

/// Data the model follows exactly (a straight line for the trend model, a
/// line plus a fixed season for the seasonal one) leave no innovation at
/// all, whatever the variances; every estimate is then zero. A negligible
/// common variance keeps the filter defined and the smoother exact. (The
/// local level model follows only constant data exactly, which were turned
/// away before: no probe for it.)
std::optional<FitResult> exact_fit(const StructuralModel& model, std::span<const double> z, double scale) {
  if (model.variance_count() == 2) return std::nullopt;
  const std::vector<double> equal(model.variance_count(), 1.0);
  const LikelihoodParts probe = filter_likelihood(model, z, equal);
  if (!(probe.finite && probe.prior_resolved && probe.effective() > 0 && probe.sum_v2_over_f < kExactFit))
    return std::nullopt;
  FitResult result;
  result.variances.assign(model.variance_count(), kExactFitVariance * scale * scale);
  result.log_likelihood = std::numeric_limits<double>::infinity();
  result.evaluations = 1;
  result.at_bound = true;
  return result;
}

/// A model with two variances: one ratio, searched by fit_one_ratio. The
/// pass at the best ratio gave the common scale too: no pass more.
FitResult ratio_fit(const StructuralModel& model, std::span<const double> z, double scale, const FitOptions& options) {
  const RatioFit ratio = fit_one_ratio(z, options);
  if (ratio.relative.empty())
    throw MethodFailure("the " + model.name() + " model's likelihood is not finite at any variance ratio");
  const double sigma2 = ratio.best.scale;
  if (!(sigma2 > 0) || !std::isfinite(sigma2))
    throw MethodFailure("the " + model.name() + " model's fitted scale is not positive");
  FitResult result;
  result.variances = {ratio.relative[0] * sigma2 * scale * scale, ratio.relative[1] * sigma2 * scale * scale};
  result.log_likelihood = ratio.log_likelihood - static_cast<double>(ratio.best.effective) * std::log(scale);
  result.evaluations = ratio.evaluations;
  result.starts = 1;
  result.converged = ratio.converged;
  result.at_bound = ratio_at_bound(ratio.relative);
  return result;
}

/// Three or more variances: a coarse search from each starting share, then
/// a fine one from the best of them.
FitResult searched_fit(const StructuralModel& model, std::span<const double> z, double scale,
                       const FitOptions& options) {
  Search search(model, z);
  std::size_t starts = 0;
  for (const auto& share : fit_starts(model)) {
    search.run(share, kScreenFactor * options.x_tolerance, kScreenFactor * options.f_tolerance, 1.0,
               std::min(kScreenEvaluations, options.max_evaluations));
    ++starts;
  }
  if (search.best_relative.empty())
    throw MethodFailure("the " + model.name() + " model's likelihood is not finite at any starting point");
  const std::vector<double> best_start = search.best_relative;
  const bool converged = search.run(best_start, options.x_tolerance, options.f_tolerance, 0.1, options.max_evaluations);
  ++starts;
  FitResult result = scaled_fit(model, z, search.best_relative, scale);
  result.evaluations += search.evaluations;
  result.starts = starts;
  result.converged = converged;
  result.at_bound = ratio_at_bound(search.best_relative);
  return result;
}

}  // namespace

FitResult fit_variances(const StructuralModel& model, std::span<const double> y, const FitOptions& options) {
  const Standardised data = standardise(y);
  if (data.observed <= model.state_dim())
    throw MethodFailure("too few observations for the " + model.name() + " model: " + std::to_string(data.observed) +
                        " observed, more than " + std::to_string(model.state_dim()) + " needed");
  if (!(data.scale > 0) || !std::isfinite(data.scale))
    throw MethodFailure("the observed values are constant (or not finite): no variance to estimate");
  if (auto exact = exact_fit(model, data.z, data.scale)) return *exact;
  if (model.variance_count() == 2) return ratio_fit(model, data.z, data.scale, options);
  return searched_fit(model, data.z, data.scale, options);
}

}  // namespace gapmark::state_space
