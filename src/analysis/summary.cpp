#include "gapmark/analysis/summary.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>
#include <tuple>

#include "gapmark/json_number.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/rng.hpp"
#include "gapmark/stats/bootstrap.hpp"
#include "gapmark/stats/critical_difference.hpp"
#include "gapmark/stats/descriptive.hpp"
#include "gapmark/stats/equivalence.hpp"
#include "gapmark/stats/friedman.hpp"
#include "gapmark/stats/multiple_testing.hpp"
#include "gapmark/stats/ranks.hpp"
#include "gapmark/stats/signed_rank_power.hpp"
#include "gapmark/stats/wilcoxon.hpp"

namespace gapmark {

std::size_t replicates_needed(std::size_t methods, double alpha) {
  if (methods < 2 || !(alpha > 0)) return 0;
  return stats::fewest_signed_rank_pairs(methods - 1, alpha);
}

const char* standing_name(Standing standing) {
  switch (standing) {
    case Standing::Best: return "best";
    case Standing::Better: return "better";
    case Standing::Equivalent: return "equivalent";
    case Standing::NotDistinguishable: return "not distinguishable";
    case Standing::Worse: return "worse";
  }
  return "not distinguishable";
}

namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();
const double kInf = std::numeric_limits<double>::infinity();

/// "No value" (a failed or partial trial, a metric not applicable) is worse
/// than every value: +inf, so it ranks last and such entries tie.
double or_worst(double badness_value) { return std::isnan(badness_value) ? kInf : badness_value; }

using Table = std::vector<std::vector<double>>;  // [replicate][method]

/// The noise level of a condition: kNoiseRelative times its scale, the
/// median of the finite |badness| values in the table (their largest when
/// the median is 0).
double noise_level(const Table& table) {
  std::vector<double> magnitudes;
  for (const auto& row : table)
    for (double v : row)
      if (std::isfinite(v)) magnitudes.push_back(std::abs(v));
  if (magnitudes.empty()) return 0;
  std::sort(magnitudes.begin(), magnitudes.end());
  double scale = stats::sorted_quantile(magnitudes, 0.5);
  if (scale == 0) scale = magnitudes.back();
  return kNoiseRelative * scale;
}

/// Paired difference method - best in one replicate, on badness, with no
/// value as the worst outcome: both without a value 0; a noise-level
/// difference 0.
double paired_difference(double method, double best, double noise) {
  if (std::isnan(method) && std::isnan(best)) return 0;
  if (std::isnan(method)) return kInf;
  if (std::isnan(best)) return -kInf;
  const double d = method - best;
  return std::abs(d) <= noise ? 0.0 : d;
}

MetricSummary describe(const std::vector<double>& xs, double level, std::uint64_t seed) {
  MetricSummary s;
  s.n = xs.size();
  s.mean = stats::mean(xs);
  s.sd = stats::sample_sd(xs);
  const auto ci = stats::bootstrap_mean_interval(xs, level, seed);
  s.ci_low = ci.low;
  s.ci_high = ci.high;
  return s;
}

/// What summarize() reads from a group's trials before ordering.
struct GroupData {
  std::vector<MethodSummary> methods;
  Table table;                          ///< badness of the ranking metric, NaN = no value
  std::vector<std::vector<double>> ranks;  ///< within-replicate ranks, noise ties shared
};

GroupData collect(CellGroup& g, const std::vector<const TrialRecord*>& trials, const ResultSet& results,
                  std::size_t rank_col) {
  const Direction direction = results.columns[rank_col].direction;
  const double level = 1.0 - results.alpha;
  std::vector<std::string> methods;
  std::map<std::string, std::size_t> method_index;
  std::map<int, std::size_t> replicate_index;
  std::map<int, bool> mask_failed;
  for (const auto* t : trials) {
    if (method_index.try_emplace(t->method, methods.size()).second) methods.push_back(t->method);
    if (t->status == TrialStatus::MaskFailed) mask_failed[t->replicate] = true;
  }
  for (const auto* t : trials)
    if (!mask_failed.count(t->replicate)) replicate_index.try_emplace(t->replicate, replicate_index.size());
  const std::size_t k = methods.size(), reps = replicate_index.size();
  g.replicates = reps;
  g.mask_failed = mask_failed.size();
  GroupData d;
  d.table.assign(reps, std::vector<double>(k, kNaN));
  std::vector<std::vector<std::vector<double>>> values(k, std::vector<std::vector<double>>(results.columns.size()));
  d.methods.resize(k);
  for (std::size_t m = 0; m < k; ++m) d.methods[m].method = methods[m];
  for (const auto* t : trials) {
    if (mask_failed.count(t->replicate)) continue;
    const std::size_t m = method_index[t->method];
    d.methods[m].trials++;
    // Only a trial that filled every masked point counts: a partial one is
    // scored on the easier points it did fill, which would flatter it.
    if (t->status != TrialStatus::Ok) {
      d.methods[m].failures++;
      continue;  // the worst of its replicate, left out of the means
    }
    for (std::size_t c = 0; c < results.columns.size(); ++c)
      if (std::isfinite(t->metrics[c])) values[m][c].push_back(t->metrics[c]);
    d.table[replicate_index[t->replicate]][m] =
        std::isfinite(t->metrics[rank_col]) ? badness(t->metrics[rank_col], direction) : kNaN;
  }
  g.noise = noise_level(d.table);
  std::vector<double> rank_sum(k, 0.0);
  for (const auto& row : d.table) {
    std::vector<double> keys(k);
    std::transform(row.begin(), row.end(), keys.begin(), or_worst);
    d.ranks.push_back(stats::average_ranks_within(keys, g.noise));
    for (std::size_t m = 0; m < k; ++m) rank_sum[m] += d.ranks.back()[m];
  }
  // One resampling stream per condition, shared by every method and metric:
  // the same replicates are drawn for each, so methods with the same values
  // get the same interval.
  const std::uint64_t stream =
      stable_hash("bootstrap|" + g.series + "|" + g.scheme + "|" + format_double(g.rate));
  for (std::size_t m = 0; m < k; ++m) {
    for (std::size_t c = 0; c < results.columns.size(); ++c)
      d.methods[m].metrics.push_back(describe(values[m][c], level, stream));
    d.methods[m].mean_rank = reps ? rank_sum[m] / static_cast<double>(reps) : kNaN;
    d.methods[m].p_vs_best = d.methods[m].p_equivalent = d.methods[m].relative_difference = kNaN;
  }
  return d;
}

/// The paired tests of each method against the best (position 0 of
/// `order`): the signed-rank test and, between methods that filled every
/// trial, the TOST on the margin; Holm's correction over the k - 1
/// comparisons, separately for each test. Sets each method's standing.
void test_against_best(CellGroup& g, const GroupData& d, const std::vector<std::size_t>& order,
                       const std::vector<double>& mean_badness, double alpha) {
  const std::size_t k = order.size();
  if (k == 0) return;
  const std::size_t best = order[0];
  std::vector<double> signed_rank(k, kNaN), tost(k, kNaN);
  std::vector<bool> worse(k, false);
  for (std::size_t pos = 1; pos < k; ++pos) {
    const std::size_t m = order[pos];
    std::vector<double> differences;
    for (const auto& row : d.table) differences.push_back(paired_difference(row[m], row[best], g.noise));
    if (differences.empty()) continue;
    const auto w = stats::wilcoxon_signed_rank(differences);
    signed_rank[pos] = w.p;
    worse[pos] = 2 * w.w_plus >= static_cast<double>(w.n * (w.n + 1)) / 2;
    const bool complete =
        std::all_of(differences.begin(), differences.end(), [](double x) { return std::isfinite(x); });
    if (complete && d.methods[m].failures == 0 && d.methods[best].failures == 0 && differences.size() >= 2 &&
        g.margin > 0)
      tost[pos] = stats::paired_tost(differences, -g.margin, g.margin).p;
  }
  const auto signed_adjusted = stats::holm_adjust(signed_rank);
  const auto tost_adjusted = stats::holm_adjust(tost);
  g.methods[0].standing = Standing::Best;
  for (std::size_t pos = 1; pos < k; ++pos) {
    auto& ms = g.methods[pos];
    ms.p_vs_best = signed_adjusted[pos];
    ms.p_equivalent = tost_adjusted[pos];
    const double b = mean_badness[order[0]], x = mean_badness[order[pos]];
    ms.relative_difference = std::isfinite(b) && std::isfinite(x) && b != 0 ? (x - b) / std::abs(b) : kNaN;
    if (std::isfinite(ms.p_equivalent) && ms.p_equivalent < alpha)
      ms.standing = Standing::Equivalent;
    else if (std::isfinite(ms.p_vs_best) && ms.p_vs_best < alpha)
      ms.standing = worse[pos] ? Standing::Worse : Standing::Better;
    else
      ms.standing = Standing::NotDistinguishable;
  }
}

CellGroup summarize_group(const std::string& series, const std::string& scheme, double rate,
                          const std::vector<const TrialRecord*>& trials, const ResultSet& results,
                          std::size_t rank_col) {
  CellGroup g;
  g.series = series;
  g.scheme = scheme;
  g.rate = rate;
  GroupData d = collect(g, trials, results, rank_col);
  if (g.replicates == 0) return g;  // nothing was masked: the caller leaves the condition out
  const std::size_t k = d.methods.size();
  const Direction direction = results.columns[rank_col].direction;
  std::vector<double> mean_badness(k);
  for (std::size_t m = 0; m < k; ++m) {
    const double v = d.methods[m].metrics[rank_col].mean;
    mean_badness[m] = std::isnan(v) ? kNaN : badness(v, direction);
  }
  // Order: methods that filled every trial first, then by the mean badness
  // of the ranking metric (means within the noise level count as equal),
  // methods without a value last, ties by mean rank. A method that failed
  // in some replicates is never "the best" on the fewer, easier replicates
  // it managed.
  std::vector<std::size_t> order(k);
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) {
    const bool fa = d.methods[a].failures > 0, fb = d.methods[b].failures > 0;
    if (fa != fb) return fb;
    // A non-finite mean (no value, or one that overflowed) never ranks before a finite one.
    const auto finiteness = [](double v) { return std::isnan(v) ? 2 : std::isinf(v) ? 1 : 0; };
    if (finiteness(mean_badness[a]) != finiteness(mean_badness[b]))
      return finiteness(mean_badness[a]) < finiteness(mean_badness[b]);
    const double sa = or_worst(mean_badness[a]), sb = or_worst(mean_badness[b]);
    if (sa != sb && !(std::abs(sa - sb) <= g.noise)) return sa < sb;
    return d.methods[a].mean_rank < d.methods[b].mean_rank;
  });
  const double best = k ? mean_badness[order[0]] : kNaN;
  g.margin = std::isfinite(best) ? std::max(results.equivalence * std::abs(best), g.noise) : 0;
  g.replicates_needed = replicates_needed(k, results.alpha);
  for (std::size_t pos = 0; pos < k; ++pos) {
    d.methods[order[pos]].rank = pos + 1;
    g.methods.push_back(d.methods[order[pos]]);
  }
  std::vector<double> matrix;
  for (const auto& row : d.ranks) matrix.insert(matrix.end(), row.begin(), row.end());
  const auto friedman = stats::friedman(matrix, d.ranks.size(), k);
  g.friedman_statistic = friedman.statistic;
  g.friedman_p = friedman.p;
  test_against_best(g, d, order, mean_badness, results.alpha);
  return g;
}

