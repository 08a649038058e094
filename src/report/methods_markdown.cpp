// methods.md: the experiment described in neutral scientific English for a
// paper: data, masking, the methods with the parameters that were set,
// metrics, the statistical analysis with the test variants named, the
// verdict per series with effect sizes and the equivalence margin, a
// Limitations paragraph generated from the run, reproducibility facts and
// the references of the published work it used.
#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "gapmark/analysis/test_names.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/params.hpp"
#include "gapmark/report/fit_text.hpp"
#include "gapmark/report/references.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"
#include "gapmark/stats/bootstrap.hpp"

namespace gapmark {
namespace {

std::string join(const std::vector<std::string>& items, const std::string& last = "and") {
  std::string out;
  for (std::size_t i = 0; i < items.size(); ++i) {
    if (i) out += items.size() == 2 ? " " + last + " " : (i + 1 == items.size() ? ", " + last + " " : ", ");
    out += items[i];
  }
  return out;
}

std::string cite(const std::vector<std::string>& keys) {
  std::vector<std::string> parts;
  for (const auto& k : keys) parts.push_back("[" + k + "]");
  return parts.empty() ? "" : " " + join(parts, "and");
}

std::vector<std::string> keys_for(const std::vector<CitedUse>& uses, const std::string& kind, const std::string& name) {
  for (const auto& u : uses)
    if (u.kind == kind && u.name == name) return u.keys;
  return {};
}

/// "`name` (a = 1, b = x)": the parameters the spec set, not the defaults.
template <class Interface>
std::string with_parameters(const std::string& label) {
  CallSpec call;
  try {
    call = CallSpec::parse(label, "label");
  } catch (const std::exception&) {
    return markdown_code(label);
  }
  std::string out = markdown_code(call.name);
  std::vector<std::string> params;
  for (const auto& [k, v] : call.args) params.push_back(k + " = " + v);
  return params.empty() ? out : out + " (" + join(params, "and") + ")";
}

template <class Interface>
std::string summary_of(const std::string& label) {
  const auto colon = label.find(':');
  const auto* entry = Registry<Interface>::global().find(colon == std::string::npos ? label : label.substr(0, colon));
  return entry ? entry->summary : "";
}

std::string percent(double share) { return short_number(100 * share) + "%"; }

/// The statistical analysis, with every procedure named as references.cpp knows it.
std::string analysis_section(const ResultSet& results, const Summary& summary, const std::vector<CitedUse>& uses) {
  const auto& rc = results.columns[results.column_index(results.rank_by)];
  const std::string level = short_number(100 * (1 - summary.alpha));
  std::string out = "\n## Statistical analysis\n\n";
  out += "For each series, scheme and rate (a condition), each metric was summarised over replicates by its mean, "
         "standard deviation and the " + level + "% percentile bootstrap interval of the mean (" +
         std::to_string(stats::kBootstrapResamples) + " resamples, seeded from the condition, method and metric)" +
         cite(keys_for(uses, "test", test_names::kBootstrapInterval)) +
         "; the interval describes the variation from mask to mask on these series only. Trials in which a method "
         "failed or left masked points unfilled were counted, left out of the means and treated as the worst "
         "outcome of their replicate in every rank and test. Differences of `" + rc.name + "` smaller than " +
         format_double(kNoiseRelative) + " times the condition's scale (the median of its absolute values) were "
         "treated as ties, since fills that agree to rounding error differ by far less. Within each replicate "
         "the methods were ranked by `" + rc.name + "` (ties sharing the average rank). The best method of a "
         "condition was the one with the " + std::string(rc.direction == Direction::Lower ? "lowest" : "best") +
         " mean `" + rc.name + "` among those that filled every trial.";
  out += " Each other method was compared with it on the paired replicates by a two-sided Wilcoxon signed-rank "
         "test" + cite(keys_for(uses, "test", test_names::kSignedRank)) +
         " (zero differences dropped; the exact null distribution when at most 50 differences remain with no "
         "tied magnitudes, otherwise the normal approximation with the tie correction of the variance and no "
         "continuity correction), and by paired two one-sided tests (TOST) for equivalence" +
         cite(keys_for(uses, "test", test_names::kEquivalence)) + " with a margin of ±" +
         percent(summary.equivalence) + " of the best method's mean `" + rc.name + "`";
  out += "; Holm's correction was applied to each family of k − 1 comparisons. A method was called equivalent when "
         "the adjusted TOST p-value was below α, worse (or better) when the adjusted signed-rank p-value was, "
         "and not distinguishable otherwise; a method with a failed trial was never tested for equivalence.";
  const auto friedman = keys_for(uses, "test", test_names::kFriedman);
  if (!friedman.empty()) out += " The Friedman test" + cite(friedman) + " assessed whether the methods differed at all.";
  const auto nemenyi = keys_for(uses, "test", test_names::kNemenyi);
  if (!nemenyi.empty())
    out += " Across series, each series was one data set (its conditions combined by averaging the methods' mean "
           "ranks), and the methods' mean ranks were compared with the Friedman test, the Iman-Davenport "
           "correction" + cite(keys_for(uses, "test", test_names::kImanDavenport)) +
           " and the Nemenyi critical difference" + cite(nemenyi) + ".";
  out += " The significance level was α = " + short_number(summary.alpha) + ".\n";
  return out;
}

/// A series' verdict as sentences: the recommendation, its reasons and caveats.
std::string verdict_sentences(const SeriesVerdict& v) {
  std::string out = "**" + markdown_text(v.series) + "**. ";
  if (v.recommended.empty()) {
    out += "No method could be ranked.";
  } else {
    out += markdown_code(v.recommended) + " is recommended";
    if (!v.equally_good.empty()) {
      std::vector<std::string> names;
      for (const auto& n : v.equally_good) names.push_back(markdown_code(n));
      out += "; " + join(names) + (names.size() == 1 ? " was" : " were") + " shown equally good";
    }
    out += ".";
  }
  for (const auto& r : v.reasons) out += " " + r;
  for (const auto& c : v.caveats) out += " " + c;
  return out + "\n\n";
}

/// The other methods of a condition grouped by their standing against the
/// best, each with its relative difference and failures.
std::string standings_text(const CellGroup& g) {
  std::map<Standing, std::vector<std::string>> by;
  for (std::size_t i = 1; i < g.methods.size(); ++i) {
    const auto& m = g.methods[i];
    std::string item = markdown_code(m.method);
    if (std::isfinite(m.relative_difference)) item += " (" + signed_percent(m.relative_difference) + ")";
    if (m.failures) item += " (failed " + std::to_string(m.failures) + " of " + std::to_string(m.trials) + ")";
    by[m.standing].push_back(item);
  }
  std::string out;
  for (auto st : {Standing::Better, Standing::Equivalent, Standing::NotDistinguishable, Standing::Worse})
    if (by.count(st)) out += " " + std::string(standing_name(st)) + ": " + join(by[st]) + ".";
  return out;
}

/// One condition's line: the best method with its mean, interval and margin,
/// then the others by standing.
std::string condition_line(const CellGroup& g, std::size_t rank_col, const MetricColumn& rc, const std::string& level) {
  const auto& best = g.methods.front();
  const auto& s = best.metrics[rank_col];
  std::string out = "- " + g.scheme + ", rate " + format_double(g.rate) + " (" + std::to_string(g.replicates) +
                    " replicates): best `" + best.method + "`, mean " + rc.name + " ";
  const int decimals = std::isfinite(s.ci_low) ? supported_decimals(s.ci_low, s.ci_high) : -1;
  out += fixed_number(s.mean, decimals);
  if (std::isfinite(s.ci_low))
    out += " (" + level + "% interval " + fixed_number(s.ci_low, decimals) + " to " + fixed_number(s.ci_high, decimals) + ")";
  out += "; margin ±" + fixed_number(g.margin, decimals) + ".";
  out += standings_text(g);
  if (g.underpowered())
    out += " With " + std::to_string(g.replicates) + " replicates no difference could be detected (at least " +
           std::to_string(g.replicates_needed) + " needed).";
  return out + "\n";
}

/// The across-series line of the statistics over all conditions; "" when not made.
std::string across_line(const AcrossSeries& a) {
  if (a.datasets < 2 || a.methods.empty() || !a.scheme.empty()) return "";
  std::size_t best = 0;
  for (std::size_t i = 1; i < a.mean_ranks.size(); ++i)
    if (a.mean_ranks[i] < a.mean_ranks[best]) best = i;
  return "Across N = " + std::to_string(a.datasets) + " series, `" + a.methods[best] + "` had the best mean rank (" +
         short_number(a.mean_ranks[best]) + "); Friedman χ² = " + short_number(a.friedman_chi2) + ", p = " +
         short_number(a.friedman_p) + "; Iman-Davenport F = " + short_number(a.iman_davenport_f) + ", p = " +
         short_number(a.iman_davenport_p) + "; critical difference " + short_number(a.critical_difference) + ".\n";
}

/// The verdict per series, then each condition's standings with effect sizes.
std::string results_section(const ResultSet& results, const Summary& summary) {
  const std::size_t rank_col = results.column_index(results.rank_by);
  const auto& rc = results.columns[rank_col];
  const std::string level = short_number(100 * (1 - summary.alpha));
  std::string out = "\n## Results\n\n";
  for (const auto& v : summary.verdict.series) {
    out += verdict_sentences(v);
    for (const auto& g : summary.groups)
      if (g.series == v.series && !g.methods.empty()) out += condition_line(g, rank_col, rc, level);
    out += "\n";
  }
  for (const auto& a : summary.across) out += across_line(a);
  return out;
}

/// Fitted models over the replicates, per series and method, with the fits
/// that ended on a bound or did not converge named.
std::string fits_section(const Summary& summary) {
  if (summary.fits.empty()) return "";
  std::string out = "\n## Fitted models\n\nThe model-based methods estimated their parameters anew on every "
                    "masked series. Over the replicates of each series (all schemes and rates together), the "
                    "median and range [min, max] of each estimate and of the log-likelihood were:\n";
  std::string series;
  for (const auto& f : summary.fits) {
    if (f.series != series) {
      series = f.series;
      out += "\n**" + markdown_text(series) + "**\n\n| method | fits | model | estimates | log-likelihood | on a bound | "
             "not converged |\n|---|--:|---|---|---|--:|--:|\n";
    }
    out += "| " + markdown_code(f.method) + " | " + std::to_string(f.fits) + " | " + markdown_text(models_text(f)) +
           " | " + markdown_text(estimates_text(f)) + " | " + range_text(f.log_likelihood) + " | " +
           std::to_string(f.at_bound) + " | " + std::to_string(f.not_converged) + " |\n";
  }
  std::string flagged;
  for (const auto& w : summary.warnings)
    if (w.code == "fit-at-bound" || w.code == "fit-not-converged")
      flagged += "\n- " + markdown_code(w.where) + ": " + markdown_text(w.message) + " (" + markdown_text(w.hint) + ").";
  if (!flagged.empty()) out += "\nFits to check:\n" + flagged + "\n";
  return out;
}

/// Limitations generated from the run.
std::string limitations_section(const ResultSet& results, const Summary& summary, double max_rate) {
  std::string out = "\n## Limitations\n\n";
  out += "The real gaps of the series were not scored: there is no truth for them, and the masks only imitate them.";
  std::vector<std::string> shares;
  for (const auto& s : results.series) {
    const auto points = static_cast<double>(s.points), observed = static_cast<double>(s.observed);
    if (points <= 0) continue;
    const double total = (points - observed + max_rate * observed) / points;
    if (points - observed > 0) shares.push_back(markdown_code(s.label) + " " + percent(total));
  }
  if (!shares.empty())
    out += " The masks came on top of the series' own missing values, so at the highest rate the total missing "
           "share was " + join(shares) + ".";
  out += " The intervals describe the variation from mask to mask on these series only, not the variation to "
         "expect on other series, other periods or other kinds of gaps.";
  std::vector<std::string> assumed;
  const auto& spec = results.context.spec;
  bool period_given = false;
  if (spec.is_object() && spec.contains("data") && spec["data"].is_array())
    for (const auto& d : spec["data"]) period_given = period_given || d.contains("period") || d.contains("periods");
  if (!period_given)
    for (const auto& s : results.series)
      if (s.period > 0) assumed.push_back(markdown_code(s.label) + " (" + std::to_string(s.period) + ")");
  if (!assumed.empty())
    out += " The seasonal period was not set in the spec; the one assumed from the time step was used for " +
           join(assumed) + ".";
  out += " The masks hide values without regard to their size; where real values go missing because of what they "
         "are (detection limits, saturation, outages during extremes), the errors here may understate the real ones.";
  for (const auto& w : summary.warnings)
    if (w.code == "under-powered") out += " " + w.message + ".";
  return out + "\n";
}

/// The series and the input files.
std::string data_section(const ResultSet& results) {
  std::string out = "## Data\n\n";
  std::set<std::string> sources;
  for (const auto& s : results.series) sources.insert(s.source);
  out += "The benchmark used " + std::to_string(results.series.size()) + " series from " +
         std::to_string(sources.size()) + " data file" + (sources.size() == 1 ? "" : "s") + ":\n\n";
  for (const auto& s : results.series)
    out += "- " + markdown_code(s.label) + " (" + markdown_text(s.source) + "): " + std::to_string(s.points) +
           " points, " + std::to_string(s.observed) + " observed, regular step " + s.step + " starting " + s.start +
           ", seasonal period " + (s.period ? std::to_string(s.period) + " steps" : std::string("none")) + ".\n";
  if (!results.context.inputs.empty()) {
    out += "\nInput files and their SHA-256 digests:";
    for (const auto& in : results.context.inputs) out += " `" + in.file + "` (`" + in.sha256 + "`)";
    out += ".\n";
  }
  return out;
}

/// The schemes with their rates and the methods, in first-seen trial order.
struct Design {
  std::vector<std::string> schemes;
  std::vector<std::vector<double>> rates;  ///< per scheme
  std::vector<std::string> methods;
  double max_rate = 0;
};

Design design_of(const ResultSet& results) {
  Design d;
  for (const auto& t : results.trials) {
    d.max_rate = std::max(d.max_rate, t.rate);
    std::size_t k = 0;
    while (k < d.schemes.size() && d.schemes[k] != t.scheme) ++k;
    if (k == d.schemes.size()) d.schemes.push_back(t.scheme), d.rates.emplace_back();
    bool seen = false;
    for (double r : d.rates[k]) seen = seen || r == t.rate;
    if (!seen) d.rates[k].push_back(t.rate);
    bool known = false;
    for (const auto& m : d.methods) known = known || m == t.method;
    if (!known) d.methods.push_back(t.method);
  }
  return d;
}

/// The schemes and rates, replicates and seeds, the holdout, excluded conditions.
std::string masking_section(const ResultSet& results, const Summary& summary, const Design& design) {
  const std::string replicates = std::to_string(results.context.replicates);
  const std::string seed = std::to_string(results.context.seed);
  const std::size_t holdout = results.context.holdout;
  std::string out = "\n## Masking\n\nObserved values were hidden artificially and each method was scored on the hidden "
                    "points only. The masking schemes and missing rates (fractions of the eligible observed points) "
                    "were:\n\n";
  for (std::size_t k = 0; k < design.schemes.size(); ++k) {
    std::vector<std::string> rs;
    for (double r : design.rates[k]) rs.push_back(format_double(r));
    const std::string what = summary_of<MaskScheme>(design.schemes[k]);
    out += "- " + with_parameters<MaskScheme>(design.schemes[k]) + (what.empty() ? "" : ": " + what) + "; rates " +
           join(rs) + ".\n";
  }
  out += "\nEach combination of series, scheme and rate was repeated in " + replicates +
         " replicates. The random stream of each replicate was seeded from the experiment seed (" + seed +
         ") and the replicate's key (series, scheme, rate, replicate number), so the masks do not depend on the "
         "order of execution, and all methods were applied to the same masked series within a replicate "
         "(a paired design).";
  if (holdout)
    out += " The last " + std::to_string(holdout) + " points of each series were never hidden; they served as "
           "the forecast holdout.";
  for (const auto& e : summary.excluded)
    out += " The condition " + e.scheme + " at rate " + format_double(e.rate) + " of `" + e.series +
           "` could not be masked (" + e.reason + ") and is left out.";
  return out + "\n";
}

/// The methods with their parameters, then the metric columns and the ranking metric.
std::string methods_and_metrics_sections(const ResultSet& results, const Design& design,
                                         const std::vector<CitedUse>& uses) {
  std::string out = "\n## Fill methods\n\nEach method ran with its documented defaults except for the parameters "
                    "given.\n\n";
  for (const auto& m : design.methods) {
    const std::string what = summary_of<FillMethod>(m);
    const auto name = m.substr(0, m.find(':'));
    out += "- " + with_parameters<FillMethod>(m) + (what.empty() ? "" : ": " + what) +
           cite(keys_for(uses, "method", name)) + ".\n";
  }
  out += "\n## Metrics\n\n";
  for (const auto& c : results.columns)
    out += "- `" + c.name + "` (" + (c.unit.empty() ? std::string("no unit") : c.unit) + ", " +
           direction_words(c.direction) + "): " + c.summary + cite(keys_for(uses, "metric", c.name)) + ".\n";
  const auto& rc = results.columns[results.column_index(results.rank_by)];
  out += "\nMethods were ranked by `" + rc.name + "` (" + direction_words(rc.direction) + ").\n";
  return out;
}

/// The build and spec that reproduce the run, then the works cited.
std::string reproducibility_and_references(const ResultSet& results, const std::vector<CitedUse>& uses) {
  const RunContext& ctx = results.context;
  std::string out = "\n## Reproducibility\n\n";
  out += "The experiment was run with gapmark " + ctx.version + " (source commit " + ctx.commit + ") from the spec `" +
         ctx.spec_name + "` with SHA-256 `" + ctx.spec_sha256 + "`. Running `gapmark run` on the same spec and data "
         "reproduces every mask and every number reported here; the spec is stored in results.json.\n";
  const auto keys = cited_keys(uses);
  if (!keys.empty()) {
    out += "\n## References\n\n";
    for (const auto& k : keys)
      if (const auto* r = find_reference(k)) out += "- [" + k + "] " + r->citation + "\n";
  }
  return out;
}

class MethodsMarkdown final : public Reporter {
public:
  std::string file_name() const override { return "methods.md"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const auto uses = cited_uses(results, summary);
    const Design design = design_of(results);
    std::string out = "# Methods\n\n";
    out += data_section(results);
    out += masking_section(results, summary, design);
    out += methods_and_metrics_sections(results, design, uses);
    out += analysis_section(results, summary, uses);
    out += results_section(results, summary);
    out += fits_section(summary);
    out += limitations_section(results, summary, design.max_rate);
    out += reproducibility_and_references(results, uses);
    return out;
  }
};

const Registration<Reporter> registration{{
    .name = "methods-md",
    .summary = "a methods section for a paper: data, masking, methods, metrics, tests, verdicts, limitations, references",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<MethodsMarkdown>(); },
}};

}  // namespace
}  // namespace gapmark
