// Calendar arithmetic (see calendar.hpp); the calendar facts come from the date library.
#include "gapmark/calendar.hpp"

#include <date/date.h>

#include <algorithm>
#include <stdexcept>
#include <vector>

namespace gapmark::calendar {

std::int64_t floor_div(std::int64_t a, std::int64_t b) {
  std::int64_t q = a / b;
  if ((a % b != 0) && ((a < 0) != (b < 0))) --q;
  return q;
}

Civil to_civil(std::int64_t seconds) {
  const std::int64_t days = floor_div(seconds, kSecondsPerDay);
  const date::year_month_day ymd{date::sys_days{date::days{days}}};
  return {int(ymd.year()), unsigned(ymd.month()), unsigned(ymd.day()), seconds - days * kSecondsPerDay};
}

std::int64_t days_from_civil(int year, unsigned month, unsigned day) {
  const date::sys_days days{date::year{year} / date::month{month} / date::day{day}};
  return days.time_since_epoch().count();
}

unsigned last_day_of_month(int year, unsigned month) {
  return unsigned((date::year{year} / date::month{month} / date::last).day());
}

bool is_month_end(const Civil& c) { return c.day == last_day_of_month(c.year, c.month); }

std::int64_t month_number(const Civil& c) { return std::int64_t(c.year) * 12 + (c.month - 1); }

std::int64_t month_number(std::int64_t seconds) { return month_number(to_civil(seconds)); }

std::int64_t month_point(std::int64_t number, int month_day, std::int64_t second_of_day) {
  const std::int64_t year = floor_div(number, 12);
  if (year < -32767 || year > 32767) throw std::out_of_range("time outside the years -32767..32767");
  const unsigned month = unsigned(number - year * 12) + 1;
  const unsigned day = std::min(unsigned(month_day), last_day_of_month(int(year), month));
  return days_from_civil(int(year), month, day) * kSecondsPerDay + second_of_day;
}

int month_anchor_day(std::span<const std::int64_t> seconds) {
  if (seconds.empty()) return 0;
  std::vector<Civil> civil;
  civil.reserve(seconds.size());
  for (const std::int64_t t : seconds) civil.push_back(to_civil(t));
  const auto same_time_of_day = [&](const Civil& c) { return c.second_of_day == civil.front().second_of_day; };
  if (!std::all_of(civil.begin(), civil.end(), same_time_of_day)) return 0;
  const auto same_day = [&](const Civil& c) { return c.day == civil.front().day; };
  if (std::all_of(civil.begin(), civil.end(), same_day)) return int(civil.front().day);
  if (std::all_of(civil.begin(), civil.end(), is_month_end)) return kMonthEnd;
  // Monthly on day D, clamped to the month's end in months shorter than D.
  unsigned anchor = 0;
  for (const Civil& c : civil) anchor = std::max(anchor, c.day);
  const auto on_anchor = [&](const Civil& c) { return c.day == anchor || (c.day < anchor && is_month_end(c)); };
  if (std::all_of(civil.begin(), civil.end(), on_anchor)) return int(anchor);
  return 0;
}

}  // namespace gapmark::calendar