/// Across series: rows are data sets (series), columns methods, values the
/// scores to rank within a row (smaller is better; +inf = absent). Ranks
/// each row, then the Friedman and Iman-Davenport tests and the Nemenyi
/// critical difference.
AcrossSeries compare_rows(const std::vector<std::string>& methods, const std::vector<std::vector<double>>& rows,
                          double alpha, std::map<std::size_t, double>& cd_q) {
  AcrossSeries a;
  a.methods = methods;
  a.datasets = rows.size();
  const std::size_t k = methods.size(), n = rows.size();
  std::vector<double> matrix;
  for (const auto& row : rows) matrix.insert(matrix.end(), row.begin(), row.end());
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
    a.critical_difference = kNaN;
  }
  return a;
}

/// The across-series comparisons: per condition over the series that have
/// it, and, with several conditions, every series' conditions combined.
/// A method's score in a condition is its mean rank there (failures count
/// as the worst of their replicate).
void compare_series(Summary& summary) {
  std::vector<std::string> methods, series;
  std::vector<std::pair<std::string, double>> conditions;
  for (const auto& g : summary.groups) {
    if (std::find(conditions.begin(), conditions.end(), std::make_pair(g.scheme, g.rate)) == conditions.end())
      conditions.emplace_back(g.scheme, g.rate);
    if (std::find(series.begin(), series.end(), g.series) == series.end()) series.push_back(g.series);
    for (const auto& m : g.methods)
      if (std::find(methods.begin(), methods.end(), m.method) == methods.end()) methods.push_back(m.method);
  }
  const auto score_row = [&](const std::vector<const CellGroup*>& groups) {
    std::vector<double> sum(methods.size(), 0.0);
    std::vector<std::size_t> count(methods.size(), 0);
    for (const auto* g : groups)
      for (const auto& m : g->methods) {
        const auto i = static_cast<std::size_t>(std::find(methods.begin(), methods.end(), m.method) - methods.begin());
        if (std::isfinite(m.mean_rank)) sum[i] += m.mean_rank, ++count[i];
      }
    std::vector<double> row(methods.size(), kInf);
    for (std::size_t i = 0; i < methods.size(); ++i)
      if (count[i] == groups.size() && count[i]) row[i] = sum[i] / static_cast<double>(count[i]);
    return row;
  };
  std::map<std::size_t, double> nemenyi_q;  // by number of methods
  for (const auto& [scheme, rate] : conditions) {
    std::vector<std::vector<double>> rows;
    for (const auto& g : summary.groups)
      if (g.scheme == scheme && g.rate == rate) rows.push_back(score_row({&g}));
    auto a = compare_rows(methods, rows, summary.alpha, nemenyi_q);
    a.scheme = scheme;
    a.rate = rate;
    summary.across.push_back(std::move(a));
  }
  if (conditions.size() > 1 && series.size() > 1) {
    std::vector<std::vector<double>> rows;
    for (const auto& s : series) {
      std::vector<const CellGroup*> members;
      for (const auto& g : summary.groups)
        if (g.series == s) members.push_back(&g);
      rows.push_back(score_row(members));
    }
    auto a = compare_rows(methods, rows, summary.alpha, nemenyi_q);
    a.scheme.clear();
    a.rate = 0;
    summary.across.push_back(std::move(a));
  }
  if (series.size() >= 2 && series.size() < kFewestSeries)
    add_warning(summary.warnings,
                {"few-series", "across series",
                 "the comparison across series rests on N = " + std::to_string(series.size()) +
                     " series; its chi-square, F and studentized-range approximations need about " +
                     std::to_string(kFewestSeries) + " or more",
                 "read the across-series ranks as descriptive, or add series"});
}

