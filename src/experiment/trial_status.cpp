#include "gapmark/experiment/trial_status.hpp"

#include "gapmark/error.hpp"

namespace gapmark {

const char* trial_status_name(TrialStatus status) {
  switch (status) {
    case TrialStatus::Ok: return "ok";
    case TrialStatus::Partial: return "partial";
    case TrialStatus::Failed: return "failed";
    case TrialStatus::MaskFailed: return "mask-failed";
  }
  return "failed";
}

TrialStatus parse_trial_status(const std::string& text, const std::string& where) {
  for (auto s : {TrialStatus::Ok, TrialStatus::Partial, TrialStatus::Failed, TrialStatus::MaskFailed})
    if (text == trial_status_name(s)) return s;
  throw InputError(where, "unknown trial status '" + text + "' (ok, partial, failed or mask-failed)");
}

}  // namespace gapmark
