// Numerical edge cases for every registered metric (by_gap_length included)
// and for methods that need more than a lone series: an outside program
// (external, through tests/fill_external/linear_fill.sh) and low-rank, which
// fills from a sibling series. The data have two related columns.
//
// Extreme magnitudes: the series is multiplied by 2^996 (~6.7e299) and by
// 2^-996 (~1.5e-300). A power of two scales every value exactly, and the
// masks do not depend on the values, so each trial must come out as it does
// unscaled: the same status; columns measured in the data's unit (MAE, RMSE,
// bias, CRPS, RMSE by gap length) multiplied by the same power of two; every
// other column (counts, autocorrelation distortion, variance ratio, MASE,
// coverage) unchanged. n/a must stay n/a and a number must stay a number, so
// no NaN appears at the extremes that the unscaled series does not have.
// (Scale equivariance of these fills and scale invariance of these metrics
// is a property of their definitions; no outside library is needed.)
#include <doctest/doctest.h>

#include <cmath>
#include <map>
#include <set>

#include "gapmark/error.hpp"
#include "gapmark/experiment/runner.hpp"
#include "scale_helpers.hpp"

using namespace gapmark;
using namespace gapmark::scale_testing;

namespace {

/// Every listed method that binds without parameters, and the outside program.
nlohmann::json methods_under_test() {
  nlohmann::json out = nlohmann::json::array();
  for (const auto* entry : MethodRegistry::global().list()) {
    if (entry->hidden) continue;
    try {
      MethodRegistry::global().bind(CallSpec::parse(entry->name, "test"), "test");
      out.push_back(entry->name);
    } catch (const InputError&) {
    }
  }
  const fs::path script = fs::path(GAPMARK_SOURCE_DIR) / "tests" / "fill_external" / "linear_fill.sh";
  out.push_back({{"name", "external"}, {"command", "sh '" + script.string() + "'"}});
  return out;
}

/// Every listed metric, with its default parameters.
std::vector<std::string> every_metric() {
  std::vector<std::string> out;
  for (const auto* entry : MetricRegistry::global().list())
    if (!entry->hidden) out.push_back(entry->name);
  return out;
}

/// Two related invented columns: a daily cycle and a wobble, the second a
/// scaled and shifted copy of the first with its own wobble.
void two_columns(std::size_t n, std::vector<double>& a, std::vector<double>& b) {
  a.resize(n);
  b.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double t = static_cast<double>(i);
    a[i] = 1.0 + 0.3 * std::sin(2 * M_PI * t / 24.0) + 0.05 * std::sin(0.7 * t);
    b[i] = 0.5 + 0.8 * 0.3 * std::sin(2 * M_PI * t / 24.0) + 0.04 * std::cos(0.3 * t);
  }
}

std::string csv_of(const std::vector<double>& a, const std::vector<double>& b) {
  std::string csv = "t,x,y\n";
  const auto cell = [](double v) { return std::isnan(v) ? std::string() : format_double(v); };
  for (std::size_t i = 0; i < a.size(); ++i) csv += std::to_string(i) + "," + cell(a[i]) + "," + cell(b[i]) + "\n";
  return csv;
}

ResultSet run_on(const std::string& name, const std::vector<double>& a, const std::vector<double>& b,
                 std::size_t holdout) {
  const fs::path dir = fresh_dir("edge_scaling_" + name);
  write_file(dir / "x.csv", csv_of(a, b));
  const nlohmann::json methods = methods_under_test();
  const nlohmann::json metrics = every_metric();
  const std::string spec_text =
      R"j({"name": "edge case (invented data)", "seed": 5, "replicates": 2, "holdout": )j" + std::to_string(holdout) +
      R"(, "data": [{"file": "x.csv", "period": 24}],
    "schemes": [{"name": "random", "rates": [0.2]}, {"name": "blocks", "length_mean": 4, "rates": [0.3]}],
    "methods": )" + methods.dump() + R"(, "metrics": )" + metrics.dump() + "}";
  const auto spec = parse_spec(spec_text, name + ".json", dir);
  RunOptions options;
  options.threads = 2;
  return run_experiment(spec, options);
}

