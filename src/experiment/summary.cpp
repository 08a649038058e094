#include "gapmark/experiment/summary.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>
#include <tuple>

#include "gapmark/stats/critical_difference.hpp"
#include "gapmark/stats/descriptive.hpp"
#include "gapmark/stats/friedman.hpp"
#include "gapmark/stats/multiple_testing.hpp"
#include "gapmark/stats/ranks.hpp"
#include "gapmark/stats/wilcoxon.hpp"

namespace gapmark {
namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();

MetricSummary describe(const std::vector<double>& xs, double level) {
  const auto d = stats::describe(xs, level);
  MetricSummary s;
  s.n = d.n;
  s.mean = d.mean;
  s.sd = d.sd;
  s.ci_low = d.ci.low;
  s.ci_high = d.ci.high;
  return s;
}

/// Badness with "no value" (a failed trial, a metric not applicable) placed
/// after every value: +inf, so it ranks last and such entries tie.
double badness_or_worst(double badness_value) {
  return std::isnan(badness_value) ? std::numeric_limits<double>::infinity() : badness_value;
}

/// Average ranks (1 = best) of `scores`; NaN scores share the worst ranks.
std::vector<double> average_ranks(const std::vector<double>& scores) {
  std::vector<double> keys(scores.size());
  std::transform(scores.begin(), scores.end(), keys.begin(), badness_or_worst);
  return stats::average_ranks(keys);
}

/// The tests behind a group's ranking. `table[replicate][method]` holds the
/// badness of the ranking metric (NaN = no value); g.methods is in rank order
/// (front = best) and `column_of[position]` is that method's column in
/// `table`. Sets the group's Friedman result and each method's p_vs_best
/// and tied_with_best.
void test_group(CellGroup& g, const std::vector<std::vector<double>>& table,
                const std::vector<std::size_t>& column_of, double alpha) {
  const std::size_t k = g.methods.size(), reps = table.size();
  // Friedman over replicates (blocks) and methods (treatments).
  std::vector<double> matrix;
  matrix.reserve(reps * k);
  for (const auto& row : table)
    for (double v : row) matrix.push_back(badness_or_worst(v));
  const auto friedman = stats::friedman(matrix, reps, k);
  g.friedman_statistic = friedman.statistic;
  g.friedman_p = friedman.p;

  // Wilcoxon signed-rank of each method against the best, paired over the
  // replicates where both have a value; Holm over the k - 1 comparisons.
  if (k == 0) return;
  const std::size_t best = column_of[0];
  std::vector<double> raw(k, std::numeric_limits<double>::quiet_NaN());
  for (std::size_t pos = 1; pos < k; ++pos) {
    const std::size_t m = column_of[pos];
    std::vector<double> differences;
    for (const auto& row : table)
      if (!std::isnan(row[m]) && !std::isnan(row[best])) differences.push_back(row[m] - row[best]);
    if (!differences.empty()) raw[pos] = stats::wilcoxon_signed_rank(differences).p;
  }
  const auto adjusted = stats::holm_adjust(raw);
  g.methods[0].p_vs_best = std::numeric_limits<double>::quiet_NaN();
  g.methods[0].tied_with_best = true;
  for (std::size_t pos = 1; pos < k; ++pos) {
    g.methods[pos].p_vs_best = adjusted[pos];
    // No shared replicate: cannot be compared, so not counted as tied.
    g.methods[pos].tied_with_best = !std::isnan(adjusted[pos]) && adjusted[pos] >= alpha;
  }
}

/// Across series: each group is a data set; methods are ranked within it by
/// the badness of their mean on the ranking metric (ties averaged, no value
/// last), then the mean ranks are tested.
AcrossSeries compare_groups(const std::vector<const CellGroup*>& groups, std::size_t rank_col,
                            Direction direction, double alpha, std::map<std::size_t, double>& cd_q) {
  AcrossSeries a;
  a.datasets = groups.size();
  std::map<std::string, std::size_t> index;
  for (const auto* g : groups)
    for (const auto& m : g->methods)
      if (index.try_emplace(m.method, a.methods.size()).second) a.methods.push_back(m.method);
  const std::size_t k = a.methods.size(), n = groups.size();
  std::vector<double> matrix(n * k, std::numeric_limits<double>::infinity());
  for (std::size_t i = 0; i < n; ++i)
    for (const auto& m : groups[i]->methods)
      matrix[i * k + index[m.method]] = badness_or_worst(badness(m.metrics[rank_col].mean, direction));
  a.mean_ranks = stats::mean_row_ranks(matrix, n, k);
  const auto friedman = stats::friedman(matrix, n, k);
  a.friedman_chi2 = friedman.statistic;
  a.friedman_p = friedman.p;
  const auto id = stats::iman_davenport(friedman.statistic, k, n);
  a.iman_davenport_f = id.f;
  a.iman_davenport_p = id.p;
  if (k >= 2 && n >= 1) {
    auto it = cd_q.find(k);
    if (it == cd_q.end()) it = cd_q.emplace(k, stats::nemenyi_q(alpha, static_cast<int>(k))).first;
    const double kk = static_cast<double>(k);
    a.critical_difference = it->second * std::sqrt(kk * (kk + 1) / (6.0 * static_cast<double>(n)));
  } else {
    a.critical_difference = std::numeric_limits<double>::quiet_NaN();
  }
  return a;
}

}  // namespace

