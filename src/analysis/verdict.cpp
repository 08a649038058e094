#include "gapmark/analysis/verdict.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>

#include "gapmark/analysis/summary.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {

std::string join_words(const std::vector<std::string>& items, const std::string& last) {
  std::string out;
  for (std::size_t i = 0; i < items.size(); ++i) {
    if (i) out += i + 1 == items.size() ? " " + last + " " : ", ";
    out += items[i];
  }
  return out;
}

namespace {

std::string percent(double share) { return short_number(100 * share) + "%"; }

std::string condition_name(const CellGroup& g) { return g.scheme + " at " + percent(g.rate); }

bool as_good(Standing s) { return s == Standing::Best || s == Standing::Equivalent; }

const MethodSummary* find(const CellGroup& g, const std::string& method) {
  for (const auto& m : g.methods)
    if (m.method == method) return &m;
  return nullptr;
}

std::string base_name(const std::string& call) { return call.substr(0, call.find(':')); }

/// One method's record over the conditions of a series.
struct Tally {
  std::string method;
  std::size_t top = 0, failures = 0, trials = 0, seen = 0;
  double rank_sum = 0;
  double mean_rank() const { return seen ? rank_sum / static_cast<double>(seen) : HUGE_VAL; }
};

std::vector<Tally> tally(const std::vector<const CellGroup*>& groups) {
  std::vector<Tally> out;
  for (const auto* g : groups)
    for (const auto& m : g->methods) {
      auto it = std::find_if(out.begin(), out.end(), [&](const Tally& t) { return t.method == m.method; });
      if (it == out.end()) it = out.insert(out.end(), Tally{m.method});
      it->top += as_good(m.standing);
      it->failures += m.failures;
      it->trials += m.trials;
      if (std::isfinite(m.mean_rank)) it->rank_sum += m.mean_rank, ++it->seen;
    }
  // Most conditions as good as the best first; then the fewest failures;
  // then the lowest mean rank over the conditions; then first seen.
  std::stable_sort(out.begin(), out.end(), [](const Tally& a, const Tally& b) {
    if (a.top != b.top) return a.top > b.top;
    if ((a.failures == 0) != (b.failures == 0)) return a.failures == 0;
    return a.mean_rank() < b.mean_rank();
  });
  return out;
}

std::string value_with_interval(const MetricSummary& s, double alpha) {
  if (!std::isfinite(s.ci_low)) return short_number(s.mean);
  const RoundedInterval r = rounded_interval(s.mean, s.ci_low, s.ci_high);
  return r.value + " (" + short_number(100 * (1 - alpha)) + "% bootstrap interval " + r.low + " to " + r.high + ")";
}

/// How a method stands in one condition, in words.
std::string standing_words(const CellGroup& g, const MethodSummary& m, const std::string& rank_by) {
  const auto& best = g.methods.front();
  if (m.standing == Standing::Best) return "best";
  if (m.standing == Standing::Better) {
    std::string out = "smaller " + rank_by + " than " + best.method + " in most replicates (paired signed-rank test)";
    if (std::isfinite(m.relative_difference))
      out += " though its mean " + rank_by + " is " + (m.relative_difference >= 0 ? "higher by " : "lower by ") +
             rounded_percent(std::abs(m.relative_difference));
    return out;
  }
  std::string out = standing_name(m.standing);
  if (m.standing == Standing::Equivalent)
    out += " to " + best.method;
  else
    out += std::string(m.standing == Standing::Worse ? " than " : " from ") + best.method;
  if (std::isfinite(m.relative_difference))
    out += ", " + signed_percent(m.relative_difference) + " " + rank_by;
  return out;
}

/// What every step of one series' verdict reads: its conditions, the
/// methods in order of merit (the first is the recommendation) and the
/// ranking metric.
struct SeriesFacts {
  const std::vector<const CellGroup*>& groups;
  const std::vector<Tally>& order;
  const Summary& summary;
  std::size_t rank_col;
  Direction direction;
  const Tally& recommended() const { return order.front(); }
  const std::string& rank_by() const { return summary.rank_by; }
};

/// The methods as good as the recommendation wherever it is as good as the best.
std::vector<std::string> equally_good(const SeriesFacts& f) {
  std::vector<std::string> out;
  const std::string& rec = f.recommended().method;
  for (std::size_t i = 1; i < f.order.size(); ++i) {
    bool all = f.order[i].top > 0;
    for (const auto* g : f.groups) {
      const auto* r = find(*g, rec);
      const auto* o = find(*g, f.order[i].method);
      if (r && as_good(r->standing) && !(o && as_good(o->standing))) all = false;
    }
    if (all) out.push_back(f.order[i].method);
  }
  return out;
}

/// The gain over the mean baseline, averaged over the conditions where both
/// have a finite score; empty when there is none.
std::optional<std::string> gain_over_baseline(const SeriesFacts& f) {
  double gain = 0;
  std::size_t counted = 0;
  std::string baseline;
  for (const auto* g : f.groups) {
    const auto* r = find(*g, f.recommended().method);
    const MethodSummary* b = nullptr;
    for (const auto& m : g->methods)
      if (base_name(m.method) == "mean") b = &m;
    if (!r || !b || b == r) continue;
    const double x = badness(r->metrics[f.rank_col].mean, f.direction);
    const double y = badness(b->metrics[f.rank_col].mean, f.direction);
    if (!std::isfinite(x) || !std::isfinite(y) || y == 0) continue;
    gain += (y - x) / std::abs(y);
    ++counted;
    baseline = b->method;
  }
  if (!counted) return std::nullopt;
  const bool lower = f.direction == Direction::Lower;
  return std::string(lower ? "Its " + f.rank_by() + " is " : "It is ") +
         rounded_percent(std::abs(gain / static_cast<double>(counted))) +
         (gain >= 0 ? (lower ? " lower" : " better") : (lower ? " higher" : " worse")) + " than the `" + baseline +
         "` baseline's" + (counted > 1 ? " (mean over " + std::to_string(counted) + " conditions)" : "") + ".";
}

/// Why the recommendation: its record, its score per condition, the methods
/// equally good, its gain over the baseline.
std::vector<std::string> reasons(const SeriesFacts& f, const std::vector<std::string>& equally) {
  const Tally& rec = f.recommended();
  const std::string& rank_by = f.rank_by();
  std::vector<std::string> out;
  out.push_back("Best, or within the equivalence margin (" + percent(f.summary.equivalence) + " of the best's " + rank_by +
                ", paired TOST), in " + std::to_string(rec.top) + " of " + std::to_string(f.groups.size()) +
                " condition" + (f.groups.size() == 1 ? "" : "s") + ".");
  for (const auto* g : f.groups) {
    const auto* m = find(*g, rec.method);
    if (m == nullptr) continue;
    out.push_back(condition_name(*g) + ": " + rank_by + " " + value_with_interval(m->metrics[f.rank_col], f.summary.alpha) +
                  ", " + standing_words(*g, *m, rank_by) + " (" + std::to_string(g->replicates) + " replicates).");
  }
  if (!equally.empty()) out.push_back("Shown equally good (best or equivalent wherever it is): " + join_words(equally) + ".");
  if (auto gain = gain_over_baseline(f)) out.push_back(*gain);
  return out;
}

/// The caveats of one condition: where the recommendation is not as good as
/// the best, where the mean and the paired test disagree, too few replicates.
void condition_caveats(const SeriesFacts& f, const CellGroup& g, std::vector<std::string>& out) {
  const Tally& rec = f.recommended();
  const std::string& rank_by = f.rank_by();
  const auto* m = find(g, rec.method);
  if (m && m->standing == Standing::Better)
    out.push_back("In " + condition_name(g) + " it is not the best by mean: " + g.methods.front().method +
                  " has the lower mean " + rank_by + ", while " + rec.method + " had the smaller " + rank_by +
                  " in most replicates (paired signed-rank test). The mean and the paired test disagree when "
                  "a few replicates weigh heavily; look at that condition's table before relying on either.");
  else if (m && !as_good(m->standing))
    out.push_back("In " + condition_name(g) + " it was " + standing_words(g, *m, rank_by) + ".");
  for (const auto& o : g.methods)
    if (o.standing == Standing::Better && o.method != rec.method)
      out.push_back("In " + condition_name(g) + ", " + o.method + " had the smaller " + rank_by +
                    " in most replicates (paired signed-rank test) while " + g.methods.front().method +
                    " had the lower mean; the best is the one with the lowest mean, the statistic the "
                    "equivalence test uses, and the two disagree when a few replicates weigh heavily.");
  if (g.underpowered())
    out.push_back("In " + condition_name(g) + ", " + std::to_string(g.replicates) +
                  " replicates are too few for the paired tests to find any difference among " +
                  std::to_string(g.methods.size()) + " methods (at least " + std::to_string(g.replicates_needed) +
                  " are needed): 'not distinguishable' there is no evidence of equal quality.");
}

/// The other methods not distinguishable from the best in some condition
/// that had replicates enough: more replicates would decide.
std::vector<std::string> undecided(const SeriesFacts& f) {
  std::vector<std::string> out;
  for (const auto& t : f.order) {
    if (t.method == f.recommended().method) continue;
    bool open = false;
    for (const auto* g : f.groups) {
      const auto* m = find(*g, t.method);
      open = open || (m && m->standing == Standing::NotDistinguishable && !g->underpowered());
    }
    if (open) out.push_back(t.method);
  }
  return out;
}

/// What to keep in mind: per condition, then failures, then the undecided.
std::vector<std::string> caveats(const SeriesFacts& f) {
  std::vector<std::string> out;
  for (const auto* g : f.groups) condition_caveats(f, *g, out);
  const Tally& rec = f.recommended();
  if (rec.failures)
    out.push_back("It failed or left masked points unfilled in " + std::to_string(rec.failures) + " of " +
                  std::to_string(rec.trials) + " trials.");
  const std::vector<std::string> open = undecided(f);
  if (!open.empty())
    out.push_back("Neither shown worse than the best nor within the margin in some condition (more replicates "
                  "would decide): " + join_words(open) + ".");
  return out;
}

SeriesVerdict decide_series(const std::string& series, const std::vector<const CellGroup*>& groups,
                            const Summary& summary, const ResultSet& results) {
  SeriesVerdict v;
  v.series = series;
  v.conditions = groups.size();
  const auto order = tally(groups);
  const std::size_t rank_col = results.column_index(summary.rank_by);
  if (order.empty() || order.front().top == 0) {
    v.caveats.push_back("No method could be ranked on this series.");
    return v;
  }
  const SeriesFacts facts{.groups = groups, .order = order, .summary = summary, .rank_col = rank_col,
                          .direction = results.columns[rank_col].direction};
  v.recommended = order.front().method;
  v.top = order.front().top;
  v.equally_good = equally_good(facts);
  v.reasons = reasons(facts, v.equally_good);
  v.caveats = caveats(facts);
  return v;
}

}  // namespace

