// Gaps like the series' own: learn the pattern of the real gaps and replay it
// on the complete stretches.
//
// Learning. The real gaps are the runs of missing points with an observed
// point on both sides (runs at the ends are cut off by the series' span and
// their true length is unknown, so they are left out). From them:
//  - the gap-length distribution: the empirical distribution of their lengths;
//  - the gap-start probability by phase: for each phase p (hour of day below a
//    daily step, ISO weekday for daily steps, month for weekly and monthly
//    steps, i mod period on integer axes; `phase` chooses), the number of
//    gaps starting at phase p over the number of points at phase p where a gap
//    could start (the point before is observed). `prior_starts` pseudo gap
//    starts, spread evenly over the phases, keep every phase possible.
//
// Replaying. Blocks are placed one after another until exactly target_count
// points are hidden. A block's length is drawn from the learned lengths; the
// one that would overshoot the target is cut to fit (so only the last block
// of a mask can have a length the real gaps do not have). Its
// start is drawn among the valid starts with probability proportional to the
// learned start probability of its phase. A block is valid when every point
// it covers is observed and before the holdout, and the point just before
// and just after it are observed and not hidden: so each block is a gap of
// exactly its drawn length, never merged with a real gap or another block.
// When no start fits a length, a new length is drawn; after many failures in
// a row the rate cannot be reached and an InputError says so. As with
// `blocks`, tight room favours short lengths at high rates.
//
// Learning from a sibling. With `from=NAME` the pattern is learned from the
// series of that name on the same time axis (another column of the file,
// another group of the panel) and replayed on this one: the way to give a
// complete series the gaps its sibling really has. The series itself may be
// named too (it then learns from its own gaps, as without `from`).
//
// Randomness only from the Rng given (seeded from the task's key).
#include <algorithm>
#include <cmath>
#include <map>
#include <optional>

#include "gapmark/error.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/number_format.hpp"
#include "block_placement.hpp"
#include "phase_unit.hpp"

namespace gapmark {
namespace {

constexpr int kRandomTries = 64;
constexpr int kMaxLengthFailures = 200;
constexpr std::int64_t kDay = 86400;

using mask::PhaseUnit;

/// The phase unit `name` asks for; nullopt = no phase ("none", or nothing fits the axis).
std::optional<PhaseUnit> choose_unit(const std::string& name, const MaskRequest& request) {
  if (name == "none") return std::nullopt;
  if (name != "auto") return mask::parse_phase_unit(name);
  const TimeAxis* axis = request.axis;
  if (axis == nullptr || axis->kind() == TimeKind::Index)
    return request.period > 1 ? std::optional(PhaseUnit::Index) : std::nullopt;
  const Step& step = axis->step();
  if (step.unit == Step::Unit::Months) return step.amount < 12 ? std::optional(PhaseUnit::Month) : std::nullopt;
  if (step.amount < kDay) return PhaseUnit::Hour;
  if (step.amount < 7 * kDay) return PhaseUnit::Weekday;
  return PhaseUnit::Month;
}

/// The learned pattern of one series.
struct Pattern {
  std::vector<std::size_t> lengths;   ///< sorted
  std::vector<double> weight;         ///< per position: start weight of its phase
  double max_weight = 0;
};

Pattern learn(const MaskRequest& request, std::optional<PhaseUnit> unit, double prior_starts) {
  const auto& v = request.values;
  const std::size_t n = v.size();
  const auto missing = [&](std::size_t i) { return std::isnan(v[i]); };
  std::vector<int> phase(n, 0);
  if (unit && (*unit == PhaseUnit::Index || request.axis != nullptr)) {
    if (*unit != PhaseUnit::Index && request.axis->kind() == TimeKind::Index)
      throw InputError(request.where, "replay: phase by calendar needs dated times; use phase=index or phase=none");
    if (*unit == PhaseUnit::Index && request.period < 2)
      throw InputError(request.where, "replay: phase=index needs a seasonal period of at least 2");
    for (std::size_t i = 0; i < n; ++i) phase[i] = mask::phase_of(*unit, request.axis, request.period, i);
  }
  Pattern p;
  std::map<int, std::pair<double, double>> by_phase;  // phase -> (starts, opportunities)
  for (std::size_t i = 1; i < n; ++i) {
    if (missing(i - 1)) continue;
    auto& c = by_phase[phase[i]];
    c.second += 1;
    if (!missing(i)) continue;
    std::size_t j = i;
    while (j < n && missing(j)) ++j;
    if (j == n) break;  // runs to the end: censored
    c.first += 1;
    p.lengths.push_back(j - i);
  }
  if (p.lengths.empty())
    throw InputError(request.where, "replay: the series has no gaps between observed values to learn from; use blocks or random");
  std::sort(p.lengths.begin(), p.lengths.end());
  const double spread = prior_starts / double(by_phase.size());
  std::map<int, double> w;
  for (const auto& [ph, c] : by_phase) w[ph] = (c.first + spread) / c.second;
  p.weight.assign(n, 0);
  for (std::size_t i = 0; i < n; ++i) {
    const auto it = w.find(phase[i]);
    p.weight[i] = it == w.end() ? 0 : it->second;
    p.max_weight = std::max(p.max_weight, p.weight[i]);
  }
  return p;
}

class ReplayScheme final : public MaskScheme {
public:
  ReplayScheme(std::string phase, double prior_starts, std::string from)
      : phase_(std::move(phase)), prior_starts_(prior_starts), from_(std::move(from)) {}

