// Time axes: parsing times and ISO 8601 durations, calendar arithmetic,
// inferring a regular axis, and calendar facts checked against Python's
// datetime and pandas (reference/iso_time/iso_time.json).
#include <doctest/doctest.h>

#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "../reference_json.hpp"
#include "gapmark/error.hpp"
#include "gapmark/time_axis.hpp"

using gapmark::InputError;
using gapmark::infer_axis;
using gapmark::parse_time;
using gapmark::Step;
using gapmark::TimeAxis;
using gapmark::TimeKind;
using gapmark::TimePoint;

namespace {

TimePoint time_of(const std::string& text) {
  const auto t = parse_time(text);
  REQUIRE_MESSAGE(t.has_value(), "not parsed: " << text);
  return *t;
}

std::vector<TimePoint> times_of(const std::vector<std::string>& texts) {
  std::vector<TimePoint> out;
  for (const auto& t : texts) out.push_back(time_of(t));
  return out;
}

// Inference over times that sit on lines 2, 3, ... of "data.csv".
TimeAxis infer(const std::vector<std::string>& texts, std::optional<Step> step = std::nullopt) {
  const auto times = times_of(texts);
  return infer_axis(times, step, "data.csv", 2);
}

std::string error_of(const std::vector<std::string>& texts,
                     std::optional<Step> step = std::nullopt) {
  try {
    infer(texts, step);
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

std::string step_error(const std::string& text) {
  try {
    Step::parse(text, "--step");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

constexpr std::int64_t kDay = 86400;

}  // namespace

TEST_CASE("parse_time: integers are Index times") {
  for (const auto& [text, value] : std::vector<std::pair<std::string, std::int64_t>>{
           {"0", 0}, {"42", 42}, {"-7", -7}, {" 15 ", 15}, {"20260301", 20260301}}) {
    const TimePoint t = time_of(text);
    CHECK(t.kind == TimeKind::Index);
    CHECK(t.value == value);
    CHECK_FALSE(t.offset_minutes.has_value());
  }
}

TEST_CASE("parse_time: dates and date-times in every accepted form") {
  const TimePoint day = time_of("2026-03-01");
  CHECK(day.kind == TimeKind::Date);
  CHECK(day.value % kDay == 0);
  CHECK(time_of("2026-03-02").value - day.value == kDay);
  CHECK(time_of("2026-04-01").value - day.value == 31 * kDay);

  const std::int64_t six = day.value + 6 * 3600;
  for (const std::string text :
       {"2026-03-01T06:00", "2026-03-01 06:00", "2026-03-01T06:00:00", "2026-03-01 06:00:00",
        "2026-03-01T06:00:00.000", "2026-03-01t06:00", "2026-03-01T06:00:00,0"}) {
    const TimePoint t = time_of(text);
    CHECK_MESSAGE(t.kind == TimeKind::DateTime, text);
    CHECK_MESSAGE(t.value == six, text);
    CHECK_MESSAGE(!t.offset_minutes.has_value(), text);
  }
  CHECK(time_of("2026-03-01T06:00:30").value == six + 30);

  // Offsets are kept apart; the value stays the wall-clock time as written.
  struct Case {
    std::string text;
    int offset;
    bool z;
  };
  for (const Case& c : std::vector<Case>{{"2026-03-01T06:00Z", 0, true},
                                         {"2026-03-01T06:00:00z", 0, true},
                                         {"2026-03-01T06:00+00:00", 0, false},
                                         {"2026-03-01T06:00+01:00", 60, false},
                                         {"2026-03-01 06:00-05:30", -330, false},
                                         {"2026-03-01T06:00+0530", 330, false},
                                         {"2026-03-01T06:00:00.000-0800", -480, false},
                                         {"2026-03-01T06:00+02", 120, false}}) {
    const TimePoint t = time_of(c.text);
    CHECK_MESSAGE(t.kind == TimeKind::DateTime, c.text);
    CHECK_MESSAGE(t.value == six, c.text);
    REQUIRE_MESSAGE(t.offset_minutes.has_value(), c.text);
    CHECK_MESSAGE(*t.offset_minutes == c.offset, c.text);
    CHECK_MESSAGE(t.utc_z == c.z, c.text);
  }
}

TEST_CASE("parse_time: rejects what is not a time") {
  for (const std::string text :
       {"", "   ", "abc", "1.5", "1e3", "--3", "+5", "2026-02-30", "2025-02-29", "2026-13-01",
        "2026-00-01", "2026-03-00", "2026-03-32", "2026-3-1", "26-03-01", "2026/03/01",
        "2026-03-01T25:00", "2026-03-01T24:00", "2026-03-01T12:60", "2026-03-01T12:00:60",
        "2026-03-01T06", "2026-03-01T6:00", "2026-03-01T06:00:5", "2026-03-01T",
        "2026-03-01X06:00", "2026-03-01  06:00", "2026-03-01T06:00:00.5",
        "2026-03-01T06:00:00.", "2026-03-01Z", "2026-03-01T06:00+24:00",
        "2026-03-01T06:00+01:60", "2026-03-01T06:00 +01:00", "2026-03-01T06:00+1",
        "2026-03-01T06:00UTC", "12:00", "9223372036854775808"}) {
    CHECK_MESSAGE(!parse_time(text).has_value(), "accepted: '" << text << "'");
  }
}

TEST_CASE("Step::parse reads ISO 8601 durations and integer steps") {
  using U = Step::Unit;
  struct Case {
    std::string text;
    U unit;
    std::int64_t amount;
  };
  for (const Case& c : std::vector<Case>{{"PT15M", U::Seconds, 900},
                                         {"PT1H", U::Seconds, 3600},
                                         {"PT30S", U::Seconds, 30},
                                         {"PT1H30M", U::Seconds, 5400},
                                         {"P1D", U::Seconds, kDay},
                                         {"P1DT12H", U::Seconds, kDay + 12 * 3600},
                                         {"P1W", U::Seconds, 7 * kDay},
                                         {"P2W3D", U::Seconds, 17 * kDay},
                                         {"P1M", U::Months, 1},
                                         {"P3M", U::Months, 3},
                                         {"P1Y", U::Months, 12},
                                         {"P1Y6M", U::Months, 18},
                                         {"pt15m", U::Seconds, 900},
                                         {" P1D ", U::Seconds, kDay},
                                         {"1", U::Index, 1},
                                         {"5", U::Index, 5}}) {
    const Step s = Step::parse(c.text);
    CHECK_MESSAGE(s.unit == c.unit, c.text);
    CHECK_MESSAGE(s.amount == c.amount, c.text);
  }
}

TEST_CASE("Step::iso writes the shortest canonical form and round-trips") {
  CHECK(Step::parse("PT900S").iso() == "PT15M");
  CHECK(Step::parse("PT3600S").iso() == "PT1H");
  CHECK(Step::parse("PT86400S").iso() == "P1D");
  CHECK(Step::parse("PT1440M").iso() == "P1D");
  CHECK(Step::parse("PT604800S").iso() == "P7D");
  CHECK(Step::parse("P1W").iso() == "P7D");
  CHECK(Step::parse("P12M").iso() == "P1Y");
  CHECK(Step::parse("P24M").iso() == "P2Y");
  CHECK(Step::parse("P3M").iso() == "P3M");
  CHECK(Step::parse("P18M").iso() == "P18M");
  CHECK(Step::parse("PT36H").iso() == "P1DT12H");
  CHECK(Step::parse("PT5400S").iso() == "PT1H30M");
  CHECK(Step::parse("PT3661S").iso() == "PT1H1M1S");
  CHECK(Step::parse("7").iso() == "7");
  for (const std::string text : {"PT15M", "PT1H", "P1D", "P7D", "P1M", "P3M", "P1Y", "P1DT12H",
                                 "PT45S", "P18M", "3", "PT10M", "P2D"}) {
    const Step s = Step::parse(text);
    CHECK_MESSAGE(s.iso() == text, text);
    CHECK_MESSAGE(Step::parse(s.iso()) == s, text);
  }
}

TEST_CASE("Step::parse rejects bad steps with the place and the reason") {
  CHECK(step_error("P1MT1H").find("--step: step 'P1MT1H' mixes calendar parts") == 0);
  CHECK(step_error("P1Y2D").find("mixes calendar parts") != std::string::npos);
  CHECK(step_error("P0D").find("must be positive") != std::string::npos);
  CHECK(step_error("PT0S").find("must be positive") != std::string::npos);
  CHECK(step_error("0").find("must be positive") != std::string::npos);
  CHECK(step_error("-3").find("must be positive") != std::string::npos);
  CHECK(step_error("-P1D").find("must be positive") != std::string::npos);
  CHECK(step_error("P1.5D").find("whole numbers") != std::string::npos);
  CHECK(step_error("").find("empty step") != std::string::npos);
  for (const std::string text : {"P", "PT", "P1DT", "1D", "P1H", "PT1D", "P1D1M", "P1M1Y",
                                 "PT1M1H", "abc", "P1DD", "PTH", "+5", "P1D2"}) {
    CHECK_MESSAGE(step_error(text).find("is not an ISO 8601 duration") != std::string::npos,
                  text << " -> " << step_error(text));
  }
  try {
    Step::parse("P1MT1H", "spec.json: /step");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(e.where() == "spec.json: /step");
  }
}

TEST_CASE("infer_axis finds fixed steps") {
  const TimeAxis quarter = infer({"2026-03-01T00:00", "2026-03-01T00:15", "2026-03-01T00:30",
                                  "2026-03-01T00:45", "2026-03-01T01:00"});
  CHECK(quarter.step().iso() == "PT15M");
  CHECK(quarter.size() == 5);
  CHECK(quarter.kind() == TimeKind::DateTime);
  CHECK(quarter.default_period() == 96);

  const TimeAxis hourly = infer({"2026-03-01 22:00", "2026-03-01 23:00", "2026-03-02 00:00"});
  CHECK(hourly.step().iso() == "PT1H");
  CHECK(hourly.default_period() == 24);

  const TimeAxis daily = infer({"2024-02-28", "2024-02-29", "2024-03-01", "2024-03-02"});
  CHECK(daily.step().iso() == "P1D");
  CHECK(daily.default_period() == 7);
  CHECK(daily.format(2) == "2024-03-01");

  const TimeAxis weekly = infer({"2026-01-26", "2026-02-02", "2026-02-09", "2026-02-16"});
  CHECK(weekly.step().iso() == "P7D");
  CHECK(weekly.default_period() == 52);

  const TimeAxis index = infer({"10", "15", "20", "25"});
  CHECK(index.kind() == TimeKind::Index);
  CHECK(index.step() == Step{Step::Unit::Index, 5});
  CHECK(index.at(3) == 25);
  CHECK(index.format(1) == "15");
  CHECK(index.default_period() == 0);
}

TEST_CASE("infer_axis finds calendar steps: months, quarters, years") {
  const TimeAxis monthly = infer({"2026-01-15", "2026-02-15", "2026-03-15", "2026-04-15"});
  CHECK(monthly.step() == Step{Step::Unit::Months, 1});
  CHECK(monthly.step().iso() == "P1M");
  CHECK(monthly.default_period() == 12);

  // On the 31st: shorter months clamp to their last day.
  const TimeAxis day31 = infer({"2026-01-31", "2026-02-28", "2026-03-31", "2026-04-30",
                                "2026-05-31", "2026-06-30"});
  CHECK(day31.step().iso() == "P1M");
  CHECK(day31.format(5) == "2026-06-30");

  // Month-ends starting in February: the 28th is a month-end, not an anchor.
  const TimeAxis ends = infer({"2026-02-28", "2026-03-31", "2026-04-30", "2026-05-31"});
  CHECK(ends.step().iso() == "P1M");
  CHECK(ends.style().month_day == 31);
  CHECK(ends.format(1) == "2026-03-31");

  // A series on the 28th that starts in February stays on the 28th.
  const TimeAxis day28 = infer({"2026-02-28", "2026-03-28", "2026-04-28"});
  CHECK(day28.style().month_day == 28);
  CHECK(day28.format(2) == "2026-04-28");

  // Monthly on the 30th, through a February.
  const TimeAxis day30 = infer({"2026-01-30", "2026-02-28", "2026-03-30", "2026-04-30"});
  CHECK(day30.style().month_day == 30);
  CHECK(day30.format(2) == "2026-03-30");

  const TimeAxis quarterly = infer({"2025-01-01", "2025-04-01", "2025-07-01", "2025-10-01"});
  CHECK(quarterly.step().iso() == "P3M");
  CHECK(quarterly.default_period() == 4);

  const TimeAxis yearly = infer({"2023-06-30", "2024-06-30", "2025-06-30"});
  CHECK(yearly.step().iso() == "P1Y");
  CHECK(yearly.default_period() == 0);

  const TimeAxis monthly_times = infer({"2026-01-31T08:00Z", "2026-02-28T08:00Z", "2026-03-31T08:00Z"});
  CHECK(monthly_times.step().iso() == "P1M");
  CHECK(monthly_times.format(1) == "2026-02-28T08:00Z");

  // Different times of day are not a monthly series.
  CHECK(error_of({"2026-01-15T00:00", "2026-02-15T01:00"}) == "(no error)");
  CHECK(infer({"2026-01-15T00:00", "2026-02-15T01:00"}).step().unit == Step::Unit::Seconds);
}

TEST_CASE("infer_axis: a single row defaults to step 1 or P1D unless one is given") {
  CHECK(infer({"7"}).step() == Step{Step::Unit::Index, 1});
  CHECK(infer({"2026-03-01"}).step().iso() == "P1D");
  CHECK(infer({"2026-03-01T06:00"}).step().iso() == "P1D");
  CHECK(infer({"2026-03-01T06:00"}, Step::parse("PT1H")).step().iso() == "PT1H");
  CHECK(infer({"2026-03-01"}, Step::parse("P1M")).step().iso() == "P1M");
  CHECK(infer_axis({}, std::nullopt, "data.csv", 2).size() == 0);
}

TEST_CASE("infer_axis with a given step checks every row against it") {
  const TimeAxis a = infer({"2026-03-01", "2026-03-08", "2026-03-15"}, Step::parse("P1W"));
  CHECK(a.step().iso() == "P7D");
  CHECK(error_of({"2026-03-01", "2026-03-08", "2026-03-15"}, Step::parse("P1D")) ==
        "data.csv:3: irregular time step: expected 2026-03-02 after 2026-03-01, found "
        "2026-03-08 (regularize the data first, or check --step)");
  CHECK(error_of({"2026-03-01", "2026-03-02"}, Step::parse("PT1H")) ==
        "data.csv: step PT1H does not fit dates (YYYY-MM-DD); use days, weeks, months or years");
  CHECK(error_of({"1", "2"}, Step::parse("P1D")).find("does not fit integer times") !=
        std::string::npos);
  CHECK(error_of({"2026-03-01", "2026-03-02"}, Step::parse("2")).find("does not fit dated times") !=
        std::string::npos);
  // A month-end series checked against a given P1M.
  const TimeAxis ends =
      infer({"2026-02-28", "2026-03-31", "2026-04-30"}, Step::parse("P1M"));
  CHECK(ends.format(2) == "2026-04-30");
}

TEST_CASE("infer_axis errors name the file line") {
  CHECK(error_of({"2026-03-01T04:00", "2026-03-01T05:00", "2026-03-01T06:00", "2026-03-01T06:00"}) ==
        "data.csv:5: duplicate time 2026-03-01T06:00");
  CHECK(error_of({"2026-03-02T00:00", "2026-03-02T01:00", "2026-03-02T02:00", "2026-03-02T03:00",
                  "2026-03-02T04:00"}) == "(no error)");
  CHECK(error_of({"2026-03-01T23:00", "2026-03-02T00:00", "2026-03-02T03:00", "2026-03-02T04:00"}) ==
        "data.csv:4: irregular time step: expected 2026-03-02T01:00 after 2026-03-02T00:00, found "
        "2026-03-02T03:00 (regularize the data first, or give --step)");
  // A different spacing (not a gap) is irregular too.
  // (the smallest difference, 5 minutes, is the step)
  CHECK(error_of({"2026-03-01T00:00", "2026-03-01T00:10", "2026-03-01T00:15"}) ==
        "data.csv:3: irregular time step: expected 2026-03-01T00:05 after 2026-03-01T00:00, found "
        "2026-03-01T00:10 (regularize the data first, or give --step)");
  CHECK(error_of({"2026-03-01", "2026-03-03", "2026-03-02"}) ==
        "data.csv:4: time 2026-03-02 comes before 2026-03-03 on line 3 (sort the rows by time)");
  CHECK(error_of({"2026-03-01T00:00+01:00", "2026-03-01T01:00+01:00", "2026-03-01T02:00+02:00"}) ==
        "data.csv:4: mixed UTC offsets: +02:00 here, +01:00 on line 2 (write all times with one "
        "offset)");
  CHECK(error_of({"2026-03-01T00:00Z", "2026-03-01T01:00"}).find(
            "data.csv:3: mixed UTC offsets: no offset here, Z on line 2") == 0);
  // Z and +00:00 are the same offset.
  CHECK(error_of({"2026-03-01T00:00Z", "2026-03-01T01:00+00:00"}) == "(no error)");
  CHECK(error_of({"2026-03-01", "2026-03-02T00:00"}) ==
        "data.csv:3: mixed time formats: a date-time here, a date on line 2");
  CHECK(error_of({"2026-01-01", "2026-02-01", "2026-04-01"}) ==
        "data.csv:4: irregular time step: expected 2026-03-01 after 2026-02-01, found 2026-04-01 "
        "(regularize the data first, or give --step)");
  CHECK(error_of({"1", "2", "4"}).find("data.csv:4: irregular time step: expected 3 after 2") == 0);
}

TEST_CASE("infer_axis uses the line of each row when given one per time") {
  const auto times = times_of({"2026-03-01", "2026-03-02", "2026-03-02"});
  const std::vector<std::size_t> lines{2, 5, 9};  // rows with quoted line breaks
  try {
    infer_axis(times, std::nullopt, "data.csv", lines);
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == "data.csv:9: duplicate time 2026-03-02");
    CHECK(e.where() == "data.csv:9");
  }
}

TEST_CASE("TimeAxis formats points like the input") {
  // Seconds only when some point of the axis has them.
  const TimeAxis minutes = infer({"2026-03-01T06:00:00", "2026-03-01T06:15:00"});
  CHECK(minutes.format(1) == "2026-03-01T06:15");
  const TimeAxis seconds = infer({"2026-03-01T06:00:00", "2026-03-01T06:00:30"});
  CHECK(seconds.format(0) == "2026-03-01T06:00:00");
  CHECK(seconds.format(1) == "2026-03-01T06:00:30");
  const TimeAxis offset_start = infer({"2026-03-01T06:00:10", "2026-03-01T07:00:10"});
  CHECK(offset_start.format(1) == "2026-03-01T07:00:10");

  const TimeAxis z = infer({"2026-03-01T23:00Z", "2026-03-02T00:00Z"});
  CHECK(z.format(1) == "2026-03-02T00:00Z");
  const TimeAxis utc = infer({"2026-03-01T23:00+00:00", "2026-03-02T00:00+00:00"});
  CHECK(utc.format(1) == "2026-03-02T00:00+00:00");
  const TimeAxis east = infer({"2026-03-01T23:00+0530", "2026-03-02T00:00+0530"});
  CHECK(east.format(1) == "2026-03-02T00:00+05:30");
  const TimeAxis west = infer({"2026-03-01T23:00-03:00", "2026-03-02T00:00-03:00"});
  CHECK(west.format(0) == "2026-03-01T23:00-03:00");

  // Before 1970 the values are negative; formatting still works.
  const TimeAxis old = infer({"1969-12-31T23:00", "1970-01-01T00:00"});
  CHECK(old.at(0) == -3600);
  CHECK(old.format(0) == "1969-12-31T23:00");

  CHECK(gapmark::format_time(TimeKind::DateTime, time_of("2026-03-01T06:00:07").value,
                             std::nullopt) == "2026-03-01T06:00:07");
  CHECK(gapmark::format_time(TimeKind::Index, -4, std::nullopt) == "-4");
}

TEST_CASE("advance moves by fixed and calendar steps") {
  const std::int64_t jan31 = time_of("2026-01-31").value;
  CHECK(gapmark::advance(TimeKind::Date, jan31, Step::parse("P1M"), 1) == time_of("2026-02-28").value);
  CHECK(gapmark::advance(TimeKind::Date, jan31, Step::parse("P1M"), 2) == time_of("2026-03-31").value);
  CHECK(gapmark::advance(TimeKind::Date, jan31, Step::parse("P1M"), -2) == time_of("2025-11-30").value);
  CHECK(gapmark::advance(TimeKind::Date, jan31, Step::parse("P1Y"), -2) == time_of("2024-01-31").value);
  CHECK(gapmark::advance(TimeKind::Date, jan31, Step::parse("P1D"), 1) == time_of("2026-02-01").value);
  CHECK(gapmark::advance(TimeKind::DateTime, time_of("2026-03-01T23:30").value, Step::parse("PT45M"), 1) ==
        time_of("2026-03-02T00:15").value);
  CHECK(gapmark::advance(TimeKind::Index, 3, Step::parse("4"), 5) == 23);
}

TEST_CASE("calendar phases of dated axes") {
  const TimeAxis hourly = infer({"2026-03-01T22:00", "2026-03-01T23:00"});
  const TimeAxis long_hourly(TimeKind::DateTime, hourly.step(), hourly.start(), 30);
  for (std::size_t i = 0; i < long_hourly.size(); ++i)
    CHECK(long_hourly.hour_of_day(i) == int((22 + i) % 24));
  CHECK(long_hourly.format(2) == "2026-03-02T00:00");

  // 2026-03-02 is a Monday: a daily axis walks Monday..Sunday and wraps.
  const TimeAxis daily(TimeKind::Date, Step::parse("P1D"), time_of("2026-03-02").value, 15);
  for (std::size_t i = 0; i < daily.size(); ++i) CHECK(daily.day_of_week(i) == int(i % 7) + 1);
  CHECK(daily.hour_of_day(0) == 0);

  const TimeAxis monthly(TimeKind::Date, Step::parse("P1M"), time_of("2025-11-30").value, 14);
  for (std::size_t i = 0; i < monthly.size(); ++i) CHECK(monthly.month(i) == int((10 + i) % 12) + 1);
  CHECK(monthly.format(3) == "2026-02-28");
  CHECK(monthly.format(4) == "2026-03-30");

  const TimeAxis idx = TimeAxis::index(5);
  CHECK(idx.hour_of_day(2) == 0);
  CHECK(idx.day_of_week(2) == 0);
  CHECK(idx.month(2) == 0);
  CHECK(idx.at(4) == 4);
}

TEST_CASE("default_period per step") {
  const auto period = [](const std::string& step, TimeKind kind = TimeKind::DateTime) {
    return TimeAxis(kind, Step::parse(step), 0, 10).default_period();
  };
  CHECK(period("PT15M") == 96);
  CHECK(period("PT1H") == 24);
  CHECK(period("P1D") == 7);
  CHECK(period("P7D") == 52);
  CHECK(period("P1M") == 12);
  CHECK(period("P3M") == 4);
  CHECK(period("P1Y") == 0);
  CHECK(period("PT30M") == 0);
  CHECK(period("1", TimeKind::Index) == 0);
}

// Calendar facts from Python's datetime and pandas, stored by
// reference/iso_time/make_reference.py in reference/iso_time/iso_time.json.
TEST_CASE("calendar facts agree with Python datetime and pandas (reference/iso_time)") {
  const nlohmann::json ref = gapmark::test::reference_json("iso_time/iso_time.json");
  INFO("reference made with Python " << ref["versions"]["python"].get<std::string>()
                                     << ", pandas " << ref["versions"]["pandas"].get<std::string>());

  SUBCASE("dates: epoch days, ISO weekday and week (datetime.date.isocalendar)") {
    REQUIRE(ref["dates"].size() >= 20);
    for (const auto& d : ref["dates"]) {
      const std::string text = d["date"];
      const TimePoint t = time_of(text);
      CHECK_MESSAGE(t.kind == TimeKind::Date, text);
      CHECK_MESSAGE(t.value == d["epoch_days"].get<std::int64_t>() * kDay, text);
      const TimeAxis one(TimeKind::Date, Step::parse("P1D"), t.value, 1);
      CHECK_MESSAGE(one.day_of_week(0) == d["iso_weekday"].get<int>(), text);
      CHECK_MESSAGE(one.day_of_week(0) == d["isoweekday"].get<int>(), text);
      CHECK_MESSAGE(one.iso_week(0) == d["iso_week"].get<int>(), text);
      CHECK_MESSAGE(one.month(0) == d["month"].get<int>(), text);
      CHECK_MESSAGE(one.format(0) == text, text);
    }
  }

  SUBCASE("date-times: wall-clock seconds and offsets (datetime.fromisoformat)") {
    for (const auto& d : ref["date_times"]) {
      const std::string text = d["text"];
      const TimePoint t = time_of(text);
      CHECK_MESSAGE(t.kind == TimeKind::DateTime, text);
      CHECK_MESSAGE(t.value == d["wall_seconds"].get<std::int64_t>(), text);
      if (d["offset_minutes"].is_null()) {
        CHECK_MESSAGE(!t.offset_minutes.has_value(), text);
      } else {
        REQUIRE_MESSAGE(t.offset_minutes.has_value(), text);
        CHECK_MESSAGE(*t.offset_minutes == d["offset_minutes"].get<int>(), text);
      }
      const TimeAxis one(TimeKind::DateTime, Step::parse("PT1H"), t.value, 1, t.offset_minutes);
      CHECK_MESSAGE(one.hour_of_day(0) == d["hour"].get<int>(), text);
      CHECK_MESSAGE(one.day_of_week(0) == d["isoweekday"].get<int>(), text);
      CHECK_MESSAGE(one.month(0) == d["month"].get<int>(), text);
    }
  }

  SUBCASE("strings datetime.fromisoformat rejects are not times here either") {
    REQUIRE(ref["invalid"].size() >= 10);
    for (const auto& d : ref["invalid"]) {
      const std::string text = d;
      CHECK_MESSAGE(!parse_time(text).has_value(), text);
    }
  }

  SUBCASE("month arithmetic (pandas Timestamp + DateOffset(months=n))") {
    for (const auto& d : ref["month_shifts"]) {
      const std::string start = d["start"];
      const TimePoint t = time_of(start);
      const std::int64_t got =
          gapmark::advance(t.kind, t.value, Step::parse("P1M"), d["months"].get<std::int64_t>());
      CHECK_MESSAGE(got == d["result_wall_seconds"].get<std::int64_t>(), start);
      const std::string result = d["result"];
      CHECK_MESSAGE(got == time_of(result).value, start);
      if (t.kind == TimeKind::Date)
        CHECK_MESSAGE(gapmark::format_time(t.kind, got, std::nullopt) == result, start);
    }
  }

  SUBCASE("inferred steps match pandas.infer_freq; the axis reproduces every time") {
    REQUIRE(ref["axes"].size() >= 9);
    for (const auto& a : ref["axes"]) {
      const std::string name = a["name"];
      const std::vector<std::string> texts = a["times"];
      const TimeAxis axis = infer(texts);
      const std::string unit = a["unit"];
      const Step expected{unit == "months" ? Step::Unit::Months : Step::Unit::Seconds,
                          a["amount"].get<std::int64_t>()};
      CHECK_MESSAGE(axis.step() == expected, name << ": got " << axis.step().iso());
      REQUIRE(axis.size() == texts.size());
      for (std::size_t i = 0; i < texts.size(); ++i) {
        CHECK_MESSAGE(axis.at(i) == time_of(texts[i]).value, name << " point " << i);
        CHECK_MESSAGE(axis.format(i) == texts[i], name << " point " << i);
      }
    }
  }
}
