#pragma once
// A fill method takes a series with NaN gaps and returns it filled. Observed
// values must come back unchanged. A method may also return a variance for
// each point (0 at observed points) when it has a predictive distribution.
//
// Edge policy, shared by the built-in methods unless their summary says
// otherwise: a gap before the first or after the last observation is filled
// with the nearest observed value (`edges=nearest`), or left missing
// (`edges=leave`), in which case the scorer counts those points as unfilled.
#include <cstddef>
#include <cstdint>
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "gapmark/fill/model_fit.hpp"
#include "gapmark/registry.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

struct FillRequest {
  std::span<const double> values;                  ///< NaN = to fill
  const TimeAxis* axis = nullptr;                  ///< never null in the harness
  std::size_t period = 0;                          ///< seasonal period, 0 = none
  std::vector<std::span<const double>> siblings;   ///< other series on the same axis
  std::vector<std::string> sibling_names;
  /// Where an outside program runs (`external`): the spec's folder in a run,
  /// so that relative paths in its command read like the spec's data paths;
  /// empty: the current directory.
  std::string working_dir;
  /// Seeds a method's own random draws (the conditional sample paths of
  /// `kalman` and `arima`): in a run, derived from the task's key and the
  /// method, so draws do not depend on thread count or order.
  std::uint64_t seed = 0;
};

struct FillResult {
  std::vector<double> values;    ///< same length as the request; NaN = left unfilled
  std::vector<double> variance;  ///< empty, or one per point (predictive variance)
  std::size_t clipped = 0;       ///< filled points moved into `bounds=LO,HI`
  ModelFit fit;                  ///< what a model-based method estimated; empty otherwise
  /// Conditional sample paths (methods with `draws=M`): M series of the
  /// request's length, observed points as given, each missing point a draw
  /// from the model's distribution given the observed values; empty otherwise.
  std::vector<std::vector<double>> draws;
};

class FillMethod {
public:
  static constexpr const char* family = "method";
  virtual ~FillMethod() = default;
  /// Fills the gaps. Throws MethodFailure with a reason when it cannot. The
  /// caller has checked the registration's needs (check_needs) first, so a
  /// method may rely on them.
  virtual FillResult fill(const FillRequest& request) const = 0;

  /// The parameters every method takes (method_common_params.cpp): `period`
  /// (methods that use one), `bounds` and `transform`.
  static std::vector<ParamSpec> common_params(const Needs& needs);
  /// Wraps a method in the common parameters that were given; returns it
  /// unchanged when none was.
  static std::unique_ptr<FillMethod> wrap(std::unique_ptr<FillMethod> method, const ParamValues& values,
                                          const Needs& needs);
};

using MethodRegistry = Registry<FillMethod>;

/// Checks the method's needs against a request; throws MethodFailure naming
/// the unmet need ("needs a seasonal period of at least 2", UnmetNeed::Period).
void check_needs(const Needs& needs, const FillRequest& request);
/// The period a bound method works with: its own `period=N` when given, else the data's.
std::size_t method_period(const Bound<FillMethod>& method, std::size_t data_period);
/// The same for a bound method: its own `period=N`, when given, replaces the data's.
void check_needs(const Bound<FillMethod>& method, const FillRequest& request);

/// The shared `edges` parameter (nearest | leave).
ParamSpec edges_param();
/// The shared `draws` parameter of methods that can sample (0 = none).
ParamSpec draws_param();
/// Largest number of draws a method accepts.
inline constexpr std::int64_t kMaxDraws = 10000;
/// The first and last observed (non-NaN) positions of a series.
struct ObservedSpan {
  std::size_t first;
  std::size_t last;
};
/// std::nullopt when no value is observed.
std::optional<ObservedSpan> observed_span(std::span<const double> values);
/// Fills leading and trailing gaps of `values` with the nearest observed value.
void fill_edges_nearest(std::vector<double>& values);

}  // namespace gapmark
