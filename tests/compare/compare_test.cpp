// `gapmark compare` as a library: a deliberately degraded method must be
// named as a regression, an identical rerun must say "no change", and the
// paired test must agree with scipy.stats.wilcoxon on stored values.
#include <doctest/doctest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <fstream>

#include "../reference_json.hpp"
#include "gapmark/compare/compare.hpp"
#include "gapmark/error.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/fill/method.hpp"

using namespace gapmark;

namespace {

// A test-only method: linear interpolation plus a bias set by the test, so a
// baseline and a degraded run share the method's label.
std::atomic<double> g_bias{0.0};

class BiasedLinear final : public FillMethod {
public:
  FillResult fill(const FillRequest& request) const override {
    static const auto linear = MethodRegistry::global().bind(CallSpec::parse("linear", "test"), "test");
    FillResult r = linear.impl->fill(request);
    for (std::size_t i = 0; i < r.values.size(); ++i)
      if (std::isnan(request.values[i]) && std::isfinite(r.values[i])) r.values[i] += g_bias.load();
    return r;
  }
};

const Registration<FillMethod> biased_registration{{
    .name = "test-biased-linear",
    .summary = "test only: linear interpolation plus a bias set by the test",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<BiasedLinear>(); },
    .hidden = true,
}};

ExperimentSpec regression_spec_with_biased_method() {
  const std::string dir = std::string(GAPMARK_SOURCE_DIR) + "/experiments/regression";
  std::ifstream in(dir + "/regression.json");
  REQUIRE(in);
  nlohmann::json j = nlohmann::json::parse(in);
  j["methods"].push_back("test-biased-linear");
  return parse_spec(j.dump(1), "regression.json (test variant)", dir);
}

ResultSet run_with_bias(const ExperimentSpec& spec, double bias) {
  g_bias = bias;
  RunOptions options;
  options.threads = 2;
  return run_experiment(spec, options);
}

nlohmann::json load_cases() {
  return gapmark::test::reference_json("compare/wilcoxon_cases.json");
}

/// One cell, one metric column, trials from per-replicate values; the
/// current trials are stored in reverse replicate order so that pairing by
/// position would be wrong.
ResultSet one_cell(const std::vector<double>& values, Direction direction, bool reversed) {
  ResultSet r;
  r.columns = {{"m", "value", direction, "a metric"}};
  r.rank_by = "m";  // the ranking metric is compared without a tolerance given
  r.context.seed = 1;
  for (std::size_t i = 0; i < values.size(); ++i) {
    const std::size_t k = reversed ? values.size() - 1 - i : i;
    TrialRecord t;
    t.series = "s";
    t.scheme = "random";
    t.rate = 0.1;
    t.replicate = static_cast<int>(k);
    t.method = "linear";
    t.status = gapmark::TrialStatus::Ok;
    t.metrics = {values[k]};
    r.trials.push_back(t);
  }
  return r;
}

}  // namespace

TEST_CASE("a method made worse is named as a regression; the others are unchanged") {
  const ExperimentSpec spec = regression_spec_with_biased_method();
  const ResultSet baseline = run_with_bias(spec, 0.0);
  const ResultSet degraded = run_with_bias(spec, 2.0);
  const Comparison c = compare_results(baseline, degraded);
  CHECK_FALSE(c.no_change);
  // 2 series x 3 conditions, each with the biased method regressed.
  REQUIRE(c.regressed.size() == 6);
  for (const auto& name : c.regressed) CHECK(name.rfind("test-biased-linear/", 0) == 0);
  for (const auto& cell : c.cells) {
    if (cell.method != "test-biased-linear") {
      for (const auto& m : cell.metrics) CHECK(m.verdict == Verdict::Same);
      continue;
    }
    const auto rmse = std::find_if(cell.metrics.begin(), cell.metrics.end(), [](auto& m) { return m.metric == "rmse"; });
    REQUIRE(rmse != cell.metrics.end());
    CHECK(rmse->verdict == Verdict::Regressed);
    CHECK(rmse->pairs == 8);
    CHECK(rmse->tested);
    // Every replicate got worse: the exact two-sided p for n = 8 is 2 / 2^8.
    CHECK(rmse->p == doctest::Approx(2.0 / 256.0));
    CHECK(rmse->change > 0);
  }
  const std::string text = comparison_text(c);
  CHECK(text.find("REGRESSION in 6 of") != std::string::npos);
  CHECK(text.find("test-biased-linear/chamber_humidity_pct/random@0.1") != std::string::npos);

  SUBCASE("the summary comes first, then the worst cells, with Holm's correction said") {
    const std::size_t summary = text.find("REGRESSION in 6 of");
    const std::size_t worst = text.find("Worst ");
    REQUIRE(worst != std::string::npos);
    CHECK(summary < worst);
    CHECK(text.find("Holm-corrected over the 6 tests made") != std::string::npos);
    CHECK(text.find("regressed, 0 worse beyond tolerance but not significant") != std::string::npos);
    // One row per cell by default: the table holds at most the 6 changed cells.
    const std::string limited = comparison_text(c, 2);
    CHECK(limited.find("Worst 2 cells") != std::string::npos);
    CHECK(limited.find("(4 more changed cells not shown; --all prints every change)") != std::string::npos);
    for (const auto& cell : c.cells)
      for (const auto& m : cell.metrics)
        if (m.tested) CHECK(m.p_holm == doctest::Approx(6 * 2.0 / 256.0));
  }
  SUBCASE("another seed alone is no regression, even with every metric watched") {
    ExperimentSpec other = spec;
    nlohmann::json j = spec.json;
    j["seed"] = 27182;
    other = parse_spec(j.dump(1), "regression.json (other seed)", spec.base_dir);
    const ResultSet reseeded = run_with_bias(other, 0.0);
    for (const char* tolerance : {"", "*=0%"}) {
      CAPTURE(tolerance);
      const Comparison seed = compare_results(baseline, reseeded, parse_tolerance_text(tolerance, "t"));
      CHECK_FALSE(seed.same_seed);
      CHECK(seed.regressed.empty());
      CHECK_FALSE(seed.no_change);
    }
  }
  SUBCASE("the same change the other way is an improvement, not a regression") {
    const Comparison back = compare_results(degraded, baseline);
    CHECK(back.regressed.empty());
    CHECK_FALSE(back.no_change);
  }
  SUBCASE("a wide enough tolerance accepts it") {
    const Comparison loose = compare_results(baseline, degraded, parse_tolerance_text("*=1e9%", "test"));
    CHECK(loose.regressed.empty());
  }
  SUBCASE("an identical rerun is no change") {
    const ResultSet again = run_with_bias(spec, 0.0);
    const Comparison same = compare_results(baseline, again);
    CHECK(same.no_change);
    CHECK(same.regressed.empty());
    CHECK(comparison_text(same).find("no change") != std::string::npos);
  }
  SUBCASE("timing is ignored and the comparison survives a round trip through results.json") {
    ResultSet copy = results_from_json(nlohmann::json::parse(results_to_json(baseline, summarize(baseline)).dump()),
                                       "copy");
    copy.timing.wall_seconds = 12345.0;
    CHECK(compare_results(baseline, copy).no_change);
  }
}

