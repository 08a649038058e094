// The verdict and the statistics it reads: noise ties, failures as the worst
// outcome, equivalence, power, conditions that could not be masked, and one
// verdict in results.json.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/analysis/verdict.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"

using namespace gapmark;

namespace {

TrialRecord trial(const std::string& method, int replicate, double value, const std::string& scheme = "blocks",
                  const std::string& series = "s") {
  TrialRecord r;
  r.series = series;
  r.scheme = scheme;
  r.rate = 0.2;
  r.replicate = replicate;
  r.method = method;
  r.status = std::isnan(value) ? TrialStatus::Failed : TrialStatus::Ok;
  r.masked = 20;
  r.metrics = {value};
  return r;
}

ResultSet rmse_results() {
  ResultSet rs;
  rs.columns = {MetricColumn{"rmse", "value", Direction::Lower, "root mean squared error"}};
  rs.rank_by = "rmse";
  rs.series = {{.label = "s"}};
  return rs;
}

const MethodSummary& method(const CellGroup& g, const std::string& name) {
  for (const auto& m : g.methods)
    if (m.method == name) return m;
  FAIL("no method " << name);
  return g.methods.front();
}

bool has_warning(const Summary& s, const std::string& code) {
  return std::any_of(s.warnings.begin(), s.warnings.end(), [&](const Warning& w) { return w.code == code; });
}

bool mentions(const std::vector<std::string>& lines, const std::string& text) {
  return std::any_of(lines.begin(), lines.end(), [&](const std::string& l) { return l.find(text) != std::string::npos; });
}

}  // namespace

TEST_CASE("noise tie: fills agreeing to about 1e-11 are tied in ranks and tests, and equivalent") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 12; ++r) {
    const double x = 0.4 + 0.01 * r;
    rs.trials.push_back(trial("kalman", r, x));
    rs.trials.push_back(trial("linear", r, r == 5 ? x : x + 5e-12));  // higher by 5e-12 in 11 of 12
    rs.trials.push_back(trial("pchip", r, x * 1.2));
  }
  const auto s = summarize(rs);
  const auto& g = s.groups.at(0);
  CHECK(g.noise > 1e-9 * 0.40);  // 1e-9 of the median |rmse|, which lies between 0.40 and 0.61
  CHECK(g.noise < 1e-9 * 0.61);
  CHECK(method(g, "kalman").mean_rank == 1.5);
  CHECK(method(g, "linear").mean_rank == 1.5);
  const auto& other = g.methods[0].method == "kalman" ? method(g, "linear") : method(g, "kalman");
  CHECK(other.p_vs_best == 1.0);  // every difference is noise: a zero
  CHECK(other.standing == Standing::Equivalent);
  CHECK(method(g, "pchip").standing == Standing::Worse);
  const auto* v = verdict_for(s.verdict, "s");
  REQUIRE(v != nullptr);
  CHECK(v->equally_good.size() == 1);
}

TEST_CASE("without the noise rule the same 5e-12 would separate them: the rule is what ties them") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 12; ++r) {
    const double x = 0.4 + 0.01 * r;
    rs.trials.push_back(trial("kalman", r, x));
    rs.trials.push_back(trial("linear", r, r == 5 ? x : x + 5e-6));  // a real, if tiny, difference
  }
  const auto summary = summarize(rs);
  const auto& g = summary.groups.at(0);
  CHECK(g.methods[0].method == "kalman");
  CHECK(g.methods[1].p_vs_best < 0.05);
  // 5e-6 is far inside the 5% margin: equivalent, not "worse".
  CHECK(g.methods[1].standing == Standing::Equivalent);
}

TEST_CASE("partial failure: a method that failed in any replicate is never equivalent, nor recommended") {
  ResultSet rs = rmse_results();
  const double nan = std::nan("");
  for (int r = 0; r < 12; ++r) {
    const double x = 1.0 + 0.01 * r;
    rs.trials.push_back(trial("steady", r, x));
    rs.trials.push_back(trial("once", r, r == 7 ? nan : x));          // identical, but failed once
    rs.trials.push_back(trial("mostly", r, r == 0 ? 0.5 * x : nan));  // failed 11 of 12, great on the one
  }
  const auto s = summarize(rs);
  const auto& g = s.groups.at(0);
  CHECK(g.methods[0].method == "steady");
  for (const char* name : {"once", "mostly"}) {
    CAPTURE(name);
    const auto& m = method(g, name);
    CHECK(m.standing != Standing::Equivalent);
    CHECK(m.standing != Standing::Best);
    CHECK(std::isnan(m.p_equivalent));
  }
  CHECK(method(g, "mostly").standing == Standing::Worse);
  const auto* v = verdict_for(s.verdict, "s");
  REQUIRE(v != nullptr);
  CHECK(v->recommended == "steady");
  CHECK(v->equally_good.empty());
  // Across series "mostly" is ranked on its mean rank, failures as the worst.
  CHECK(method(g, "mostly").mean_rank > method(g, "steady").mean_rank);
}