std::vector<double> scaled(std::vector<double> v, double factor) {
  for (double& x : v) x *= factor;
  return v;
}

/// Columns measured in the data's own unit scale with it; the rest do not.
bool scales_with_data(const MetricColumn& column) { return column.unit == "value"; }

/// Interval columns come from the method's variance, in the data's squared
/// unit, which no double holds for data beyond ~1e154 or below ~1e-154: a
/// method then gives no variance there (kalman: NaN) and these are n/a.
bool from_variance(const MetricColumn& column) {
  return column.name == "coverage" || column.name == "coverage_error" || column.name == "crps";
}

/// low-rank holds out cells for choosing lambda with a seed hashed from the
/// data's bytes, so scaled data hold out other cells and may choose another
/// lambda: its trials are compared for status and n/a only.
bool compares_values(const std::string& method) { return method != "low-rank"; }

void check_same_up_to_scale(const ResultSet& unscaled, const ResultSet& other, double factor) {
  REQUIRE(unscaled.trials.size() == other.trials.size());
  REQUIRE(unscaled.columns.size() == other.columns.size());
  std::size_t compared = 0;
  for (std::size_t i = 0; i < unscaled.trials.size(); ++i) {
    const auto& u = unscaled.trials[i];
    const auto& o = other.trials[i];
    INFO(u.name() << " (scaled: " << gapmark::trial_status_name(o.status) << " " << o.reason << ")");
    REQUIRE(u.name() == o.name());
    CHECK(u.status == o.status);
    CHECK(u.masked == o.masked);
    CHECK(u.unfilled == o.unfilled);
    if (u.status != o.status) continue;
    for (std::size_t c = 0; c < unscaled.columns.size(); ++c) {
      const auto& column = unscaled.columns[c];
      const double expected = u.metrics[c];
      const double got = scales_with_data(column) ? o.metrics[c] / factor : o.metrics[c];
      INFO(column.name << ": unscaled " << expected << ", scaled back " << got);
      CHECK_FALSE(std::isinf(o.metrics[c]));
      if (from_variance(column)) {
        CHECK(std::isnan(got));
        continue;
      }
      CHECK(std::isnan(got) == std::isnan(expected));
      if (std::isnan(got) || std::isnan(expected) || !compares_values(u.method)) continue;
      CHECK(std::abs(got - expected) <= 1e-9 * std::max(1.0, std::abs(expected)));
      ++compared;
    }
  }
  MESSAGE(compared << " metric values compared over " << unscaled.trials.size() << " trials");
  CHECK(compared > 0);
}

}  // namespace

TEST_CASE("edge case: magnitudes near 1e300 and 1e-300 score as the unscaled series does, every metric") {
  std::vector<double> a, b;
  two_columns(300, a, b);
  const ResultSet unscaled = run_on("unscaled", a, b, 24);
  // The unscaled run itself: every method ran; low-rank and the outside
  // program filled (they are the reason for this test's set-up).
  std::set<std::string> ok_methods;
  bool kalman_coverage = false;
  for (const auto& t : unscaled.trials) {
    if (t.status == gapmark::TrialStatus::Ok) ok_methods.insert(t.method.substr(0, t.method.find(':')));
    if (t.method == "kalman") kalman_coverage |= std::isfinite(t.metrics[unscaled.column_index("coverage")]);
  }
  CHECK(ok_methods.count("low-rank") == 1);
  CHECK(ok_methods.count("external") == 1);
  CHECK(kalman_coverage);  // the unscaled run has intervals to lose
  for (const char* column : {"rmse_gap_short", "acf_rms", "mase_filled", "coverage"})
    CHECK_NOTHROW(unscaled.column_index(column));

  const double huge = std::ldexp(1.0, 996), tiny = std::ldexp(1.0, -996);
  SUBCASE("times 2^996") { check_same_up_to_scale(unscaled, run_on("huge", scaled(a, huge), scaled(b, huge), 24), huge); }
  SUBCASE("times 2^-996") { check_same_up_to_scale(unscaled, run_on("tiny", scaled(a, tiny), scaled(b, tiny), 24), tiny); }
}

