#pragma once
// Metrics score a fill. Each metric contributes one or more columns to every
// trial record; a column knows its unit and which direction is better.
// Point metrics look only at the masked points; downstream metrics look at
// what the fill does to the analysis that follows (autocorrelation, forecast).
#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "gapmark/mask/scheme.hpp"
#include "gapmark/registry.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

enum class Direction {
  Lower,       ///< smaller is better (MAE, RMSE)
  ZeroBest,    ///< closer to zero is better (bias)
  Higher,      ///< larger is better
  OneBest,     ///< closer to one is better (variance ratio)
  None,        ///< descriptive only (counts)
};
std::string to_string(Direction d);
Direction direction_from_string(const std::string& text);

/// A metric value as a distance from its best value, so that smaller is
/// better whatever the column's direction: the value (Lower, None), its
/// absolute value (ZeroBest), |value - 1| (OneBest), minus the value (Higher).
/// Every ranking, test and comparison orders methods by this one function.
double badness(double value, Direction direction);

struct MetricColumn {
  std::string name;     ///< "rmse", "acf_rms", "mase_filled"
  std::string unit;     ///< "value", "ratio", "count", "probability", "" ...
  Direction direction = Direction::Lower;
  std::string summary;  ///< one line for tables and docs
};

struct ScoreInput {
  std::span<const double> truth;     ///< the series before masking (its own NaNs kept)
  std::span<const double> filled;    ///< what the method returned
  std::span<const double> variance;  ///< empty when the method gives none
  const Mask* mask = nullptr;        ///< 1 = hidden and scored
  const TimeAxis* axis = nullptr;
  std::size_t period = 0;
  std::size_t holdout = 0;
  /// Conditional sample paths (methods with draws), each the series' length; empty otherwise.
  std::span<const std::vector<double>> draws;
};

class Metric {
public:
  static constexpr const char* family = "metric";
  virtual ~Metric() = default;
  virtual std::vector<MetricColumn> columns() const = 0;
  /// Writes one value per column into `out` (NaN = not applicable, shown as
  /// null / n/a). Must not throw for numerical trouble: write NaN instead.
  virtual void compute(const ScoreInput& input, std::span<double> out) const = 0;
};

using MetricRegistry = Registry<Metric>;

/// The metric calls used when a spec names none.
std::vector<std::string> default_metric_calls();

/// The `level` parameter of a metric that scores central intervals: a
/// probability in [0.01, 0.99], 0.9 by default; `help` says which intervals.
ParamSpec interval_level_param(std::string help);

}  // namespace gapmark
