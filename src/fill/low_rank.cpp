// Low-rank completion across the series of one data set that share the time
// axis (soft-impute on the standardised time x series matrix), with lambda
// given, or chosen on held-out cells along a warm-started path. Parameters
// and the choice of lambda: docs/fill-methods.md, "How low-rank chooses
// lambda".
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/fill/soft_impute.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/rng.hpp"
#include "gapmark/series.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.siblings = true, .min_observed = 1};

constexpr double kHoldoutFraction = 0.10;
constexpr std::size_t kGridSize = 20;
constexpr double kSmallestRatio = 1e-3;
constexpr std::size_t kPatience = 3;
/// Observed cells needed to hold some out and still fit (common practice).
constexpr std::size_t kMinObservedForSelection = 20;

struct ColumnScale {
  double centre = 0.0;
  double scale = 1.0;
};

/// Mean and sample standard deviation of the observed cells; a column with
/// fewer than two observed values or no spread keeps scale 1.
ColumnScale observed_scale(std::span<const double> v) {
  double sum = 0.0;
  std::size_t count = 0;
  for (double x : v)
    if (!std::isnan(x)) { sum += x; ++count; }
  ColumnScale s;
  if (count == 0) return s;
  s.centre = sum / static_cast<double>(count);
  if (count < 2) return s;
  // Squared deviations beyond ~1e154 overflow and below ~1e-154 vanish:
  // there the deviations are first multiplied by a power of two (exact)
  // that brings the largest near 1, and the deviation scaled back.
  double largest = 0.0;
  for (double x : v)
    if (!std::isnan(x)) largest = std::max(largest, std::abs(x - s.centre));
  const int exponent = largest > 1e100 || (largest > 0.0 && largest < 1e-100) ? std::ilogb(largest) : 0;
  double ss = 0.0;
  for (double x : v)
    if (!std::isnan(x)) ss += std::ldexp(x - s.centre, -exponent) * std::ldexp(x - s.centre, -exponent);
  const double sd = std::ldexp(std::sqrt(ss / static_cast<double>(count - 1)), exponent);
  if (std::isfinite(sd) && sd > 0.0) s.scale = sd;
  return s;
}

/// A seed from the data's bytes (NaN written as one fixed pattern).
std::uint64_t data_seed(const std::vector<std::span<const double>>& columns) {
  std::string bytes = "low-rank:" + std::to_string(columns.size()) + ":" + std::to_string(columns[0].size()) + ":";
  for (const auto& c : columns) {
    for (double x : c) {
      std::uint64_t bits = 0;
      if (!std::isnan(x)) std::memcpy(&bits, &x, sizeof bits);
      else bits = 0x7ff8000000000000ULL;
      bytes.append(reinterpret_cast<const char*>(&bits), sizeof bits);
    }
  }
  return stable_hash(bytes);
}

/// The target first, then each sibling of the same length with observed values.
std::vector<std::span<const double>> usable_columns(const FillRequest& request) {
  const std::size_t n = request.values.size();
  std::vector<std::span<const double>> columns{request.values};
  for (const auto& s : request.siblings)
    if (s.size() == n && count_observed(s) > 0) columns.push_back(s);
  if (columns.size() < 2)
    throw MethodFailure("needs at least one sibling series of the same length with observed values",
                        UnmetNeed::Siblings);
  return columns;
}

/// The series side by side as columns, each centred and scaled by its observed values.
struct ScaledMatrix {
  Eigen::MatrixXd x;
  std::vector<ColumnScale> scales;
};

ScaledMatrix scaled_matrix(const std::vector<std::span<const double>>& columns) {
  const std::size_t n = columns[0].size();
  ScaledMatrix out{.x = Eigen::MatrixXd(static_cast<Eigen::Index>(n), static_cast<Eigen::Index>(columns.size())),
                   .scales = {}};
  for (Eigen::Index j = 0; j < out.x.cols(); ++j) {
    out.scales.push_back(observed_scale(columns[j]));
    for (std::size_t i = 0; i < n; ++i)
      out.x(static_cast<Eigen::Index>(i), j) = (columns[j][i] - out.scales[j].centre) / out.scales[j].scale;
  }
  return out;
}

/// Where the final completion starts, and whether a chosen lambda lies at
/// an end of its grid.
struct LambdaStart {
  Eigen::MatrixXd start;
  bool at_grid_end = false;
};

