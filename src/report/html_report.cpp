// report.html: one self-contained page (inline CSS and SVG, no scripts, no
// outside fonts or images) that a person can read without the JSON: how to
// read it, the cautions, per series the recommendation, charts of error
// against missing rate and gap length, an example window with the leading
// fills and their autocorrelation, the ranked tables, and across series the
// mean-rank chart with the critical difference.
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <map>
#include <set>

#include "gapmark/number_format.hpp"
#include "gapmark/report/fit_text.hpp"
#include "html_charts.hpp"
#include "html_style.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

namespace gapmark {
namespace {

using svg::escape;
using svg::escape_with_code;

constexpr std::size_t kShownMethods = 5;  ///< methods drawn in the charts of a series
const char* kGapColumns[3] = {"rmse_gap_short", "rmse_gap_medium", "rmse_gap_long"};

std::string percent(double rate) { return short_number(100 * rate) + "%"; }

std::string condition(const CellGroup& g) { return g.scheme + " at " + percent(g.rate); }

std::string anchor(std::size_t index) { return "series-" + std::to_string(index + 1); }

/// The groups of one series, in summary order.
std::vector<const CellGroup*> groups_of(const Summary& summary, const std::string& series) {
  std::vector<const CellGroup*> out;
  for (const auto& g : summary.groups)
    if (g.series == series) out.push_back(&g);
  return out;
}

std::vector<std::string> series_labels(const ResultSet& results, const Summary& summary) {
  std::vector<std::string> out;
  std::set<std::string> seen;
  for (const auto& s : results.series)
    if (seen.insert(s.label).second) out.push_back(s.label);
  for (const auto& g : summary.groups)
    if (seen.insert(g.series).second) out.push_back(g.series);
  return out;
}

/// Methods of a series ordered by their average rank over its conditions.
std::vector<std::string> method_order(const std::vector<const CellGroup*>& groups) {
  std::map<std::string, std::pair<double, std::size_t>> sums;
  std::vector<std::string> names;
  for (const auto* g : groups)
    for (const auto& m : g->methods) {
      auto [it, inserted] = sums.try_emplace(m.method, 0.0, 0);
      if (inserted) names.push_back(m.method);
      it->second.first += static_cast<double>(m.rank);
      it->second.second++;
    }
  std::stable_sort(names.begin(), names.end(), [&](const auto& a, const auto& b) {
    return sums[a].first / static_cast<double>(sums[a].second) < sums[b].first / static_cast<double>(sums[b].second);
  });
  return names;
}

class StyleMap {
public:
  explicit StyleMap(const std::vector<std::string>& order) {
    for (std::size_t i = 0; i < order.size() && i < kShownMethods; ++i) index_[order[i]] = i;
  }
  svg::Style operator()(const std::string& method) {
    auto it = index_.find(method);
    if (it == index_.end()) it = index_.emplace(method, index_.size()).first;
    return svg::style(it->second);
  }

private:
  std::map<std::string, std::size_t> index_;
};

std::string legend(const std::vector<std::string>& methods, StyleMap& styles) {
  std::string out = "<div class=\"legend\">";
  for (const auto& m : methods) out += "<span>" + svg::legend_swatch(styles(m)) + escape(m) + "</span>";
  return out + "</div>";
}

const MethodSummary* find_method(const CellGroup& g, const std::string& method) {
  for (const auto& m : g.methods)
    if (m.method == method) return &m;
  return nullptr;
}

std::string metric_cell(const MetricSummary& s) { return escape(mean_sd(s)); }

// ---------------------------------------------------------------- sections

std::string page_header(const ResultSet& results, const Summary& summary) {
  const RunContext& c = results.context;
  std::string out = "<header class=\"page\"><h1>Gap-filling benchmark: " + escape(c.spec_name) + "</h1>";
  out += "<div class=\"facts\">gapmark " + escape(c.version) + " (commit " + escape(c.commit) + ") · seed " +
         std::to_string(c.seed) + " · " + std::to_string(c.replicates) + " replicates · ranked by " +
         escape(summary.rank_by) + " · α = " + short_number(summary.alpha) + "<br>spec SHA-256 <code>" +
         escape(c.spec_sha256) + "</code></div></header>";
  return out;
}

std::string how_to_read(const ResultSet& results, const Summary& summary) {
  const auto& rc = results.columns[results.column_index(summary.rank_by)];
  const std::string level = short_number(100 * (1 - summary.alpha));
  std::string out = "<section id=\"how-to-read\"><h2>How to read this</h2>";
  out += "<p>Known values of each series were hidden on purpose, following the masking schemes listed with each "
         "table, at each missing rate and over several replicates. Every method filled the same hidden points, "
         "and each fill was scored against the values that had been hidden. A <em>condition</em> is one scheme at "
         "one missing rate.</p>";
  out += "<p>Methods are ranked by <strong>" + escape(rc.name) + "</strong> (" + escape(rc.summary) + "; " +
         escape(direction_words(rc.direction)) + "). Each cell shows the mean ± standard deviation over the "
         "replicates; the interval is the " + level +
         "% percentile bootstrap interval of the mean. The <em>verdict</em> column gives each method's standing "
         "against the best of its condition (the lowest mean among the methods that filled every trial): "
         "<em>equivalent</em> (a green row) when a paired two one-sided test puts it within ±" +
         short_number(100 * summary.equivalence) + "% of the best's " + escape(rc.name) +
         "; <em>worse</em> or <em>better</em> when the paired signed-rank test separates them; <em>not "
         "distinguishable</em> when neither test decides, which is no evidence that they are as good. Both tests "
         "are Holm-adjusted at α = " + short_number(summary.alpha) + ". A failed or partial trial is the worst "
         "outcome of its replicate, so a method that failed anywhere is never equivalent. The charts show the five leading methods of each "
         "series, each with its own colour, line pattern and marker; shaded bands and whiskers are the "
         + level + "% bootstrap intervals.</p></section>";
  return out;
}

std::string cautions() {
  return "<aside class=\"caution\" id=\"cautions\"><strong>Before you use these results</strong>"
         "Filled values are estimates, not measurements. A benchmark on synthetic masks can flatter a method "
         "when the real gaps differ in length, timing or cause from the masks used here, so check that the "
         "schemes resemble your gaps. Where filled data feed safety decisions (flood warnings, dosing, "
         "structural monitoring and the like), follow the applicable standards and have a qualified person "
         "review the method and the filled values before use.</aside>";
}

/// The verdict of the series (analysis/verdict.hpp), as the page's card:
/// the recommendation, the methods shown equally good, reasons and caveats.
std::string recommendation_card(const Summary& summary, const std::string& series) {
  const auto* v = verdict_for(summary.verdict, series);
  std::string out = "<div class=\"card recommend\"><p>";
  if (v == nullptr || v->recommended.empty()) {
    out += "No method could be ranked on this series.</p>";
  } else {
    out += "Recommended on this evidence: <span class=\"best\">" + escape(v->recommended) + "</span>";
    if (!v->equally_good.empty()) out += "; shown equally good: " + escape(join_words(v->equally_good));
    out += ".</p>";
  }
  if (v != nullptr && !v->reasons.empty()) {
    out += "<ul>";
    for (const auto& r : v->reasons) out += "<li>" + escape_with_code(r) + "</li>";
    out += "</ul>";
  }
  if (v != nullptr && !v->caveats.empty()) {
    out += "<ul class=\"caveats\">";
    for (const auto& c : v->caveats) out += "<li><strong>Caution:</strong> " + escape_with_code(c) + "</li>";
    out += "</ul>";
  }
  return out + "</div>";
}

/// Every method of a condition with a single missing rate: a dot and its
/// interval per method, in rank order; the leading methods keep their style,
/// the others are grey.
std::string single_rate_chart(const ResultSet& results, const CellGroup& g, StyleMap& styles) {
  const std::size_t rank_col = results.column_index(results.rank_by);
  charts::DotChart chart;
  chart.title = results.rank_by + " of every method, " + condition(g);
  chart.x_label = metric_label(results.columns[rank_col], series_units(results, g.series)) + " at " +
                  percent(g.rate) + " missing";
  for (const auto& m : g.methods) {
    const MetricSummary& s = m.metrics[rank_col];
    chart.rows.push_back({m.method, s.n ? s.mean : NAN, s.ci_low, s.ci_high, styles(m.method)});
  }
  return charts::dot_chart(chart);
}

/// Error against missing rate: one chart per scheme of the series; a scheme
/// run at a single rate gets a dot chart of every method instead.
std::string rate_charts(const ResultSet& results, const std::vector<const CellGroup*>& groups,
                        const std::vector<std::string>& shown, StyleMap& styles) {
  const std::size_t rank_col = results.column_index(results.rank_by);
  std::vector<std::string> schemes;
  for (const auto* g : groups)
    if (std::find(schemes.begin(), schemes.end(), g->scheme) == schemes.end()) schemes.push_back(g->scheme);
  std::string out = "<h3>Error by condition</h3><div class=\"grid2\">";
  for (const auto& scheme : schemes) {
    std::vector<const CellGroup*> gs;
    for (const auto* g : groups)
      if (g->scheme == scheme) gs.push_back(g);
    std::stable_sort(gs.begin(), gs.end(), [](auto a, auto b) { return a->rate < b->rate; });
    std::string svg, note;
    if (gs.size() == 1) {
      svg = single_rate_chart(results, *gs.front(), styles);
      note = "One missing rate: each method's mean " + results.rank_by + " (marker) and its " +
             short_number(100 * (1 - results.alpha)) + "% bootstrap interval (line), best first; the leading "
             "methods in their colours, the others grey. A method far worse than the rest sits at the axis' end "
             "with its value written out.";
    } else {
      charts::LineChart chart;
      chart.title = results.rank_by + " against missing rate, " + scheme;
      chart.x_label = "missing rate";
      chart.y_label = metric_label(results.columns[rank_col], series_units(results, gs.front()->series));
      for (const auto* g : gs) chart.x.push_back(g->rate);
      for (const auto& m : shown) {
        charts::ChartLine line{m, {}, {}, {}, styles(m)};
        for (const auto* g : gs) {
          const auto* ms = find_method(*g, m);
          const MetricSummary s = ms ? ms->metrics[rank_col] : MetricSummary{NAN, NAN, NAN, NAN, 0};
          line.y.push_back(s.mean);
          line.low.push_back(s.ci_low);
          line.high.push_back(s.ci_high);
        }
        chart.lines.push_back(std::move(line));
      }
      svg = charts::line_chart(chart);
      note = "Mean " + results.rank_by + " of the leading methods at each missing rate; the band is the " +
             short_number(100 * (1 - results.alpha)) + "% bootstrap interval of the mean.";
    }
    out += "<div class=\"figure\"><h4>" + escape(scheme) + "</h4>" +
           (svg.empty() ? "<p class=\"empty\">no values to draw</p>" : svg + "<p class=\"note\">" + escape(note) + "</p>") +
           "</div>";
  }
  return out + "</div>";
}

/// Error against gap length for one condition, when the results carry the
/// by_gap_length columns.
std::string gap_chart(const ResultSet& results, const CellGroup& g, const std::vector<std::string>& shown,
                      StyleMap& styles) {
  std::vector<std::size_t> cols;
  std::vector<std::string> names;
  for (const char* name : kGapColumns)
    for (std::size_t c = 0; c < results.columns.size(); ++c)
      if (results.columns[c].name == name) {
        cols.push_back(c);
        const std::string& text = results.columns[c].summary;
        const auto pos = text.find("length ");
        names.push_back(pos == std::string::npos ? name : text.substr(pos + 7));
      }
  if (cols.size() != 3) return "";
  charts::LineChart chart;
  chart.title = "RMSE by gap length, " + condition(g);
  chart.x_label = "gap length (points)";
  chart.y_label = series_units(results, g.series).empty() ? "rmse" : "rmse (" + series_units(results, g.series) + ")";
  chart.x = {0, 1, 2};
  chart.x_names = names;
  chart.bands = false;
  std::size_t classes_with_values = 0;
  for (std::size_t k = 0; k < 3; ++k)
    for (const auto& m : g.methods)
      if (m.metrics[cols[k]].n) {
        ++classes_with_values;
        break;
      }
  if (classes_with_values < 1) return "";
  for (const auto& m : shown) {
    const auto* ms = find_method(g, m);
    if (!ms) continue;
    charts::ChartLine line{m, {}, {}, {}, styles(m)};
    for (auto c : cols) {
      line.y.push_back(ms->metrics[c].mean);
      line.low.push_back(ms->metrics[c].ci_low);
      line.high.push_back(ms->metrics[c].ci_high);
    }
    chart.lines.push_back(std::move(line));
  }
  const std::string svg = charts::line_chart(chart);
  if (svg.empty()) return "";
  return "<div class=\"figure\">" + svg +
         "<p class=\"note\">RMSE on the hidden points grouped by the length of the gap they sat in (hidden points "
         "and the series' own missing values together). A class without points in a replicate has no value.</p></div>";
}

std::string standing_class(Standing s) {
  switch (s) {
    case Standing::Best:
    case Standing::Equivalent: return "good";
    case Standing::Better: return "better";
    case Standing::Worse: return "worse";
    case Standing::NotDistinguishable: return "open";
  }
  return "open";
}

/// The ranked table of one condition: rank, method, the ranking metric with
/// its interval, the verdict, failures and mean rank, narrow enough to show
/// failures without scrolling; the other metrics follow in a second table
/// behind a disclosure.
std::string ranked_table(const ResultSet& results, const Summary& summary, const CellGroup& g) {
  const std::size_t rank_col = results.column_index(results.rank_by);
  const std::string level = short_number(100 * (1 - summary.alpha));
  std::vector<std::size_t> others;
  for (std::size_t c = 0; c < results.columns.size(); ++c)
    if (c != rank_col && results.columns[c].direction != Direction::None) others.push_back(c);
  std::string out = "<div class=\"scroll\"><table><caption>" + escape(condition(g)) + ", " +
                    std::to_string(g.replicates) + " replicates; mean ± sd over replicates";
  if (std::isfinite(g.friedman_p))
    out += "; Friedman test over replicates χ² = " + escape(short_number(g.friedman_statistic)) + ", p = " +
           escape(short_number(g.friedman_p));
  out += "; equivalence margin ±" + escape(short_number(g.margin)) + " " + escape(results.rank_by);
  if (g.mask_failed)
    out += "; " + std::to_string(g.mask_failed) + " replicate(s) could not be masked and are left out";
  const std::string units = series_units(results, g.series);
  out += "</caption><thead><tr><th>rank</th><th class=\"name\">method</th><th title=\"" +
         escape(results.columns[rank_col].summary) + "\">" + escape(metric_label(results.columns[rank_col], units)) +
         "</th><th>" + level +
         "% interval</th><th>verdict</th><th>failed</th><th>mean rank</th></tr></thead><tbody>";
  for (const auto& m : g.methods) {
    const bool good = m.standing == Standing::Best || m.standing == Standing::Equivalent;
    out += std::string("<tr") + (good ? " class=\"tied\"" : "") + "><td>" + std::to_string(m.rank) +
           "</td><td class=\"name\">" + escape(m.method) + "</td><td>" + metric_cell(m.metrics[rank_col]) +
           "</td><td>" + escape(interval(m.metrics[rank_col])) + "</td><td class=\"mark " +
           standing_class(m.standing) + "\">" + escape(standing_name(m.standing)) + "</td><td" +
           (m.failures ? " class=\"failed\"" : "") + ">" +
           (m.failures ? std::to_string(m.failures) + "/" + std::to_string(m.trials) : "0") + "</td><td>" +
           escape(short_number(m.mean_rank)) + "</td></tr>";
  }
  out += "</tbody></table></div>";
  if (others.empty()) return out;
  std::string names;
  for (auto c : others) names += (names.empty() ? "" : ", ") + results.columns[c].name;
  out += "<details class=\"more\"><summary>Other metrics <span class=\"sub\">(" + escape(names) +
         ")</span></summary><div class=\"scroll\"><table><thead><tr><th class=\"name\">method</th>";
  for (auto c : others)
    out += "<th title=\"" + escape(results.columns[c].summary) + "\">" +
           escape(metric_label(results.columns[c], units)) + "</th>";
  out += "</tr></thead><tbody>";
  for (const auto& m : g.methods) {
    out += "<tr><td class=\"name\">" + escape(m.method) + "</td>";
    for (auto c : others) out += "<td>" + metric_cell(m.metrics[c]) + "</td>";
    out += "</tr>";
  }
  return out + "</tbody></table></div><p class=\"note\">Hover a column name for its definition; the metrics "
               "page of the documentation gives each formula.</p></details>";
}

/// The legend above the example charts: the truth, the hidden stretches and each method.
std::string example_legend(const std::vector<std::string>& names, const std::vector<svg::Style>& s) {
  std::string out = "<div class=\"legend\"><span><svg class=\"swatch\" viewBox=\"0 0 34 12\" width=\"34\" height=\"12\" "
         "aria-hidden=\"true\"><line x1=\"1\" y1=\"6\" x2=\"33\" y2=\"6\" stroke=\"" + std::string(svg::kInk) +
         "\" stroke-width=\"1.3\"/><circle cx=\"17\" cy=\"6\" r=\"2.6\" fill=\"#fff\" stroke=\"" + svg::kInk +
         "\"/></svg>true values (rings: hidden)</span><span><svg class=\"swatch\" viewBox=\"0 0 34 12\" width=\"34\" "
         "height=\"12\" aria-hidden=\"true\"><rect x=\"1\" y=\"0\" width=\"32\" height=\"12\" fill=\"" +
         svg::kShade + "\"/></svg>hidden stretch</span>";
  for (std::size_t i = 0; i < names.size(); ++i)
    out += "<span>" + svg::legend_swatch(s[i]) + escape(names[i]) + "</span>";
  return out + "</div>";
}

/// What the window shows: the condition, the mask, the points and times, and
/// the methods that failed or were not run.
std::string example_note(const ExampleWindow& example, const std::string& failures) {
  const std::string replicate = std::to_string(example.replicate);
  const auto last = static_cast<std::int64_t>(example.start + example.length) - 1;
  return "<p class=\"note\">" + escape(example.scheme) + " at " + percent(example.rate) + ", replicate " + replicate +
         " (the mask that gapmark mask --replicate " + replicate + " draws with the run's seed): points " +
         std::to_string(example.start) + " to " + std::to_string(last) + " (" + escape(example.time_first) + " to " +
         escape(example.time_last) + ", step " + escape(example.step) +
         "), chosen as the stretch with the most hidden points. The leading methods of that condition refilled the "
         "same mask as in the run." + failures + "</p>";
}

std::string example_section(const ExampleWindow* example, const std::string& units, StyleMap& styles) {
  std::string out = "<h3>Example window</h3>";
  if (example == nullptr)
    return out + "<p class=\"empty\">These results carry no example window for this series.</p>";
  if (!example->note.empty()) return out + "<p class=\"empty\">No example: " + escape(example->note) + "</p>";
  std::vector<svg::Style> s;
  std::vector<std::string> names;
  std::string failures;
  for (const auto& m : example->methods) {
    names.push_back(m.method);
    s.push_back(styles(names.back()));
    if (!m.status)
      failures += " " + escape(names.back()) + " is not drawn: " + escape(m.reason) + ".";
    else if (*m.status == TrialStatus::Failed)
      failures += " " + escape(names.back()) + " failed on this replicate: " + escape(m.reason) + ".";
  }
  const std::string window = charts::window_chart(*example, s, units.empty() ? "value" : "value (" + units + ")");
  const std::string acf = charts::acf_chart(*example, s);
  out += example_legend(names, s);
  out += "<div class=\"figure\">" + (window.empty() ? "<p class=\"empty\">nothing to draw</p>" : window) +
         example_note(*example, failures) + "</div>";
  if (!acf.empty())
    out += "<div class=\"figure\">" + acf +
           "<p class=\"note\">Autocorrelation of the whole series: grey bars for the complete series, lines for the "
           "series with each method's fill. A fill that keeps the series' structure stays close to the bars.</p></div>";
  return out;
}

/// The fitted models of a series' model-based methods over the replicates.
std::string fits_table(const Summary& summary, const std::string& label) {
  std::string rows;
  for (const auto& f : summary.fits) {
    if (f.series != label) continue;
    const bool flagged = f.at_bound > 0 || f.not_converged > 0;
    rows += "<tr><td class=\"name\">" + escape(f.method) + "</td><td>" + std::to_string(f.fits) + "</td><td>" +
            escape(models_text(f)) + "</td><td>" + escape(estimates_text(f)) + "</td><td>" +
            escape(range_text(f.log_likelihood)) + "</td><td" + (flagged ? " class=\"failed\"" : "") + ">" +
            std::to_string(f.at_bound) + " / " + std::to_string(f.not_converged) + "</td></tr>";
  }
  if (rows.empty()) return "";
  return "<h3>Fitted models</h3><div class=\"scroll\"><table><caption>Estimates over the replicates (every scheme "
         "and rate): median [min, max]</caption><thead><tr><th class=\"name\">method</th><th>fits</th><th>model"
         "</th><th>estimates</th><th>log-likelihood</th><th>on a bound / not converged</th></tr></thead><tbody>" +
         rows + "</tbody></table></div>";
}

/// The facts line of a series: its file, length, step, period, start and units.
std::string series_facts(const SeriesDescription& s, const std::string& units) {
  return "<p class=\"facts\">" + escape(s.source) + " · " + std::to_string(s.points) + " points, " +
         std::to_string(s.observed) + " observed · step " + escape(s.step) + " · period " +
         (s.period ? std::to_string(s.period) : std::string("none")) + " · starts " + escape(s.start) +
         (units.empty() ? "" : " · units " + escape(units)) + "</p>";
}

std::string series_section(const ResultSet& results, const Summary& summary, const std::string& label,
                           std::size_t index) {
  const auto groups = groups_of(summary, label);
  const auto order = method_order(groups);
  std::vector<std::string> shown(order.begin(), order.begin() + std::min(order.size(), kShownMethods));
  StyleMap styles(order);
  std::string out = "<section id=\"" + anchor(index) + "\"><h2>" + escape(label) + "</h2>";
  for (const auto& s : results.series)
    if (s.label == label) out += series_facts(s, series_units(results, label));
  if (groups.empty()) return out + "<p class=\"empty\">No trials for this series.</p></section>";
  out += recommendation_card(summary, label);
  out += "<h3>Leading methods</h3>" + legend(shown, styles);
  out += rate_charts(results, groups, shown, styles);
  const ExampleWindow* example = results.examples ? results.examples->find(label) : nullptr;
  out += example_section(example, series_units(results, label), styles);
  out += "<h3>Ranked tables</h3>";
  for (std::size_t i = 0; i < groups.size(); ++i) {
    const auto* g = groups[i];
    const std::string best = g->methods.empty() ? std::string("n/a") : g->methods.front().method;
    out += std::string("<details") + (i == 0 ? " open" : "") + "><summary>" + escape(condition(*g)) +
           " <span class=\"sub\">— best " + escape(best) + "</span></summary>";
    out += ranked_table(results, summary, *g);
    out += gap_chart(results, *g, shown, styles);
    out += "</details>";
  }
  out += fits_table(summary, label);
  return out + "</section>";
}

std::string across_section(const Summary& summary) {
  std::string out = "<section id=\"across\"><h2>Across series</h2>";
  bool drawn = false;
  // The pooled comparison first; the per-condition ones folded below it.
  std::vector<const AcrossSeries*> order;
  for (const auto& a : summary.across)
    if (a.scheme.empty()) order.insert(order.begin(), &a);
    else order.push_back(&a);
  bool folded = false;
  for (const auto* ap : order) {
    const AcrossSeries& a = *ap;
    const std::string svg = a.datasets >= 2 ? charts::rank_ladder(a) : "";
    if (svg.empty()) continue;
    drawn = true;
    if (!a.scheme.empty() && !folded) {
      out += "<details><summary>Each condition on its own</summary>";
      folded = true;
    }
    out += "<h3>" + (a.scheme.empty() ? std::string("All conditions, one data set per series") : escape(a.scheme + " at " + percent(a.rate))) +
           "</h3><p class=\"facts\">" + std::to_string(a.datasets) + " series" + (a.scheme.empty() ? " (each series' conditions combined)" : "") + " · Friedman χ² = " +
           escape(short_number(a.friedman_chi2)) + ", p = " + escape(short_number(a.friedman_p)) +
           " · Iman–Davenport F = " + escape(short_number(a.iman_davenport_f)) + ", p = " +
           escape(short_number(a.iman_davenport_p)) + " · critical difference " +
           escape(short_number(a.critical_difference)) + " at α = " + escape(short_number(summary.alpha)) + "</p>";
    out += "<div class=\"figure\">" + svg +
           "<p class=\"note\">Each row is a method at its mean rank over the series (1 = best). Methods joined "
           "by a bracket on the right differ by less than the critical difference: the test cannot tell them "
           "apart.</p></div>";
  }
  if (folded) out += "</details>";
  if (!drawn)
    out += "<p class=\"empty\">Not enough series for a comparison across series: it needs mean ranks over at least "
           "two data sets and a critical difference.</p>";
  return out + "</section>";
}

std::string warnings_section(const std::vector<Warning>& warnings, const RunVerdict& verdict) {
  std::string out = "<section id=\"warnings\"><h2>Warnings</h2>";
  for (const auto& n : verdict.notes) out += "<p class=\"facts\">" + escape(n) + "</p>";
  if (warnings.empty()) return out + "<p class=\"empty\">None.</p></section>";
  out += "<ul class=\"warnings\">";
  for (const auto& w : warnings)
    out += "<li><strong>" + escape(w.code) + "</strong> (" + escape(w.where) + "): " + escape(w.message) +
           ". <em>" + escape(w.hint) + ".</em></li>";
  return out + "</ul></section>";
}

class HtmlReport final : public Reporter {
public:
  std::string file_name() const override { return "report.html"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const std::string& name = results.context.spec_name;
    const auto labels = series_labels(results, summary);
    const auto warnings = all_warnings(results, summary);
    std::string out = "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
                      "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
                      "<title>gapmark report: " + escape(name) + "</title><style>" + report_css() +
                      "</style></head><body><main>";
    out += page_header(results, summary);
    out += "<nav class=\"toc\"><a href=\"#how-to-read\">How to read this</a>";
    for (std::size_t i = 0; i < labels.size(); ++i)
      out += "<a href=\"#" + anchor(i) + "\">" + escape(labels[i]) + "</a>";
    out += "<a href=\"#across\">Across series</a><a href=\"#warnings\">Warnings (" +
           std::to_string(warnings.size()) + ")</a></nav>";
    out += cautions();
    out += how_to_read(results, summary);
    for (std::size_t i = 0; i < labels.size(); ++i) out += series_section(results, summary, labels[i], i);
    out += across_section(summary);
    out += warnings_section(warnings, summary.verdict);
    out += "<footer>Made by gapmark " + escape(results.context.version) +
           " from the results of spec " + escape(name) +
           ". This page is self-contained: it loads nothing from elsewhere. methods.md describes the "
           "experiment for a paper; results.json holds every trial.</footer></main></body></html>\n";
    return out;
  }
};

const Registration<Reporter> registration{{
    .name = "report-html",
    .summary = "a self-contained HTML page with tables, charts, recommendations and cautions",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<HtmlReport>(); },
}};

}  // namespace
}  // namespace gapmark
