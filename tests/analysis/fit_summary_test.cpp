// Fitted parameters over the replicates: median and range per series and
// method (hand-worked), the models chosen and how often, one warning per
// (series, method) whose fits hit a bound or did not converge, and the same
// numbers in results.json, methods.md and report.html.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/report/fit_text.hpp"
#include "gapmark/report/reporter.hpp"

using namespace gapmark;

namespace {

TrialRecord fitted(const std::string& series, const std::string& method, int replicate, const std::string& model,
                   double a, double loglik, bool at_bound = false, bool converged = true) {
  TrialRecord r;
  r.series = series;
  r.scheme = "random";
  r.rate = 0.1;
  r.replicate = replicate;
  r.method = method;
  r.masked = 20;
  r.metrics = {1.0 + 0.01 * replicate};
  r.fit.model = model;
  r.fit.parameters = {{"a", a}};
  if (model == "B") r.fit.parameters.emplace_back("b", 2.0 * a);
  r.fit.log_likelihood = loglik;
  r.fit.at_bound = at_bound;
  r.fit.converged = converged;
  return r;
}

ResultSet results() {
  ResultSet rs;
  rs.columns = {MetricColumn{"rmse", "value", Direction::Lower, "root mean squared error"}};
  rs.rank_by = "rmse";
  rs.series = {{.label = "s"}, {.label = "t"}};
  // series s, method m: a = 3, 1, 2, 10 -> median 2.5 (mean of the middle two), range [1, 10];
  // models A three times, B once (B also has b = 20 once)
  rs.trials.push_back(fitted("s", "m", 0, "A", 3, -10));
  rs.trials.push_back(fitted("s", "m", 1, "B", 10, -14, true));
  rs.trials.push_back(fitted("s", "m", 2, "A", 1, -12));
  rs.trials.push_back(fitted("s", "m", 3, "A", 2, std::nan("")));
  // series t, method m: one fit that stopped on its budget
  rs.trials.push_back(fitted("t", "m", 0, "A", 5, -3, false, false));
  // a method without a model: no fit summary
  TrialRecord plain = fitted("s", "linear", 0, "", 0, 0);
  plain.fit = ModelFit{};
  rs.trials.push_back(plain);
  return rs;
}

}  // namespace

TEST_CASE("fit summaries: median and range per series and method, models counted") {
  const ResultSet rs = results();
  std::vector<Warning> warnings;
  const auto fits = summarize_fits(rs, warnings);
  REQUIRE(fits.size() == 2);
  const FitSummary& s = fits[0];
  CHECK(s.series == "s");
  CHECK(s.method == "m");
  CHECK(s.fits == 4);
  REQUIRE(s.models.size() == 2);
  CHECK(s.models[0] == std::pair<std::string, std::size_t>{"A", 3});
  CHECK(s.models[1] == std::pair<std::string, std::size_t>{"B", 1});
  REQUIRE(s.estimates.size() == 2);
  CHECK(s.estimates[0].name == "a");
  CHECK(s.estimates[0].median == 2.5);
  CHECK(s.estimates[0].low == 1);
  CHECK(s.estimates[0].high == 10);
  CHECK(s.estimates[0].n == 4);
  CHECK(s.estimates[1].name == "b");
  CHECK(s.estimates[1].n == 1);
  CHECK(s.estimates[1].median == 20);
  // the log-likelihood over the three finite values -10, -14, -12
  CHECK(s.log_likelihood.n == 3);
  CHECK(s.log_likelihood.median == -12);
  CHECK(s.log_likelihood.low == -14);
  CHECK(s.at_bound == 1);
  CHECK(s.not_converged == 0);
  CHECK(fits[1].not_converged == 1);
  REQUIRE(warnings.size() == 2);
  CHECK(warnings[0].code == "fit-at-bound");
  CHECK(warnings[0].where == "m");
  CHECK(warnings[0].message == "fits ended with an estimate on a bound of the search: 1 of 4 on s");
  CHECK(warnings[1].code == "fit-not-converged");
  CHECK(warnings[1].where == "m");
  CHECK(warnings[1].message.find(": 1 of 1 on t") != std::string::npos);

  CHECK(range_text(s.estimates[0]) == "2.5 [1, 10]");
  CHECK(range_text(s.estimates[1]) == "20");
  CHECK(models_text(s) == "A (3), B (1)");
  CHECK(models_text(fits[1]) == "A");
}

TEST_CASE("fit summaries: one answer in results.json, methods.md and report.html") {
  const ResultSet rs = results();
  const Summary summary = summarize(rs);
  REQUIRE(summary.fits.size() == 2);
  const auto j = summary_to_json(summary, rs);
  REQUIRE(j.contains("fits"));
  CHECK(j["fits"][0]["estimates"][0]["median"] == 2.5);
  CHECK(j["fits"][0]["estimates"][0]["max"] == 10.0);
  CHECK(j["fits"][0]["at_bound"] == 1);
  CHECK(j["fits"][1]["not_converged"] == 1);
  const auto warned = all_warnings(rs, summary);
  CHECK(std::count_if(warned.begin(), warned.end(), [](const Warning& w) { return w.code.rfind("fit-", 0) == 0; }) == 2);

  const auto render = [&](const char* name) {
    const auto* entry = ReporterRegistry::global().find(name);
    REQUIRE(entry != nullptr);
    return entry->make(ParamValues{})->render(rs, summary);
  };
  const std::string md = render("methods-md");
  CHECK(md.find("## Fitted models") != std::string::npos);
  CHECK(md.find("| `m` | 4 | A (3), B (1) | a 2.5 [1, 10]; b 20 | -12 [-14, -10] | 1 | 0 |") != std::string::npos);
  CHECK(md.find("- `m`: fits stopped on their budget of iterations before meeting their tolerance: 1 of 1 on t") !=
        std::string::npos);
  const std::string html = render("report-html");
  CHECK(html.find("<h3>Fitted models</h3>") != std::string::npos);
  CHECK(html.find("a 2.5 [1, 10]; b 20") != std::string::npos);
}
