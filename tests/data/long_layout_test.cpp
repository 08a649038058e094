// Regular long-layout tables: series per group × variable, the wide view
// used by fill and mask with --group and its way back, and experiment specs
// with "groups".
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <unistd.h>

#include "data_helpers.hpp"
#include "gapmark/long_layout.hpp"
#include "gapmark/experiment/runner.hpp"

using namespace gapmark;

namespace {

const char* kLong =
    "site,time,a,b\n"
    "N,2026-03-01T00:00,1,10\n"
    "N,2026-03-01T01:00,,11\n"
    "N,2026-03-01T02:00,3,12\n"
    "S,2026-03-01T01:00,5,50\n"
    "S,2026-03-01T02:00,6,\n"
    "S,2026-03-01T03:00,7,70\n";

LongReadOptions by_site() {
  LongReadOptions o;
  o.group_columns = {"site"};
  return o;
}

}  // namespace

TEST_CASE("long layout: one series per group and variable, each on its own span") {
  const auto series = read_long_series(parse_csv(kLong, "panel.csv"), by_site());
  REQUIRE(series.size() == 4);
  CHECK(series[0].label() == "a[site=N]");
  CHECK(series[1].label() == "b[site=N]");
  CHECK(series[2].label() == "a[site=S]");
  CHECK(series[0].axis.format(0) == "2026-03-01T00:00");
  CHECK(series[2].axis.format(0) == "2026-03-01T01:00");
  CHECK(series[2].axis.size() == 3);
  CHECK(std::isnan(series[0].values[1]));
  CHECK(series[3].values[0] == 50);
  CHECK(series[0].period == 24);
}

TEST_CASE("long layout: a skipped time, a duplicate or a text cell is a one-line error") {
  CHECK(data_test::error_of([] {
          read_long_series(parse_csv("site,time,a\nN,2026-03-01T00:00,1\nN,2026-03-01T01:00,2\nN,2026-03-01T03:00,3\n", "p.csv"),
                           by_site());
        }).rfind("p.csv:4: irregular time step: expected 2026-03-01T02:00 after 2026-03-01T01:00, found 2026-03-01T03:00", 0) == 0);
  CHECK(data_test::error_of([] {
          read_long_series(parse_csv("site,time,a\nN,2026-03-01T00:00,1\nN,2026-03-01T00:00,2\n", "p.csv"), by_site());
        }) == "p.csv:3: duplicate time 2026-03-01T00:00");
  CHECK(data_test::error_of([] {
          read_long_series(parse_csv("site,time,a\nN,2026-03-01T00:00,1\nN,2026-03-01T01:00,many\n", "p.csv"), by_site());
        }) == "p.csv:3: column 'a': not a number: 'many'");
}

TEST_CASE("long layout side by side and back") {
  const LongAsWide w = long_to_wide(parse_csv(kLong, "panel.csv"), by_site());
  CHECK(w.table.columns == std::vector<std::string>{"a[site=N]", "b[site=N]", "a[site=S]", "b[site=S]"});
  CHECK(w.table.axis.size() == 4);  // 00..03
  CHECK(std::isnan(w.table.values[2][0]));  // S starts at 01
  CHECK(w.table.values[2][1] == 5);
  CHECK(w.spans[1] == std::pair<std::size_t, std::size_t>{1, 4});
  // Writing back: each group over its own span; extra columns per variable.
  WideTable t = w.table;
  t.cells[0][1] = "2";
  const std::vector<ExtraColumn> extra{{"a[site=N]_filled", {"0", "1", "0", "0"}}, {"a[site=S]_filled", {"", "0", "0", "0"}}};
  CHECK(long_csv(w, t, extra) ==
        "site,time,a,b,a_filled\n"
        "N,2026-03-01T00:00,1,10,0\n"
        "N,2026-03-01T01:00,2,11,1\n"
        "N,2026-03-01T02:00,3,12,0\n"
        "S,2026-03-01T01:00,5,50,0\n"
        "S,2026-03-01T02:00,6,,0\n"
        "S,2026-03-01T03:00,7,70,0\n");
}

TEST_CASE("a spec's data source with groups gives labelled series; a missing group column names the field") {
  namespace fs = std::filesystem;
  const fs::path dir = fs::temp_directory_path() / ("gapmark_groups_" + std::to_string(::getpid()));
  fs::create_directories(dir);
  std::ofstream(dir / "panel.csv") << kLong;
  const std::string spec = R"({"data": [{"file": "panel.csv", "groups": ["site"], "columns": ["b"]}],
    "schemes": [{"name": "random", "rates": [0.2]}], "methods": ["linear"]})";
  const LoadedData data = load_data(parse_spec(spec, "spec.json", dir));
  REQUIRE(data.series.size() == 2);
  CHECK(data.series[0].label() == "b[site=N]");
  CHECK(data.series[1].label() == "b[site=S]");
  CHECK(data.series[1].groups == std::vector<std::pair<std::string, std::string>>{{"site", "S"}});
  const std::string bad = R"({"data": [{"file": "panel.csv", "groups": ["pen"]}],
    "schemes": [{"name": "random", "rates": [0.2]}], "methods": ["linear"]})";
  CHECK(data_test::error_of([&] { load_data(parse_spec(bad, "spec.json", dir)); }) ==
        "spec.json: /data/0/groups/0: no column 'pen' in " + (dir / "panel.csv").string());
  CHECK(data_test::error_of([&] {
          parse_spec(R"({"data": [{"file": "panel.csv", "groups": "site"}], "schemes": [{"name": "random", "rates": [0.2]}],
                        "methods": ["linear"]})", "spec.json", dir);
        }) == "spec.json: /data/0/groups: expected a non-empty array");
  fs::remove_all(dir);
}
