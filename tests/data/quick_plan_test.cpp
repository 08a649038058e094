// The one-command answer: kinds, default methods, the planned spec (it must
// parse).
#include <doctest/doctest.h>

#include <cmath>

#include "data_helpers.hpp"
#include "gapmark/data/quick_plan.hpp"
#include "gapmark/data/quick_risks.hpp"
#include "gapmark/data/quick_setup.hpp"
#include "gapmark/experiment/spec.hpp"

using namespace gapmark;
using namespace gapmark::data;

TEST_CASE("kind guesses: count only from the data's own structure, never from whole numbers alone") {
  CHECK(guess_kind(std::vector<double>{0, 0, 3, 0, 1, 0, 2, 0}).kind == VariableKind::Count);
  CHECK(guess_kind(std::vector<double>{0, 0, 2.5, 0, 0, 3.1}).kind == VariableKind::Count);
  // Whole numbers without zeros (a concentration in whole ppb): unknown, and the reason says why.
  const KindGuess ozone = guess_kind(std::vector<double>{41, 36, 12, 18, 28, 23, 19, 8, 7, 16});
  CHECK(ozone.kind == VariableKind::Unknown);
  CHECK(ozone.reason.find("whole numbers alone do not make a count") != std::string::npos);
  // 20% zeros is not enough; event rows are.
  CHECK(guess_kind(std::vector<double>{0, 3, 4, 5, 6, 0, 7, 8, 9, 1}).kind == VariableKind::Unknown);
  CHECK(guess_kind(std::vector<double>{0, 3, 4, 5, 6, 0, 7, 8, 9, 1}, 4).kind == VariableKind::Count);
  // Negative values are never a count.
  CHECK(guess_kind(std::vector<double>{0, 0, 0, -1, 0, 2}).kind == VariableKind::Unknown);
  std::vector<double> smooth;
  for (int i = 0; i < 200; ++i) smooth.push_back(5.5 + std::sin(i * 0.1));
  CHECK(guess_kind(smooth).kind == VariableKind::Unknown);
  CHECK(data_test::error_of([] { parse_kind("rate", "--kind"); }).rfind("--kind: unknown kind 'rate'", 0) == 0);
}

TEST_CASE("the same candidates for every kind; zero for counts, seasonal-mean with a period, low-rank with siblings") {
  const std::vector<std::string> core = {"mean", "carry-forward", "linear", "pchip", "kalman:model=level"};
  CHECK(candidate_methods(false, false, false) == core);
  const auto count = candidate_methods(true, true, false);
  CHECK(count.front() == "zero");
  CHECK(std::find(count.begin(), count.end(), "seasonal-mean") != count.end());
  const auto with_siblings = candidate_methods(false, false, true);
  CHECK(std::find(with_siblings.begin(), with_siblings.end(), "low-rank") != with_siblings.end());
  CHECK(std::find(with_siblings.begin(), with_siblings.end(), "zero") == with_siblings.end());
  CHECK(kind_caution(VariableKind::Count, "feed_kg").find("--empty feed_kg=zero") != std::string::npos);
  CHECK(kind_caution(VariableKind::Level, "salinity").find("not a zero") != std::string::npos);
  const std::string unknown = kind_caution(VariableKind::Unknown, "ozone");
  CHECK(unknown.find("never as zero") != std::string::npos);
  CHECK(unknown.find("--kind count") != std::string::npos);
  CHECK(unknown.find("=zero") == std::string::npos);
}