  Mask draw(const MaskRequest& request, Rng& rng) const override {
    const auto [eligible, limit, target] = draw_basis(request);
    const MaskRequest source = learning_source(request);
    const Pattern pattern = learn(source, choose_unit(phase_, source), prior_starts_);
    Mask mask(request.values.size(), 0);
    const mask::BlockRoom room{request.values, mask, eligible, limit, /*inside_observed=*/true};
    std::size_t hidden = 0;
    int failures = 0;
    while (hidden < target) {
      const std::size_t len = draw_length(pattern.lengths, target - hidden, rng);
      const auto start = pattern.max_weight <= 0
                             ? std::nullopt
                             : mask::place_block(room, len, kRandomTries, rng, &pattern.weight, pattern.max_weight);
      if (!start) {
        if (++failures >= kMaxLengthFailures) throw unreachable(request, hidden, target);
        continue;
      }
      failures = 0;
      for (std::size_t i = *start; i < *start + len; ++i) mask[i] = 1;
      hidden += len;
    }
    return mask;
  }

  bool uses_siblings() const override { return !from_.empty(); }

private:
  /// The series whose gaps are learned: this one, or the sibling named by `from`.
  MaskRequest learning_source(const MaskRequest& request) const {
    if (from_.empty() || from_ == request.name) return request;
    for (std::size_t k = 0; k < request.sibling_names.size(); ++k) {
      if (request.sibling_names[k] != from_) continue;
      if (request.siblings[k].size() != request.values.size())
        throw InputError(request.where, "replay: from='" + from_ + "' is not on this series' time axis (" +
                                            std::to_string(request.siblings[k].size()) + " points, this one " +
                                            std::to_string(request.values.size()) + ")");
      MaskRequest source = request;
      source.values = request.siblings[k];
      source.where = request.where + " (gaps learned from '" + from_ + "')";
      return source;
    }
    std::string names;
    for (std::size_t k = 0; k < request.sibling_names.size() && k < 8; ++k)
      names += (k ? ", " : "") + request.sibling_names[k];
    if (request.sibling_names.size() > 8) names += ", ...";
    throw InputError(request.where, "replay: no series '" + from_ + "' beside this one to learn gaps from" +
                                        (names.empty() ? std::string(" (it has no siblings)") : " (there are: " + names + ")"));
  }

  /// A learned length, cut to the room left: only the last block of a mask is ever cut.
  static std::size_t draw_length(const std::vector<std::size_t>& lengths, std::size_t room, Rng& rng) {
    return std::min(lengths[rng.below(lengths.size())], room);
  }

  static InputError unreachable(const MaskRequest& request, std::size_t hidden, std::size_t target) {
    return InputError(request.where, "replay: rate " + format_double(request.rate) + " cannot be reached: no room left after hiding " +
                                         std::to_string(hidden) + " of " + std::to_string(target) +
                                         " points in gaps shaped like the real ones (they may not touch real gaps or each other); lower the rate");
  }

  std::string phase_;
  double prior_starts_;
  std::string from_;
};

const Registration<MaskScheme> registration{{
    .name = "replay",
    .summary = "gaps like the series' own: real gap lengths and gap-start probability by phase, replayed on the complete stretches",
    .params = {{.name = "phase",
                .type = ParamType::Choice,
                .default_value = "auto",
                .min = 0,
                .max = 0,
                .choices = {"auto", "hour", "weekday", "month", "index", "none"},
                .help = "phase the start probability depends on; auto: hour below a daily step, weekday for days, month "
                        "for weeks and months, i mod period on integer axes"},
               {.name = "prior_starts",
                .type = ParamType::Real,
                .default_value = "1",
                .min = 0,
                .max = 1e6,
                .choices = {},
                .help = "pseudo gap starts spread evenly over the phases before learning, so that no phase is impossible"},
               {.name = "from",
                .type = ParamType::Text,
                .default_value = "",
                .min = 0,
                .max = 0,
                .choices = {},
                .help = "learn the gaps of the series of this name on the same time axis (another column or group); "
                        "empty: the series' own gaps"}},
    .make =
        [](const ParamValues& p) {
          return std::make_unique<ReplayScheme>(p.text("phase"), p.real("prior_starts"), p.text("from"));
        },
}};

}  // namespace
}  // namespace gapmark
