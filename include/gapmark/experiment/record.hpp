#pragma once
// What a run produces: one record per trial (series x scheme x rate x
// replicate x method), the metric columns those records carry, the run's
// context and its warnings. Summaries and reporters read these; they never
// recompute a metric.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/experiment/example_windows.hpp"
#include "gapmark/experiment/record_checks.hpp"
#include "gapmark/experiment/run_context.hpp"
#include "gapmark/experiment/run_timing.hpp"
#include "gapmark/experiment/series_description.hpp"
#include "gapmark/experiment/trial_status.hpp"
#include "gapmark/fill/model_fit.hpp"
#include "gapmark/score/metric.hpp"

namespace gapmark {

inline constexpr int kResultsSchemaVersion = 1;

/// The default practical equivalence margin: a method whose mean ranking
/// metric is within 5% of the best's counts as equally good (see
/// docs/statistics.md for why 5%).
inline constexpr double kDefaultEquivalence = 0.05;

struct TrialRecord {
  std::string series;     ///< series label
  std::string scheme;     ///< canonical scheme call ("blocks:mean_length=12")
  double rate = 0;
  int replicate = 0;      ///< 0-based
  std::string method;     ///< canonical method call
  TrialStatus status = TrialStatus::Ok;
  std::string reason;     ///< why, when not ok
  std::size_t masked = 0;    ///< points hidden and scored
  std::size_t unfilled = 0;  ///< hidden points the method left empty
  std::size_t clipped = 0;   ///< filled points moved into the method's bounds=LO,HI
  std::vector<double> metrics;  ///< one per column; NaN = not applicable
  ModelFit fit;                 ///< the method's fitted parameters; empty for methods without a model
  double seconds = 0;           ///< wall-clock fill time: kept out of `trials` in results.json

  /// "method/series/scheme@rate/replicate": the trial's canonical name.
  std::string name() const;
};

/// A fixed set of warnings, each with a hint on what to do.
struct Warning {
  std::string code;     ///< "few-masked-points", "observed-changed", ...
  std::string where;    ///< the series, cell or trial it is about
  std::string message;
  std::string hint;
};

struct ResultSet {
  RunContext context;                  ///< the build, the spec, the seed, the inputs' SHA-256
  std::vector<SeriesDescription> series;
  std::vector<MetricColumn> columns;
  std::vector<TrialRecord> trials;     ///< in canonical order
  std::vector<Warning> warnings;
  std::string rank_by = "rmse";
  double alpha = 0.05;
  double equivalence = kDefaultEquivalence;  ///< relative margin on the ranking metric
  RunTiming timing;                    ///< wall-clock facts; comparisons ignore it
  std::optional<ExampleWindows> examples;  ///< example windows for the reports (analysis/examples.hpp); none = not made

  std::size_t column_index(const std::string& name) const;  ///< InputError if absent
};

/// Adds a warning unless the same (code, where) is already there.
void add_warning(std::vector<Warning>& warnings, Warning warning);

/// The metric columns as stored in results.json and checkpoint headers.
nlohmann::json columns_to_json(const std::vector<MetricColumn>& columns);
std::vector<MetricColumn> columns_from_json(const StoredObject& stored, const std::string& key);

nlohmann::json trial_to_json(const TrialRecord& t, const std::vector<MetricColumn>& columns);
TrialRecord trial_from_json(const nlohmann::json& j, const std::vector<MetricColumn>& columns,
                            const std::string& where);

}  // namespace gapmark