namespace {

/// Checks every trial of an edge case: ok, or partial/failed with a reason;
/// an ok trial has finite MAE, RMSE and bias and no infinite value; a column
/// is n/a only for a reason its metric documents, given as `allowed` (column
/// -> why) for the case, plus what holds for any data: interval columns for
/// a method without a variance, and a gap-length class no scored point fell
/// in (but one class at least has a point, since every point is in a gap).
void check_explained(const ResultSet& r, const std::map<std::string, std::string>& allowed) {
  std::size_t ok = 0;
  for (const auto& t : r.trials) {
    INFO(t.name() << ": " << gapmark::trial_status_name(t.status) << " " << t.reason);
    if (t.status != gapmark::TrialStatus::Ok) {
      CHECK_FALSE(t.reason.empty());
      continue;
    }
    ++ok;
    bool some_gap_class = false;
    for (std::size_t c = 0; c < r.columns.size(); ++c) {
      const std::string& name = r.columns[c].name;
      const double v = t.metrics[c];
      INFO(name << " = " << v);
      CHECK_FALSE(std::isinf(v));
      if (name.rfind("rmse_gap_", 0) == 0) {
        some_gap_class |= std::isfinite(v);
        continue;
      }
      if (!std::isnan(v)) continue;
      const bool no_variance = t.method != "kalman" && (name == "coverage" || name == "coverage_error" || name == "crps");
      // The sample metrics need draws, which only a method given draws=M returns.
      const bool no_draws = (name.rfind("sample_", 0) == 0 || name.rfind("gap_total_", 0) == 0) &&
                            t.method.find("draws=") == std::string::npos;
      CHECK_MESSAGE((no_variance || no_draws || allowed.count(name) == 1), "unexplained n/a");
    }
    CHECK(some_gap_class);
  }
  MESSAGE(ok << " of " << r.trials.size() << " trials ok");
  CHECK(ok > 0);
}

const std::map<std::string, std::string> kNoHoldout = {
    {"mase_filled", "no holdout to forecast"}, {"mase_complete", "no holdout to forecast"},
    {"mase_cost", "no holdout to forecast"}};

}  // namespace

TEST_CASE("edge cases, every metric, low-rank and an outside program: every n/a has a documented reason") {
  SUBCASE("a constant series") {
    const auto r = run_on("constant", std::vector<double>(300, 4.25), std::vector<double>(300, -1.5), 24);
    check_explained(r, {{"acf_rms", "the complete series has no variance"},
                        {"acf_max", "the complete series has no variance"},
                        {"var_ratio", "the complete series has no variance"},
                        {"mase_filled", "zero MASE scale: the training part repeats exactly"},
                        {"mase_complete", "zero MASE scale: the training part repeats exactly"},
                        {"mase_cost", "zero MASE scale: the training part repeats exactly"}});
    // A constant is filled exactly (to rounding) by everything but zero.
    for (const auto& t : r.trials)
      if (t.status == gapmark::TrialStatus::Ok && t.method != "zero") CHECK_MESSAGE(t.metrics[r.column_index("mae")] < 1e-12, t.name());
  }
  SUBCASE("a single observed value per series") {
    std::vector<double> a(200, std::nan("")), b(200, std::nan(""));
    a[77] = 3.5;
    b[20] = 1.0;
    auto allowed = kNoHoldout;
    for (const char* c : {"acf_rms", "acf_max", "var_ratio"}) allowed[c] = "one observed value: no variance";
    const auto r = run_on("single", a, b, 0);
    check_explained(r, allowed);
    // Hiding the one value leaves nothing to fill from: only zero works.
    for (const auto& t : r.trials) CHECK_MESSAGE((t.status == gapmark::TrialStatus::Ok) == (t.method == "zero"), t.name());
  }
  SUBCASE("a series shorter than its period") {
    std::vector<double> a, b;
    two_columns(10, a, b);
    check_explained(run_on("short", a, b, 0), kNoHoldout);
  }
  SUBCASE("99% missing") {
    std::vector<double> a, b;
    two_columns(2000, a, b);
    for (std::size_t i = 0; i < a.size(); ++i) {
      if (i % 100 != 3) a[i] = std::nan("");
      if (i % 100 != 50) b[i] = std::nan("");
    }
    check_explained(run_on("sparse", a, b, 0), kNoHoldout);
  }
}
