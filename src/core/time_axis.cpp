// Regular time axes: parsing ISO 8601 times and durations, calendar
// arithmetic (through the date library), and inferring the axis of a column.
#include "gapmark/time_axis.hpp"

#include <date/date.h>
#include <date/iso_week.h>

#include <algorithm>
#include <cctype>
#include <cstdio>
#include <limits>
#include <stdexcept>
#include <vector>

#include "gapmark/calendar.hpp"
#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {
namespace {

using namespace calendar;
constexpr std::int64_t kDay = kSecondsPerDay;
constexpr std::int64_t kWeek = kSecondsPerWeek;

// Moves `months` calendar months from `value`, onto day `month_day` (0: the
// value's own day) clamped to the length of the month reached.
std::int64_t add_months(std::int64_t value, std::int64_t months, int month_day) {
  const Civil c = to_civil(value);
  return calendar::month_point(month_number(c) + months, month_day > 0 ? month_day : int(c.day), c.second_of_day);
}

// ---- parsing helpers -------------------------------------------------------

bool is_digit(char c) { return c >= '0' && c <= '9'; }

// Reads exactly `count` digits at `pos`; false when they are not all there.
bool read_digits(std::string_view s, std::size_t pos, std::size_t count, int& out) {
  if (pos + count > s.size()) return false;
  int value = 0;
  for (std::size_t k = 0; k < count; ++k) {
    if (!is_digit(s[pos + k])) return false;
    value = value * 10 + (s[pos + k] - '0');
  }
  out = value;
  return true;
}

std::optional<TimePoint> parse_integer_time(std::string_view s) {
  std::size_t pos = 0;
  const bool negative = !s.empty() && s[0] == '-';
  if (negative) pos = 1;
  if (pos == s.size()) return std::nullopt;
  std::int64_t value = 0;
  for (; pos < s.size(); ++pos) {
    if (!is_digit(s[pos])) return std::nullopt;
    const int d = s[pos] - '0';
    if (value > (std::numeric_limits<std::int64_t>::max() - d) / 10) return std::nullopt;
    value = value * 10 + d;
  }
  // Integer times are kept within ±10^18, so that differences between them
  // and steps across them cannot overflow.
  if (value > 1'000'000'000'000'000'000) return std::nullopt;
  return TimePoint{TimeKind::Index, negative ? -value : value, std::nullopt, false};
}

// Parses a trailing UTC offset: Z, ±hh:mm, ±hhmm or ±hh.
bool parse_offset(std::string_view s, int& minutes, bool& utc_z) {
  if (s == "Z" || s == "z") {
    minutes = 0;
    utc_z = true;
    return true;
  }
  if (s.size() < 3 || (s[0] != '+' && s[0] != '-')) return false;
  int hh = 0, mm = 0;
  if (!read_digits(s, 1, 2, hh)) return false;
  if (s.size() == 3) {
    mm = 0;
  } else if (s.size() == 6 && s[3] == ':') {
    if (!read_digits(s, 4, 2, mm)) return false;
  } else if (s.size() == 5) {
    if (!read_digits(s, 3, 2, mm)) return false;
  } else {
    return false;
  }
  if (hh > 23 || mm > 59) return false;
  minutes = (s[0] == '-' ? -1 : 1) * (hh * 60 + mm);
  utc_z = false;
  return true;
}

std::optional<TimePoint> parse_dated_time(std::string_view s) {
  int year = 0, month = 0, day = 0;
  if (!read_digits(s, 0, 4, year) || s.size() < 10 || s[4] != '-' ||
      !read_digits(s, 5, 2, month) || s[7] != '-' || !read_digits(s, 8, 2, day))
    return std::nullopt;
  const date::year_month_day ymd{date::year{year}, date::month{unsigned(month)},
                                 date::day{unsigned(day)}};
  if (!ymd.ok()) return std::nullopt;
  const std::int64_t days = date::sys_days{ymd}.time_since_epoch().count();
  if (s.size() == 10) return TimePoint{TimeKind::Date, days * kDay, std::nullopt, false};

  // A date-time: 'T' or one space, hh:mm, optional :ss and .fff, optional offset.
  if (s[10] != 'T' && s[10] != 't' && s[10] != ' ') return std::nullopt;
  int hour = 0, minute = 0, second = 0;
  if (!read_digits(s, 11, 2, hour) || s.size() < 16 || s[13] != ':' ||
      !read_digits(s, 14, 2, minute))
    return std::nullopt;
  std::size_t pos = 16;
  if (pos < s.size() && s[pos] == ':') {
    if (!read_digits(s, pos + 1, 2, second)) return std::nullopt;
    pos += 3;
    if (pos < s.size() && (s[pos] == '.' || s[pos] == ',')) {
      // Sub-second times are not supported: a fraction must be all zeros.
      const std::size_t first = ++pos;
      while (pos < s.size() && s[pos] == '0') ++pos;
      if (pos == first || (pos < s.size() && is_digit(s[pos]))) return std::nullopt;
    }
  }
  if (hour > 23 || minute > 59 || second > 59) return std::nullopt;
  TimePoint point{TimeKind::DateTime, days * kDay + hour * 3600 + minute * 60 + second,
                  std::nullopt, false};
  if (pos < s.size()) {
    int offset = 0;
    bool utc_z = false;
    if (!parse_offset(s.substr(pos), offset, utc_z)) return std::nullopt;
    point.offset_minutes = offset;
    point.utc_z = utc_z;
  }
  return point;
}

std::string two(unsigned v) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "%02u", v % 100);
  return buf;
}

