// The statistics wired into summarize(): per-group ranks, Friedman, Wilcoxon
// and TOST against the best with Holm's correction, standings, and the
// across-series comparison with one data set per series.
#include <cmath>
#include <doctest/doctest.h>
#include <set>
#include <string>
#include <vector>

#include "gapmark/analysis/summary.hpp"
#include "reference_values.hpp"

namespace {

gapmark::ResultSet results_from(const nlohmann::json& doc, const std::string& only_series = "") {
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, "root mean squared error"}};
  rs.rank_by = "rmse";
  rs.alpha = doc["alpha"].get<double>();
  rs.equivalence = doc["equivalence"].get<double>();
  for (const auto& t : doc["trials"]) {
    if (!only_series.empty() && t["series"] != only_series) continue;
    gapmark::TrialRecord r;
    r.series = t["series"].get<std::string>();
    r.scheme = t["scheme"].get<std::string>();
    r.rate = t["rate"].get<double>();
    r.replicate = t["replicate"].get<int>();
    r.method = t["method"].get<std::string>();
    r.status = gapmark::parse_trial_status(t["status"].get<std::string>(), "reference");
    r.metrics = {stats_test::number(t["rmse"])};
    rs.trials.push_back(r);
  }
  return rs;
}

gapmark::TrialRecord trial(const std::string& method, int replicate, double value,
                           const std::string& series = "s") {
  gapmark::TrialRecord r;
  r.series = series;
  r.scheme = "scheme_z";
  r.rate = 0.1;
  r.replicate = replicate;
  r.method = method;
  r.status = std::isnan(value) ? gapmark::TrialStatus::Failed : gapmark::TrialStatus::Ok;
  r.metrics = {value};
  return r;
}

std::size_t index_of(const std::vector<std::string>& names, const std::string& name) {
  for (std::size_t i = 0; i < names.size(); ++i)
    if (names[i] == name) return i;
  FAIL("no method " << name);
  return 0;
}

}  // namespace

// Source: reference/stats/summary.json, made by reference/stats/make_reference.py
// with scipy.stats (rankdata, friedmanchisquare, wilcoxon, f, studentized_range)
// and statsmodels (multipletests(method="holm"), ttost_paired) under the
// conventions written there. Tolerances: ranks and means 1e-12 relative, statistics 1e-10,
// p-values and the critical difference 1e-8.
TEST_CASE("one group: ranks, Friedman over replicates, Wilcoxon and TOST against the best with Holm, standings") {
  const auto ref = stats_test::load_reference("summary.json")["cases"];
  const auto summary = gapmark::summarize(results_from(ref));
  const auto methods = ref["methods"].get<std::vector<std::string>>();
  const auto& e = ref["group"];
  const gapmark::CellGroup* g = nullptr;
  for (const auto& candidate : summary.groups)
    if (candidate.series == e["series"].get<std::string>()) g = &candidate;
  REQUIRE(g != nullptr);
  CHECK(g->replicates == 10);
  REQUIRE(g->methods.size() == methods.size());
  CHECK(g->methods.front().method == methods[e["best"].get<std::size_t>()]);
  CHECK_CLOSE(g->friedman_statistic, e["friedman_statistic"].get<double>(), 1e-10, 0);
  CHECK_CLOSE(g->friedman_p, e["friedman_p"].get<double>(), 1e-8, 0);
  CHECK_CLOSE(g->margin, e["margin"].get<double>(), 1e-12, 0);
  std::set<std::string> standings;
  for (const auto& m : g->methods) {
    INFO("method " << m.method);
    const std::size_t i = index_of(methods, m.method);
    CHECK_CLOSE(m.mean_rank, e["mean_rank"][i].get<double>(), 1e-12, 0);
    CHECK_CLOSE(m.metrics[0].mean, e["mean"][i].get<double>(), 1e-12, 0);
    CHECK_CLOSE(m.p_vs_best, stats_test::number(e["p_vs_best"][i]), 1e-8, 0);
    CHECK_CLOSE(m.p_equivalent, stats_test::number(e["p_equivalent"][i]), 1e-8, 0);
    CHECK(std::string(gapmark::standing_name(m.standing)) == e["standing"][i].get<std::string>());
    standings.insert(gapmark::standing_name(m.standing));
  }
  // The stored case exercises four standings and a failed trial.
  CHECK(standings.size() == 4);
  CHECK(g->methods.back().failures == 1);
}