TEST_CASE("under-powered: 7 replicates and 6 methods cannot show any difference; warned and named, never equivalent") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 7; ++r)
    for (int m = 0; m < 6; ++m) rs.trials.push_back(trial(m == 5 ? "mean" : "m" + std::to_string(m), r, (1 + m) * (1.0 + 0.01 * r)));
  const auto s = summarize(rs);
  const auto& g = s.groups.at(0);
  CHECK(replicates_needed(6, 0.05) == 8);  // 5 * 2 / 2^7 = 0.078 >= 0.05; 5 * 2 / 2^8 = 0.039
  CHECK(g.underpowered());
  CHECK(has_warning(s, "under-powered"));
  for (std::size_t i = 1; i < g.methods.size(); ++i) CHECK(g.methods[i].standing == Standing::NotDistinguishable);
  const auto* v = verdict_for(s.verdict, "s");
  REQUIRE(v != nullptr);
  CHECK(v->recommended == "m0");
  CHECK(v->equally_good.empty());
  CHECK(mentions(v->caveats, "too few for the paired tests"));
  // The gain over the mean baseline: 1 against 6, 83% lower.
  CHECK(mentions(v->reasons, "83% lower than the `mean` baseline"));
  // results.json carries the warning and the verdict.
  const auto j = results_to_json(rs, s);
  bool warned = false;
  for (const auto& w : j["warnings"]) warned = warned || w["code"] == "under-powered";
  CHECK(warned);
  CHECK(j["verdict"]["series"][0]["recommended"] == "m0");
}

TEST_CASE("a condition whose masking failed is left out of tables, verdicts and comparisons, with one note") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 8; ++r) {
    rs.trials.push_back(trial("a", r, 1.0 + 0.01 * r));
    rs.trials.push_back(trial("b", r, 2.0 + 0.01 * r));
    for (const char* m : {"a", "b"}) {
      auto t = trial(m, r, std::nan(""), "replay");
      t.status = TrialStatus::MaskFailed;
      t.reason = "mask: the series has no gaps to replay";
      rs.trials.push_back(t);
    }
  }
  const auto s = summarize(rs);
  REQUIRE(s.groups.size() == 1);
  CHECK(s.groups[0].scheme == "blocks");
  REQUIRE(s.excluded.size() == 1);
  CHECK(s.excluded[0].scheme == "replay");
  CHECK(has_warning(s, "condition-left-out"));
  CHECK(s.verdict.notes.size() == 1);
  const auto* v = verdict_for(s.verdict, "s");
  REQUIRE(v != nullptr);
  CHECK(v->recommended == "a");
  CHECK(v->conditions == 1);
  for (const auto& a : s.across) CHECK(a.scheme != "replay");
}

TEST_CASE("across series: one data set per series, and a warning below five series") {
  ResultSet rs = rmse_results();
  rs.series.clear();
  for (const char* series : {"x", "y", "z"}) {
    rs.series.push_back({.label = series});
    for (const char* scheme : {"blocks", "random"})
      for (int r = 0; r < 8; ++r) {
        rs.trials.push_back(trial("a", r, 1.0 + 0.01 * r, scheme, series));
        rs.trials.push_back(trial("b", r, 1.5 + 0.01 * r, scheme, series));
      }
  }
  const auto s = summarize(rs);
  REQUIRE(s.across.size() == 3);  // blocks, random, then the series combined
  CHECK(s.across.back().scheme.empty());
  CHECK(s.across.back().datasets == 3);
  CHECK(has_warning(s, "few-series"));
  CHECK(s.verdict.series.size() == 3);
  CHECK(mentions(s.verdict.notes, "N = 3 series"));
}

TEST_CASE("the spec's equivalence margin reaches the standing") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 12; ++r) {
    rs.trials.push_back(trial("a", r, 1.0 + 0.01 * r));
    rs.trials.push_back(trial("b", r, 1.03 + 0.01 * r + 0.001 * (r % 3)));  // about 3% higher
  }
  rs.equivalence = 0.05;
  CHECK(summarize(rs).groups.at(0).methods[1].standing == Standing::Equivalent);
  rs.equivalence = 0.01;
  CHECK(summarize(rs).groups.at(0).methods[1].standing == Standing::Worse);
}

TEST_CASE("methods with the same values get the same bootstrap interval: one resampling stream per condition") {
  ResultSet rs = rmse_results();
  for (int r = 0; r < 10; ++r) {
    const double x = 0.4 + 0.037 * ((r * 7) % 10);  // spread, so resampling moves the mean
    rs.trials.push_back(trial("linear", r, x));
    rs.trials.push_back(trial("copy-of-linear", r, x));
    rs.trials.push_back(trial("scaled", r, 2 * x));
  }
  const auto s = summarize(rs);
  const auto& g = s.groups.at(0);
  const auto& a = method(g, "linear").metrics.at(0);
  const auto& b = method(g, "copy-of-linear").metrics.at(0);
  const auto& c = method(g, "scaled").metrics.at(0);
  REQUIRE(a.ci_low < a.mean);
  REQUIRE(a.mean < a.ci_high);
  CHECK(a.ci_low == b.ci_low);
  CHECK(a.ci_high == b.ci_high);
  // The same replicates are drawn for every method, so doubling every value
  // doubles the interval exactly (up to the rounding of the sums).
  CHECK(c.ci_low == doctest::Approx(2 * a.ci_low).epsilon(1e-12));
  CHECK(c.ci_high == doctest::Approx(2 * a.ci_high).epsilon(1e-12));
}
