#pragma once
// The one-command answer: from a variable's profile, a default experiment
// whose masks mimic the variable's own gaps, a method set chosen by the kind
// of variable. The recommendation is the summary's verdict (analysis/verdict.hpp).
#include <cstddef>
#include <cstdint>
#include <nlohmann/json.hpp>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "gapmark/data/profile.hpp"
#include "gapmark/experiment/record.hpp"

namespace gapmark::data {

/// What a variable measures, which decides what an absent record means.
enum class VariableKind {
  Count,    ///< counts and event totals: absent usually means zero
  Level,    ///< a reading of a state that holds between readings
  Smooth,   ///< a smooth physical quantity
  Unknown,  ///< not given, and the data do not show it: absent stays unknown, never zero
};

VariableKind parse_kind(const std::string& text, const std::string& where);
std::string kind_name(VariableKind kind);

struct KindGuess {
  VariableKind kind = VariableKind::Unknown;
  std::string reason;
};
/// The guessing rule (common practice, no source): a variable is taken for
/// a count only when its own structure says so: all values non-negative and
/// either at least 30% of them exactly zero, or event rows (several rows in
/// one time step, `event_rows` > 0). Whole numbers alone never make a count
/// (a concentration in whole ppb, a temperature in whole degrees). Otherwise
/// the kind is unknown, and only `--kind` sets it.
KindGuess guess_kind(std::span<const double> values, std::size_t event_rows = 0);

/// The candidates, the same for every kind: a mean baseline, carry-forward,
/// linear, pchip and the local level smoother; seasonal-mean with a period;
/// zero for counts; low-rank across the file's other numeric columns when it
/// has them.
std::vector<std::string> candidate_methods(bool count, bool has_period, bool has_siblings);

/// What an absent record means for this kind, and what to do about it.
std::string kind_caution(VariableKind kind, const std::string& variable);

struct QuickPlanInput {
  std::string data_file;                   ///< as the spec should name it (relative to the spec's folder)
  std::string column;
  std::vector<std::string> siblings;       ///< the file's other numeric columns (low-rank learns from them)
  std::vector<std::string> groups;
  std::string time_column;
  std::optional<Step> step;
  std::size_t period = 0;                  ///< given period; 0 = the grid's default
  VariableKind kind = VariableKind::Unknown;
  int replicates = 10;
  std::uint64_t seed = 1;
};

/// The masks and their numbers, as planned from the profile.
struct QuickPlan {
  nlohmann::json spec;
  double observed_missing = 0;   ///< share of points missing over the variable's series
  double mask_rate = 0;          ///< observed_missing clamped to [0.05, 0.5]
  double mean_gap = 0;           ///< mean length of the real gaps (0 when none)
  bool replay = false;           ///< real gaps to learn from
  std::size_t holdout = 0;
  std::size_t period = 0;
  std::vector<std::string> methods;
};

/// Plans the experiment for the series of `input.column` in `profile`:
/// replay (when there are real gaps between observed values), blocks with the
/// real mean gap length, and random, all at the observed missing share
/// clamped to [0.05, 0.5]; the candidate methods; a holdout for the forecast
/// effect (two periods, or a tenth of the series, at most a fifth). The
/// siblings are data columns too (so low-rank can use them), scored as well.
QuickPlan plan_quick(const DataProfile& profile, const QuickPlanInput& input);

}  // namespace gapmark::data
