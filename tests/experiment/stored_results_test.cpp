// The typed parts of a results file (the run's context, the series, the
// timing, the example windows, the ranking metric, the warnings) written and read back: the same values and the same JSON, members
// that are optional stay absent, and a bad field in a file from someone else
// is one line naming the file and the field's JSON pointer.
#include <doctest/doctest.h>

#include <cmath>
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

namespace {

/// Example windows with every kind of entry: a window with a complete, a
/// partial, a failed and a not-run fill, and a series with a note instead.
ExampleWindows small_examples() {
  const double nan = std::nan("");
  ExampleWindow w;
  w.series = "flow";
  w.scheme = "random";
  w.rate = 0.25;
  w.start = 4;
  w.length = 3;
  w.time_first = "2031-01-05T04:00";
  w.time_last = "2031-01-05T06:00";
  w.step = "PT1H";
  w.truth = {1.5, nan, 2.5};
  w.mask = {0, 0, 1};
  w.methods = {{.method = "linear", .rank = 1, .status = TrialStatus::Ok, .reason = {}, .filled = {nan, nan, 2.0}},
               {.method = "mean", .rank = 2, .status = TrialStatus::Partial, .reason = {}, .filled = {nan, nan, nan}},
               {.method = "arima", .rank = 3, .status = TrialStatus::Failed, .reason = "no fit", .filled = {}},
               {.method = "external", .rank = 4, .status = std::nullopt, .reason = "not started", .filled = {}}};
  w.lags = 2;
  w.acf_truth = {0.5, nan};
  w.acf_methods = {{"linear", {0.4, 0.1}}};
  ExampleWindow noted;
  noted.series = "level";
  noted.scheme = "random";
  noted.rate = 0.25;
  noted.note = "no summary for this cell";
  return {.window = 3, .top = 4, .series = {w, noted}};
}

}  // namespace

TEST_CASE("example windows read back as written and write the same JSON again") {
  ResultSet r = small_results();
  r.examples = small_examples();
  const json j = stored(r);
  const json& ex = j.at("examples").at("series");
  CHECK(ex.at(0).at("methods").at(0).at("status") == "ok");
  CHECK_FALSE(ex.at(0).at("methods").at(0).contains("reason"));
  CHECK(ex.at(0).at("methods").at(2).at("filled").is_null());
  CHECK(ex.at(0).at("methods").at(3).at("status") == "not run");
  CHECK(ex.at(0).at("mask").dump() == "[0,0,1]");
  CHECK(ex.at(1).at("note") == "no summary for this cell");
  CHECK_FALSE(ex.at(1).contains("truth"));
  const ResultSet back = results_from_json(json::parse(j.dump()), "round trip");
  REQUIRE(back.examples.has_value());
  REQUIRE(back.examples->series.size() == 2);
  const ExampleWindow& w = back.examples->series[0];
  CHECK(w.methods[1].status == TrialStatus::Partial);
  CHECK_FALSE(w.methods[3].status.has_value());
  CHECK(w.methods[3].reason == "not started");
  CHECK(std::isnan(w.truth[1]));
  CHECK(back.examples->find("level")->note == "no summary for this cell");
  CHECK(back.examples->find("nowhere") == nullptr);
  CHECK(stored(back).dump(1) == j.dump(1));
  r.examples.reset();  // none made: no "examples" member at all
  CHECK_FALSE(stored(r).contains("examples"));
  CHECK_FALSE(results_from_json(stored(r), "none").examples.has_value());
}

TEST_CASE("a bad example window field is an input error naming the file and its JSON pointer") {
  ResultSet r = small_results();
  r.examples = small_examples();
  const json good = stored(r);
  json j = good;
  j["examples"]["series"][0].erase("truth");
  check_names(read_error(j), "/examples/series/0/truth");
  j = good;
  j["examples"]["series"][0]["mask"][1] = 2;
  check_names(read_error(j), "/examples/series/0/mask");
  j = good;
  j["examples"]["series"][0]["methods"][0]["status"] = "fine";
  check_names(read_error(j), "/examples/series/0/methods/0/status");
  j = good;
  j["examples"]["series"][0]["methods"][1]["filled"] = json::array({1.0});
  check_names(read_error(j), "/examples/series/0/methods/1/filled");
  j = good;
  j["examples"]["series"][0]["acf"]["methods"][0].erase("values");
  check_names(read_error(j), "/examples/series/0/acf/methods/0/values");
  j = good;
  j["examples"]["series"][0]["length"] = 4;  // the truth holds 3 values
  check_names(read_error(j), "/examples/series/0/truth");
  j = good;
  j["examples"]["series"][1]["rate"] = "a quarter";
  check_names(read_error(j), "/examples/series/1/rate");
}

TEST_CASE("a bad ranking metric, trials array or warning is an input error naming the file and its JSON pointer") {
  ResultSet r = small_results();
  r.warnings.push_back({"few-masked-points", "flow", "only 3 points were masked", "raise the rate"});
  const json good = stored(r);
  REQUIRE(results_from_json(good, "good.json").warnings.size() == r.warnings.size());
  json j = good;
  j["rank_by"] = 3;
  check_names(read_error(j), "/rank_by");
  j = good;
  j["trials"] = json::object();
  check_names(read_error(j), "/trials");
  j = good;
  j["warnings"][0].erase("hint");
  check_names(read_error(j), "/warnings/0/hint");
  j = good;
  j["warnings"][0]["code"] = json::array();
  check_names(read_error(j), "/warnings/0/code");
}
