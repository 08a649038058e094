// Kalman smoothing: a structural state-space model (local level, local
// linear trend, or local linear trend plus a seasonal of the request's
// period, in dummy or trigonometric form) is fitted by maximum likelihood (state_space.hpp), and each gap is
// filled with the smoothed signal, Z a_t given all observations. The variance
// returned at a filled point is that of the smoothed signal (variance=signal)
// or of the missing value itself, signal plus irregular (variance=value); it
// is 0 at observed points, which come back unchanged.
//
// Edges follow the shared policy. With edges=nearest the variance at an edge
// point is the expected squared error of that nearest value under the model:
// smoothed variance plus the squared distance to the smoothed signal.
//
// The data are centred and scaled to unit variance before fitting and
// smoothing; results are scaled back. A constant series is filled with its
// constant and variance 0 (every variance estimate would be zero).
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/fill/simulation_smoother.hpp"
#include "gapmark/fill/state_space.hpp"

namespace gapmark {
namespace {

namespace ss = state_space;

/// Observed values per state at the least: a rule of thumb (common practice).
constexpr std::size_t kObservedPerState = 3;
/// Dummy seasonals beyond this make the state too large to fit quickly.
constexpr std::size_t kMaxPeriod = 100;
/// Largest number of trigonometric harmonics accepted.
constexpr std::int64_t kMaxHarmonics = 50;

class Kalman final : public FillMethod {
public:
  Kalman(std::string model, std::size_t harmonics, bool edges_nearest, bool value_variance, std::size_t draws)
      : model_(std::move(model)), harmonics_(harmonics), edges_nearest_(edges_nearest),
        value_variance_(value_variance), draws_(draws) {}

  FillResult fill(const FillRequest& request) const override {
    const auto& x = request.values;
    const std::size_t n = x.size();
    const ss::StructuralModel model = build_model(request);
    for (double v : x)
      if (std::isinf(v)) throw MethodFailure("the observed values include an infinity");
    const ss::Standardised data = ss::standardise(x);
    const std::size_t needed = kObservedPerState * model.state_dim();
    if (data.observed < needed)
      throw MethodFailure("model=" + model_ + " needs at least " + std::to_string(needed) + " observed values (" +
                          std::to_string(kObservedPerState) + " per state), found " +
                          std::to_string(data.observed));

    FillResult result;
    result.values.assign(x.begin(), x.end());
    result.variance.assign(n, 0.0);
    const auto [first, last] = *observed_span(x);  // data.observed >= needed > 0 above

    if (data.scale == 0) {  // constant: the model's fit is exact, every variance is zero
      for (std::size_t t = 0; t < n; ++t)
        if (std::isnan(x[t])) set_fill(result, t, (t > first && t < last) || edges_nearest_ ? x[first] : kNaN, 0.0);
      result.draws.assign(draws_, result.values);
      return result;
    }

    const ss::FitResult fit = ss::fit_variances(model, data.z);
    const ss::SmoothedSignal smooth = ss::smooth_signal(model, data.z, fit.variances);
    result.fit.model = model.name();
    const auto names = model.variance_names();
    for (std::size_t k = 0; k < names.size(); ++k)
      result.fit.parameters.emplace_back("variance_" + names[k], in_data_units(data.scale, fit.variances[k]));
    // the likelihood of the data in their own units: the standardised one less n log(scale)
    result.fit.log_likelihood =
        fit.log_likelihood - static_cast<double>(smooth.likelihood.effective()) * std::log(data.scale);
    result.fit.iterations = fit.evaluations;
    result.fit.converged = fit.converged;
    result.fit.at_bound = fit.at_bound;
    const double n_eff = static_cast<double>(smooth.likelihood.effective()), k = static_cast<double>(names.size());
    if (n_eff - k - 1 > 0)
      result.fit.aicc = -2 * result.fit.log_likelihood + 2 * k + 2 * k * (k + 1) / (n_eff - k - 1);
    const double extra = value_variance_ ? fit.variances[0] : 0.0;
    const double s = data.scale;
    for (std::size_t t = 0; t < n; ++t) {
      if (!std::isnan(x[t])) continue;
      const double mean = smooth.mean[t], var = smooth.variance[t] + extra;
      if (!std::isfinite(mean) || !std::isfinite(var))
        throw MethodFailure("the smoother gave a non-finite value at point " + std::to_string(t + 1));
      if (t > first && t < last) {
        set_fill(result, t, data.centre + s * mean, in_data_units(s, var));
      } else if (edges_nearest_) {
        const std::size_t near = t < first ? first : last;
        const double gap = mean - data.z[near];
        set_fill(result, t, x[near], in_data_units(s, var + gap * gap));
      } else {
        set_fill(result, t, kNaN, kNaN);
      }
    }
    if (draws_ > 0) add_draws(result, model, data, fit.variances, smooth.mean, first, last, request.seed);
    return result;
  }

private:
  static constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