Summary summarize(const ResultSet& results) {
  Summary summary;
  summary.rank_by = results.rank_by;
  summary.alpha = results.alpha;
  const std::size_t rank_col = results.column_index(results.rank_by);
  const Direction direction = results.columns[rank_col].direction;
  const double level = 1.0 - results.alpha;

  // Group trials by (series, scheme, rate), keeping first-seen order.
  using Key = std::tuple<std::string, std::string, double>;
  std::vector<Key> keys;
  std::map<Key, std::vector<const TrialRecord*>> groups;
  for (const auto& t : results.trials) {
    Key key{t.series, t.scheme, t.rate};
    auto [it, inserted] = groups.try_emplace(key);
    if (inserted) keys.push_back(key);
    it->second.push_back(&t);
  }

  for (const auto& key : keys) {
    const auto& trials = groups[key];
    CellGroup g;
    std::tie(g.series, g.scheme, g.rate) = key;
    std::vector<std::string> methods;
    std::map<std::string, std::size_t> method_index;
    std::map<int, std::size_t> replicate_index;
    for (const auto* t : trials) {
      if (method_index.try_emplace(t->method, methods.size()).second) methods.push_back(t->method);
      replicate_index.try_emplace(t->replicate, replicate_index.size());
    }
    const std::size_t k = methods.size(), reps = replicate_index.size();
    g.replicates = reps;
    // table[replicate][method] of badness for the ranking metric
    std::vector<std::vector<double>> table(reps, std::vector<double>(k, kNaN));
    std::vector<std::vector<std::vector<double>>> values(
        k, std::vector<std::vector<double>>(results.columns.size()));
    std::vector<MethodSummary> ms(k);
    for (std::size_t m = 0; m < k; ++m) ms[m].method = methods[m];
    for (const auto* t : trials) {
      const std::size_t m = method_index[t->method];
      ms[m].trials++;
      // Only a trial that filled every masked point counts: a partial one is
      // scored on the easier points it did fill, which would flatter it.
      if (t->status != TrialStatus::Ok) {
        ms[m].failures++;
        continue;  // ranked last in its replicate (NaN), left out of the means
      }
      for (std::size_t c = 0; c < results.columns.size(); ++c)
        if (std::isfinite(t->metrics[c])) values[m][c].push_back(t->metrics[c]);
      table[replicate_index[t->replicate]][m] = std::isfinite(t->metrics[rank_col])
                                                    ? badness(t->metrics[rank_col], direction)
                                                    : kNaN;
    }
    std::vector<double> rank_sum(k, 0.0);
    for (const auto& row : table) {
      const auto r = average_ranks(row);
      for (std::size_t m = 0; m < k; ++m) rank_sum[m] += r[m];
    }
    for (std::size_t m = 0; m < k; ++m) {
      for (std::size_t c = 0; c < results.columns.size(); ++c)
        ms[m].metrics.push_back(describe(values[m][c], level));
      ms[m].mean_rank = reps ? rank_sum[m] / static_cast<double>(reps) : kNaN;
      ms[m].p_vs_best = kNaN;
    }
    // Order: methods that filled every trial first, then by the mean of the
    // ranking metric (direction-aware), methods without a value last, ties
    // by mean rank. A method that failed in some replicates is never "the
    // best" on the fewer, easier replicates it managed.
    std::vector<std::size_t> order(k);
    std::iota(order.begin(), order.end(), std::size_t{0});
    auto score = [&](std::size_t m) {
      const double v = ms[m].metrics[rank_col].mean;
      return std::isnan(v) ? HUGE_VAL : badness(v, direction);
    };
    std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) {
      const bool fa = ms[a].failures > 0, fb = ms[b].failures > 0;
      if (fa != fb) return fb;
      if (score(a) != score(b)) return score(a) < score(b);
      return ms[a].mean_rank < ms[b].mean_rank;
    });
    for (std::size_t pos = 0; pos < k; ++pos) {
      ms[order[pos]].rank = pos + 1;
      g.methods.push_back(ms[order[pos]]);
    }
    test_group(g, table, order, results.alpha);
    summary.groups.push_back(std::move(g));
  }

  // Across series: per (scheme, rate) over its series, then all groups
  // pooled when there is more than one (scheme, rate) and more than one
  // series (conditions of a single series are not separate data sets).
  std::map<std::size_t, double> nemenyi_q;  // by number of methods
  std::vector<std::pair<std::string, double>> conditions;
  std::vector<std::string> series;
  for (const auto& g : summary.groups) {
    if (std::find(conditions.begin(), conditions.end(), std::make_pair(g.scheme, g.rate)) == conditions.end())
      conditions.emplace_back(g.scheme, g.rate);
    if (std::find(series.begin(), series.end(), g.series) == series.end()) series.push_back(g.series);
  }
  for (const auto& [scheme, rate] : conditions) {
    std::vector<const CellGroup*> members;
    for (const auto& g : summary.groups)
      if (g.scheme == scheme && g.rate == rate) members.push_back(&g);
    auto a = compare_groups(members, rank_col, direction, results.alpha, nemenyi_q);
    a.scheme = scheme;
    a.rate = rate;
    summary.across.push_back(std::move(a));
  }
  if (conditions.size() > 1 && series.size() > 1) {
    std::vector<const CellGroup*> all;
    for (const auto& g : summary.groups) all.push_back(&g);
    auto a = compare_groups(all, rank_col, direction, results.alpha, nemenyi_q);
    a.scheme.clear();
    a.rate = 0;
    summary.across.push_back(std::move(a));
  }
  return summary;
}