// Source: as above (reference/stats/summary.json, "across").
TEST_CASE("across series: per condition and combined mean ranks, Friedman, Iman-Davenport, CD") {
  const auto ref = stats_test::load_reference("summary.json")["cases"];
  const auto summary = gapmark::summarize(results_from(ref));
  // Conditions: scheme_x@0.2 (one series), scheme_y@0.1, scheme_y@0.3, then combined (6 series).
  REQUIRE(summary.across.size() == 4);
  CHECK(summary.across[0].scheme == "scheme_x");
  CHECK(summary.across[0].datasets == 1);
  CHECK(std::isnan(summary.across[0].iman_davenport_f));  // needs two data sets
  CHECK(summary.across.back().scheme.empty());
  for (const auto& a : summary.across) {
    std::string key = a.scheme.empty() ? "combined" : a.scheme + "@" + (a.rate == 0.1 ? "0.1" : "0.3");
    if (a.scheme == "scheme_x") continue;
    INFO("condition " << key);
    // The combined comparison here has series_one too; the stored combined
    // values cover the five scheme_y series, compared on a summary without
    // scheme_x below.
    if (key == "combined") {
      CHECK(a.datasets == 6);
      continue;
    }
    REQUIRE(ref["across"].contains(key));
    const auto& e = ref["across"][key];
    CHECK(a.datasets == e["datasets"].get<std::size_t>());
    const auto methods = ref["methods"].get<std::vector<std::string>>();
    REQUIRE(a.methods.size() == methods.size());
    for (std::size_t i = 0; i < a.methods.size(); ++i)
      CHECK_CLOSE(a.mean_ranks[i], e["mean_ranks"][index_of(methods, a.methods[i])].get<double>(), 1e-12, 0);
    CHECK_CLOSE(a.friedman_chi2, e["friedman_chi2"].get<double>(), 1e-10, 0);
    CHECK_CLOSE(a.friedman_p, e["friedman_p"].get<double>(), 1e-8, 0);
    CHECK_CLOSE(a.iman_davenport_f, e["iman_davenport_f"].get<double>(), 1e-8, 0);
    CHECK_CLOSE(a.iman_davenport_p, e["iman_davenport_p"].get<double>(), 1e-8, 0);
    CHECK_CLOSE(a.critical_difference, e["critical_difference"].get<double>(), 1e-8, 0);
  }
}

TEST_CASE("across series: each series' two scheme_y conditions combined, N = 5 series") {
  auto doc = stats_test::load_reference("summary.json")["cases"];
  nlohmann::json trials = nlohmann::json::array();
  for (const auto& t : doc["trials"])
    if (t["scheme"] == "scheme_y") trials.push_back(t);
  doc["trials"] = trials;
  const auto summary = gapmark::summarize(results_from(doc));
  REQUIRE(summary.across.size() == 3);
  const auto& a = summary.across.back();
  const auto& e = doc["across"]["combined"];
  CHECK(a.scheme.empty());
  CHECK(a.datasets == 5);
  const auto methods = doc["methods"].get<std::vector<std::string>>();
  for (std::size_t i = 0; i < a.methods.size(); ++i)
    CHECK_CLOSE(a.mean_ranks[i], e["mean_ranks"][index_of(methods, a.methods[i])].get<double>(), 1e-12, 0);
  CHECK_CLOSE(a.friedman_chi2, e["friedman_chi2"].get<double>(), 1e-10, 0);
  CHECK_CLOSE(a.friedman_p, e["friedman_p"].get<double>(), 1e-8, 0);
  CHECK_CLOSE(a.iman_davenport_f, e["iman_davenport_f"].get<double>(), 1e-8, 0);
  CHECK_CLOSE(a.iman_davenport_p, e["iman_davenport_p"].get<double>(), 1e-8, 0);
  CHECK_CLOSE(a.critical_difference, e["critical_difference"].get<double>(), 1e-8, 0);
}

TEST_CASE("one condition only: no pooled entry") {
  const auto ref = stats_test::load_reference("summary.json")["cases"];
  const auto summary = gapmark::summarize(results_from(ref, "series_one"));
  REQUIRE(summary.across.size() == 1);
  CHECK(summary.across[0].scheme == "scheme_x");
}