  /// The conditional sample paths (simulation_smoother.hpp), in data units.
  /// At an edge point filled with the nearest value, a draw is that value
  /// plus the draw's distance from the smoothed signal (so the draws centre
  /// on the fill); where the fill is left empty, so are the draws.
  void add_draws(FillResult& result, const ss::StructuralModel& model, const ss::Standardised& data,
                 const std::vector<double>& variances, const std::vector<double>& smoothed, std::size_t first,
                 std::size_t last, std::uint64_t seed) const {
    Rng rng(seed);  // the fit's variances are those of the standardised data, as the draws are
    result.draws = ss::conditional_draws(model, data.z, variances, draws_, value_variance_, rng);
    const auto& x = result.values;
    for (auto& path : result.draws)
      for (std::size_t t = 0; t < path.size(); ++t) {
        if (!std::isnan(data.z[t])) {
          path[t] = x[t];
        } else if (std::isnan(x[t])) {
          path[t] = kNaN;
        } else if (t < first || t > last) {
          path[t] = x[t] + data.scale * (path[t] - smoothed[t]);
        } else {
          path[t] = data.centre + data.scale * path[t];
        }
      }
  }

  /// A variance of the standardised data in the data's squared unit, or NaN
  /// where that is no normal double (data beyond ~1e154 or below ~1e-154,
  /// whose squares overflow or vanish): interval scores are then n/a, not
  /// computed from an infinite or zero width.
  static double in_data_units(double scale, double variance) {
    const double v = scale * scale * variance;
    return variance > 0 && !std::isnormal(v) ? kNaN : v;
  }

  static void set_fill(FillResult& r, std::size_t t, double value, double variance) {
    r.values[t] = value;
    r.variance[t] = std::isnan(value) ? kNaN : variance;
  }

  ss::StructuralModel build_model(const FillRequest& request) const {
    if (model_ == "level") return ss::StructuralModel::local_level();
    if (model_ == "trend") return ss::StructuralModel::local_linear_trend();
    const std::size_t period = request.period;
    if (period < 2) throw MethodFailure("model=seasonal needs a seasonal period", UnmetNeed::Period);
    if (2 * period > request.values.size())
      throw MethodFailure("model=seasonal needs a seasonal period of at most half the series (period " +
                          std::to_string(period) + ", " + std::to_string(request.values.size()) +
                          " points)",
                          UnmetNeed::Length);
    if (harmonics_ > 0) {
      if (2 * harmonics_ >= period)
        throw MethodFailure("harmonics=" + std::to_string(harmonics_) + " needs a period above " +
                            std::to_string(2 * harmonics_) + " (period " + std::to_string(period) +
                            " takes at most " + std::to_string((period - 1) / 2) + " harmonics)");
      return ss::StructuralModel::trigonometric(period, harmonics_);
    }
    if (period > kMaxPeriod)
      throw MethodFailure("model=seasonal handles periods up to " + std::to_string(kMaxPeriod) + " (period " +
                          std::to_string(period) + " gives too large a state; harmonics=k keeps it at 2k + 2)");
    return ss::StructuralModel::basic_structural(period);
  }

  std::string model_;
  std::size_t harmonics_;
  bool edges_nearest_;
  bool value_variance_;
  std::size_t draws_;
};

const Registration<FillMethod> registration{{
    .name = "kalman",
    .summary = "smoothed signal of a structural state-space model (local level, local linear trend, or "
               "trend plus seasonal) with maximum-likelihood variances",
    .params = {choice_param("model", "level", {"level", "trend", "seasonal"},
                            "level: random-walk level; trend: level and slope; seasonal: level, slope and a "
                            "seasonal of the series' period (see harmonics)"),
               {.name = "harmonics",
                .type = ParamType::Integer,
                .default_value = "0",
                .min = 0,
                .max = static_cast<double>(kMaxHarmonics),
                .choices = {},
                .help = "model=seasonal only: 0 = dummy seasonal (period - 1 states, periods up to 100); "
                        "k = k trigonometric harmonics of the period sharing one variance (2k states, "
                        "k below period/2; far faster for long periods)"},
               edges_param(),
               draws_param(),
               choice_param("variance", "value", {"signal", "value"},
                            "variance returned at filled points: of the missing value itself (signal plus "
                            "irregular: what an interval for the true value needs), or of the smoothed signal "
                            "only")},
    .needs = {.period = false, .uses_period = true, .siblings = false, .min_observed = 3},
    .make = [](const ParamValues& p) {
      if (p.integer("harmonics") != 0 && p.text("model") != "seasonal")
        throw InputError("kalman: harmonics", "applies to model=seasonal only (model=" + p.text("model") + ")");
      return std::make_unique<Kalman>(p.text("model"), static_cast<std::size_t>(p.integer("harmonics")),
                                      p.text("edges") == "nearest", p.text("variance") == "value",
                                      static_cast<std::size_t>(p.integer("draws")));
    },
}};

}  // namespace
}  // namespace gapmark
