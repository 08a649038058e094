// Profiles of hand-built tables whose missing records, missing values,
// duplicates, out-of-order and off-grid rows are known by construction.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include "data_helpers.hpp"
#include "gapmark/data/completeness_svg.hpp"
#include "gapmark/data/profile.hpp"

using namespace gapmark;
using namespace gapmark::data;

namespace {

// 00:00..07:00 hourly. Records absent at 02, 05, 06; a duplicate at 01 (its
// first copy has a empty); b empty at 03; an off-grid, out-of-order 02:30.
const char* kWide =
    "time,a,b\n"
    "2026-03-01T00:00,1,5\n"
    "2026-03-01T01:00,,6\n"
    "2026-03-01T01:00,2,6\n"
    "2026-03-01T03:00,4,\n"
    "2026-03-01T02:30,9,9\n"
    "2026-03-01T04:00,5,7\n"
    "2026-03-01T07:00,8,8\n";

}  // namespace

TEST_CASE("profile: records, duplicates, order and grid of a wide table") {
  const DataProfile p = profile_data(data_test::raw(kWide));
  CHECK(p.step == Step{Step::Unit::Seconds, 3600});
  CHECK_FALSE(p.step_given);
  REQUIRE(p.groups.size() == 1);
  const GroupProfile& g = p.groups[0];
  CHECK(g.label == "all rows");
  CHECK(g.rows == 7);
  CHECK(g.grid.size() == 8);
  CHECK(g.grid.format(0) == "2026-03-01T00:00");
  CHECK(g.present == 5);
  CHECK(g.missing_records == 3);
  CHECK(g.duplicates == 1);
  CHECK(g.conflicting_duplicates == 1);
  CHECK(g.out_of_order == 1);
  CHECK(g.off_grid == 1);
}

TEST_CASE("profile: missing values and missing records are counted apart, gaps by length and make-up") {
  const DataProfile p = profile_data(data_test::raw(kWide));
  REQUIRE(p.series.size() == 2);
  const SeriesProfile& a = p.series[0];
  CHECK(a.label == "a");
  CHECK(a.expected == 8);
  CHECK(a.observed == 5);         // the duplicate at 01 supplies a's value
  CHECK(a.missing_values == 0);
  CHECK(a.missing_records == 3);
  REQUIRE(a.gaps.size() == 2);
  CHECK(a.gaps[0].length == 1);
  CHECK(a.gaps[0].count == 1);
  CHECK(a.gaps[0].records == 1);
  CHECK(a.gaps[1].length == 2);
  CHECK(a.gaps[1].records == 1);
  CHECK(a.longest_gap == 2);

  const SeriesProfile& b = p.series[1];
  CHECK(b.observed == 4);
  CHECK(b.missing_values == 1);
  CHECK(b.missing_records == 3);
  CHECK(b.missing() == 4);
  REQUIRE(b.gaps.size() == 1);     // 02-03 (record then value) and 05-06 (records)
  CHECK(b.gaps[0].length == 2);
  CHECK(b.gaps[0].count == 2);
  CHECK(b.gaps[0].mixed == 1);
  CHECK(b.gaps[0].records == 1);
  CHECK(b.states[2] == SlotState::MissingRecord);
  CHECK(b.states[3] == SlotState::MissingValue);
  CHECK(b.states[4] == SlotState::Present);
  CHECK(b.gap_count == 2);
}

TEST_CASE("profile: missingness by hour and weekday for an hourly step") {
  const DataProfile p = profile_data(data_test::raw(kWide));
  const SeriesProfile& a = p.series[0];
  REQUIRE(a.phases.size() == 2);
  CHECK(a.phases[0].unit == "hour");
  REQUIRE(a.phases[0].phases.size() == 8);
  std::size_t missing = 0;
  for (std::size_t k = 0; k < 8; ++k) {
    CHECK(a.phases[0].expected[k] == 1);
    missing += a.phases[0].missing[k];
    const int hour = a.phases[0].phases[k];
    CHECK(a.phases[0].missing[k] == ((hour == 2 || hour == 5 || hour == 6) ? 1u : 0u));
  }
  CHECK(missing == 3);
  CHECK(a.phases[1].unit == "weekday");
  CHECK(a.phases[1].phases == std::vector<int>{7});  // 2026-03-01 is a Sunday
}

