// Maximum-likelihood variances of a structural model.
//
// The data are centred and scaled to unit variance first (the diffuse
// likelihood does not depend on the centre, and the scale only shifts it by
// -effective * log(scale)), so huge or tiny magnitudes behave alike.
//
// Parameters: one variance is the reference; the others are exp(x_j) times
// it, and the common scale is concentrated out of the likelihood (its best
// value is sum(v^2/F) / effective), leaving variance_count - 1 free log
// ratios, each bounded to [-23, 23] (ratios 1e-10 .. 1e10). BOBYQA (NLopt,
// derivative-free, deterministic) maximises the concentrated likelihood from
// each starting share in fit_starts(); the reference of a start is its
// largest share. These searches are short (at most 20 likelihood passes, at
// tolerances 1000 times coarser than asked: they only need to find the best
// basin, and on the stored references they end in the same optimum as
// searches run to convergence); the best end point is then
// polished to full tolerance with its own largest variance as the reference,
// so that a reference whose estimate goes to zero cannot pin the others to a
// bound. A search stops when a step moves every log ratio by less than the x
// tolerance or the log-likelihood by less than the f tolerance.
//
// Models with two variances (the local level) have a single free log ratio
// x = log(level / irregular) in [-23, 23]. A one-dimensional search serves it
// better: the concentrated likelihood at 9 evenly spaced ratios picks the
// basin, and Brent's method (Boost.Math) polishes the best of them within its
// neighbours to the x tolerance. A best grid point on a bound is kept when
// the likelihood falls when stepping inside by the x tolerance (fits whose
// irregular or level variance goes to zero end there, as BOBYQA's do). About
// 11-35 likelihood passes (18 on average on the benchmark's cold-room series),
// where the general search took 50-150.
#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <exception>
#include <limits>
#include <string>
#include <boost/math/tools/minima.hpp>
#include <nlopt.hpp>

#include "gapmark/error.hpp"
#include "gapmark/fill/state_space.hpp"

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

/// Grid of log ratios screened by the one-ratio search.
constexpr std::size_t kRatioGrid = 9;

/// The relative variances (irregular, level) at log ratio x = log(level /
/// irregular), the larger one 1 so that neither underflows.
std::vector<double> ratio_variances(double x) {
  return x > 0 ? std::vector<double>{std::exp(-x), 1.0} : std::vector<double>{1.0, std::exp(x)};
}

/// Maximum-likelihood log ratio of a two-variance model on standardised data
/// z: the best relative variances and the concentrated log-likelihood there.
struct RatioFit {
  std::vector<double> relative;
  double log_likelihood = -std::numeric_limits<double>::infinity();
  std::size_t evaluations = 0;
  bool converged = true;  ///< Brent stopped on its tolerance within its budget
};

RatioFit fit_one_ratio(const StructuralModel& model, std::span<const double> z, const FitOptions& options) {
  RatioFit fit;
  // Negative concentrated log-likelihood at x; the best point seen is kept.
  auto negative = [&](double x) {
    std::vector<double> relative = ratio_variances(x);
    ++fit.evaluations;
    const double ll = filter_likelihood(model, z, relative).concentrated_log_likelihood();
    if (!std::isfinite(ll)) return kPenalty;
    if (ll > fit.log_likelihood) {
      fit.log_likelihood = ll;
      fit.relative = std::move(relative);
    }
    return -ll;
  };
  std::array<double, kRatioGrid> grid{};
  std::array<double, kRatioGrid> values{};
  std::size_t best = 0;
  for (std::size_t i = 0; i < kRatioGrid; ++i) {
    grid[i] = -kBound + 2 * kBound * static_cast<double>(i) / static_cast<double>(kRatioGrid - 1);
    values[i] = negative(grid[i]);
    if (values[i] < values[best]) best = i;
  }
  if (fit.relative.empty()) return fit;
  const bool at_bound = best == 0 || best == kRatioGrid - 1;
  if (at_bound) {
    const double inside = grid[best] + (best == 0 ? 1.0 : -1.0) * options.x_tolerance;
    if (negative(inside) >= values[best]) return fit;
  }
  // Brent's relative tolerance 2^(1 - bits) |x| meets the absolute x
  // tolerance over the whole range; Boost allows at most half the digits.
  const int bits = std::clamp(static_cast<int>(std::ceil(std::log2(kBound / options.x_tolerance))) + 1, 8,
                              std::numeric_limits<double>::digits / 2);
  std::uintmax_t iterations = options.max_evaluations;
  const double lo = grid[best == 0 ? 0 : best - 1];
  const double hi = grid[best + 1 == kRatioGrid ? best : best + 1];
  boost::math::tools::brent_find_minima(negative, lo, hi, bits, iterations);
  fit.converged = iterations < options.max_evaluations;
  return fit;
}