TEST_CASE("one series only: no pooled entry, however many conditions") {
  const auto ref = stats_test::load_reference("summary.json")["cases"];
  const auto summary = gapmark::summarize(results_from(ref, "s2"));  // scheme_y at two rates
  REQUIRE(summary.across.size() == 2);
  for (const auto& a : summary.across) {
    CHECK(a.scheme == "scheme_y");
    CHECK(a.datasets == 1);
  }
}

TEST_CASE("closer to zero is better: ranks use the absolute value") {
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"bias", "value", gapmark::Direction::ZeroBest, "mean error"}};
  rs.rank_by = "bias";
  // a: about -0.1, b: about +0.5, c: about -1.0 in every replicate: by |bias| a < b < c.
  for (int r = 0; r < 7; ++r) {
    rs.trials.push_back(trial("a", r, -0.1 - 0.01 * r));
    rs.trials.push_back(trial("b", r, 0.5 + 0.011 * r));
    rs.trials.push_back(trial("c", r, -1.0 - 0.013 * r));
  }
  const auto summary = gapmark::summarize(rs);
  REQUIRE(summary.groups.size() == 1);
  const auto& g = summary.groups[0];
  REQUIRE(g.methods.size() == 3);
  CHECK(g.methods[0].method == "a");
  CHECK(g.methods[0].mean_rank == 1.0);
  CHECK(g.methods[1].method == "b");
  CHECK(g.methods[1].mean_rank == 2.0);
  CHECK(g.methods[2].mean_rank == 3.0);
  // Friedman with perfect agreement: N (k - 1) = 14; chi-squared with 2 df
  // has upper tail exp(-x/2) = exp(-7).
  CHECK(g.friedman_statistic == doctest::Approx(14.0));
  CHECK(g.friedman_p == doctest::Approx(std::exp(-7.0)).epsilon(1e-12));
  // Seven replicates all one way: exact p = 2 / 2^7 = 1/64 each; Holm gives
  // 2/64 to the smaller, then the running maximum: both 1/32 < 0.05.
  CHECK(std::isnan(g.methods[0].p_vs_best));
  CHECK(g.methods[0].standing == gapmark::Standing::Best);
  CHECK(g.methods[1].p_vs_best == doctest::Approx(1.0 / 32));
  CHECK(g.methods[2].p_vs_best == doctest::Approx(1.0 / 32));
  CHECK(g.methods[1].standing == gapmark::Standing::Worse);
  CHECK(g.methods[2].standing == gapmark::Standing::Worse);
}

TEST_CASE("few replicates cannot separate methods: six replicates, two comparisons, an under-powered warning") {
  // Exact two-sided p with n = 6 all one way is 2/64; Holm doubles the
  // smaller of two: 1/16 >= 0.05, so neither is shown worse; and they are
  // far outside the margin, so neither is equivalent either.
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, ""}};
  for (int r = 0; r < 6; ++r) {
    rs.trials.push_back(trial("a", r, 1.0 + 0.01 * r));
    rs.trials.push_back(trial("b", r, 2.0 + 0.02 * r));
    rs.trials.push_back(trial("c", r, 3.0 + 0.03 * r));
  }
  const auto summary = gapmark::summarize(rs);
  const auto& g = summary.groups.at(0);
  CHECK(g.methods[1].p_vs_best == doctest::Approx(1.0 / 16));
  CHECK(g.methods[2].p_vs_best == doctest::Approx(1.0 / 16));
  CHECK(g.methods[1].standing == gapmark::Standing::NotDistinguishable);
  CHECK(g.methods[2].standing == gapmark::Standing::NotDistinguishable);
  // 2 * 2 / 2^n < 0.05 first at n = 7.
  CHECK(g.replicates_needed == 7);
  CHECK(g.underpowered());
  bool warned = false;
  for (const auto& w : summary.warnings) warned = warned || w.code == "under-powered";
  CHECK(warned);
}