TEST_CASE("the plan: masks at the observed missing share, clamped, and a spec that parses") {
  // 48 hourly points, 6 missing in 2 interior gaps (lengths 2 and 4): 12.5%.
  std::string text = "time,x\n";
  for (int h = 0; h < 48; ++h) {
    char line[64];
    const bool gap = (h >= 10 && h < 12) || (h >= 30 && h < 34);
    std::snprintf(line, sizeof line, "2026-03-%02dT%02d:00,%s\n", 1 + h / 24, h % 24, gap ? "" : "1.5");
    text += line;
  }
  const DataProfile profile = profile_data(data_test::raw(text));
  QuickPlanInput input;
  input.data_file = "x.csv";
  input.column = "x";
  input.kind = VariableKind::Smooth;
  QuickPlan plan = plan_quick(profile, input);
  CHECK(std::find(plan.methods.begin(), plan.methods.end(), "seasonal-mean") != plan.methods.end());
  CHECK(plan.observed_missing == doctest::Approx(0.125));
  CHECK(plan.mask_rate == doctest::Approx(0.125));
  CHECK(plan.replay);
  CHECK(plan.mean_gap == doctest::Approx(3.0));
  CHECK(plan.period == 24);
  CHECK(plan.holdout == 9);  // two periods, at most a fifth of 48
  CHECK(plan.spec["schemes"][0]["name"] == "replay");
  CHECK(plan.spec["schemes"][1]["length_mean"] == 3.0);
  CHECK(plan.spec["schemes"][2]["rates"][0] == 0.125);
  const ExperimentSpec spec = parse_spec(plan.spec.dump(), "spec.json", ".");
  CHECK(spec.schemes.size() == 3);
  CHECK(spec.methods.size() == plan.methods.size());

  // No gaps: no replay, the rate clamped up to 0.05.
  const DataProfile full = profile_data(data_test::raw("time,x\n1,1\n2,2\n3,3\n4,4\n"));
  input.kind = VariableKind::Count;
  plan = plan_quick(full, input);
  CHECK_FALSE(plan.replay);
  CHECK(plan.mask_rate == 0.05);
  CHECK(plan.spec["schemes"].size() == 2);

  // A given period and siblings reach the spec.
  input.period = 3;
  input.siblings = {"y"};
  plan = plan_quick(full, input);
  CHECK(plan.period == 3);
  CHECK(plan.spec["data"][0]["period"] == 3);
  CHECK(plan.spec["data"][0]["columns"] == nlohmann::json::array({"x", "y"}));
  CHECK(std::find(plan.methods.begin(), plan.methods.end(), "low-rank") != plan.methods.end());
}

// R's airquality (reference/airquality/export_airquality.R): ozone in whole
// ppb with 37 of 153 days missing, 21 of them in June 1973.
TEST_CASE("quick's risks on airquality: the June cluster, the replicates, fills outside the observed range") {
  QuickRequest request;
  request.input = std::string(GAPMARK_SOURCE_DIR) + "/reference/airquality/airquality.csv";
  request.column = "ozone";
  QuickSetup setup = prepare_quick(request);
  CHECK(setup.kind == VariableKind::Unknown);
  CHECK(setup.siblings == std::vector<std::string>{"solar_r", "wind", "temp"});
  CHECK(std::find(setup.plan.methods.begin(), setup.plan.methods.end(), "zero") == setup.plan.methods.end());

  const auto clusters = gap_clusters(setup);
  REQUIRE(clusters.size() == 1);
  CHECK(clusters[0].window == "1973-06");
  CHECK(clusters[0].missing == 21);
  CHECK(clusters[0].points == 30);

  // Exact signed-rank test: smallest p = 2 / 2^n; Holm over 6 comparisons needs 6 * 2 / 2^n < 0.05: n = 8.
  CHECK(fewest_replicates(7, 0.05) == 8);
  CHECK(fewest_replicates(2, 0.05) == 6);

  // A natural spline through ozone's observed days swings outside 1..168; linear cannot.
  setup.plan.methods = {"linear", "natural-spline", "natural-spline:bounds=1,168"};
  double low = 0, high = 0;
  const auto outside = fills_out_of_range(setup, low, high);
  CHECK(low == 1);
  CHECK(high == 168);
  REQUIRE(outside.size() == 1);
  CHECK(outside[0].method == "natural-spline");
  CHECK((outside[0].low < 1 || outside[0].high > 168));
}
