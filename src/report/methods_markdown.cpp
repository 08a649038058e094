// methods.md: the experiment described in neutral scientific English, with
// everything a reviewer needs to rerun it (data, masking, replicates and
// seed, methods with every parameter, metrics, tests and alpha, the winner
// per series and condition, the tool version and the spec's SHA-256),
// followed by the references of the published work it used.
#include <cmath>
#include <set>

#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/params.hpp"
#include "gapmark/report/references.hpp"
#include "gapmark/report/reporter.hpp"
#include "gapmark/report/table_text.hpp"

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

/// "name (a = 1, b = x [default])": every parameter, given or defaulted.
template <class Interface>
std::string with_parameters(const std::string& label) {
  CallSpec call;
  try {
    call = CallSpec::parse(label, "label");
  } catch (const std::exception&) {
    return "`" + label + "`";
  }
  const auto* entry = Registry<Interface>::global().find(call.name);
  std::string out = "`" + call.name + "`";
  if (entry == nullptr || entry->params.empty()) return out;
  std::vector<std::string> params;
  for (const auto& p : entry->params) {
    std::string value = p.default_value.empty() ? "(none)" : p.default_value;
    bool given = false;
    for (const auto& [k, v] : call.args)
      if (k == p.name) value = v, given = true;
    params.push_back(p.name + " = " + value + (given ? "" : " (default)"));
  }
  return out + " (" + join(params, "and") + ")";
}

template <class Interface>
std::string summary_of(const std::string& label) {
  const auto colon = label.find(':');
  const auto* entry = Registry<Interface>::global().find(colon == std::string::npos ? label : label.substr(0, colon));
  return entry ? entry->summary : "";
}

std::string best_words(Direction d) {
  switch (d) {
    case Direction::Lower: return "lowest";
    case Direction::Higher: return "highest";
    case Direction::ZeroBest: return "closest to zero";
    case Direction::OneBest: return "closest to one";
    case Direction::None: return "first";
  }
  return "best";
}

