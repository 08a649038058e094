// regularize on hand-worked cases: the empty-bin policies, rows with only
// empty cells, calendar bins, layouts, and one-line errors.
#include <doctest/doctest.h>

#include "data_helpers.hpp"
#include "data/decimal_sum.hpp"
#include "gapmark/data/regularize.hpp"
#include "gapmark/data/regularize_report.hpp"

using namespace gapmark;
using namespace gapmark::data;

namespace {

const char* kEvents =
    "pen,time,feed_kg,oxygen\n"
    "A,2026-03-02T07:05:10,2.5,7.1\n"
    "A,2026-03-02T07:40:00,1.5,\n"
    "B,2026-03-02T07:20:00,3,6.0\n"
    "A,2026-03-02T09:59:59,,\n"       // rows but no values at 09
    "B,2026-03-02T10:00:00,1,6.5\n"
    "A,2026-03-02T10:30:00,4,7.3\n";

RegularizeOptions hourly() {
  RegularizeOptions o;
  o.step = Step::parse("PT1H");
  o.aggregation["feed_kg"] = Aggregation::Sum;
  o.empty["feed_kg"] = EmptyPolicy::Zero;
  return o;
}

RawReadOptions by_pen() {
  RawReadOptions r;
  r.group_columns = {"pen"};
  return r;
}

}  // namespace

TEST_CASE("regularize: zero for intervals without rows, missing for intervals with rows but no value") {
  const Panel p = regularize(data_test::raw(kEvents, by_pen()), hourly());
  REQUIRE(p.axes.size() == 2);
  CHECK(p.axes[0].format(0) == "2026-03-02T07:00");
  CHECK(p.axes[0].size() == 4);  // shared span 07..10
  // pen A: feed 07 = 4, 08 no rows -> 0, 09 rows but empty -> "", 10 = 4
  CHECK(p.cells[0][0] == std::vector<std::string>{"4", "0", "", "4"});
  // oxygen (mean, missing): 07 = 7.1 (one empty cell), 08 "", 09 "", 10 7.3
  CHECK(p.cells[0][1] == std::vector<std::string>{"7.1", "", "", "7.3"});
  CHECK(p.counts[0][0].empty_bins == 1);
  CHECK(p.counts[0][0].empty_value_bins == 1);
  CHECK(p.counts[0][1].partial == 1);
  // pen B over the shared span: 07 = 3, 08 0, 09 0, 10 = 1
  CHECK(p.cells[1][0] == std::vector<std::string>{"3", "0", "0", "1"});
}

TEST_CASE("regularize: own spans, long and wide layouts") {
  RegularizeOptions o = hourly();
  o.shared_span = false;
  const Panel own = regularize(data_test::raw(kEvents, by_pen()), o);
  CHECK(own.axes[1].size() == 4);  // B: 07..10
  CHECK(panel_csv(own, PanelLayout::Long).rfind("pen,time,feed_kg,oxygen\nA,2026-03-02T07:00,4,7.1\n", 0) == 0);
  // A's rows span 07:05..10:30, B's 07:20..10:00: both 07..10 here, so wide works
  const Panel shared = regularize(data_test::raw(kEvents, by_pen()), hourly());
  const std::string wide = panel_csv(shared, PanelLayout::Wide);
  CHECK(wide.rfind("time,feed_kg[pen=A],oxygen[pen=A],feed_kg[pen=B],oxygen[pen=B]\n2026-03-02T07:00,4,7.1,3,6\n", 0) == 0);

  const char* uneven = "pen,time,v\nA,2026-03-02T07:00,1\nB,2026-03-02T09:00,2\n";
  RegularizeOptions own_span;
  own_span.step = Step::parse("PT1H");
  own_span.shared_span = false;
  const Panel p = regularize(data_test::raw(uneven, by_pen()), own_span);
  CHECK(p.axes[0].size() == 1);
  CHECK(p.axes[1].format(0) == "2026-03-02T09:00");
  CHECK(data_test::error_of([&] { panel_csv(p, PanelLayout::Wide); }).find("use --span shared") != std::string::npos);
}

