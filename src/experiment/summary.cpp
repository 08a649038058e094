#include "gapmark/experiment/summary.hpp"

#include <algorithm>
#include <boost/math/distributions/students_t.hpp>
#include <cmath>
#include <map>
#include <numeric>
#include <tuple>

namespace gapmark {
namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();

/// Maps a metric value to a "badness" score: smaller is better.
double badness(double value, Direction direction) {
  switch (direction) {
    case Direction::Lower: return value;
    case Direction::ZeroBest: return std::abs(value);
    case Direction::Higher: return -value;
    case Direction::OneBest: return std::abs(value - 1.0);
    case Direction::None: return value;
  }
  return value;
}

MetricSummary describe(const std::vector<double>& xs, double level) {
  MetricSummary s;
  s.n = xs.size();
  if (xs.empty()) {
    s.mean = s.sd = s.ci_low = s.ci_high = kNaN;
    return s;
  }
  const double n = static_cast<double>(xs.size());
  s.mean = std::accumulate(xs.begin(), xs.end(), 0.0) / n;
  if (xs.size() < 2) {
    s.sd = s.ci_low = s.ci_high = kNaN;
    return s;
  }
  double ss = 0;
  for (double x : xs) ss += (x - s.mean) * (x - s.mean);
  s.sd = std::sqrt(ss / (n - 1));
  boost::math::students_t t(n - 1);
  const double half = boost::math::quantile(boost::math::complement(t, (1 - level) / 2)) * s.sd / std::sqrt(n);
  s.ci_low = s.mean - half;
  s.ci_high = s.mean + half;
  return s;
}

/// Average ranks (1 = best) of `scores`; NaN scores share the worst ranks.
std::vector<double> average_ranks(const std::vector<double>& scores) {
  const std::size_t k = scores.size();
  std::vector<std::size_t> order(k);
  std::iota(order.begin(), order.end(), std::size_t{0});
  auto key = [&](std::size_t i) { return std::isnan(scores[i]) ? HUGE_VAL : scores[i]; };
  std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) { return key(a) < key(b); });
  std::vector<double> ranks(k);
  for (std::size_t i = 0; i < k;) {
    std::size_t j = i;
    while (j + 1 < k && key(order[j + 1]) == key(order[i])) ++j;
    const double r = (static_cast<double>(i + j) + 2.0) / 2.0;
    for (std::size_t m = i; m <= j; ++m) ranks[order[m]] = r;
    i = j + 1;
  }
  return ranks;
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
      if (t->status != "ok") ms[m].failures++;
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
    // Order: by the mean of the ranking metric (direction-aware), methods
    // without a value last, ties by mean rank.
    std::vector<std::size_t> order(k);
    std::iota(order.begin(), order.end(), std::size_t{0});
    auto score = [&](std::size_t m) {
      const double v = ms[m].metrics[rank_col].mean;
      return std::isnan(v) ? HUGE_VAL : badness(v, direction);
    };
    std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) {
      if (score(a) != score(b)) return score(a) < score(b);
      return ms[a].mean_rank < ms[b].mean_rank;
    });
    for (std::size_t pos = 0; pos < k; ++pos) {
      ms[order[pos]].rank = pos + 1;
      g.methods.push_back(ms[order[pos]]);
    }
    if (!g.methods.empty()) g.methods.front().tied_with_best = true;
    g.friedman_statistic = g.friedman_p = kNaN;
    summary.groups.push_back(std::move(g));
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
