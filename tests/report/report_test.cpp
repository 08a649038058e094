// The readable reports: the example block re-creates the run's masks and
// fills, report.html is self-contained and carries what a reader needs,
// methods.md and references.bib cite exactly what was used.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <regex>

#include "gapmark/analysis/examples.hpp"
#include "gapmark/analysis/results_json.hpp"
#include "gapmark/experiment/results_io.hpp"
#include "gapmark/experiment/runner.hpp"
#include "report/html_charts.hpp"
#include "gapmark/report/references.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

using namespace gapmark;

namespace {

struct Run {
  ExperimentSpec spec;
  LoadedData data;
  ResultSet results;
  Summary summary;
};

const Run& regression_run() {
  static const Run run = [] {
    Run r;
    r.spec = load_spec(std::string(GAPMARK_SOURCE_DIR) + "/experiments/regression/regression.json");
    r.data = load_data(r.spec);
    RunOptions options;
    options.threads = 2;
    r.results = run_experiment(r.spec, options);
    r.summary = summarize(r.results);
    r.results.examples = build_examples(r.spec, r.data, r.summary, {.threads = 2, .allow_external = true});
    return r;
  }();
  return run;
}

std::string render(const std::string& reporter, const ResultSet& results) {
  const auto* entry = ReporterRegistry::global().find(reporter);
  REQUIRE(entry != nullptr);
  return entry->make(ParamValues{})->render(results, summarize(results));
}

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (auto pos = text.find(what); pos != std::string::npos; pos = text.find(what, pos + 1)) ++n;
  return n;
}

}  // namespace

TEST_CASE("examples re-create the run's mask and fills: their RMSE equals the recorded one") {
  const Run& run = regression_run();
  // A window wider than the series keeps every point, so the RMSE over the
  // window is the RMSE of the whole trial.
  const auto examples = build_examples(run.spec, run.data, run.summary, {.window = 100000, .top = 3});
  REQUIRE(examples.series.size() == run.data.series.size());
  const std::size_t rmse_col = run.results.column_index("rmse");
  for (const auto& ex : examples.series) {
    INFO(ex.series);
    CHECK(ex.note.empty());
    CHECK(ex.replicate == 0);
    CHECK(ex.scheme == run.spec.schemes[0].scheme.label);
    REQUIRE(ex.methods.size() == 3);
    REQUIRE(ex.truth.size() == run.data.series[0].values.size());
    REQUIRE(ex.mask.size() == ex.truth.size());
    std::size_t masked = 0;
    for (auto m : ex.mask) masked += m;
    for (const auto& m : ex.methods) {
      REQUIRE(m.filled.size() == ex.truth.size());
      double sq = 0;
      std::size_t n = 0;
      for (std::size_t i = 0; i < ex.truth.size(); ++i)
        if (ex.mask[i] == 1) {
          const double e = m.filled[i] - ex.truth[i];
          sq += e * e;
          ++n;
        }
      const TrialRecord* rec = nullptr;
      for (const auto& t : run.results.trials)
        if (t.series == ex.series && t.scheme == ex.scheme && t.rate == ex.rate && t.replicate == 0 &&
            t.method == m.method)
          rec = &t;
      REQUIRE(rec != nullptr);
      CHECK(rec->masked == masked);
      CHECK(std::sqrt(sq / static_cast<double>(n)) == doctest::Approx(rec->metrics[rmse_col]).epsilon(1e-12));
    }
    // The methods shown are the leading ones of that cell, in rank order.
    for (const auto& g : run.summary.groups)
      if (g.series == ex.series && g.scheme == ex.scheme && g.rate == ex.rate)
        for (std::size_t k = 0; k < 3; ++k) CHECK(ex.methods[k].method == g.methods[k].method);
    CHECK(ex.lags == 48);  // twice the period of 24
    CHECK(ex.acf_truth.size() == 48);
  }
}

TEST_CASE("the default window keeps 200 points around the most hidden points") {
  const Run& run = regression_run();
  const auto examples = build_examples(run.spec, run.data, run.summary);
  for (const auto& ex : examples.series) {
    CHECK(ex.length == 200);
    CHECK(ex.truth.size() == 200);
    CHECK(ex.start + 200 <= run.data.series[0].values.size());
  }
  // Deterministic: the same inputs give the same bytes.
  CHECK(examples_to_json(build_examples(run.spec, run.data, run.summary)).dump() ==
        examples_to_json(examples).dump());
}