RunVerdict decide_verdict(const Summary& summary, const ResultSet& results) {
  RunVerdict verdict;
  std::vector<std::string> series;
  for (const auto& s : results.series)
    if (std::find(series.begin(), series.end(), s.label) == series.end()) series.push_back(s.label);
  for (const auto& g : summary.groups)
    if (std::find(series.begin(), series.end(), g.series) == series.end()) series.push_back(g.series);
  for (const auto& e : summary.excluded)
    if (std::find(series.begin(), series.end(), e.series) == series.end()) series.push_back(e.series);
  for (const auto& s : series) {
    std::vector<const CellGroup*> groups;
    for (const auto& g : summary.groups)
      if (g.series == s) groups.push_back(&g);
    bool any = !groups.empty();
    for (const auto& e : summary.excluded) any = any || e.series == s;
    if (any) verdict.series.push_back(decide_series(s, groups, summary, results));
  }
  for (const auto& e : summary.excluded)
    verdict.notes.push_back("Left out of every table, verdict and comparison: " + e.series + ", " + e.scheme + " at " +
                            percent(e.rate) + " (" + e.reason + ").");
  for (const auto& a : summary.across)
    if (a.scheme.empty() && a.datasets >= 2) {
      verdict.notes.push_back("Across series, each series counts once (its conditions combined first): N = " +
                              std::to_string(a.datasets) + " series" +
                              (a.datasets < kFewestSeries ? ", too few for the approximations behind the tests; read "
                                                            "the mean ranks as descriptive."
                                                          : "."));
    }
  return verdict;
}