class MethodsMarkdown final : public Reporter {
public:
  std::string file_name() const override { return "methods.md"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const auto& ctx = results.context;
    const auto uses = cited_uses(results, summary);
    const std::size_t rank_col = results.column_index(results.rank_by);
    const auto& rc = results.columns[rank_col];
    const std::string level = short_number(100 * (1 - summary.alpha));
    std::string out = "# Methods\n\n";

    // Data.
    out += "## Data\n\n";
    const std::size_t n_series = results.series.is_array() ? results.series.size() : 0;
    std::set<std::string> sources;
    if (results.series.is_array())
      for (const auto& s : results.series) sources.insert(s.value("source", std::string()));
    out += "The benchmark used " + std::to_string(n_series) + " series from " + std::to_string(sources.size()) +
           " data file" + (sources.size() == 1 ? "" : "s") + ":\n\n";
    if (results.series.is_array())
      for (const auto& s : results.series) {
        const std::size_t period = s.value("period", 0);
        out += "- `" + s.value("label", std::string()) + "` (" + s.value("source", std::string()) + "): " +
               std::to_string(s.value("points", 0)) + " points, " + std::to_string(s.value("observed", 0)) +
               " observed, regular step " + s.value("step", std::string()) + " starting " +
               s.value("start", std::string()) + ", seasonal period " +
               (period ? std::to_string(period) + " steps" : std::string("none")) + ".\n";
      }
    if (ctx.contains("inputs") && ctx["inputs"].is_array() && !ctx["inputs"].empty()) {
      out += "\nInput files and their SHA-256 digests:";
      for (const auto& in : ctx["inputs"])
        out += " `" + in.value("file", std::string()) + "` (`" + in.value("sha256", std::string()) + "`)";
      out += ".\n";
    }

    // Masking.
    std::vector<std::string> schemes;
    std::vector<std::vector<double>> rates;
    std::vector<std::string> methods;
    for (const auto& t : results.trials) {
      std::size_t k = 0;
      while (k < schemes.size() && schemes[k] != t.scheme) ++k;
      if (k == schemes.size()) schemes.push_back(t.scheme), rates.emplace_back();
      bool seen = false;
      for (double r : rates[k]) seen = seen || r == t.rate;
      if (!seen) rates[k].push_back(t.rate);
      bool known = false;
      for (const auto& m : methods) known = known || m == t.method;
      if (!known) methods.push_back(t.method);
    }
    const std::string replicates = ctx.contains("replicates") ? ctx["replicates"].dump() : "?";
    const std::string seed = ctx.contains("seed") ? ctx["seed"].dump() : "?";
    const std::size_t holdout = ctx.value("holdout", std::size_t{0});
    out += "\n## Masking\n\nObserved values were hidden artificially and each method was scored on the hidden "
           "points only. The masking schemes and missing rates (fractions of the eligible observed points) were:\n\n";
    for (std::size_t k = 0; k < schemes.size(); ++k) {
      std::vector<std::string> rs;
      for (double r : rates[k]) rs.push_back(format_double(r));
      const std::string what = summary_of<MaskScheme>(schemes[k]);
      out += "- " + with_parameters<MaskScheme>(schemes[k]) + (what.empty() ? "" : ": " + what) + "; rates " +
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
    out += "\n";

    // Methods.
    out += "\n## Fill methods\n\n";
    for (const auto& m : methods) {
      const std::string what = summary_of<FillMethod>(m);
      const auto name = m.substr(0, m.find(':'));
      out += "- " + with_parameters<FillMethod>(m) + (what.empty() ? "" : ": " + what) +
             cite(keys_for(uses, "method", name)) + ".\n";
    }

    // Metrics.
    out += "\n## Metrics\n\n";
    for (const auto& c : results.columns)
      out += "- `" + c.name + "` (" + (c.unit.empty() ? std::string("no unit") : c.unit) + ", " +
             direction_words(c.direction) + "): " + c.summary + cite(keys_for(uses, "metric", c.name)) + ".\n";
    out += "\nMethods were ranked by `" + rc.name + "` (" + direction_words(rc.direction) + ").\n";

    // Statistics.
    out += "\n## Statistical analysis\n\n";
    out += "For each series, scheme and rate, each metric was summarised over replicates by its mean, standard "
           "deviation and the " + level + "% confidence interval of the mean from Student's t distribution" +
           cite(keys_for(uses, "test", "Student-t confidence interval")) +
           ". Trials in which a method failed or left masked points unfilled were counted, excluded from the means "
           "and ranked last in their replicate, and such methods were ordered after those that filled every trial. "
           "Within each replicate the methods were ranked by `" + rc.name + "` (ties sharing the average rank); the "
           "mean of these ranks over replicates is reported beside the means.";
    const auto vs_best = keys_for(uses, "test", "Wilcoxon signed-rank test against the best, Holm-adjusted");
    if (!vs_best.empty())
      out += " Each method was compared with the best one by a two-sided Wilcoxon signed-rank test on the "
             "paired replicates, with Holm's adjustment for the number of comparisons" + cite(vs_best) +
             "; methods with an adjusted p-value of at least α were reported as not distinguishable from the best.";
    const auto friedman = keys_for(uses, "test", "Friedman test");
    if (!friedman.empty())
      out += " The Friedman test" + cite(friedman) + " assessed whether the methods differed at all.";
    const auto nemenyi = keys_for(uses, "test", "Nemenyi critical difference");
    if (!nemenyi.empty())
      out += " Across series, the methods' mean ranks over all data sets (series and condition) were compared "
             "with the Friedman test and the Iman-Davenport correction" +
             cite(keys_for(uses, "test", "Iman-Davenport test")) +
             ", followed by the Nemenyi critical difference" + cite(nemenyi) + ".";
    out += " The significance level was α = " + short_number(summary.alpha) + ".\n";

    // Results.
    out += "\n## Results\n\n";
    std::string current;
    for (const auto& g : summary.groups) {
      if (g.methods.empty()) continue;
      if (g.series != current) {
        current = g.series;
        out += "\n**" + g.series + "**\n\n";
      }
      const auto& best = g.methods.front();
      const auto& s = best.metrics[rank_col];
      out += "- " + g.scheme + ", rate " + format_double(g.rate) + ": `" + best.method + "` had the " +
             best_words(rc.direction) + " mean " + rc.name + ", " + short_number(s.mean);
      if (std::isfinite(s.ci_low))
        out += " (" + level + "% CI " + short_number(s.ci_low) + " to " + short_number(s.ci_high) + ")";
      out += ", over " + std::to_string(s.n) + " replicates";
      bool tested = false;
      std::vector<std::string> tied;
      for (const auto& m : g.methods) {
        tested = tested || std::isfinite(m.p_vs_best);
        if (&m != &best && m.tied_with_best) tied.push_back("`" + m.method + "`");
      }
      if (!tested)
        out += "; no paired test against it was available for this condition.\n";
      else if (tied.empty())
        out += "; every other method differed from it significantly.\n";
      else
        out += "; not distinguishable from it at α = " + short_number(summary.alpha) + ": " + join(tied) + ".\n";
    }
    for (const auto& a : summary.across) {
      if (a.datasets < 2 || a.methods.empty()) continue;
      std::size_t best = 0;
      for (std::size_t i = 1; i < a.mean_ranks.size(); ++i)
        if (a.mean_ranks[i] < a.mean_ranks[best]) best = i;
      out += "\nAcross " + std::to_string(a.datasets) + " data sets" +
             (a.scheme.empty() ? std::string() : " (" + a.scheme + ", rate " + format_double(a.rate) + ")") + ", `" +
             a.methods[best] + "` had the best mean rank (" + short_number(a.mean_ranks[best]) +
             "); Friedman χ² = " + short_number(a.friedman_chi2) + ", p = " + short_number(a.friedman_p) +
             "; Iman-Davenport F = " + short_number(a.iman_davenport_f) + ", p = " + short_number(a.iman_davenport_p) +
             "; critical difference " + short_number(a.critical_difference) + ".\n";
    }

    // Reproducibility.
    out += "\n## Reproducibility\n\n";
    out += "The experiment was run with gapmark " + ctx.value("version", std::string("?")) + " (source commit " +
           ctx.value("commit", std::string("unknown")) + ") from the spec `" +
           ctx.value("spec_name", std::string("experiment")) + "` with SHA-256 `" +
           ctx.value("spec_sha256", std::string("?")) + "`. Running `gapmark run` on the same spec and data "
           "reproduces every mask and every number reported here; the spec is stored in results.json.\n";

    // References.
    const auto keys = cited_keys(uses);
    if (!keys.empty()) {
      out += "\n## References\n\n";
      for (const auto& k : keys)
        if (const auto* r = find_reference(k)) out += "- [" + k + "] " + r->citation + "\n";
    }
    return out;
  }
};

const Registration<Reporter> registration{{
    .name = "methods-md",
    .summary = "a methods section for a paper: data, masking, methods, metrics, tests, winners, references",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<MethodsMarkdown>(); },
}};

}  // namespace
}  // namespace gapmark