void power_warnings(Summary& summary) {
  std::size_t fewest = SIZE_MAX, needed = 0, methods = 0;
  for (const auto& g : summary.groups)
    if (g.underpowered() && g.replicates < fewest) {
      fewest = g.replicates;
      needed = g.replicates_needed;
      methods = g.methods.size();
    }
  if (fewest == SIZE_MAX) return;
  add_warning(summary.warnings,
              {"under-powered", "replicates",
               "with " + std::to_string(fewest) + " replicates the paired tests cannot find any difference among " +
                   std::to_string(methods) + " methods at alpha = " + format_double(summary.alpha) +
                   " after Holm's correction (the smallest attainable p is above alpha); methods are then 'not "
                   "distinguishable', which is no evidence that they are as good",
               "use at least " + std::to_string(needed) + " replicates"});
}

}  // namespace

Summary summarize(const ResultSet& results) {
  Summary summary;
  summary.rank_by = results.rank_by;
  summary.alpha = results.alpha;
  summary.equivalence = results.equivalence;
  const std::size_t rank_col = results.column_index(results.rank_by);

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
    const auto& [series, scheme, rate] = key;
    CellGroup g = summarize_group(series, scheme, rate, trials, results, rank_col);
    if (g.replicates == 0) {
      summary.excluded.push_back({series, scheme, rate, trials.front()->reason});
      add_warning(summary.warnings, {"condition-left-out", series + " " + scheme + "@" + format_double(rate),
                                     "no replicate could be masked (" + trials.front()->reason +
                                         "); this condition is left out of tables, verdicts and comparisons",
                                     "choose a scheme that fits this series, or a lower rate"});
      continue;
    }
    summary.groups.push_back(std::move(g));
  }
  compare_series(summary);
  power_warnings(summary);
  summary.fits = summarize_fits(results, summary.warnings);
  summary.verdict = decide_verdict(summary, results);
  return summary;
}