TEST_CASE("report.html is self-contained and readable without the JSON") {
  const Run& run = regression_run();
  ResultSet results = run.results;
  results.examples = build_examples(run.spec, run.data, run.summary);
  // Through results.json and back, as `gapmark report` does.
  results = results_from_json(nlohmann::json::parse(results_to_json(results, run.summary).dump()), "round trip");
  const std::string html = render("report-html", results);
  CHECK(html.rfind("<!DOCTYPE html>", 0) == 0);
  // Nothing from elsewhere: no scheme-relative or absolute URLs, no external
  // sources, no scripts, no imports.
  CHECK(html.find("http:") == std::string::npos);
  CHECK(html.find("https:") == std::string::npos);
  CHECK(html.find("src=") == std::string::npos);
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("@import") == std::string::npos);
  CHECK(html.find("url(") == std::string::npos);
  CHECK(std::regex_search(html, std::regex("=\"//")) == false);
  // What a reader needs.
  CHECK(html.find("How to read this") != std::string::npos);
  CHECK(html.find("Filled values are estimates") != std::string::npos);
  CHECK(html.find("synthetic masks can flatter a method") != std::string::npos);
  CHECK(html.find("qualified person") != std::string::npos);
  CHECK(count(html, "Recommended on this evidence") == 2);
  CHECK(count(html, "Error by condition") == 2);
  CHECK(count(html, "<title>RMSE by gap length") == 6);  // every condition has the by_gap_length columns
  CHECK(count(html, "<title>Example window: true values") == 2);
  CHECK(count(html, "<title>Autocorrelation of the complete series") == 2);
  // Each condition: the ranked table, and the other metrics in a second one behind a disclosure.
  CHECK(count(html, "<table>") == 2 * 6);
  CHECK(count(html, "<details class=\"more\"><summary>Other metrics") == 6);
  // The ranked table is narrow: rank, method, metric, interval, verdict, failed, mean rank.
  const auto first_table = html.substr(html.find("<table>"), html.find("</thead>", html.find("<table>")) - html.find("<table>"));
  CHECK(count(first_table, "</th>") == 7);
  std::size_t across = 0;
  for (const auto& a : run.summary.across)
    across += a.datasets >= 2 && std::isfinite(a.critical_difference) && a.methods.size() >= 2;
  CHECK(across >= 1);
  // Rate charts per scheme, gap charts per condition, two example charts per series, rank charts.
  CHECK(count(html, "<svg class=\"chart\"") == 2 * 2 + 6 + 2 * 2 + across);
  CHECK(count(html, "<title>Mean ranks across series") == across);
  for (const auto& g : run.summary.groups) CHECK(html.find(svg::escape(g.methods.front().method)) != std::string::npos);
  // The verdict's sentences mark names with backticks for Markdown; the page sets them as code.
  CHECK(count(html, "than the <code>mean</code> baseline") == 2);
  CHECK(html.find('`') == std::string::npos);
  // Balanced markup for the elements we open.
  for (const char* tag : {"section", "table", "svg", "details", "g"})
    CHECK(count(html, std::string("<") + tag + " ") + count(html, std::string("<") + tag + ">") ==
          count(html, std::string("</") + tag + ">"));
  CHECK(html.find("Not enough series") == std::string::npos);
  CHECK(html.find("the paired test cannot tell any two methods apart") == std::string::npos);  // 8 replicates
  // Same inputs, same bytes.
  CHECK(render("report-html", results) == html);
  // For a look in a browser: GAPMARK_SAMPLE_REPORT=path/report.html keeps the page.
  if (const char* keep = std::getenv("GAPMARK_SAMPLE_REPORT")) std::ofstream(keep) << html;
}

TEST_CASE("report.html without examples or across-series statistics still renders and says so") {
  ResultSet one = regression_run().results;
  one.examples.reset();  // as when results are read from a file written without them
  std::erase_if(one.trials, [](const TrialRecord& t) {
    return t.series != "chamber_humidity_pct" || t.scheme != "random" || t.rate != 0.1;
  });
  const std::string html = render("report-html", one);
  CHECK(html.find("carry no example window") != std::string::npos);
  CHECK(html.find("Not enough series") != std::string::npos);
  // Five replicates cannot separate the methods after Holm: the card names the
  // condition as under-powered and the warnings list says so.
  std::erase_if(one.trials, [](const TrialRecord& t) { return t.replicate >= 5; });
  const std::string few = render("report-html", one);
  CHECK(few.find("5 replicates are too few for the paired tests to find any difference") != std::string::npos);
  CHECK(few.find("<strong>under-powered</strong>") != std::string::npos);
}