class LowRank final : public FillMethod {
public:
  // `base` carries the rank cap and the stopping rule; its lambda is set per fill.
  LowRank(const SoftImputeOptions& base, double lambda_fraction) : base_(base), lambda_fraction_(lambda_fraction) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const std::vector<std::span<const double>> columns = usable_columns(request);
    const std::size_t rank = base_.max_rank;
    if (rank > 0 && lambda_fraction_ == 0.0 && rank >= columns.size())
      throw MethodFailure("rank " + std::to_string(rank) + " leaves nothing to complete with " +
                          std::to_string(columns.size()) + " series; choose a rank below the number of series");
    const ScaledMatrix m = scaled_matrix(columns);
    SoftImputeOptions options = base_;
    const LambdaStart chosen = set_lambda(m.x, columns, options);
    const double top = lambda_max(m.x);
    const SoftImputeFit fit = soft_impute(m.x, options, chosen.start);
    if (!fit.z.allFinite()) throw MethodFailure("the completion diverged (non-finite values)");

    FillResult result;
    // On record: lambda as the fraction of lambda_max given or chosen, the
    // components the final step kept, and whether the updates met the tolerance.
    result.fit.model = "soft-thresholded SVD, " + std::to_string(columns.size()) + " series";
    result.fit.parameters = {{"lambda", top > 0 ? options.lambda / top : 0.0},
                             {"rank", static_cast<double>(fit.rank)}};
    result.fit.iterations = fit.iterations;
    result.fit.converged = fit.converged;
    // lambda chosen at an end of its grid: the best lies at or beyond the searched range
    result.fit.at_bound = chosen.at_grid_end;
    result.values.assign(request.values.begin(), request.values.end());
    for (std::size_t i = 0; i < result.values.size(); ++i)
      if (std::isnan(result.values[i]))
        result.values[i] = fit.z(static_cast<Eigen::Index>(i), 0) * m.scales[0].scale + m.scales[0].centre;
    return result;
  }

private:
  /// Sets options.lambda: chosen by hold-out (neither rank nor lambda
  /// given), 0 after the rank-capped path (rank only), or the given
  /// fraction of lambda_max.
  LambdaStart set_lambda(const Eigen::MatrixXd& x, const std::vector<std::span<const double>>& columns,
                         SoftImputeOptions& options) const {
    LambdaStart out{.start = Eigen::MatrixXd::Zero(x.rows(), x.cols()), .at_grid_end = false};
    if (base_.max_rank == 0 && lambda_fraction_ == 0.0) {
      const std::size_t observed = static_cast<std::size_t>((!x.array().isNaN()).count());
      if (observed < kMinObservedForSelection)
        throw MethodFailure("only " + std::to_string(observed) + " observed cells, too few to choose lambda by " +
                            "hold-out (needs " + std::to_string(kMinObservedForSelection) +
                            "); give rank or lambda");
      const LambdaSelection sel = select_lambda(x, kGridSize, kSmallestRatio, kHoldoutFraction,
                                                data_seed(columns), options, kPatience);
      options.lambda = sel.lambdas.at(sel.best);
      out.start = sel.best_z;
      out.at_grid_end = sel.best == 0 || sel.best + 1 == kGridSize;
    } else if (lambda_fraction_ == 0.0) {
      // Rank only: the rank-capped soft-thresholded path down to lambda 0,
      // each fit warm-starting the next.
      std::vector<double> path = lambda_grid(lambda_max(x), kGridSize, kSmallestRatio);
      out.start = soft_impute_path(x, path, options).z;
      options.lambda = 0.0;
    } else {
      options.lambda = lambda_fraction_ * lambda_max(x);
    }
    return out;
  }

  SoftImputeOptions base_;
  double lambda_fraction_;
};

const Registration<FillMethod> registration{{
    .name = "low-rank",
    .summary = "soft-thresholded SVD completion of the time x series matrix of one data set (needs siblings)",
    .params = {{.name = "rank", .type = ParamType::Integer, .default_value = "0", .min = 0, .max = 1000,
                .choices = {},
                .help = "keep at most this many components after centring (0 = no cap); rank alone means lambda 0"},
               {.name = "lambda", .type = ParamType::Real, .default_value = "0", .min = 0, .max = 1,
                .choices = {},
                .help = "soft threshold as a fraction of the largest singular value of the standardised "
                        "observed matrix (0 with rank 0 = chosen by hold-out validation)"},
               {.name = "tolerance", .type = ParamType::Real, .default_value = "1e-05", .min = 0, .max = 1,
                .choices = {},
                .help = "stop when an update changes the estimate by at most this fraction (Frobenius norm)"},
               {.name = "max_iterations", .type = ParamType::Integer, .default_value = "1000", .min = 1,
                .max = 1e7, .choices = {},
                .help = "update steps at most (per lambda while choosing it)"}},
    .needs = kNeeds,
    .make = [](const ParamValues& p) {
      const SoftImputeOptions base{.lambda = 0.0,
                                   .max_rank = static_cast<std::size_t>(p.integer("rank")),
                                   .tolerance = p.real("tolerance"),
                                   .max_iterations = static_cast<std::size_t>(p.integer("max_iterations"))};
      return std::make_unique<LowRank>(base, p.real("lambda"));
    },
}};

}  // namespace
}  // namespace gapmark