TEST_CASE("regularize: count, min, max and last keep what was written") {
  const char* text =
      "time,v\n"
      "2026-03-02T07:50,7.10\n"
      "2026-03-02T07:10,3.5\n"
      "2026-03-02T07:50,8.25\n"   // same time as the first row: later in the file, so last
      "2026-03-02T07:30,NA\n";
  const auto run = [&](Aggregation a) {
    RegularizeOptions o;
    o.step = Step::parse("PT1H");
    o.default_aggregation = a;
    return regularize(data_test::raw(text), o).cells[0][0][0];
  };
  CHECK(run(Aggregation::Count) == "3");
  CHECK(run(Aggregation::Min) == "3.5");
  CHECK(run(Aggregation::Max) == "8.25");
  CHECK(run(Aggregation::Last) == "8.25");
  CHECK(run(Aggregation::Sum) == "18.85");
  CHECK(run(Aggregation::Mean) == "6.283333333333334");
}

TEST_CASE("regularize: daily steps write dates; weeks start on Monday; months on the 1st") {
  const char* text = "time,n\n2026-01-31T23:00,1\n2026-02-01T01:00,2\n2026-03-15T12:00,4\n";
  RegularizeOptions o;
  o.default_aggregation = Aggregation::Sum;
  o.empty["n"] = EmptyPolicy::Zero;
  o.step = Step::parse("P1D");
  Panel p = regularize(data_test::raw(text), o);
  CHECK(p.axes[0].format(0) == "2026-01-31");
  CHECK(p.axes[0].size() == 44);
  o.step = Step::parse("P1W");
  p = regularize(data_test::raw(text), o);
  CHECK(p.axes[0].format(0) == "2026-01-26");  // Monday of ISO week 5
  CHECK(p.cells[0][0][0] == "3");              // Saturday 31st and Sunday 1st: one week
  o.step = Step::parse("P1M");
  p = regularize(data_test::raw(text), o);
  CHECK(p.axes[0].format(0) == "2026-01-01");
  CHECK(p.cells[0][0] == std::vector<std::string>{"1", "2", "4"});
}

TEST_CASE("regularize: naive local times across a daylight-saving change are taken as written") {
  // The autumn change repeats 02:00-03:00 local: its rows land in one bin.
  const char* text = "time,n\n2026-10-25T01:30,1\n2026-10-25T02:10,1\n2026-10-25T02:50,1\n2026-10-25T02:20,1\n"
                     "2026-10-25T03:10,1\n";
  RegularizeOptions o;
  o.step = Step::parse("PT1H");
  o.default_aggregation = Aggregation::Count;
  const Panel p = regularize(data_test::raw(text), o);
  CHECK(p.cells[0][0] == std::vector<std::string>{"1", "3", "1"});
}

TEST_CASE("regularize: times with offsets converted to one offset") {
  const char* text = "time,n\n2026-03-29T01:30+01:00,1\n2026-03-29T03:10+02:00,2\n";
  RawReadOptions r;
  CHECK(data_test::error_of([&] { data_test::raw(text, r); }) ==
        "data.csv:3: column 'time': mixed UTC offsets: +02:00 here, +01:00 on line 2 (give --utc-offset to convert every "
        "time to one offset)");
  r.utc_offset_minutes = 0;
  RegularizeOptions o;
  o.step = Step::parse("PT1H");
  o.default_aggregation = Aggregation::Sum;
  const Panel p = regularize(data_test::raw(text, r), o);
  CHECK(p.axes[0].format(0) == "2026-03-29T00:00+00:00");
  CHECK(p.cells[0][0] == std::vector<std::string>{"1", "2"});  // 00:30Z and 01:10Z
}

TEST_CASE("regularize: one-line errors naming the line and column") {
  RegularizeOptions o;
  o.step = Step::parse("PT1H");
  o.default_aggregation = Aggregation::Sum;
  CHECK(data_test::error_of([&] { regularize(data_test::raw("time,v\n2026-03-01T00:00,1\n2026-03-01T00:10,lots\n"), o); }) ==
        "data.csv:3: column 'v': aggregation 'sum' does not fit the value 'lots' (not a number); count it with --agg v=count, "
        "or leave the column out");
  CHECK(data_test::error_of([&] { data_test::raw("time,v\n2026-03-01T00:00,1\nyesterday,2\n"); }).rfind(
            "data.csv:3: column 'time': not a time: 'yesterday'", 0) == 0);
  CHECK(data_test::error_of([&] { data_test::raw("time,v\n2026-03-01T00:00,1\n2026-03-02,2\n"); }) ==
        "data.csv:3: column 'time': mixed time formats: a date here, a date-time on line 2");
  RawReadOptions r;
  r.group_columns = {"site"};
  CHECK(data_test::error_of([&] { data_test::raw("time,v\n2026-03-01T00:00,1\n", r); }) ==
        "data.csv:1: no group column 'site' (columns: time, v)");
  o.step = Step::parse("PT7H");
  CHECK(data_test::error_of([&] { regularize(data_test::raw("time,v\n2026-03-01T00:00,1\n"), o); }).find(
            "step PT7H does not divide a day") != std::string::npos);
  o.step = Step::parse("P5M");
  CHECK(data_test::error_of([&] { regularize(data_test::raw("time,v\n2026-03-01T00:00,1\n"), o); }).find(
            "does not divide a year") != std::string::npos);
  o.step = Step::parse("PT1H");
  CHECK(data_test::error_of([&] { regularize(data_test::raw("time,v\n2026-03-01,1\n"), o); }).find(
            "is finer than the data's dates") != std::string::npos);
  o.aggregation["w"] = Aggregation::Sum;
  CHECK(data_test::error_of([&] { regularize(data_test::raw("time,v\n2026-03-01T00:00,1\n"), o); }) ==
        "data.csv:1: an aggregation is given for 'w', which is not a value column (value columns: v)");
}