std::string format_offset(int minutes, bool utc_z) {
  if (minutes == 0 && utc_z) return "Z";
  const unsigned a = unsigned(minutes < 0 ? -minutes : minutes);
  return std::string(minutes < 0 ? "-" : "+") + two(a / 60) + ":" + two(a % 60);
}

std::string format_dated(TimeKind kind, std::int64_t value, std::optional<int> offset,
                         bool utc_z, bool show_seconds) {
  const Civil c = to_civil(value);
  // gapmark reads four-digit years only, so it writes no other: a time moved
  // out of 0001-9999 (by an offset, or a step past the end) is refused.
  if (c.year < 1 || c.year > 9999)
    throw InputError("time", "a time in the year " + std::to_string(c.year) +
                                 " cannot be written: times must stay within the years 0001-9999");
  char date_text[32];
  std::snprintf(date_text, sizeof date_text, "%04d-%02u-%02u", c.year, c.month, c.day);
  std::string out = date_text;
  if (kind == TimeKind::Date) return out;
  const auto s = unsigned(c.second_of_day);
  out += "T" + two(s / 3600) + ":" + two(s / 60 % 60);
  if (show_seconds) out += ":" + two(s % 60);
  if (offset) out += format_offset(*offset, utc_z);
  return out;
}

// ---- duration parsing ------------------------------------------------------

[[noreturn]] void bad_step(std::string_view where, std::string_view text, const std::string& why) {
  throw InputError(std::string(where), "step '" + std::string(text) + "' " + why);
}