TEST_CASE("cells and metrics present in one file only are listed, not dropped") {
  const std::vector<double> v{1, 2, 3, 4, 5, 6};
  ResultSet a = one_cell(v, Direction::Lower, false);  // linear (shared) and mean
  ResultSet b = one_cell(v, Direction::Lower, false);  // linear (shared) and pchip
  for (std::size_t i = 0; i < v.size(); ++i) {
    a.trials.push_back(a.trials[i]);
    a.trials.back().method = "mean";
    b.trials.push_back(b.trials[i]);
    b.trials.back().method = "pchip";
  }
  const Comparison c = compare_results(a, b);
  CHECK_FALSE(c.no_change);
  CHECK(c.cells.size() == 1);
  CHECK(c.only_in_baseline == std::vector<std::string>{"mean/s/random@0.1"});
  CHECK(c.only_in_current == std::vector<std::string>{"pchip/s/random@0.1"});
  CHECK(c.regressed.empty());
}

TEST_CASE("files that share no cell are refused, saying what differs") {
  const std::vector<double> v{1, 2, 3, 4, 5, 6};
  ResultSet a = one_cell(v, Direction::Lower, false);
  ResultSet b = one_cell(v, Direction::Lower, false);
  a.context.spec_sha256 = "aaaaaaaaaaaaaaaa";
  b.context.spec_sha256 = "bbbbbbbbbbbbbbbb";
  for (auto& t : b.trials) t.method = "pchip", t.series = "other";
  CHECK_THROWS_WITH_AS(compare_results(a, b, {}, "base.json", "cur.json"),
                       "cur.json: no cell in common with base.json, nothing to compare; spec SHA-256 aaaaaaaaaaaa vs "
                       "bbbbbbbbbbbb; series s vs other; methods linear vs pchip (compare two runs of the same spec)",
                       InputError);
}

TEST_CASE("only the ranking metric and the metrics given a tolerance are compared") {
  ResultSet a = one_cell({1, 2, 3, 4, 5, 6, 7}, Direction::Lower, false);
  a.columns.push_back({"extra", "value", Direction::Lower, "another metric"});
  for (auto& t : a.trials) t.metrics.push_back(1.0);
  ResultSet b = a;
  for (auto& t : b.trials) t.metrics[1] = 5.0;  // much worse, but nobody watches it
  const Comparison quiet = compare_results(a, b);
  CHECK(quiet.regressed.empty());
  CHECK(quiet.compared_metrics == std::vector<std::string>{"m"});
  CHECK(quiet.uncompared_metrics == std::vector<std::string>{"extra"});
  CHECK(comparison_text(quiet).find("not compared (no tolerance given") != std::string::npos);
  const Comparison watched = compare_results(a, b, parse_tolerance_text("extra=10%", "t"));
  CHECK(watched.regressed.size() == 1);
  CHECK(compare_results(a, b, parse_tolerance_text("*=10%", "t")).regressed.size() == 1);
}