/// The fit in data units from the best relative variances on data
/// standardised by `scale`: the common scale concentrated out is put back.
FitResult scaled_fit(const StructuralModel& model, std::span<const double> z, const std::vector<double>& relative,
                     double concentrated_log_likelihood, double scale) {
  const LikelihoodParts parts = filter_likelihood(model, z, relative);
  const double sigma2 = parts.best_scale();
  if (!(sigma2 > 0) || !std::isfinite(sigma2))
    throw MethodFailure("the " + model.name() + " model's fitted scale is not positive");
  FitResult result;
  result.variances.resize(model.variance_count());
  for (std::size_t j = 0; j < result.variances.size(); ++j)
    result.variances[j] = relative[j] * sigma2 * scale * scale;
  result.log_likelihood = concentrated_log_likelihood - static_cast<double>(parts.effective()) * std::log(scale);
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

FitResult fit_variances(const StructuralModel& model, std::span<const double> y, const FitOptions& options) {
  const Standardised data = standardise(y);
  if (data.observed <= model.state_dim())
    throw MethodFailure("too few observations for the " + model.name() + " model: " + std::to_string(data.observed) +
                        " observed, more than " + std::to_string(model.state_dim()) + " needed");
  if (!(data.scale > 0) || !std::isfinite(data.scale))
    throw MethodFailure("the observed values are constant (or not finite): no variance to estimate");
  const double scale = data.scale;
  const std::vector<double>& z = data.z;

  FitResult result;
  // Data the model follows exactly (a straight line for the trend model, a
  // line plus a fixed season for the seasonal one) leave no innovation at
  // all, whatever the variances; every estimate is then zero. A negligible
  // common variance keeps the filter defined and the smoother exact.
  const std::vector<double> equal(model.variance_count(), 1.0);
  const LikelihoodParts probe = filter_likelihood(model, z, equal);
  if (probe.finite && probe.prior_resolved && probe.effective() > 0 && probe.sum_v2_over_f < kExactFit) {
    result.variances.assign(model.variance_count(), kExactFitVariance * scale * scale);
    result.log_likelihood = std::numeric_limits<double>::infinity();
    result.evaluations = 1;
    result.at_bound = true;
    return result;
  }

  if (model.variance_count() == 2) {
    const RatioFit ratio = fit_one_ratio(model, z, options);
    if (ratio.relative.empty())
      throw MethodFailure("the " + model.name() + " model's likelihood is not finite at any variance ratio");
    result = scaled_fit(model, z, ratio.relative, ratio.log_likelihood, scale);
    result.evaluations += ratio.evaluations;
    result.starts = 1;
    result.converged = ratio.converged;
    result.at_bound = ratio_at_bound(ratio.relative);
    return result;
  }

  Search search(model, z);
  for (const auto& share : fit_starts(model)) {
    search.run(share, kScreenFactor * options.x_tolerance, kScreenFactor * options.f_tolerance, 1.0,
               std::min(kScreenEvaluations, options.max_evaluations));
    ++result.starts;
  }
  if (search.best_relative.empty())
    throw MethodFailure("the " + model.name() + " model's likelihood is not finite at any starting point");
  const std::vector<double> best_start = search.best_relative;
  const bool converged = search.run(best_start, options.x_tolerance, options.f_tolerance, 0.1, options.max_evaluations);
  ++result.starts;

  const std::size_t starts = result.starts;
  result = scaled_fit(model, z, search.best_relative, search.best, scale);
  result.evaluations += search.evaluations;
  result.starts = starts;
  result.converged = converged;
  result.at_bound = ratio_at_bound(search.best_relative);
  return result;
}

}  // namespace gapmark::state_space
