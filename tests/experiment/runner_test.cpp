#include <doctest/doctest.h>

#include <cmath>
#include <sstream>

#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "gapmark/analysis/summary.hpp"
#include "gapmark/number_format.hpp"
#include "test_methods.hpp"

using namespace gapmark;

namespace {

class Oracle final : public FillMethod {
public:
  FillResult fill(const FillRequest& r) const override {
    FillResult out;
    out.values = testing::oracle_truth();
    if (out.values.size() != r.values.size()) throw MethodFailure("oracle truth not set");
    return out;
  }
};

class Constant final : public FillMethod {
public:
  explicit Constant(double v) : v_(v) {}
  FillResult fill(const FillRequest& r) const override {
    FillResult out;
    out.values.assign(r.values.begin(), r.values.end());
    for (double& x : out.values)
      if (std::isnan(x)) x = v_;
    return out;
  }

private:
  double v_;
};

class AlwaysFails final : public FillMethod {
public:
  FillResult fill(const FillRequest&) const override { throw MethodFailure("deliberate failure"); }
};

const Registration<FillMethod> oracle_reg{{.name = "test-oracle", .summary = "test only", .params = {},
    .make = [](const ParamValues&) { return std::make_unique<Oracle>(); }, .hidden = true}};
const Registration<FillMethod> constant_reg{{.name = "test-constant", .summary = "test only",
    .params = {{.name = "value", .type = ParamType::Real, .default_value = "0"}},
    .make = [](const ParamValues& p) { return std::make_unique<Constant>(p.real("value")); }, .hidden = true}};
const Registration<FillMethod> fails_reg{{.name = "test-fails", .summary = "test only", .params = {},
    .make = [](const ParamValues&) { return std::make_unique<AlwaysFails>(); }, .hidden = true}};

/// A 300-point daily series: a weekly cycle plus a trend; two real gaps.
std::string make_csv(std::vector<double>& truth) {
  std::ostringstream csv;
  csv << "day,load,other\n";
  truth.clear();
  for (int i = 0; i < 300; ++i) {
    const double v = 10 + 0.01 * i + 3 * std::sin(2 * M_PI * i / 7.0);
    const bool gap = i == 17 || i == 150;
    truth.push_back(gap ? std::nan("") : v);
    csv << 1000 + i << "," << (gap ? std::string("") : format_double(v)) << "," << 2 * i << "\n";
  }
  return csv.str();
}

std::string spec_text(const std::string& data, const std::string& methods, int replicates = 5) {
  return R"({"name": "t", "seed": 9, "replicates": )" + std::to_string(replicates) +
         R"(, "holdout": 14, "data": [{"file": ")" + data +
         R"(", "columns": ["load"], "period": 7}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 4, "rates": [0.2]}],
  "methods": )" + methods + R"(, "metrics": ["error"]})";
}

}  // namespace

TEST_CASE("the oracle scores zero error and the constant filler scores its known error") {
  std::vector<double> truth;
  const auto csv = testing::temp_file("runner_oracle.csv", make_csv(truth));
  // The truth the oracle returns must be the series as read (with its real gaps, which are never masked).
  testing::oracle_truth() = truth;
  auto spec = parse_spec(spec_text(csv.string(), R"(["test-oracle", "test-constant:value=10"])"), "t.json", ".");
  auto results = run_experiment(spec);
  REQUIRE(results.trials.size() == 1u * 3 * 5 * 2);
  const auto mae = results.column_index("mae"), rmse = results.column_index("rmse"),
             bias = results.column_index("bias"), scored = results.column_index("scored");
  for (const auto& t : results.trials) {
    CHECK(t.status == gapmark::TrialStatus::Ok);
    CHECK(t.masked > 0);
    CHECK(t.metrics[scored] == static_cast<double>(t.masked));
    if (t.method == "test-oracle") {
      CHECK(t.metrics[mae] == 0.0);
      CHECK(t.metrics[rmse] == 0.0);
      CHECK(t.metrics[bias] == 0.0);
    } else {
      CHECK(t.method == "test-constant:value=10");
      CHECK(t.metrics[rmse] >= t.metrics[mae]);
      CHECK(t.metrics[mae] > 1.0);
    }
  }
  auto summary = summarize(results);
  REQUIRE(summary.groups.size() == 3);
  for (const auto& g : summary.groups) {
    CHECK(g.replicates == 5);
    CHECK(g.methods.front().method == "test-oracle");
    CHECK(g.methods.front().rank == 1);
    CHECK(g.methods.front().mean_rank == 1.0);
  }
}