std::vector<Warning> all_warnings(const ResultSet& results, const Summary& summary) {
  std::vector<Warning> out = results.warnings;
  for (const auto& w : summary.warnings) add_warning(out, w);
  return out;
}

nlohmann::json summary_to_json(const Summary& summary, const ResultSet& results) {
  nlohmann::json groups = nlohmann::json::array();
  for (const auto& g : summary.groups) {
    nlohmann::json methods = nlohmann::json::array();
    for (const auto& m : g.methods) {
      nlohmann::json metrics = nlohmann::json::object();
      for (std::size_t c = 0; c < results.columns.size(); ++c) {
        const auto& s = m.metrics[c];
        metrics[results.columns[c].name] = {{"mean", json_number(s.mean)}, {"sd", json_number(s.sd)},
                                            {"ci_low", json_number(s.ci_low)}, {"ci_high", json_number(s.ci_high)},
                                            {"n", s.n}};
      }
      methods.push_back({{"method", m.method},
                         {"rank", m.rank},
                         {"mean_rank", json_number(m.mean_rank)},
                         {"standing", standing_name(m.standing)},
                         {"p_vs_best", json_number(m.p_vs_best)},
                         {"p_equivalent", json_number(m.p_equivalent)},
                         {"relative_difference", json_number(m.relative_difference)},
                         {"trials", m.trials},
                         {"failures", m.failures},
                         {"metrics", metrics}});
    }
    groups.push_back({{"series", g.series},
                      {"scheme", g.scheme},
                      {"rate", g.rate},
                      {"replicates", g.replicates},
                      {"replicates_mask_failed", g.mask_failed},
                      {"replicates_needed", g.replicates_needed},
                      {"noise", json_number(g.noise)},
                      {"equivalence_margin", json_number(g.margin)},
                      {"friedman_statistic", json_number(g.friedman_statistic)},
                      {"friedman_p", json_number(g.friedman_p)},
                      {"methods", methods}});
  }
  nlohmann::json excluded = nlohmann::json::array();
  for (const auto& e : summary.excluded)
    excluded.push_back({{"series", e.series}, {"scheme", e.scheme}, {"rate", e.rate}, {"reason", e.reason}});
  nlohmann::json across = nlohmann::json::array();
  for (const auto& a : summary.across) {
    nlohmann::json ranks = nlohmann::json::object();
    for (std::size_t i = 0; i < a.methods.size(); ++i) ranks[a.methods[i]] = json_number(a.mean_ranks[i]);
    across.push_back({{"scheme", a.scheme.empty() ? nlohmann::json(nullptr) : nlohmann::json(a.scheme)},
                      {"rate", a.scheme.empty() ? nlohmann::json(nullptr) : json_number(a.rate)},
                      {"datasets", a.datasets},
                      {"mean_ranks", ranks},
                      {"friedman_chi2", json_number(a.friedman_chi2)},
                      {"friedman_p", json_number(a.friedman_p)},
                      {"iman_davenport_f", json_number(a.iman_davenport_f)},
                      {"iman_davenport_p", json_number(a.iman_davenport_p)},
                      {"critical_difference", json_number(a.critical_difference)}});
  }
  return {{"rank_by", summary.rank_by},
          {"alpha", summary.alpha},
          {"equivalence", summary.equivalence},
          {"groups", groups},
          {"excluded", excluded},
          {"across_series", across},
          {"fits", fits_to_json(summary.fits)}};
}

}  // namespace gapmark