Step parse_duration(std::string_view text, std::string_view where) {
  static const std::string kForm =
      "is not an ISO 8601 duration (PT15M, PT1H, P1D, P1W, P1M, P1Y, P1DT12H) or a positive "
      "integer";
  std::size_t pos = 1;  // after 'P'
  bool in_time = false;
  // Designators in the order ISO 8601 writes them; each at most once.
  const std::string date_order = "YMWD", time_order = "HMS";
  std::size_t next_date = 0, next_time = 0;
  std::int64_t years = 0, months = 0, seconds = 0;
  bool any = false;
  constexpr std::int64_t kLimit = std::int64_t(1) << 40;
  while (pos < text.size()) {
    char c = char(std::toupper(static_cast<unsigned char>(text[pos])));
    if (c == 'T') {
      if (in_time) bad_step(where, text, kForm);
      in_time = true;
      ++pos;
      if (pos == text.size()) bad_step(where, text, kForm);
      continue;
    }
    std::int64_t n = 0;
    const std::size_t digits_at = pos;
    while (pos < text.size() && is_digit(text[pos])) {
      n = n * 10 + (text[pos] - '0');
      if (n > kLimit) bad_step(where, text, "is too large");
      ++pos;
    }
    if (pos < text.size() && (text[pos] == '.' || text[pos] == ','))
      bad_step(where, text, "must use whole numbers (write PT90M, not PT1.5H)");
    if (pos == digits_at || pos == text.size()) bad_step(where, text, kForm);
    c = char(std::toupper(static_cast<unsigned char>(text[pos])));
    ++pos;
    const std::string& order = in_time ? time_order : date_order;
    std::size_t& next = in_time ? next_time : next_date;
    const std::size_t at = order.find(c, next);
    if (at == std::string::npos) bad_step(where, text, kForm);
    next = at + 1;
    any = true;
    if (!in_time) {
      if (c == 'Y') years = n;
      if (c == 'M') months = n;
      if (c == 'W') seconds += n * kWeek;
      if (c == 'D') seconds += n * kDay;
    } else {
      if (c == 'H') seconds += n * 3600;
      if (c == 'M') seconds += n * 60;
      if (c == 'S') seconds += n;
    }
  }
  if (!any) bad_step(where, text, kForm);
  const std::int64_t calendar = years * 12 + months;
  if (calendar > 0 && seconds > 0)
    bad_step(where, text,
             "mixes calendar parts (years, months) with fixed parts (weeks, days, hours, "
             "minutes, seconds); use one kind");
  if (calendar > 0) return Step{Step::Unit::Months, calendar};
  if (seconds > 0) return Step{Step::Unit::Seconds, seconds};
  bad_step(where, text, "must be positive");
}

const char* kind_name(TimeKind kind) {
  switch (kind) {
    case TimeKind::Index: return "an integer";
    case TimeKind::Date: return "a date";
    case TimeKind::DateTime: return "a date-time";
  }
  return "a time";
}

std::string offset_name(const TimePoint& t) {
  return t.offset_minutes ? format_offset(*t.offset_minutes, t.utc_z) : "no offset";
}

// For dates that all fall on one day of month (clamped in shorter months), or
// all on month-ends: that day (31 for month-ends). nullopt otherwise.
std::optional<int> month_anchor(std::span<const TimePoint> times) {
  std::vector<std::int64_t> values;
  values.reserve(times.size());
  for (const TimePoint& t : times) values.push_back(t.value);
  const int day = calendar::month_anchor_day(values);
  return day == 0 ? std::nullopt : std::optional<int>(day);
}

std::string line_where(std::string_view file, std::size_t line) {
  if (file.empty()) return "line " + std::to_string(line);
  return std::string(file) + ":" + std::to_string(line);
}

}  // namespace

// ---- Step --------------------------------------------------------------------

std::string Step::iso() const {
  switch (unit) {
    case Unit::Index:
      return std::to_string(amount);
    case Unit::Months:
      if (amount % 12 == 0) return "P" + std::to_string(amount / 12) + "Y";
      return "P" + std::to_string(amount) + "M";
    case Unit::Seconds: {
      const std::int64_t days = amount / kDay;
      std::int64_t rest = amount % kDay;
      std::string out = "P";
      if (days > 0) out += std::to_string(days) + "D";
      if (rest == 0) return out;
      out += "T";
      if (rest >= 3600) out += std::to_string(rest / 3600) + "H";
      rest %= 3600;
      if (rest >= 60) out += std::to_string(rest / 60) + "M";
      rest %= 60;
      if (rest > 0) out += std::to_string(rest) + "S";
      return out;
    }
  }
  return {};
}

Step Step::parse(std::string_view text, std::string_view where) {
  const std::string_view t = trim(text);
  if (t.empty()) throw InputError(std::string(where), "empty step");
  if (t[0] == '-') bad_step(where, t, "must be positive");
  if (std::all_of(t.begin(), t.end(), is_digit)) {
    std::int64_t n = 0;
    for (char c : t) {
      n = n * 10 + (c - '0');
      if (n > (std::int64_t(1) << 40)) bad_step(where, t, "is too large");
    }
    if (n == 0) bad_step(where, t, "must be positive");
    return Step{Unit::Index, n};
  }
  if (t[0] != 'P' && t[0] != 'p')
    bad_step(where, t,
             "is not an ISO 8601 duration (PT15M, PT1H, P1D, P1W, P1M, P1Y, P1DT12H) or a "
             "positive integer");
  return parse_duration(t, where);
}

