// The typed parts of a results file (the run's context, the series, the
// timing) written and read back: the same values and the same JSON, members
// that are optional stay absent, and a bad field in a file from someone else
// is one line naming the file and the field's JSON pointer.
#include <doctest/doctest.h>

#include <cstdint>
#include <limits>
#include <string>

#include "gapmark/analysis/results_json.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/checkpoint.hpp"
#include "gapmark/experiment/results_io.hpp"

using namespace gapmark;
using nlohmann::json;

namespace {

ResultSet small_results() {
  ResultSet r;
  r.context = {.version = "0.1.0",
               .commit = "0123456789ab",
               .spec_name = "stored results (invented)",
               .spec = {{"name", "stored results (invented)"}, {"seed", 7}},
               .spec_sha256 = std::string(64, 'a'),
               .seed = std::numeric_limits<std::uint64_t>::max(),
               .replicates = 3,
               .holdout = 12,
               .inputs = {{"flow.csv", std::string(64, 'b')}, {"level.csv", std::string(64, 'c')}}};
  r.series = {{.label = "flow", .source = "flow.csv", .points = 48, .observed = 40, .step = "PT1H",
               .start = "2031-01-05T00:00", .period = 24, .units = "m3/s"},
              {.label = "level", .source = "level.csv", .points = 10, .observed = 10, .step = "P1D",
               .start = "2031-01-05", .period = 0, .units = ""}};
  r.columns = {{"rmse", "value", Direction::Lower, "root mean squared error"}};
  r.timing = {.wall_seconds = 1.25, .fill_seconds_by_method = std::map<std::string, double>{{"linear", 0.5}},
              .threads = 2u, .resumed_tasks = std::nullopt, .checkpoints = 1u};
  return r;
}

json stored(const ResultSet& r) { return results_to_json(r, summarize(r)); }

/// The message of the InputError that reading `j` throws (FAIL when none).
std::string read_error(const json& j) {
  try {
    (void)results_from_json(j, "bad.json");
  } catch (const InputError& e) {
    return e.what();
  }
  FAIL("the results were accepted");
  return "";
}

void check_names(const std::string& message, const std::string& pointer) {
  CAPTURE(message);
  CHECK(message.rfind("bad.json: " + pointer + ": ", 0) == 0);
  CHECK(message.find('\n') == std::string::npos);
}

}  // namespace

TEST_CASE("context, series and timing read back as written, and write the same JSON again") {
  const ResultSet r = small_results();
  const json j = stored(r);
  const ResultSet back = results_from_json(json::parse(j.dump()), "round trip");
  CHECK(back.context.seed == std::numeric_limits<std::uint64_t>::max());
  CHECK(back.context.replicates == 3);
  CHECK(back.context.holdout == 12);
  CHECK(back.context.inputs == r.context.inputs);
  CHECK(back.context.spec == r.context.spec);
  REQUIRE(back.series.size() == 2);
  CHECK(back.series[0].units == "m3/s");
  CHECK(back.series[1].period == 0);
  CHECK(back.timing.threads == 2u);
  CHECK_FALSE(back.timing.resumed_tasks.has_value());
  CHECK(back.timing.fill_seconds_by_method->at("linear") == 0.5);
  CHECK(stored(back).dump(1) == j.dump(1));
  // "units" only when given; a timing without any fact is null; the seed as an unsigned number.
  CHECK(j.at("series").at(0).contains("units"));
  CHECK_FALSE(j.at("series").at(1).contains("units"));
  CHECK(j.at("context").at("seed").dump() == "18446744073709551615");
  CHECK_FALSE(j.at("timing").contains("resumed_tasks"));
  ResultSet untimed = r;
  untimed.timing = {};
  CHECK(stored(untimed).at("timing").is_null());
  CHECK(results_from_json(stored(untimed), "untimed").timing.empty());
}

TEST_CASE("a bad context field is an input error naming the file and its JSON pointer") {
  const json good = stored(small_results());
  json j = good;
  j["context"]["seed"] = "seven";
  check_names(read_error(j), "/context/seed");
  j = good;
  j["context"]["replicates"] = -3;
  check_names(read_error(j), "/context/replicates");
  j = good;
  j["context"].erase("spec_sha256");
  check_names(read_error(j), "/context/spec_sha256");
  j = good;
  j["context"]["inputs"][1]["sha256"] = 5;
  check_names(read_error(j), "/context/inputs/1/sha256");
  j = good;
  j["context"] = "the context";
  check_names(read_error(j), "/context");
}

TEST_CASE("a bad series field is an input error naming the file and its JSON pointer") {
  const json good = stored(small_results());
  json j = good;
  j["series"][0]["points"] = -48;
  check_names(read_error(j), "/series/0/points");
  j = good;
  j["series"][1]["points"] = "ten";
  check_names(read_error(j), "/series/1/points");
  j = good;
  j["series"][1]["period"] = 2.5;
  check_names(read_error(j), "/series/1/period");
  j = good;
  j["series"][0]["observed"] = 49;  // more than the 48 points
  check_names(read_error(j), "/series/0/observed");
  j = good;
  j["series"][0].erase("label");
  check_names(read_error(j), "/series/0/label");
}

TEST_CASE("a bad timing field is an input error naming the file and its JSON pointer") {
  const json good = stored(small_results());
  json j = good;
  j["timing"]["threads"] = -1;
  check_names(read_error(j), "/timing/threads");
  j = good;
  j["timing"]["fill_seconds_by_method"]["a/b"] = "fast";
  check_names(read_error(j), "/timing/fill_seconds_by_method/a~1b");
  j = good;
  j["timing"]["wall_seconds"] = nullptr;
  check_names(read_error(j), "/timing/wall_seconds");
  j = good;
  j.erase("timing");  // absent: nothing was measured
  CHECK(results_from_json(j, "no timing").timing.empty());
}

TEST_CASE("a checkpoint header's frame is read with the same checks, naming the file, line and pointer") {
  const ResultSet r = small_results();
  json header = {{"frame",
                  {{"context", context_to_json(r.context)},
                   {"series", series_to_json(r.series)},
                   {"columns", columns_to_json(r.columns)},
                   {"rank_by", "rmse"},
                   {"alpha", 0.05}}}};
  const ResultSet frame = stored_frame(header, "trials.jsonl:1");
  CHECK(frame.context.inputs == r.context.inputs);
  CHECK(frame.series.size() == 2);
  CHECK(frame.equivalence == kDefaultEquivalence);  // absent before the margin existed
  header["frame"]["context"]["holdout"] = "none";
  try {
    (void)stored_frame(header, "trials.jsonl:1");
    FAIL("accepted");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()).rfind("trials.jsonl:1: /frame/context/holdout: ", 0) == 0);
  }
}
