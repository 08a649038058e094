#pragma once
// How a trial ended, and its name in checkpoints, results.json and the
// example windows.
#include <string>

namespace gapmark {

/// How a trial ended. Written to checkpoints and results.json as the strings
/// of trial_status_name ("ok", "partial", "failed", "mask-failed").
enum class TrialStatus {
  Ok,          ///< every masked point filled and scored
  Partial,     ///< some masked points left unfilled (scored on the rest; ranked as a failure)
  Failed,      ///< the method failed, or left every masked point unfilled
  MaskFailed,  ///< the scheme could not mask the series, or hid no point: nothing was tested
};

/// The status's string in checkpoints and results.json.
const char* trial_status_name(TrialStatus status);

/// The status named by `text`; InputError(where, ...) on anything else.
TrialStatus parse_trial_status(const std::string& text, const std::string& where);

}  // namespace gapmark