TEST_CASE("methods.md states what a reviewer needs and cites only what was used") {
  const Run& run = regression_run();
  const std::string md = render("methods-md", run.results);
  CHECK(md.find(run.spec.sha256) != std::string::npos);
  CHECK(md.find("(31415)") != std::string::npos);          // the seed
  CHECK(md.find("in 8 replicates") != std::string::npos);
  CHECK(md.find("`chamber_humidity_pct` (cold_store_b.csv): 240 points, 240 observed, regular step PT1H") !=
        std::string::npos);
  CHECK(md.find("`blocks`") != std::string::npos);
  CHECK(md.find("α = 0.05") != std::string::npos);
  // Every condition's best is named with its mean, every series' verdict is stated.
  for (const auto& g : run.summary.groups)
    CHECK(md.find("best `" + g.methods.front().method + "`, mean rmse") != std::string::npos);
  for (const auto& v : run.summary.verdict.series)
    CHECK(md.find("**" + v.series + "**. `" + v.recommended + "` is recommended") != std::string::npos);
  // The test variants are named, the margin stated, the limitations generated.
  CHECK(md.find("no continuity correction") != std::string::npos);
  CHECK(md.find("margin of ±5%") != std::string::npos);
  CHECK(md.find("## Limitations") != std::string::npos);
  CHECK(md.find("real gaps of the series were not scored") != std::string::npos);
  CHECK(md.find("(default)") == std::string::npos);  // parameters as set, no dumps of defaults
  CHECK(md.find("[schuirmann1987]") != std::string::npos);
  // pchip is cited, methods not in the run are not.
  CHECK(md.find("[fritsch1980] Fritsch") != std::string::npos);
  CHECK(md.find("akima1970") == std::string::npos);
  CHECK(md.find("durbin2012") == std::string::npos);
  CHECK(md.find("[box2008]") != std::string::npos);  // the acf metric

  const std::string bib = render("references-bib", run.results);
  CHECK(count(bib, "\n@") == count(md, "\n- [") );  // one entry per listed reference
  CHECK(bib.find("@article{fritsch1980,") != std::string::npos);
  CHECK(bib.find("akima1970") == std::string::npos);
  std::size_t open = 0, close = 0;
  for (char c : bib) open += c == '{', close += c == '}';
  CHECK(open == close);
}

TEST_CASE("every key in the reference table has an entry, and each entry is well formed") {
  for (const auto& r : all_references()) {
    INFO(r.key);
    CHECK(r.bibtex.find("{" + r.key + ",") != std::string::npos);
    CHECK(r.bibtex.find("year") != std::string::npos);
    CHECK(find_reference(r.key) == &r);
  }
}

// Worked example from Demšar (2006), section 3.2.4, as remembered: four
// variants of a tree learner on 14 data sets with mean ranks 3.143, 2.000,
// 2.893 and 1.964; CD = 1.25 at alpha = 0.05 (q = 2.569) and about 1.12 at
// alpha = 0.10 (q = 2.291). At 0.05 no pair differs: one group of four; at
// 0.10 the worst and the best differ.
TEST_CASE("groups within the critical difference") {
  const std::vector<double> sorted{1.964, 2.000, 2.893, 3.143};
  using Groups = std::vector<std::pair<std::size_t, std::size_t>>;
  CHECK(charts::cliques(sorted, 1.25) == Groups{{0, 3}});
  CHECK(charts::cliques(sorted, 2.291 * std::sqrt(4.0 * 5.0 / (6.0 * 14.0))) == Groups{{0, 2}, {2, 3}});
  CHECK(charts::cliques(sorted, 0.1) == Groups{{0, 1}});
  CHECK(charts::cliques(sorted, std::nan("")).empty());
}

TEST_CASE("the rank chart draws a row per method and a bracket per group") {
  AcrossSeries a;
  a.methods = {"a", "b", "c", "d"};
  a.mean_ranks = {3.143, 2.000, 2.893, 1.964};
  a.datasets = 14;
  a.critical_difference = 1.118;
  const std::string svg = charts::rank_ladder(a);
  CHECK(count(svg, "<circle") == 4);
  CHECK(count(svg, "not distinguishable:") == 2);
  CHECK(svg.find("not distinguishable: d, b, c") != std::string::npos);
  CHECK(svg.find("not distinguishable: c, a") != std::string::npos);
}