// ---- parsing and formatting times ------------------------------------------------

std::optional<TimePoint> parse_time(std::string_view text) {
  const std::string_view s = trim(text);
  if (s.empty()) return std::nullopt;
  if (s.size() >= 10 && s[4] == '-') return parse_dated_time(s);
  return parse_integer_time(s);
}

std::string format_time(TimeKind kind, std::int64_t value, std::optional<int> offset_minutes,
                        bool utc_z) {
  if (kind == TimeKind::Index) return std::to_string(value);
  const bool show_seconds = floor_div(value, 60) * 60 != value;
  return format_dated(kind, value, offset_minutes, utc_z, show_seconds);
}

std::int64_t advance(TimeKind kind, std::int64_t value, const Step& step, std::int64_t count) {
  if (step.unit == Step::Unit::Months) {
    if (kind == TimeKind::Index)
      throw std::invalid_argument("advance: a calendar step on an integer axis");
    return add_months(value, step.amount * count, 0);
  }
  return value + step.amount * count;
}

// ---- TimeAxis ----------------------------------------------------------------------

TimeAxis::TimeAxis(TimeKind kind, Step step, std::int64_t start, std::size_t length,
                   std::optional<int> offset_minutes, AxisStyle style)
    : kind_(kind), step_(step), start_(start), length_(length), offset_(offset_minutes),
      style_(style) {
  if (step_.amount <= 0) throw std::invalid_argument("TimeAxis: the step must be positive");
  if ((kind_ == TimeKind::Index) != (step_.unit == Step::Unit::Index))
    throw std::invalid_argument("TimeAxis: integer steps go with integer times only");
  if (step_.unit != Step::Unit::Months) {
    style_.month_day = 0;
    return;
  }
  const Civil c = to_civil(start_);
  if (style_.month_day == 0) style_.month_day = int(c.day);
  if (style_.month_day < 1 || style_.month_day > kMonthEnd ||
      c.day != std::min(unsigned(style_.month_day), last_day_of_month(c.year, c.month)))
    throw std::invalid_argument("TimeAxis: the start is not on the axis's day of month");
}

TimeAxis TimeAxis::index(std::size_t length) {
  return TimeAxis(TimeKind::Index, Step{}, 0, length);
}

std::int64_t TimeAxis::at(std::size_t i) const {
  const auto k = static_cast<std::int64_t>(i);
  if (step_.unit == Step::Unit::Months) return add_months(start_, k * step_.amount, style_.month_day);
  return start_ + k * step_.amount;
}

std::string TimeAxis::format(std::size_t i) const {
  if (kind_ == TimeKind::Index) return std::to_string(at(i));
  // Seconds are written for the whole axis or not at all: only when some
  // point of it has a nonzero second.
  const bool show_seconds =
      floor_div(start_, 60) * 60 != start_ ||
      (step_.unit == Step::Unit::Seconds && step_.amount % 60 != 0);
  return format_dated(kind_, at(i), offset_, style_.utc_z, show_seconds);
}

std::size_t TimeAxis::default_period() const {
  if (step_.unit == Step::Unit::Seconds) {
    switch (step_.amount) {
      case 900: return 96;
      case 3600: return 24;
      case kDay: return 7;
      case kWeek: return 52;
      default: return 0;
    }
  }
  if (step_.unit == Step::Unit::Months) {
    if (step_.amount == 1) return 12;
    if (step_.amount == 3) return 4;
  }
  return 0;
}

int TimeAxis::hour_of_day(std::size_t i) const {
  if (kind_ == TimeKind::Index) return 0;
  return int(to_civil(at(i)).second_of_day / 3600);
}

int TimeAxis::day_of_week(std::size_t i) const {
  if (kind_ == TimeKind::Index) return 0;
  const date::sys_days day{date::days{floor_div(at(i), kDay)}};
  return int(date::weekday{day}.iso_encoding());
}

