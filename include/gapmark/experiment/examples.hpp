#pragma once
// Example windows for reports: after a run, for each series, the first
// replicate of the first scheme at its first rate is masked again with the
// same seed (the same task key as the run), the leading methods of that cell
// fill it again, and a window of the series is kept with the truth, the mask
// and each fill, plus the autocorrelation of the complete series and of each
// fill. Reporters draw these; they cannot recompute fills themselves.
//
// Layout (results.json "examples"):
//   { "window": 200, "top": 3,
//     "series": [ { "series", "scheme", "rate", "replicate",
//                   "start", "length", "time_first", "time_last", "step",
//                   "truth": [...|null], "mask": [0|1 ...],
//                   "methods": [ {"method", "rank", "status", "reason",
//                                 "filled": [value at masked points, null elsewhere]} ],
//                   "acf": {"lags", "truth": [r_1..r_L], "methods": [{"method", "values"}]} } ] }
#include <cstddef>
#include <nlohmann/json.hpp>

#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/experiment/summary.hpp"

namespace gapmark {

struct ExampleOptions {
  std::size_t window = 200;  ///< most points kept per series
  std::size_t top = 3;       ///< leading methods shown
};

/// Builds the "examples" block. Deterministic: same spec, data and summary,
/// same bytes. A method that fails on the example task is listed with its
/// reason and no fill.
nlohmann::json build_examples(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                              const ExampleOptions& options = {});

}  // namespace gapmark