TEST_CASE("numbers are rounded to what their interval supports") {
  // Two significant digits of the interval's width: 0.00277 wide -> 4 decimals.
  CHECK(supported_decimals(0.06235, 0.06512) == 4);
  CHECK(supported_decimals(1.949, 2.192) == 2);
  CHECK(supported_decimals(120.0, 180.0) == 0);
  // A width that is zero or numerical noise: four significant digits instead.
  CHECK(supported_decimals(0.5, 0.5) == -1);
  CHECK(supported_decimals(0.5, 0.5 + 1e-15) == -1);
  CHECK(fixed_number(-0.00001, 2) == "0.00");  // never "-0.00"
  CHECK(fixed_number(0.0637123, 4) == "0.0637");
  const MetricSummary s{0.0637123, 0.0033, 0.06235, 0.06512, 20};
  CHECK(mean_sd(s) == "0.0637 ± 0.0033");
  CHECK(interval(s) == "[0.0624, 0.0651]");
  // An sd of numerical noise shows as zero, not as "1.133e-16".
  const MetricSummary flat{1.0, 1.133e-16, 1.0, 1.0, 20};
  CHECK(mean_sd(flat) == "1 ± 0");
}

TEST_CASE("units from the spec label the metrics in the data's units") {
  ResultSet results;
  results.series = {{.label = "flow", .units = "m3/s"}, {.label = "count"}};
  CHECK(series_units(results, "flow") == "m3/s");
  CHECK(series_units(results, "count").empty());
  CHECK(metric_label(MetricColumn{"rmse", "value", Direction::Lower, ""}, "m3/s") == "rmse (m3/s)");
  CHECK(metric_label(MetricColumn{"var_ratio", "ratio", Direction::OneBest, ""}, "m3/s") == "var_ratio");
  CHECK(metric_label(MetricColumn{"rmse", "value", Direction::Lower, ""}, "") == "rmse");
}

TEST_CASE("a dot chart draws every method, and one far worse at the axis' end") {
  charts::DotChart chart;
  chart.title = "rmse of every method";
  chart.x_label = "rmse";
  const double means[] = {1.0, 1.1, 1.2, 1.3, 50.0};
  for (std::size_t i = 0; i < 5; ++i)
    chart.rows.push_back({"m" + std::to_string(i), means[i], means[i] - 0.05, means[i] + 0.05, svg::style(i)});
  const std::string svg = charts::dot_chart(chart);
  CHECK(count(svg, "<g class=\"series\">") == 5);
  for (std::size_t i = 0; i < 5; ++i) CHECK(svg.find(">m" + std::to_string(i) + "</text>") != std::string::npos);
  CHECK(svg.find("→ 50") != std::string::npos);  // off the axis, value written
  // The axis covers the others only: no tick as far as 50.
  CHECK(svg.find(">50</text>") == std::string::npos);
  CHECK(svg.find(">40</text>") == std::string::npos);
  CHECK(charts::dot_chart(charts::DotChart{}).empty());
}

TEST_CASE("Holt-Winters is cited only when the forecast metric used it, as the stored spec bound it") {
  // The forecast metric's columns with no trials: only the metric citations matter here.
  ResultSet r;
  r.columns = {{"mase_filled", "scaled error", Direction::Lower, ""}};
  const auto cites_winters = [&](const nlohmann::json& metrics) {
    r.context.spec = {{"metrics", metrics}};
    const auto keys = cited_keys(cited_uses(r, Summary{}));
    return std::find(keys.begin(), keys.end(), "winters1960") != keys.end();
  };
  CHECK(cites_winters(nlohmann::json::array({"forecast"})));  // the default forecaster
  CHECK(cites_winters(nlohmann::json::array({"error", "forecast:model=holt-winters"})));
  CHECK_FALSE(cites_winters(nlohmann::json::array({"forecast:model=seasonal-naive"})));
  CHECK_FALSE(cites_winters(nlohmann::json::array({{{"name", "forecast"}, {"model", "seasonal-naive"}}})));
  // A stored spec that does not bind (a results file of another version):
  // the forecaster is unknown, so it is not cited.
  CHECK_FALSE(cites_winters(nlohmann::json::array({"no-such-metric"})));
}
