// Calendar bins and grids for raw times (see time_grid.hpp). Calendar facts
// (civil dates, month numbers and lengths) come from core's calendar.hpp.
#include "gapmark/time_grid.hpp"

#include <algorithm>
#include <map>
#include <stdexcept>
#include <vector>

#include "gapmark/calendar.hpp"
#include "gapmark/error.hpp"

namespace gapmark {
namespace {

using namespace calendar;
constexpr std::int64_t kDay = kSecondsPerDay;
constexpr std::int64_t kWeek = kSecondsPerWeek;

}  // namespace

void check_step_kind(TimeKind kind, const Step& step, const std::string& where) {
  const std::string name = "step " + step.iso();
  if (kind == TimeKind::Index && step.unit != Step::Unit::Index)
    throw InputError(where, name + " does not fit integer times; give a whole number");
  if (kind != TimeKind::Index && step.unit == Step::Unit::Index)
    throw InputError(where, name + " does not fit dated times; give an ISO 8601 duration such as PT1H or P1D");
  if (kind == TimeKind::Date && step.unit == Step::Unit::Seconds && step.amount % kDay != 0)
    throw InputError(where, name + " is finer than the data's dates (YYYY-MM-DD); use whole days, weeks, months or years");
}

void check_binning_step(TimeKind kind, const Step& step, const std::string& where) {
  check_step_kind(kind, step, where);
  if (kind == TimeKind::Index) return;
  const std::string name = "step " + step.iso();
  if (step.unit == Step::Unit::Months) {
    if (step.amount % 12 != 0 && 12 % step.amount != 0)
      throw InputError(where, name + " does not divide a year into equal parts; use P1M, P2M, P3M, P4M, P6M or whole years");
    return;
  }
  if (step.amount % kDay != 0 && kDay % step.amount != 0)
    throw InputError(where, name + " does not divide a day, so its bins would drift across midnight; use one that does "
                                   "(PT10M, PT15M, PT30M, PT1H, PT2H, PT3H, PT4H, PT6H, PT8H, PT12H ...) or whole days");
}

Binning::Binning(TimeKind kind, Step step, std::int64_t first) : kind_(kind), step_(step) {
  if (step_.unit == Step::Unit::Seconds && step_.amount % kDay == 0) {
    const std::int64_t midnight = floor_div(first, kDay) * kDay;
    if (step_.amount % kWeek == 0) {
      // The Monday on or before the first day: 1970-01-01 was a Thursday.
      const std::int64_t days = floor_div(first, kDay);
      const std::int64_t since_monday = ((days + 3) % 7 + 7) % 7;
      anchor_ = (days - since_monday) * kDay;
    } else {
      anchor_ = midnight;
    }
  }
}

std::int64_t Binning::floor(std::int64_t t) const {
  if (step_.unit == Step::Unit::Months) {
    const std::int64_t m = floor_div(month_number(t), step_.amount) * step_.amount;
    return month_point(m, 1, 0);
  }
  return anchor_ + floor_div(t - anchor_, step_.amount) * step_.amount;
}

void check_grid_size(std::int64_t points, const Step& step, const std::string& where) {
  if (points >= 0 && points <= kMaxGridPoints) return;
  throw InputError(where, "a regular grid over these times at step " + step.iso() + " would have " +
                              (points < 0 ? std::string("more than 9.2e18") : std::to_string(points)) +
                              " points, more than the limit of " + std::to_string(kMaxGridPoints) +
                              " per series; give a coarser step, or leave out the rows with far-off times");
}

TimeAxis Binning::axis(std::int64_t lo, std::int64_t hi, std::optional<int> offset_minutes, bool utc_z) const {
  const std::int64_t start = floor(lo), end = floor(hi);
  std::int64_t count = 0, span = 0;
  if (step_.unit == Step::Unit::Months)
    count = (month_number(end) - month_number(start)) / step_.amount + 1;
  else if (__builtin_sub_overflow(end, start, &span))
    count = -1;
  else
    count = span / step_.amount + 1;
  check_grid_size(count, step_, "--step");
  AxisStyle style;
  style.utc_z = utc_z;
  if (step_.unit == Step::Unit::Months) style.month_day = 1;
  return TimeAxis(kind_, step_, start, static_cast<std::size_t>(count),
                  kind_ == TimeKind::DateTime ? offset_minutes : std::nullopt, style);
}

std::size_t Binning::index(const TimeAxis& axis, std::int64_t t) const {
  const std::int64_t b = floor(t);
  if (step_.unit == Step::Unit::Months)
    return static_cast<std::size_t>((month_number(b) - month_number(axis.start())) / step_.amount);
  return static_cast<std::size_t>((b - axis.start()) / step_.amount);
}

std::optional<std::int64_t> grid_offset(TimeKind kind, const Step& step, std::int64_t from, std::int64_t to,
                                        int month_day) {
  if (step.unit != Step::Unit::Months) {
    const std::int64_t d = to - from;
    if (d % step.amount != 0) return std::nullopt;
    return d / step.amount;
  }
  if (kind == TimeKind::Index) return std::nullopt;
  const Civil a = calendar::to_civil(from);
  const std::int64_t k = month_number(to) - month_number(from);
  if (k % step.amount != 0) return std::nullopt;
  const int day = month_day > 0 ? month_day : int(a.day);
  if (month_point(month_number(from) + k, day, a.second_of_day) != to) return std::nullopt;
  return k / step.amount;
}

std::int64_t grid_phase_key(TimeKind kind, const Step& step, std::int64_t t) {
  if (step.unit != Step::Unit::Months || kind == TimeKind::Index) return ((t % step.amount) + step.amount) % step.amount;
  const Civil c = calendar::to_civil(t);
  const std::int64_t m = ((month_number(t) % step.amount) + step.amount) % step.amount;
  const std::int64_t day = is_month_end(c) ? 31 : c.day;
  return (m * 32 + day) * kDay + c.second_of_day;
}

std::optional<Step> infer_step(TimeKind kind, std::span<const std::int64_t> sorted_runs,
                               std::span<const std::size_t> run_ends) {
  const bool months = kind != TimeKind::Index && calendar::month_anchor_day(sorted_runs) != 0;
  std::map<std::int64_t, std::size_t> counts;
  std::size_t begin = 0;
  for (std::size_t end : run_ends) {
    for (std::size_t i = begin + 1; i < end; ++i) {
      const std::int64_t d = months ? month_number(sorted_runs[i]) - month_number(sorted_runs[i - 1])
                                    : sorted_runs[i] - sorted_runs[i - 1];
      if (d > 0) ++counts[d];
    }
    begin = end;
  }
  if (counts.empty()) return std::nullopt;
  std::int64_t best = 0;
  std::size_t best_count = 0;
  for (const auto& [d, n] : counts)
    if (n > best_count) best = d, best_count = n;  // map order: ties keep the smaller
  if (kind == TimeKind::Index) return Step{Step::Unit::Index, best};
  if (months) return Step{Step::Unit::Months, best};
  return Step{Step::Unit::Seconds, best};
}

}  // namespace gapmark