TEST_CASE("profile: long layout, groups on their own spans, rows unsorted") {
  const char* text =
      "site,time,x\n"
      "B,2026-03-02,4\n"
      "A,2026-03-01,1\n"
      "A,2026-03-03,\n"
      "B,2026-03-05,5\n"
      "A,2026-03-02,2\n"
      "A,2026-03-05,3\n";
  RawReadOptions o;
  o.group_columns = {"site"};
  const DataProfile p = profile_data(data_test::raw(text, o));
  CHECK(p.step == Step{Step::Unit::Seconds, 86400});
  REQUIRE(p.groups.size() == 2);
  CHECK(p.groups[0].label == "site=B");  // order of first appearance
  CHECK(p.groups[0].grid.size() == 4);    // 02..05
  CHECK(p.groups[0].missing_records == 2);
  CHECK(p.groups[1].label == "site=A");
  CHECK(p.groups[1].grid.size() == 5);    // 01..05
  CHECK(p.groups[1].missing_records == 1);
  CHECK(p.groups[1].out_of_order == 1);   // 03 then 02
  REQUIRE(p.series.size() == 2);
  CHECK(p.series[1].label == "x[site=A]");
  CHECK(p.series[1].missing_values == 1);
  CHECK(p.series[1].missing_records == 1);
  CHECK(p.series[1].gaps.size() == 1);    // 03 (value) and 04 (record): one mixed gap of 2
  CHECK(p.series[1].gaps[0].mixed == 1);
  // daily steps: weekday and month phases
  REQUIRE(p.series[1].phases.size() == 2);
  CHECK(p.series[1].phases[0].unit == "weekday");
  CHECK(p.series[1].phases[1].unit == "month");
}

TEST_CASE("profile: calendar months inferred from month-ends, a skipped month is a missing record") {
  const char* text = "time,v\n2026-01-31,1\n2026-02-28,2\n2026-03-31,3\n2026-05-31,5\n";
  const DataProfile p = profile_data(data_test::raw(text));
  CHECK(p.step == Step{Step::Unit::Months, 1});
  CHECK(p.groups[0].grid.size() == 5);
  CHECK(p.groups[0].grid.format(3) == "2026-04-30");
  CHECK(p.groups[0].missing_records == 1);
  CHECK(p.groups[0].off_grid == 0);
}

TEST_CASE("profile: a given step; a step that does not fit the times is an error") {
  ProfileOptions o;
  o.step = Step{Step::Unit::Seconds, 1800};
  const DataProfile p = profile_data(data_test::raw(kWide), o);
  CHECK(p.step_given);
  CHECK(p.groups[0].grid.size() == 15);  // 00:00..07:00 by 30 minutes
  CHECK(p.groups[0].off_grid == 0);
  o.step = Step{Step::Unit::Index, 2};
  CHECK(data_test::error_of([&] { profile_data(data_test::raw(kWide), o); }).find("does not fit dated times") !=
        std::string::npos);
}

TEST_CASE("profile: text, JSON and picture carry the same counts") {
  const DataProfile p = profile_data(data_test::raw(kWide));
  const auto j = nlohmann::json::parse(profile_json(p));
  CHECK(j["groups"][0]["missing_records"] == 3);
  CHECK(j["groups"][0]["duplicates"] == 1);
  CHECK(j["series"][1]["missing_values"] == 1);
  CHECK(j["series"][1]["gap_lengths"][0]["count"] == 2);
  CHECK(j["series"][0]["missing_by_phase"]["hour"].size() == 8);
  const std::string text = profile_text(p);
  CHECK(text.find("missing records") != std::string::npos);
  CHECK(text.find("screening heuristic") != std::string::npos);
  const std::string svg = completeness_svg(p);
  CHECK(svg.rfind("<svg", 0) == 0);
  CHECK(svg.find("missing record (no row at that time)") != std::string::npos);
  CHECK(svg.find("url(#absent)") != std::string::npos);
  CHECK(svg.find("#f0b43c") != std::string::npos);  // b's missing value is drawn
}
