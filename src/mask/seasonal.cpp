// Gaps concentrated on chosen phases of a cycle: nights, weekends, winters.
//
// The phase of point i is i mod period (unit=index; the series starts at
// phase 0), or a calendar phase read from the time axis: the hour 0–23
// (unit=hour), the ISO weekday Monday = 1 … Sunday = 7 (unit=weekday) or the
// month 1–12 (unit=month). `phases` lists the chosen phases: single values and
// ranges separated by ',' or '+' ("0-5+22+23"; on the command line ',' already
// separates parameters, so use '+' there). A range whose end is below its start
// wraps around the cycle: hour "22-5" is 22, 23, 0, …, 5.
//
// Of the target_count points to hide, round(concentration × target) go on the
// chosen phases and the rest on the other phases. Each side hides its eligible
// points independently with the probability that meets its share, so the
// counts are binomial with those means. With contiguous=true the chosen side
// instead hides whole phase windows (maximal runs of consecutive on-phase
// steps, e.g. one 0–5 night) in random order until its share is met exactly;
// the last window is cut short to hit the count. When the chosen phases hold
// fewer eligible points than their share, the request is an InputError.
#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/number_format.hpp"
#include "phase_unit.hpp"

namespace gapmark {
namespace {

using mask::PhaseUnit;

struct PhaseRange {
  long first = 0, last = 0;  // inclusive; first > last wraps around
};

long parse_phase_number(std::string_view text, const std::string& all) {
  text = trim(text);
  long v = 0;
  if (text.empty()) throw InputError("seasonal: phases", "empty item in '" + all + "'");
  for (char c : text) {
    if (c < '0' || c > '9' || v > 1'000'000'000)
      throw InputError("seasonal: phases", "expected phases like 0-5+22+23, found '" + all + "'");
    v = v * 10 + (c - '0');
  }
  return v;
}

std::vector<PhaseRange> parse_phases(const std::string& text) {
  if (trim(text).empty())
    throw InputError("seasonal", "parameter 'phases' is required (for example phases=0-5, or phases=6-7 with unit=weekday)");
  std::vector<PhaseRange> out;
  std::string_view rest = text;
  while (true) {
    const auto sep = rest.find_first_of(",+");
    const std::string_view item = rest.substr(0, sep);
    const auto dash = item.find('-');
    PhaseRange r;
    r.first = parse_phase_number(item.substr(0, dash), text);
    r.last = dash == std::string_view::npos ? r.first : parse_phase_number(item.substr(dash + 1), text);
    out.push_back(r);
    if (sep == std::string_view::npos) break;
    rest = rest.substr(sep + 1);
  }
  return out;
}

class SeasonalScheme final : public MaskScheme {
public:
  SeasonalScheme(std::string phases_text, PhaseUnit unit, std::size_t period, double concentration,
                 bool contiguous)
      : phases_text_(std::move(phases_text)),
        ranges_(parse_phases(phases_text_)),
        unit_(unit),
        period_(period),
        concentration_(concentration),
        contiguous_(contiguous) {
    if (unit_ != PhaseUnit::Index) chosen_phases("seasonal: phases", cycle_first(), cycle_size());
  }

  Mask draw(const MaskRequest& request, Rng& rng) const override {
    const auto [eligible, limit, target] = draw_basis(request);
    const std::vector<bool> on = on_phase(request, limit);

    std::vector<std::size_t> on_pts, off_pts;
    for (std::size_t i : eligible) (on[i] ? on_pts : off_pts).push_back(i);
    const auto k_on = static_cast<std::size_t>(std::llround(concentration_ * static_cast<double>(target)));
    const std::size_t k_off = target - k_on;
    if (k_on > on_pts.size())
      throw InputError(request.where,
                       "rate " + format_double(request.rate) + " cannot be reached on phases " + phases_text_ +
                           " (" + mask::phase_unit_name(unit_) + "): they hold " + std::to_string(on_pts.size()) + " of " +
                           std::to_string(eligible.size()) + " eligible points (" +
                           percent(on_pts.size(), eligible.size()) + ") and concentration " +
                           format_double(concentration_) + " puts " + std::to_string(k_on) +
                           " there; lower the rate or the concentration, or widen the phases");
    if (k_off > off_pts.size())
      throw InputError(request.where,
                       "rate " + format_double(request.rate) + " with concentration " +
                           format_double(concentration_) + " puts " + std::to_string(k_off) +
                           " points off phases " + phases_text_ + " (" + mask::phase_unit_name(unit_) + ") but only " +
                           std::to_string(off_pts.size()) +
                           " eligible points lie there; raise the concentration or lower the rate");

    Mask mask(request.values.size(), 0);
    std::size_t hidden = 0;
    if (contiguous_) hidden += hide_windows(request, on, limit, k_on, mask, rng);
    else hidden += hide_each(on_pts, k_on, mask, rng);
    hidden += hide_each(off_pts, k_off, mask, rng);
    if (hidden == 0) {  // independent draws hid nothing: hide one point on the side that asked
      const auto& side = k_on > 0 ? on_pts : off_pts;
      mask[side[rng.below(side.size())]] = 1;
    }
    return mask;
  }

private:
  long cycle_first() const { return unit_ == PhaseUnit::Weekday || unit_ == PhaseUnit::Month ? 1 : 0; }
  std::size_t cycle_size(std::size_t period = 0) const {
    switch (unit_) {
      case PhaseUnit::Hour: return 24;
      case PhaseUnit::Weekday: return 7;
      case PhaseUnit::Month: return 12;
      case PhaseUnit::Index: break;
    }
    return period;
  }

  /// chosen[p - lo] for each phase p of the cycle lo..lo+size-1; InputError
  /// for listed phases outside it.
  std::vector<bool> chosen_phases(const std::string& where, long lo, std::size_t size) const {
    const long hi = lo + static_cast<long>(size) - 1;
    std::vector<bool> chosen(size, false);
    for (const auto& r : ranges_) {
      for (long p : {r.first, r.last})
        if (p < lo || p > hi)
          throw InputError(where, "phase " + std::to_string(p) + " in phases=" + phases_text_ + " is outside " +
                                      std::to_string(lo) + ".." + std::to_string(hi) + " for unit=" +
                                      mask::phase_unit_name(unit_) +
                                      (unit_ == PhaseUnit::Index ? " (period " + std::to_string(size) + ")" : ""));
      for (long p = r.first;; p = p == hi ? lo : p + 1) {  // walks forward, wrapping at the cycle's end
        chosen[static_cast<std::size_t>(p - lo)] = true;
        if (p == r.last) break;
      }
    }
    return chosen;
  }

  /// on[i]: point i (before `limit`) falls on a chosen phase.
  std::vector<bool> on_phase(const MaskRequest& request, std::size_t limit) const {
    std::vector<bool> on(request.values.size(), false);
    if (unit_ == PhaseUnit::Index) {
      const std::size_t period = period_ > 0 ? period_ : request.period;
      if (period == 0)
        throw InputError(request.where, "seasonal scheme needs a period: give period=N or a period for the data");
      const auto chosen = chosen_phases(request.where, 0, period);
      for (std::size_t i = 0; i < limit; ++i) on[i] = chosen[i % period];
      return on;
    }
    if (request.axis == nullptr || request.axis->kind() == TimeKind::Index)
      throw InputError(request.where, std::string("unit=") + mask::phase_unit_name(unit_) +
                                          " needs dates on the time axis; use unit=index with a period");
    const auto chosen = chosen_phases(request.where, cycle_first(), cycle_size());
    for (std::size_t i = 0; i < limit; ++i)
      on[i] = chosen[static_cast<std::size_t>(mask::phase_of(unit_, request.axis, 0, i) - cycle_first())];
    return on;
  }

  /// Hides each of `points` independently so that `count` are hidden on average.
  static std::size_t hide_each(const std::vector<std::size_t>& points, std::size_t count, Mask& mask, Rng& rng) {
    if (count == 0) return 0;
    const double p = static_cast<double>(count) / static_cast<double>(points.size());
    std::size_t hidden = 0;
    for (std::size_t i : points) {
      if (rng.bernoulli(p)) {
        mask[i] = 1;
        ++hidden;
      }
    }
    return hidden;
  }

  /// Hides whole phase windows, in random order, until exactly `count` points are hidden.
  static std::size_t hide_windows(const MaskRequest& request, const std::vector<bool>& on, std::size_t limit,
                                  std::size_t count, Mask& mask, Rng& rng) {
    std::vector<std::pair<std::size_t, std::size_t>> windows;  // [begin, end)
    for (std::size_t i = 0; i < limit;) {
      if (!on[i]) { ++i; continue; }
      std::size_t j = i;
      bool any = false;
      for (; j < limit && on[j]; ++j) any = any || !std::isnan(request.values[j]);
      if (any) windows.emplace_back(i, j);
      i = j;
    }
    for (std::size_t i = windows.size(); i > 1; --i) std::swap(windows[i - 1], windows[rng.below(i)]);
    std::size_t hidden = 0;
    for (const auto& [begin, end] : windows) {
      for (std::size_t i = begin; i < end && hidden < count; ++i) {
        if (std::isnan(request.values[i])) continue;
        mask[i] = 1;
        ++hidden;
      }
      if (hidden == count) break;
    }
    return hidden;
  }

  static std::string percent(std::size_t part, std::size_t whole) {
    return format_double(std::round(1000.0 * static_cast<double>(part) / static_cast<double>(whole)) / 10) + "%";
  }

  std::string phases_text_;
  std::vector<PhaseRange> ranges_;
  PhaseUnit unit_;
  std::size_t period_;
  double concentration_;
  bool contiguous_;
};

const Registration<MaskScheme> registration{{
    .name = "seasonal",
    .summary = "gaps concentrated on chosen phases of a cycle (hours of the day, weekdays, months, or index mod period)",
    .params = {{.name = "phases",
                .type = ParamType::Text,
                .default_value = "",
                .choices = {},
                .help = "chosen phases: values and ranges joined by '+' or ',' (\"0-5+22+23\"); "
                        "a range like 22-5 wraps around"},
               {.name = "unit",
                .type = ParamType::Choice,
                .default_value = "index",
                .choices = {"index", "hour", "weekday", "month"},
                .help = "phase of a point: index mod period, hour 0-23, ISO weekday 1-7 (Monday = 1), month 1-12"},
               {.name = "period",
                .type = ParamType::Integer,
                .default_value = "0",
                .min = 0,
                .max = 1e6,
                .choices = {},
                .help = "cycle length for unit=index; 0 = the data's period"},
               {.name = "concentration",
                .type = ParamType::Real,
                .default_value = "1",
                .min = 0,
                .max = 1,
                .choices = {},
                .help = "share of hidden points that fall on the chosen phases; the rest fall elsewhere at random"},
               {.name = "contiguous",
                .type = ParamType::Flag,
                .default_value = "false",
                .choices = {},
                .help = "hide whole phase windows (e.g. a whole night) instead of single points"}},
    .make =
        [](const ParamValues& p) {
          const PhaseUnit unit = mask::parse_phase_unit(p.text("unit")).value_or(PhaseUnit::Index);
          if (unit != PhaseUnit::Index && p.given("period") && p.integer("period") != 0)
            throw InputError("seasonal: period", "applies to unit=index only");
          return std::make_unique<SeasonalScheme>(p.text("phases"), unit,
                                                  static_cast<std::size_t>(p.integer("period")),
                                                  p.real("concentration"), p.flag("contiguous"));
        },
}};

}  // namespace
}  // namespace gapmark
