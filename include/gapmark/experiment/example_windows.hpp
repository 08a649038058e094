#pragma once
// Example windows for the reports (built by analysis/examples.hpp): for each
// series, a window of its first task with the truth, the mask, the leading
// methods' fills and the autocorrelation of the complete series and of each
// fill. Stored as "examples" in results.json, absent when none were made:
//   { "window": 200, "top": 3,
//     "series": [ { "series", "scheme", "rate", "replicate",
//                   "start", "length", "time_first", "time_last", "step",
//                   "truth": [...|null], "mask": [0|1 ...],
//                   "methods": [ {"method", "rank", "status", "reason"?,
//                                 "filled": [value at masked points, null elsewhere] | null} ],
//                   "acf": {"lags", "truth": [r_1..r_L], "methods": [{"method", "values"}]} } ] }
// A series with no window has "note" (why) in place of everything after "replicate".
#include <cstddef>
#include <cstdint>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "gapmark/experiment/trial_status.hpp"
#include "gapmark/experiment/record_checks.hpp"

namespace gapmark {

/// One method's fill of an example window.
struct ExampleFill {
  std::string method;
  std::size_t rank = 0;              ///< its rank in the window's condition
  /// How the refill ended: Ok, Partial or Failed; none when the method was
  /// not run again (an outside program without --allow-external).
  std::optional<TrialStatus> status;
  std::string reason;                ///< why it failed or was not run
  std::vector<double> filled;        ///< per window point: the fill where masked, NaN elsewhere; empty when no fill

  bool has_fill() const { return status == TrialStatus::Ok || status == TrialStatus::Partial; }
};

/// The autocorrelation at lags 1..L of one fill.
struct ExampleAcfLine {
  std::string method;
  std::vector<double> values;
};

struct ExampleWindow {
  std::string series, scheme;
  double rate = 0;
  int replicate = 0;
  std::string note;                  ///< non-empty: no window, and why (nothing below is set)
  std::size_t start = 0, length = 0; ///< the window's first point and its width
  std::string time_first, time_last, step;
  std::vector<double> truth;         ///< NaN = missing in the data
  std::vector<std::uint8_t> mask;    ///< 1 = hidden
  std::vector<ExampleFill> methods;  ///< in rank order
  std::size_t lags = 0;
  std::vector<double> acf_truth;     ///< r_1..r_L of the complete series
  std::vector<ExampleAcfLine> acf_methods;  ///< of each complete fill
};

struct ExampleWindows {
  std::size_t window = 200;  ///< most points kept per series
  std::size_t top = 3;       ///< leading methods shown
  std::vector<ExampleWindow> series;

  /// The window of the series labelled `label`; null when there is none.
  const ExampleWindow* find(const std::string& label) const;
};

nlohmann::json examples_to_json(const ExampleWindows& examples);
/// Reads the member `key` of `stored`, which must be there.
ExampleWindows examples_from_json(const StoredObject& stored, const std::string& key);

}  // namespace gapmark