const SeriesVerdict* verdict_for(const RunVerdict& verdict, const std::string& series) {
  for (const auto& v : verdict.series)
    if (v.series == series) return &v;
  return nullptr;
}

nlohmann::json verdict_to_json(const RunVerdict& verdict) {
  nlohmann::json series = nlohmann::json::array();
  for (const auto& v : verdict.series)
    series.push_back({{"series", v.series},
                      {"recommended", v.recommended.empty() ? nlohmann::json(nullptr) : nlohmann::json(v.recommended)},
                      {"equally_good", v.equally_good},
                      {"conditions", v.conditions},
                      {"best_or_equivalent_in", v.top},
                      {"reasons", v.reasons},
                      {"caveats", v.caveats}});
  return {{"series", series}, {"notes", verdict.notes}};
}

std::string recommendation_line(const SeriesVerdict& v) {
  if (v.recommended.empty()) return "no recommendation";
  std::string out = "recommended " + v.recommended;
  if (!v.equally_good.empty()) out += "; equally good: " + join_words(v.equally_good);
  return out;
}

std::string verdict_text(const RunVerdict& verdict, const std::string& indent) {
  std::string out;
  for (const auto& v : verdict.series) {
    out += v.series + ": " + recommendation_line(v) + "\n";
    for (const auto& r : v.reasons) out += indent + "- " + r + "\n";
    for (const auto& c : v.caveats) out += indent + "- caution: " + c + "\n";
  }
  for (const auto& n : verdict.notes) out += "Note: " + n + "\n";
  return out;
}

}  // namespace gapmark