namespace {
nlohmann::json num(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(nullptr); }
}  // namespace

nlohmann::json summary_to_json(const Summary& summary, const ResultSet& results) {
  nlohmann::json groups = nlohmann::json::array();
  for (const auto& g : summary.groups) {
    nlohmann::json methods = nlohmann::json::array();
    for (const auto& m : g.methods) {
      nlohmann::json metrics = nlohmann::json::object();
      for (std::size_t c = 0; c < results.columns.size(); ++c) {
        const auto& s = m.metrics[c];
        metrics[results.columns[c].name] = {{"mean", num(s.mean)}, {"sd", num(s.sd)},
                                            {"ci_low", num(s.ci_low)}, {"ci_high", num(s.ci_high)},
                                            {"n", s.n}};
      }
      methods.push_back({{"method", m.method},
                         {"rank", m.rank},
                         {"mean_rank", num(m.mean_rank)},
                         {"tied_with_best", m.tied_with_best},
                         {"p_vs_best", num(m.p_vs_best)},
                         {"trials", m.trials},
                         {"failures", m.failures},
                         {"metrics", metrics}});
    }
    groups.push_back({{"series", g.series},
                      {"scheme", g.scheme},
                      {"rate", g.rate},
                      {"replicates", g.replicates},
                      {"friedman_statistic", num(g.friedman_statistic)},
                      {"friedman_p", num(g.friedman_p)},
                      {"methods", methods}});
  }
  nlohmann::json across = nlohmann::json::array();
  for (const auto& a : summary.across) {
    nlohmann::json ranks = nlohmann::json::object();
    for (std::size_t i = 0; i < a.methods.size(); ++i) ranks[a.methods[i]] = num(a.mean_ranks[i]);
    across.push_back({{"scheme", a.scheme.empty() ? nlohmann::json(nullptr) : nlohmann::json(a.scheme)},
                      {"rate", a.scheme.empty() ? nlohmann::json(nullptr) : num(a.rate)},
                      {"datasets", a.datasets},
                      {"mean_ranks", ranks},
                      {"friedman_chi2", num(a.friedman_chi2)},
                      {"friedman_p", num(a.friedman_p)},
                      {"iman_davenport_f", num(a.iman_davenport_f)},
                      {"iman_davenport_p", num(a.iman_davenport_p)},
                      {"critical_difference", num(a.critical_difference)}});
  }
  return {{"rank_by", summary.rank_by}, {"alpha", summary.alpha}, {"groups", groups}, {"across_series", across}};
}

}  // namespace gapmark