TEST_CASE("masks never touch real gaps or the holdout, and every method sees the same mask") {
  std::vector<double> truth;
  const auto csv = testing::temp_file("runner_mask.csv", make_csv(truth));
  testing::oracle_truth() = truth;
  auto spec = parse_spec(spec_text(csv.string(), R"(["test-oracle", "test-constant"])"), "t.json", ".");
  const auto data = load_data(spec);
  for (const auto& task : build_tasks(spec, data)) {
    std::vector<Warning> warnings;
    auto records = run_task(spec, data, task, warnings);
    REQUIRE(records.size() == 2);
    CHECK(records[0].masked == records[1].masked);
  }
}

TEST_CASE("results do not depend on the thread count and are identical run after run") {
  std::vector<double> truth;
  const auto csv = testing::temp_file("runner_threads.csv", make_csv(truth));
  testing::oracle_truth() = truth;
  const auto text = spec_text(csv.string(), R"(["linear", "carry-forward", "test-constant:value=3"])", 12);
  auto spec = parse_spec(text, "t.json", ".");
  RunOptions one, four;
  one.threads = 1;
  four.threads = 4;
  auto a = run_experiment(spec, one);
  auto b = run_experiment(spec, four);
  auto c = run_experiment(parse_spec(text, "t.json", "."), one);
  auto dump = [](ResultSet r) {
    r.timing = {};
    return results_to_json(r, summarize(r)).dump();
  };
  CHECK(dump(a) == dump(b));
  CHECK(dump(a) == dump(c));
  // A different seed draws different masks.
  auto other = text;
  other.replace(other.find("\"seed\": 9"), 9, "\"seed\": 8");
  CHECK(dump(run_experiment(parse_spec(other, "t.json", "."), one)) != dump(a));
}

TEST_CASE("a failing method becomes failed records with its reason; the others go on") {
  std::vector<double> truth;
  const auto csv = testing::temp_file("runner_fail.csv", make_csv(truth));
  auto spec = parse_spec(spec_text(csv.string(), R"(["test-fails", "linear"])"), "t.json", ".");
  auto results = run_experiment(spec);
  std::size_t failed = 0, ok = 0;
  for (const auto& t : results.trials) {
    if (t.method == "test-fails") {
      CHECK(t.status == gapmark::TrialStatus::Failed);
      CHECK(t.reason == "deliberate failure");
      CHECK(t.unfilled == t.masked);
      CHECK(std::isnan(t.metrics[results.column_index("rmse")]));
      ++failed;
    } else {
      CHECK(t.status == gapmark::TrialStatus::Ok);
      ++ok;
    }
  }
  CHECK(failed == ok);
  auto summary = summarize(results);
  for (const auto& g : summary.groups) {
    CHECK(g.methods.back().method == "test-fails");
    CHECK(g.methods.back().failures == g.methods.back().trials);
  }
  // Round trip through results.json keeps every trial.
  auto j = results_to_json(results, summary);
  auto back = results_from_json(j, "mem");
  CHECK(back.trials.size() == results.trials.size());
  CHECK(back.trials[1].reason == results.trials[1].reason);
}

TEST_CASE("spec errors name the file and the JSON path") {
  std::vector<double> truth;
  const auto csv = testing::temp_file("runner_spec.csv", make_csv(truth)).string();
  auto bad = [&](const std::string& replace_from, const std::string& replace_to) {
    auto text = spec_text(csv, R"(["linear"])");
    text.replace(text.find(replace_from), replace_from.size(), replace_to);
    return text;
  };
  CHECK_THROWS_WITH_AS(parse_spec(bad("[0.1, 0.3]", "[0.1, 1.5]"), "s.json", "."),
                       doctest::Contains("s.json: /schemes/0/rates/1: rate 1.5 is outside (0, 1)"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"linear\"", "\"lineer\""), "s.json", "."),
                       doctest::Contains("s.json: /methods/0: unknown method 'lineer' (did you mean 'linear'?)"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"length_mean\": 4", "\"length_men\": 4"), "s.json", "."),
                       doctest::Contains("unknown parameter 'length_men'"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"replicates\": 5", "\"replicates\": \"five\""), "s.json", "."),
                       doctest::Contains("s.json: /replicates: expected a whole number"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"seed\": 9,", "\"seed\": 9,,"), "s.json", "."),
                       doctest::Contains("s.json:1: invalid JSON"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"holdout\"", "\"hold_out\""), "s.json", "."),
                       doctest::Contains("s.json: /hold_out: unknown field"), InputError);
  CHECK_THROWS_WITH_AS(parse_spec(bad("\"metrics\": [\"error\"]", "\"metrics\": [\"error\"], \"rank_by\": \"crps\""), "s.json", "."),
                       doctest::Contains("s.json: /rank_by: no metric column 'crps'"), InputError);
  auto spec = parse_spec(bad("[\"load\"]", "[\"lod\"]"), "s.json", ".");
  CHECK_THROWS_WITH_AS(load_data(spec), doctest::Contains("s.json: /data/0/columns/0: no column 'lod'"), InputError);
}