TEST_CASE("more failed trials is a regression") {
  const std::vector<double> v{1, 2, 3, 4, 5, 6};
  ResultSet a = one_cell(v, Direction::Lower, false);
  ResultSet b = one_cell(v, Direction::Lower, false);
  b.trials[2].status = gapmark::TrialStatus::Failed;
  b.trials[2].metrics = {std::nan("")};
  const Comparison c = compare_results(a, b);
  REQUIRE(c.regressed.size() == 1);
  CHECK(c.cells[0].reasons[0].find("failed trials 0 -> 1") != std::string::npos);
}

// Source: reference/compare/wilcoxon_cases.json, made by
// reference/compare/make_reference.py with scipy.stats.wilcoxon (versions in
// the file). Tolerance 1e-9 relative on p.
TEST_CASE("paired test by replicate agrees with scipy.stats.wilcoxon on stored values") {
  const auto ref = load_cases();
  REQUIRE(ref["cases"].size() >= 6);
  for (const auto& cs : ref["cases"]) {
    INFO(cs["name"].get<std::string>());
    const Direction d = direction_from_string(cs["direction"].get<std::string>());
    const auto base = cs["baseline"].get<std::vector<double>>();
    const auto cur = cs["current"].get<std::vector<double>>();
    const Comparison c = compare_results(one_cell(base, d, false), one_cell(cur, d, true));
    REQUIRE(c.cells.size() == 1);
    const MetricChange& m = c.cells[0].metrics.at(0);
    CHECK(m.pairs == base.size());
    double mb = 0, mc = 0;
    for (double x : base) mb += x;
    for (double x : cur) mc += x;
    CHECK(m.change == doctest::Approx((mc - mb) / static_cast<double>(base.size())).epsilon(1e-12));
    if (base.size() < 6) {
      CHECK_FALSE(m.tested);  // 2 / 2^5 > 0.05: the test cannot reach alpha
      CHECK(m.verdict == Verdict::Regressed);  // worse beyond tolerance decides alone
      continue;
    }
    REQUIRE(m.tested);
    CHECK(m.p == doctest::Approx(cs["scipy_p"].get<double>()).epsilon(1e-9));
  }
}

TEST_CASE("verdicts follow the direction of each metric") {
  // Same |values|, sign flipped: for a zero-best metric nothing got worse.
  const std::vector<double> base{0.1, -0.2, 0.3, -0.1, 0.2, -0.3, 0.15};
  std::vector<double> flipped;
  for (double x : base) flipped.push_back(-x);
  const Comparison zero = compare_results(one_cell(base, Direction::ZeroBest, false),
                                          one_cell(flipped, Direction::ZeroBest, false));
  CHECK(zero.regressed.empty());
  // For a higher-is-better metric, lower values throughout regress.
  std::vector<double> lower;
  for (double x : base) lower.push_back(std::abs(x) - 0.05);
  std::vector<double> higher_base;
  for (double x : base) higher_base.push_back(std::abs(x));
  const Comparison higher = compare_results(one_cell(higher_base, Direction::Higher, false),
                                            one_cell(lower, Direction::Higher, false));
  CHECK(higher.regressed.size() == 1);
  // And for a lower-is-better metric the same change is an improvement.
  const Comparison better = compare_results(one_cell(higher_base, Direction::Lower, false),
                                            one_cell(lower, Direction::Lower, false));
  CHECK(better.regressed.empty());
  CHECK(better.cells[0].metrics[0].verdict == Verdict::Better);
}

TEST_CASE("tolerances: text and file forms, errors name the place") {
  Tolerances t = parse_tolerance_text("rmse=5%, mae=0.01,*=1%", "--tolerance");
  CHECK(t.of("rmse").relative == doctest::Approx(0.05));
  CHECK(t.of("rmse").absolute == 0);
  CHECK(t.of("mae").absolute == doctest::Approx(0.01));
  CHECK(t.of("bias").relative == doctest::Approx(0.01));
  CHECK(t.of("rmse").allowed(2.0) == doctest::Approx(0.1));
  CHECK(Tolerances{}.of("rmse").allowed(1.0) == doctest::Approx(1e-6));
  CHECK_THROWS_WITH_AS(parse_tolerance_text("rmse", "--tolerance"),
                       doctest::Contains("--tolerance"), InputError);
  CHECK_THROWS_WITH_AS(parse_tolerance_text("rmse=-1", "--tolerance"), doctest::Contains("rmse"), InputError);
  const std::string path = "compare_test_tolerance.json";
  {
    std::ofstream f(path);
    f << R"({"rmse": {"relative": 0.05}, "mae": {"absolute": 0.01, "relative": 0.5}})";
  }
  const Tolerances ft = read_tolerance_file(path);
  CHECK(ft.of("rmse").relative == doctest::Approx(0.05));
  CHECK(ft.of("mae").allowed(0.1) == doctest::Approx(0.05));
  {
    std::ofstream f(path);
    f << R"({"rmse": {"relativ": 0.05}})";
  }
  CHECK_THROWS_WITH_AS(read_tolerance_file(path), doctest::Contains("/rmse/relativ"), InputError);
  std::remove(path.c_str());
}
