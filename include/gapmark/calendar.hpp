#pragma once
// Calendar arithmetic on wall-clock times held as seconds since
// 1970-01-01T00:00 (the `value` of a dated TimePoint): civil dates, month
// numbers and month lengths. The calendar facts come from the date library;
// the time axis and the raw-data grids both build on these.
#include <cstdint>
#include <span>

namespace gapmark::calendar {

constexpr std::int64_t kSecondsPerDay = 86400;
constexpr std::int64_t kSecondsPerWeek = 7 * kSecondsPerDay;
constexpr int kMonthEnd = 31;  ///< a month day of 31 means the last day of every month

/// a / b rounded towards minus infinity (b > 0 or b < 0, not 0).
std::int64_t floor_div(std::int64_t a, std::int64_t b);

/// A wall-clock time split into its calendar date and seconds into the day.
struct Civil {
  int year;
  unsigned month;  ///< 1..12
  unsigned day;    ///< 1..31
  std::int64_t second_of_day;
};

Civil to_civil(std::int64_t seconds);
/// Days since 1970-01-01 of a calendar date.
std::int64_t days_from_civil(int year, unsigned month, unsigned day);
unsigned last_day_of_month(int year, unsigned month);
bool is_month_end(const Civil& c);
/// Months since year 0: year * 12 + (month - 1).
std::int64_t month_number(const Civil& c);
std::int64_t month_number(std::int64_t seconds);
/// The time in month `number` (as month_number counts) on day `month_day`,
/// clamped to that month's length, at `second_of_day`. Throws
/// std::out_of_range outside the years -32767..32767.
std::int64_t month_point(std::int64_t number, int month_day, std::int64_t second_of_day);
/// For times that all fall at one time of day on one day of month (clamped in
/// shorter months), or all on month-ends: that day (kMonthEnd for month-ends).
/// 0 when they do not, or when `seconds` is empty.
int month_anchor_day(std::span<const std::int64_t> seconds);

}  // namespace gapmark::calendar
