// TrialStatus: one string per status in checkpoints and results.json, read
// back strictly; a scheme that cannot mask a series marks its trials
// mask-failed (nothing was tested), not failed (a method's fault).
#include <doctest/doctest.h>

#include <sstream>

#include "gapmark/error.hpp"
#include "gapmark/experiment/record.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/number_format.hpp"
#include "test_methods.hpp"

using namespace gapmark;

TEST_CASE("every trial status reads back from its own string; the JSON strings of the old statuses are kept") {
  CHECK(std::string(trial_status_name(TrialStatus::Ok)) == "ok");
  CHECK(std::string(trial_status_name(TrialStatus::Partial)) == "partial");
  CHECK(std::string(trial_status_name(TrialStatus::Failed)) == "failed");
  CHECK(std::string(trial_status_name(TrialStatus::MaskFailed)) == "mask-failed");
  for (auto s : {TrialStatus::Ok, TrialStatus::Partial, TrialStatus::Failed, TrialStatus::MaskFailed})
    CHECK(parse_trial_status(trial_status_name(s), "here") == s);
}

TEST_CASE("an unknown trial status is an input error naming where it was read") {
  for (const char* bad : {"", "OK", "fail", "ok ", "mask_failed", "unknown"}) {
    CAPTURE(bad);
    try {
      parse_trial_status(bad, "results.json: trials[3]");
      FAIL("accepted");
    } catch (const InputError& e) {
      CHECK(std::string(e.what()).find("results.json: trials[3]") != std::string::npos);
    }
  }
}

TEST_CASE("a trial record keeps its status through JSON") {
  TrialRecord t;
  t.series = "s";
  t.scheme = "random";
  t.method = "linear";
  t.status = TrialStatus::MaskFailed;
  t.reason = "mask: no gaps";
  const auto j = trial_to_json(t, {});
  CHECK(j["status"] == "mask-failed");
  CHECK(trial_from_json(j, {}, "t").status == TrialStatus::MaskFailed);
  auto bad = j;
  bad["status"] = "maybe";
  CHECK_THROWS_AS(trial_from_json(bad, {}, "t"), InputError);
}

TEST_CASE("replay on a series with no gaps to learn from: every trial of that condition is mask-failed") {
  std::ostringstream csv;
  csv << "day,v\n";
  for (int i = 0; i < 120; ++i) csv << 1000 + i << "," << format_double(5 + (i % 7)) << "\n";
  const auto path = testing::temp_file("status_no_gaps.csv", csv.str());
  const std::string spec = R"({"name": "t", "seed": 3, "replicates": 3, "data": [{"file": ")" + path.string() +
                           R"(", "columns": ["v"]}],
    "schemes": [{"name": "replay", "rates": [0.1]}, {"name": "random", "rates": [0.1]}],
    "methods": ["linear", "carry-forward"], "metrics": ["error"]})";
  const auto results = run_experiment(parse_spec(spec, "t.json", "."));
  std::size_t mask_failed = 0, ok = 0;
  for (const auto& t : results.trials) {
    CAPTURE(t.name());
    if (t.scheme.rfind("replay", 0) == 0) {
      CHECK(t.status == TrialStatus::MaskFailed);
      CHECK(t.reason.rfind("mask: ", 0) == 0);
      ++mask_failed;
    } else {
      CHECK(t.status == TrialStatus::Ok);
      ++ok;
    }
  }
  CHECK(mask_failed == 6);
  CHECK(ok == 6);
}
