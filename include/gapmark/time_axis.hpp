#pragma once
// A regular time axis: where it starts, its step (an ISO 8601 duration or a
// plain integer step), how many points it has. Times are parsed from ISO 8601
// dates and date-times or plain integers, and formatted back the same way.
#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace gapmark {

/// How the time column of a file is written.
enum class TimeKind {
  Index,     ///< plain integers: 1, 2, 3 ...
  Date,      ///< 2026-03-01
  DateTime,  ///< 2026-03-01T06:00, 2026-03-01 06:00:00, optional Z or +hh:mm
};

/// A step between consecutive points. Calendar steps (months, years) are kept
/// apart from fixed ones (seconds) so that P1M follows the calendar.
struct Step {
  enum class Unit { Index, Seconds, Months };
  Unit unit = Unit::Index;
  std::int64_t amount = 1;

  /// "PT15M", "PT1H", "P1D", "P7D", "P1M", "P3M", "P1Y"; an integer step for
  /// Index axes is written as its number ("1", "5").
  std::string iso() const;
  /// Parses an ISO 8601 duration (PnYnMnWnDTnHnMnS, one calendar part or any
  /// fixed parts) or a positive integer. Throws InputError naming `where`.
  static Step parse(std::string_view text, std::string_view where = "--step");
  bool operator==(const Step&) const = default;
};

/// One parsed time. For Date/DateTime `value` is seconds since
/// 1970-01-01T00:00 of the wall-clock time as written; the UTC offset, when
/// one was written, is kept apart in `offset_minutes`.
struct TimePoint {
  TimeKind kind = TimeKind::Index;
  std::int64_t value = 0;
  std::optional<int> offset_minutes;
  bool utc_z = false;  ///< a zero offset was written "Z" rather than "+00:00"
};

/// Parses one time cell. Returns nullopt when the text is not a time.
std::optional<TimePoint> parse_time(std::string_view text);

/// How a dated axis is anchored and written, beyond its start and step.
struct AxisStyle {
  /// For a Months step: the day of month every point keeps, clamped to the
  /// month's length (31 = the last day of every month); 0 = the start's day.
  int month_day = 0;
  bool utc_z = false;  ///< write a zero offset as "Z" rather than "+00:00"
};

class TimeAxis {
public:
  TimeAxis() = default;
  TimeAxis(TimeKind kind, Step step, std::int64_t start, std::size_t length,
           std::optional<int> offset_minutes = std::nullopt, AxisStyle style = {});

  /// An integer axis 0..length-1 (for tests and generated data).
  static TimeAxis index(std::size_t length);

  TimeKind kind() const { return kind_; }
  const Step& step() const { return step_; }
  std::size_t size() const { return length_; }
  std::int64_t start() const { return start_; }
  std::optional<int> offset_minutes() const { return offset_; }
  const AxisStyle& style() const { return style_; }

  /// The time of point i (seconds for dated axes, the integer for Index).
  std::int64_t at(std::size_t i) const;
  /// Point i written like the input was (ISO 8601 or an integer).
  std::string format(std::size_t i) const;
  /// The conventional seasonal period for this step: 96 for PT15M, 24 for
  /// PT1H, 7 for P1D, 52 for P7D, 12 for P1M, 4 for P3M; 0 (none) otherwise.
  std::size_t default_period() const;

  /// Calendar phases of point i (dated axes only; 0 for Index axes).
  int hour_of_day(std::size_t i) const;
  int day_of_week(std::size_t i) const;  ///< ISO: Monday = 1 ... Sunday = 7
  int month(std::size_t i) const;        ///< 1..12
  int iso_week(std::size_t i) const;     ///< ISO 8601 week of the year, 1..53

private:
  TimeKind kind_ = TimeKind::Index;
  Step step_{};
  std::int64_t start_ = 0;
  std::size_t length_ = 0;
  std::optional<int> offset_;
  AxisStyle style_{};
};

/// Adds `count` steps to a time value of the given kind (calendar-aware: a
/// Months step keeps the day of month, clamped to the month's length, so
/// 2026-01-31 plus P1M is 2026-02-28; the time of day is kept).
std::int64_t advance(TimeKind kind, std::int64_t value, const Step& step, std::int64_t count);

/// Formats a time value of the given kind as ISO 8601 (or an integer);
/// seconds are written only when nonzero.
std::string format_time(TimeKind kind, std::int64_t value, std::optional<int> offset_minutes,
                        bool utc_z = false);

/// Builds the axis of a column of times that must already be regular:
/// sorted, without duplicates, each the previous plus one step. The step is
/// inferred (the smallest difference, read as calendar months when the dates
/// fall on the same day of month) unless given. `first_line` is the file line
/// of times[0], used in errors ("data.csv:15: duplicate time 2026-03-01").
TimeAxis infer_axis(std::span<const TimePoint> times, std::optional<Step> step,
                    std::string_view file, std::size_t first_line);
/// The same with the file line of every time (rows of a CSV file may span
/// several lines when a quoted cell holds a line break). With `positions`
/// and a given step, times may skip grid points: the axis then runs from the
/// first to the last time on the step's grid, every time must lie on that
/// grid (InputError otherwise), and positions[i] is the grid index of times[i].
TimeAxis infer_axis(std::span<const TimePoint> times, std::optional<Step> step,
                    std::string_view file, std::span<const std::size_t> lines,
                    std::vector<std::size_t>* positions = nullptr);

}  // namespace gapmark
