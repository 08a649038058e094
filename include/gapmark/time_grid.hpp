#pragma once
// Regular grids for raw times. Two ways to meet a grid:
//  - bins (regularize): every time falls in the bin [start, start + step) that
//    holds it; bins follow the calendar: steps that divide a day start at
//    midnight, weeks (P1W, P7D) on Monday 00:00 (ISO 8601), other whole days
//    at midnight of the first day, months on the 1st (quarters on January,
//    April, July, October; P1Y on 1 January).
//  - slots (profile, reading regular long files): the grid runs from a start
//    time in steps; a time is on it or off it.
#include <cstdint>
#include <optional>
#include <span>
#include <string>

#include "gapmark/time_axis.hpp"

namespace gapmark {

/// Checks that a step fits times of this kind: an integer step for integer
/// times, an ISO 8601 one for dated times, whole days or more for dates.
void check_step_kind(TimeKind kind, const Step& step, const std::string& where);

/// Checks that a step can bin times of this kind; InputError naming `where`
/// when it cannot: a sub-day step for dates, a fixed step that neither
/// divides a day nor is whole days, a month step that does not divide a
/// year, an ISO step for integer times or an integer step for dated ones.
void check_binning_step(TimeKind kind, const Step& step, const std::string& where);

/// Calendar bins of one step. `first` is the earliest time of the data (it
/// anchors steps of several days that are not whole weeks).
class Binning {
public:
  Binning(TimeKind kind, Step step, std::int64_t first);
  /// The start of the bin holding `t`.
  std::int64_t floor(std::int64_t t) const;
  /// The axis of the bins from the one holding `lo` to the one holding `hi`.
  TimeAxis axis(std::int64_t lo, std::int64_t hi, std::optional<int> offset_minutes, bool utc_z) const;
  /// Index of the bin holding `t` on `axis` (made by axis()); `t` must be in its span.
  std::size_t index(const TimeAxis& axis, std::int64_t t) const;

private:
  TimeKind kind_;
  Step step_;
  std::int64_t anchor_ = 0;  ///< a bin start, for fixed steps
};

/// The signed number of steps from `from` to `to` when `to` is exactly on
/// the grid through `from` (calendar months keep the day of month
/// `month_day`, clamped to each month's length; 0 = from's day); nullopt when
/// `to` is off that grid.
std::optional<std::int64_t> grid_offset(TimeKind kind, const Step& step, std::int64_t from, std::int64_t to,
                                        int month_day = 0);

/// A key that times on one grid share: the remainder modulo the step for
/// fixed steps; for months the month modulo the step, the time of day and
/// the day of month (31 for a month's last day).
std::int64_t grid_phase_key(TimeKind kind, const Step& step, std::int64_t t);

/// Infers the step of irregular times: calendar months when every time falls
/// on one day of month (or on month-ends) at one time of day, else the most
/// common positive difference between consecutive distinct times (ties: the
/// smaller). `sorted_runs` holds each group's sorted distinct times, one run
/// after another; `run_ends` the end of each run. nullopt when there is no
/// difference at all (one time per group).
std::optional<Step> infer_step(TimeKind kind, std::span<const std::int64_t> sorted_runs,
                               std::span<const std::size_t> run_ends);

/// The most points a regular grid may have per series (50 million: 95 years
/// at one minute, about 400 MB per value column in memory). A span and step
/// that would need more are refused before anything is allocated.
inline constexpr std::int64_t kMaxGridPoints = 50'000'000;

/// Refuses (InputError naming `where`) a grid of `points` points (a count
/// that overflowed is passed as a negative number) at `step`.
void check_grid_size(std::int64_t points, const Step& step, const std::string& where);

}  // namespace gapmark