TEST_CASE("failures: the worst of their replicate in ranks and paired tests; never equivalent") {
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, ""}};
  const double nan = std::nan("");
  for (int r = 0; r < 8; ++r) {
    rs.trials.push_back(trial("good", r, 1.0 + 0.01 * r));
    rs.trials.push_back(trial("flaky", r, r == 2 ? nan : 1.5 + 0.02 * r));
    rs.trials.push_back(trial("broken", r, nan));
  }
  const auto g = gapmark::summarize(rs).groups.at(0);
  REQUIRE(g.methods.size() == 3);
  CHECK(g.methods[0].method == "good");
  CHECK(g.methods[1].method == "flaky");
  CHECK(g.methods[2].method == "broken");
  // In replicate 2 flaky and broken share ranks 2 and 3: 2.5 each.
  CHECK(g.methods[1].mean_rank == doctest::Approx((7 * 2.0 + 2.5) / 8));
  CHECK(g.methods[2].mean_rank == doctest::Approx((7 * 3.0 + 2.5) / 8));
  CHECK(g.methods[1].failures == 1);
  CHECK(g.methods[2].failures == 8);
  // flaky: eight pairs, all worse (the failed one as the worst): exact raw p
  // 2/256. broken: eight tied "worst" differences: normal approximation with
  // the tie correction, z = 18 / sqrt(51 - 10.5), raw p = 2 (1 - Phi(z)) =
  // 0.004677. Holm over the two: 2 * 0.004677 for both (step-down maximum).
  const double broken_raw = std::erfc(18.0 / std::sqrt(40.5) / std::sqrt(2.0));
  CHECK(g.methods[1].p_vs_best == doctest::Approx(2 * broken_raw).epsilon(1e-9));
  CHECK(g.methods[2].p_vs_best == doctest::Approx(2 * broken_raw).epsilon(1e-9));
  CHECK(g.methods[1].standing == gapmark::Standing::Worse);
  CHECK(g.methods[2].standing == gapmark::Standing::Worse);
  CHECK(std::isnan(g.methods[1].p_equivalent));
  CHECK(std::isnan(g.methods[2].p_equivalent));
  CHECK(std::isfinite(g.friedman_p));
}

TEST_CASE("identical results: p = 1 and equivalent to the best") {
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, ""}};
  for (int r = 0; r < 8; ++r) {
    rs.trials.push_back(trial("first", r, 1.0 + 0.1 * r));
    rs.trials.push_back(trial("twin", r, 1.0 + 0.1 * r));
  }
  const auto g = gapmark::summarize(rs).groups.at(0);
  CHECK(g.methods[1].p_vs_best == 1.0);
  CHECK(g.methods[1].p_equivalent == 0.0);
  CHECK(g.methods[1].standing == gapmark::Standing::Equivalent);
  CHECK(g.methods[0].mean_rank == 1.5);
  CHECK(std::isnan(g.friedman_statistic));  // every replicate tied throughout
}

TEST_CASE("partial trials: left out of the means, ranked last, listed after complete methods") {
  // "gappy" leaves points unfilled in three replicates; the error on the points
  // it did fill is lower than anyone's, which must not make it the best.
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, ""}};
  for (int r = 0; r < 8; ++r) {
    rs.trials.push_back(trial("steady", r, 1.0 + 0.01 * r));
    auto t = trial("gappy", r, r < 3 ? 0.2 : 1.2 + 0.01 * r);
    if (r < 3) t.status = gapmark::TrialStatus::Partial;
    rs.trials.push_back(t);
  }
  const auto g = gapmark::summarize(rs).groups.at(0);
  REQUIRE(g.methods.size() == 2);
  CHECK(g.methods[0].method == "steady");
  CHECK(g.methods[1].method == "gappy");
  CHECK(g.methods[1].failures == 3);
  CHECK(g.methods[1].metrics[0].n == 5);  // only the complete trials
  CHECK(g.methods[1].metrics[0].mean == doctest::Approx(1.2 + 0.01 * (3 + 4 + 5 + 6 + 7) / 5.0));
  CHECK(g.methods[1].mean_rank == doctest::Approx(2.0));  // last in every replicate
}

TEST_CASE("a method that failed some replicates is listed after complete ones, even with a lower mean") {
  gapmark::ResultSet rs;
  rs.columns = {gapmark::MetricColumn{"rmse", "value", gapmark::Direction::Lower, ""}};
  const double nan = std::nan("");
  for (int r = 0; r < 8; ++r) {
    rs.trials.push_back(trial("complete", r, 1.0 + 0.01 * r));
    rs.trials.push_back(trial("lucky", r, r == 0 ? nan : 0.5));
  }
  const auto g = gapmark::summarize(rs).groups.at(0);
  CHECK(g.methods[0].method == "complete");
  CHECK(g.methods[0].rank == 1);
  CHECK(g.methods[1].method == "lucky");
}
