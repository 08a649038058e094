#pragma once
// Example windows for reports: after a run, for each series, the first
// replicate of the first scheme at its first rate is masked again with the
// same seed (the same task key as the run), the leading methods of that cell
// fill it again, and a window of the series is kept with the truth, the mask
// and each fill, plus the autocorrelation of the complete series and of each
// fill. Reporters draw these; they cannot recompute fills themselves.
//
// Layout: experiment/example_windows.hpp.
#include <cstddef>
#include <string>
#include <nlohmann/json.hpp>

#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/analysis/summary.hpp"

namespace gapmark {

struct ExampleOptions {
  std::size_t window = 200;  ///< most points kept per series
  std::size_t top = 3;       ///< leading methods shown
  std::size_t max_series = 40;  ///< example windows for the first this-many series only
  unsigned threads = 1;  ///< series built side by side (the result does not depend on it)
  /// Whether "external" methods may be started again; when not, they are
  /// listed with status "not run" and no fill.
  bool allow_external = false;
};

/// Builds the example windows. Deterministic: same spec, data and summary,
/// same bytes. A method that fails on the example task is listed with its
/// reason and no fill.
ExampleWindows build_examples(const ExperimentSpec& spec, const LoadedData& data, const Summary& summary,
                              const ExampleOptions& options = {});

/// Reloads the spec's data, checks that it is the data the run used (the
/// SHA-256 of each input in results' context) and sets results.examples
/// from `summary` (the results' own). Returns an empty string, or why no
/// examples could be made (the data changed or is gone); results.examples
/// is then left empty.
std::string attach_examples(ResultSet& results, const Summary& summary, const ExperimentSpec& spec,
                            const ExampleOptions& options = {});

}  // namespace gapmark