TEST_CASE("sums add the cells as written, exactly") {
  gapmark::data::DecimalSum s;
  s.add("2.73", 2.73);
  s.add("3.15", 3.15);
  CHECK(s.text() == "5.88");
  s.add("-0.880", -0.88);
  CHECK(s.text() == "5");
  gapmark::data::DecimalSum t;
  for (int i = 0; i < 3; ++i) t.add("0.1", 0.1);
  CHECK(t.text() == "0.3");
  CHECK(t.value() == 0.3);
  gapmark::data::DecimalSum e;
  e.add("1e3", 1000);
  e.add("0.5", 0.5);
  CHECK(e.text() == "1000.5");  // an exponent: floating point from there on
  gapmark::data::DecimalSum n;
  n.add("-0.25", -0.25);
  CHECK(n.text() == "-0.25");
}

TEST_CASE("regularize: choices per column with a default, and the report per variable") {
  RegularizeOptions o;
  o.step = Step::parse("PT1H");
  set_aggregations(o, {{"", "sum"}, {"oxygen", "max"}, {"oxygen", "mean"}}, "--agg");  // the later choice counts
  set_empty_policies(o, {{"", "zero"}, {"oxygen", "missing"}}, "--empty");
  CHECK(o.default_aggregation == Aggregation::Sum);
  CHECK(o.aggregation.at("oxygen") == Aggregation::Mean);
  const Panel p = regularize(data_test::raw(kEvents, by_pen()), o);
  CHECK(p.empty == std::vector<EmptyPolicy>{EmptyPolicy::Zero, EmptyPolicy::Missing});  // the default reaches feed_kg
  CHECK(p.cells[0][0] == std::vector<std::string>{"4", "0", "", "4"});
  CHECK_THROWS_WITH_AS(set_empty_policies(o, {{"feed_kg", "nothing"}}, "--empty"), doctest::Contains("--empty"),
                       InputError);

  // Hand-counted over both pens: feed_kg 8 intervals, A 09 has rows but no
  // value, 08 (A, B) and 09 (B) have no rows; oxygen likewise, and A 07 is
  // a mean over one empty cell.
  const RegularizeCounts feed = total_counts(p, 0);
  CHECK(feed.bins == 8);
  CHECK(feed.empty_bins == 3);
  CHECK(feed.empty_value_bins == 1);
  const std::string text = regularize_report(p, 6, o.step, "out.csv");
  CHECK(text.rfind("regularize: 6 rows -> 2 groups on a PT1H grid, written to out.csv\n", 0) == 0);
  CHECK(text.find("  oxygen (mean, empty intervals missing): 8 intervals, 4 with values, 3 without rows left empty, "
                  "1 with rows but no value (left empty), 1 aggregated over rows with some empty cells\n") !=
        std::string::npos);
  CHECK(text.find("feed_kg (sum, empty intervals zero)") != std::string::npos);
  CHECK(text.find("written as 0") != std::string::npos);
  CHECK(text.find("note:") == std::string::npos);  // a sum with zero for empty intervals needs no note

  set_empty_policies(o, {{"feed_kg", "missing"}}, "--empty");
  const Panel missing = regularize(data_test::raw(kEvents, by_pen()), o);
  CHECK(regularize_report(missing, 6, o.step, "out.csv")
            .find("  note: 'feed_kg' is a sum; if no row means nothing happened, give --empty feed_kg=zero\n") !=
        std::string::npos);
}