int TimeAxis::month(std::size_t i) const {
  if (kind_ == TimeKind::Index) return 0;
  return int(to_civil(at(i)).month);
}

int TimeAxis::iso_week(std::size_t i) const {
  if (kind_ == TimeKind::Index) return 0;
  const date::sys_days day{date::days{floor_div(at(i), kDay)}};
  return int(unsigned(iso_week::year_weeknum_weekday{day}.weeknum()));
}

// ---- inferring an axis -------------------------------------------------------------

TimeAxis infer_axis(std::span<const TimePoint> times, std::optional<Step> step,
                    std::string_view file, std::size_t first_line) {
  std::vector<std::size_t> lines(times.size());
  for (std::size_t i = 0; i < lines.size(); ++i) lines[i] = first_line + i;
  return infer_axis(times, step, file, lines);
}

namespace {

constexpr std::size_t kMaxGridPoints = 100'000'000;

/// The axis from the first to the last time on the grid of `step`, and the
/// position of each time on it; InputError for a time off the grid.
template <class Where>
TimeAxis place_on_grid(std::span<const TimePoint> times, const Step& step, const AxisStyle& style, const Where& where,
                       const std::string& step_where, std::vector<std::size_t>& positions) {
  const TimePoint& first = times.front();
  const auto steps_to = [&](std::int64_t value) {
    const std::int64_t span = step.unit == Step::Unit::Months
                                  ? month_number(to_civil(value)) - month_number(to_civil(first.value))
                                  : value - first.value;
    return span / step.amount;
  };
  const std::int64_t last = steps_to(times.back().value);
  if (last < 0 || static_cast<std::uint64_t>(last) >= kMaxGridPoints)
    throw InputError(step_where, "step " + step.iso() + " puts " + std::to_string(last + 1) +
                                     " points between the first and the last time; check --step");
  const TimeAxis axis(first.kind, step, first.value, static_cast<std::size_t>(last) + 1, first.offset_minutes, style);
  positions.assign(times.size(), 0);
  for (std::size_t i = 0; i < times.size(); ++i) {
    const auto k = static_cast<std::size_t>(steps_to(times[i].value));
    if (axis.at(k) != times[i].value) {
      const auto text = [&](std::int64_t v) { return format_time(first.kind, v, first.offset_minutes, first.utc_z); };
      throw InputError(where(i), "time " + text(times[i].value) + " is not on the " + step.iso() + " grid from " +
                                     text(first.value) + " (nearest grid time " + text(axis.at(k)) +
                                     "); regularize the data first, or check --step");
    }
    positions[i] = k;
  }
  return axis;
}

std::string time_text(const TimePoint& t) { return format_time(t.kind, t.value, t.offset_minutes, t.utc_z); }

/// The times read, with the file and lines they came from, for errors.
struct TimeRows {
  std::span<const TimePoint> times;
  std::string_view file;
  std::span<const std::size_t> lines;
  std::string where(std::size_t i) const { return line_where(file, lines[i]); }
};

/// One kind of time and one offset, strictly increasing.
void check_increasing(const TimeRows& rows) {
  const auto& times = rows.times;
  const TimePoint& first = times.front();
  for (std::size_t i = 1; i < times.size(); ++i) {
    const TimePoint& t = times[i];
    if (t.kind != first.kind)
      throw InputError(rows.where(i), std::string("mixed time formats: ") + kind_name(t.kind) + " here, " +
                                          kind_name(first.kind) + " on line " + std::to_string(rows.lines[0]));
    if (t.offset_minutes != first.offset_minutes)
      throw InputError(rows.where(i), "mixed UTC offsets: " + offset_name(t) + " here, " + offset_name(first) +
                                          " on line " + std::to_string(rows.lines[0]) +
                                          " (write all times with one offset)");
    const TimePoint& previous = times[i - 1];
    if (t.value == previous.value) throw InputError(rows.where(i), "duplicate time " + time_text(t));
    if (t.value < previous.value)
      throw InputError(rows.where(i), "time " + time_text(t) + " comes before " + time_text(previous) + " on line " +
                                          std::to_string(rows.lines[i - 1]) + " (sort the rows by time)");
  }
}

/// A given step must fit the kind of times.
void check_step_fits(TimeKind kind, const Step& step, const std::string& step_where) {
  if (kind == TimeKind::Index && step.unit != Step::Unit::Index)
    throw InputError(step_where, "step " + step.iso() + " does not fit integer times; give a whole number");
  if (kind != TimeKind::Index && step.unit == Step::Unit::Index)
    throw InputError(step_where, "step " + step.iso() +
                                     " does not fit dated times; give an ISO 8601 "
                                     "duration such as PT1H or P1D");
  if (kind == TimeKind::Date && step.unit == Step::Unit::Seconds && step.amount % kDay != 0)
    throw InputError(step_where, "step " + step.iso() +
                                     " does not fit dates (YYYY-MM-DD); use days, weeks, "
                                     "months or years");
}

/// The step: given; one default for a single row; calendar months when the
/// dates keep one day of month (which goes to style.month_day); otherwise
/// the smallest difference.
Step choose_axis_step(std::span<const TimePoint> times, std::optional<Step> step, AxisStyle& style) {
  const TimeKind kind = times.front().kind;
  const std::optional<int> anchor = kind == TimeKind::Index ? std::nullopt : month_anchor(times);
  if (step) {
    if (step->unit == Step::Unit::Months && anchor) style.month_day = *anchor;
    return *step;
  }
  if (times.size() == 1) return kind == TimeKind::Index ? Step{} : Step{Step::Unit::Seconds, kDay};
  std::int64_t smallest = std::numeric_limits<std::int64_t>::max();
  if (anchor) {
    for (std::size_t i = 1; i < times.size(); ++i)
      smallest = std::min(smallest, month_number(to_civil(times[i].value)) - month_number(to_civil(times[i - 1].value)));
    style.month_day = *anchor;
    return Step{Step::Unit::Months, smallest};
  }
  for (std::size_t i = 1; i < times.size(); ++i) smallest = std::min(smallest, times[i].value - times[i - 1].value);
  return Step{kind == TimeKind::Index ? Step::Unit::Index : Step::Unit::Seconds, smallest};
}

/// Every time is the axis' point at its row.
void check_regular(const TimeAxis& axis, const TimeRows& rows, bool step_given) {
  const auto& times = rows.times;
  const TimePoint& first = times.front();
  for (std::size_t i = 1; i < times.size(); ++i) {
    const std::int64_t expected = axis.at(i);
    if (times[i].value == expected) continue;
    const TimePoint want{first.kind, expected, first.offset_minutes, first.utc_z};
    throw InputError(rows.where(i), "irregular time step: expected " + time_text(want) + " after " +
                                        time_text(times[i - 1]) + ", found " + time_text(times[i]) +
                                        (step_given ? " (regularize the data first, or check --step)"
                                                    : " (regularize the data first, or give --step)"));
  }
}

}  // namespace

TimeAxis infer_axis(std::span<const TimePoint> times, std::optional<Step> step,
                    std::string_view file, std::span<const std::size_t> lines,
                    std::vector<std::size_t>* positions) {
  if (lines.size() != times.size())
    throw std::invalid_argument("infer_axis: one line number per time");
  if (times.empty()) return TimeAxis(TimeKind::Index, Step{}, 0, 0);
  const TimeRows rows{.times = times, .file = file, .lines = lines};
  check_increasing(rows);
  const TimePoint& first = times.front();
  const std::string step_where = file.empty() ? std::string("--step") : std::string(file);
  if (step) check_step_fits(first.kind, *step, step_where);
  AxisStyle style;
  style.utc_z = first.utc_z;
  const Step chosen = choose_axis_step(times, step, style);
  const auto where = [&rows](std::size_t i) { return rows.where(i); };
  if (positions != nullptr && step) return place_on_grid(times, chosen, style, where, step_where, *positions);
  const TimeAxis axis(first.kind, chosen, first.value, times.size(), first.offset_minutes, style);
  check_regular(axis, rows, step.has_value());
  return axis;
}

}  // namespace gapmark
