// What could make quick's recommendation wrong (see quick_risks.hpp).
#include "gapmark/data/quick_risks.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/data/text_columns.hpp"
#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/stats/signed_rank_power.hpp"

namespace gapmark::data {

std::size_t fewest_replicates(std::size_t methods, double alpha) {
  return stats::fewest_signed_rank_pairs(std::max<std::size_t>(methods, 2) - 1, alpha);
}

std::vector<GapCluster> gap_clusters(const QuickSetup& setup) {
  std::vector<GapCluster> out;
  for (const auto& s : setup.profile.series) {
    if (s.variable != setup.column || s.states.empty()) continue;
    const TimeAxis& axis = setup.profile.groups[s.group].grid;
    const std::size_t n = s.states.size();
    // Windows: calendar months for daily or finer steps, else tenths of the series.
    std::vector<std::pair<std::size_t, std::size_t>> windows;  // [begin, end)
    std::vector<std::string> names;
    const bool by_month = setup.profile.kind != TimeKind::Index && setup.profile.step.unit != Step::Unit::Months &&
                          setup.profile.step.amount <= 86400;
    if (by_month) {
      std::size_t begin = 0;
      for (std::size_t i = 1; i <= n; ++i)
        if (i == n || axis.format(i).substr(0, 7) != axis.format(begin).substr(0, 7)) {
          windows.emplace_back(begin, i);
          names.push_back(axis.format(begin).substr(0, 7));
          begin = i;
        }
    } else {
      const std::size_t width = std::max<std::size_t>(10, (n + 9) / 10);
      for (std::size_t b = 0; b < n; b += width) {
        windows.emplace_back(b, std::min(n, b + width));
        names.push_back(axis.format(b) + " to " + axis.format(std::min(n, b + width) - 1));
      }
    }
    const double overall = double(s.missing()) / double(n);
    GapCluster worst;
    double worst_share = -1;
    for (std::size_t w = 0; w < windows.size(); ++w) {
      const auto [b, e] = windows[w];
      std::size_t missing = 0;
      for (std::size_t i = b; i < e; ++i) missing += s.states[i] != SlotState::Present;
      const double share = double(missing) / double(e - b);
      if (e - b >= 10 && share > worst_share) {
        worst_share = share;
        worst = {s.label, names[w], e - b, missing, overall};
      }
    }
    if (worst_share >= 0.5 && worst_share >= 2 * overall) out.push_back(worst);
  }
  return out;
}

std::vector<OutOfRange> fills_out_of_range(const QuickSetup& setup, double& observed_low, double& observed_high) {
  observed_low = std::numeric_limits<double>::infinity();
  observed_high = -observed_low;
  for (const auto& s : setup.profile.series)
    if (s.variable == setup.column)
      for (double v : s.values)
        if (std::isfinite(v)) observed_low = std::min(observed_low, v), observed_high = std::max(observed_high, v);
  std::vector<OutOfRange> out;
  if (!(observed_low <= observed_high)) return out;
  for (const auto& name : setup.plan.methods) {
    const auto method = MethodRegistry::global().bind(CallSpec::parse(name, "quick"), "quick");
    double low = std::numeric_limits<double>::infinity(), high = -low;
    for (const auto& s : setup.profile.series) {
      if (s.variable != setup.column) continue;
      FillRequest request;
      request.values = s.values;
      request.axis = &setup.profile.groups[s.group].grid;
      request.period = setup.plan.period;
      for (const auto& other : setup.profile.series)
        if (other.group == s.group && other.variable != s.variable &&
            std::find(setup.siblings.begin(), setup.siblings.end(), other.variable) != setup.siblings.end()) {
          request.siblings.emplace_back(other.values);
          request.sibling_names.push_back(other.label);
        }
      try {
        check_needs(method, request);
        const FillResult result = method.impl->fill(request);
        for (std::size_t i = 0; i < s.values.size() && i < result.values.size(); ++i)
          if (std::isnan(s.values[i]) && std::isfinite(result.values[i]))
            low = std::min(low, result.values[i]), high = std::max(high, result.values[i]);
      } catch (const MethodFailure&) {
        // A method that cannot fill here shows as failed in the run itself.
      }
    }
    if (low < observed_low || high > observed_high) out.push_back({method.label, low, high});
  }
  return out;
}

std::vector<QuickRisk> quick_risks(const QuickSetup& setup, const ResultSet& results) {
  std::vector<QuickRisk> risks;
  for (const auto& w : results.warnings) {
    const bool ours = w.where.empty() || w.where.find(setup.column) != std::string::npos ||
                      std::none_of(setup.siblings.begin(), setup.siblings.end(),
                                   [&](const std::string& s) { return w.where.find(s) != std::string::npos; });
    if (ours) risks.push_back({w.code, w.where + ": " + w.message, w.hint});
  }
  const std::size_t methods = setup.plan.methods.size();
  const int replicates = setup.plan.spec.value("replicates", 10);
  const std::size_t needed = fewest_replicates(methods, results.alpha);
  if (static_cast<std::size_t>(replicates) < needed)
    risks.push_back({"few-replicates",
                     std::to_string(replicates) + " replicates for " + std::to_string(methods) +
                         " methods: no paired difference can reach alpha = " + short_number(results.alpha) +
                         " after Holm's correction below " + std::to_string(needed) + " replicates, so every method looks tied",
                     "rerun with --replicates " + std::to_string(needed) + " or more"});
  for (const auto& c : gap_clusters(setup))
    risks.push_back({"clustered-gaps",
                     "the real gaps of " + c.series + " cluster: " + c.window + " is " +
                         rounded_percent(double(c.missing) / double(c.points)) + " missing (" + std::to_string(c.missing) + " of " +
                         std::to_string(c.points) + ") against " + rounded_percent(c.overall) +
                         " overall; the masks spread their gaps over the whole series and do not reproduce such a stretch",
                     "read the ranking as one for scattered gaps; a long outage may need a method that uses other columns "
                     "(low-rank) or no fill at all"});
  for (const auto& s : setup.profile.series) {
    if (s.variable != setup.column || !s.screen.applicable || !(s.screen.test.p < 0.05)) continue;
    risks.push_back({"value-dependent",
                     "the values next to the gaps of " + s.label + " differ from the others (median " +
                         short_number(s.screen.near_median) + " against " + short_number(s.screen.rest_median) +
                         ", Mann-Whitney p = " + short_number(s.screen.test.p) +
                         "): values may go missing more at some levels, which random-position masks do not mimic",
                     "add the value-dependent masking scheme to the spec and compare; treat the fills with more care"});
  }
  double low = 0, high = 0;
  const auto outside = fills_out_of_range(setup, low, high);
  if (!outside.empty()) {
    std::string list;
    for (const auto& o : outside) list += (list.empty() ? "" : "; ") + o.method + " " + short_number(o.low) + " to " + short_number(o.high);
    risks.push_back({"fills-out-of-range",
                     "filling the real gaps leaves the observed range " + short_number(low) + " to " + short_number(high) +
                         ": " + list,
                     "keep fills in physical bounds with METHOD:bounds=LO,HI, or fill on a log scale with "
                     "METHOD:transform=log (values > 0) or transform=log1p (values >= 0)"});
  }
  return risks;
}

std::string risks_text(const std::vector<QuickRisk>& risks) {
  if (risks.empty()) return "Risks: none found (masked points, replicates, gap clusters, value-dependence, fill range checked)\n";
  std::string out = "Risks to this recommendation:\n";
  for (const auto& r : risks) out += "  - " + r.message + "\n    -> " + r.advice + "\n";
  return out;
}

}  // namespace gapmark::data
