// The reference table. Every entry below (authors, title, journal, volume,
// issue, pages, year) was written from memory; none has yet been checked
// against the publisher's record, and references.bib says so to its reader.
// The few DOIs given are also from memory. Checking an entry means comparing it
// with the publisher's page and saying so in the entry's comment.
#include "gapmark/report/references.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>
#include <set>

#include "gapmark/analysis/test_names.hpp"
#include "gapmark/error.hpp"
#include "gapmark/experiment/spec.hpp"
#include "gapmark/score/metric_names.hpp"

namespace gapmark {
namespace {

const std::vector<Reference> kReferences = {
    {"fritsch1980", "Fritsch, F. N. and Carlson, R. E. (1980). Monotone piecewise cubic interpolation. SIAM Journal on Numerical Analysis, 17(2), 238-246.",
     "@article{fritsch1980,\n  author  = {Fritsch, F. N. and Carlson, R. E.},\n  title   = {Monotone Piecewise Cubic Interpolation},\n"
     "  journal = {SIAM Journal on Numerical Analysis},\n  volume  = {17},\n  number  = {2},\n  pages   = {238--246},\n"
     "  year    = {1980},\n  doi     = {10.1137/0717021}\n}\n"},
    {"akima1970", "Akima, H. (1970). A new method of interpolation and smooth curve fitting based on local procedures. Journal of the ACM, 17(4), 589-602.",
     "@article{akima1970,\n  author  = {Akima, Hiroshi},\n  title   = {A New Method of Interpolation and Smooth Curve Fitting Based on Local Procedures},\n"
     "  journal = {Journal of the ACM},\n  volume  = {17},\n  number  = {4},\n  pages   = {589--602},\n  year    = {1970},\n"
     "  doi     = {10.1145/321607.321609}\n}\n"},
    {"deboor1978", "de Boor, C. (1978). A Practical Guide to Splines. Applied Mathematical Sciences 27. New York: Springer.",
     "@book{deboor1978,\n  author    = {de Boor, Carl},\n  title     = {A Practical Guide to Splines},\n  series    = {Applied Mathematical Sciences},\n"
     "  volume    = {27},\n  publisher = {Springer},\n  address   = {New York},\n  year      = {1978}\n}\n"},
    {"durbin2012", "Durbin, J. and Koopman, S. J. (2012). Time Series Analysis by State Space Methods, 2nd edition. Oxford: Oxford University Press.",
     "@book{durbin2012,\n  author    = {Durbin, James and Koopman, Siem Jan},\n  title     = {Time Series Analysis by State Space Methods},\n"
     "  edition   = {2},\n  publisher = {Oxford University Press},\n  address   = {Oxford},\n  year      = {2012}\n}\n"},
    {"mazumder2010", "Mazumder, R., Hastie, T. and Tibshirani, R. (2010). Spectral regularization algorithms for learning large incomplete matrices. Journal of Machine Learning Research, 11, 2287-2322.",
     "@article{mazumder2010,\n  author  = {Mazumder, Rahul and Hastie, Trevor and Tibshirani, Robert},\n"
     "  title   = {Spectral Regularization Algorithms for Learning Large Incomplete Matrices},\n"
     "  journal = {Journal of Machine Learning Research},\n  volume  = {11},\n  pages   = {2287--2322},\n  year    = {2010}\n}\n"},
    {"cleveland1990", "Cleveland, R. B., Cleveland, W. S., McRae, J. E. and Terpenning, I. (1990). STL: A seasonal-trend decomposition procedure based on loess. Journal of Official Statistics, 6(1), 3-73.",
     "@article{cleveland1990,\n  author  = {Cleveland, Robert B. and Cleveland, William S. and McRae, Jean E. and Terpenning, Irma},\n"
     "  title   = {{STL}: A Seasonal-Trend Decomposition Procedure Based on Loess},\n  journal = {Journal of Official Statistics},\n"
     "  volume  = {6},\n  number  = {1},\n  pages   = {3--73},\n  year    = {1990}\n}\n"},
    {"box2008", "Box, G. E. P., Jenkins, G. M. and Reinsel, G. C. (2008). Time Series Analysis: Forecasting and Control, 4th edition. Hoboken, NJ: Wiley.",
     "@book{box2008,\n  author    = {Box, George E. P. and Jenkins, Gwilym M. and Reinsel, Gregory C.},\n"
     "  title     = {Time Series Analysis: Forecasting and Control},\n  edition   = {4},\n  publisher = {Wiley},\n"
     "  address   = {Hoboken, NJ},\n  year      = {2008}\n}\n"},
    {"hyndman2006", "Hyndman, R. J. and Koehler, A. B. (2006). Another look at measures of forecast accuracy. International Journal of Forecasting, 22(4), 679-688.",
     "@article{hyndman2006,\n  author  = {Hyndman, Rob J. and Koehler, Anne B.},\n  title   = {Another Look at Measures of Forecast Accuracy},\n"
     "  journal = {International Journal of Forecasting},\n  volume  = {22},\n  number  = {4},\n  pages   = {679--688},\n"
     "  year    = {2006},\n  doi     = {10.1016/j.ijforecast.2006.03.001}\n}\n"},
    {"winters1960", "Winters, P. R. (1960). Forecasting sales by exponentially weighted moving averages. Management Science, 6(3), 324-342.",
     "@article{winters1960,\n  author  = {Winters, Peter R.},\n  title   = {Forecasting Sales by Exponentially Weighted Moving Averages},\n"
     "  journal = {Management Science},\n  volume  = {6},\n  number  = {3},\n  pages   = {324--342},\n  year    = {1960},\n"
     "  doi     = {10.1287/mnsc.6.3.324}\n}\n"},
    {"gneiting2007", "Gneiting, T. and Raftery, A. E. (2007). Strictly proper scoring rules, prediction, and estimation. Journal of the American Statistical Association, 102(477), 359-378.",
     "@article{gneiting2007,\n  author  = {Gneiting, Tilmann and Raftery, Adrian E.},\n"
     "  title   = {Strictly Proper Scoring Rules, Prediction, and Estimation},\n"
     "  journal = {Journal of the American Statistical Association},\n  volume  = {102},\n  number  = {477},\n"
     "  pages   = {359--378},\n  year    = {2007},\n  doi     = {10.1198/016214506000001437}\n}\n"},
    {"efron1993", "Efron, B. and Tibshirani, R. J. (1993). An Introduction to the Bootstrap. Monographs on Statistics and Applied Probability 57. New York: Chapman & Hall.",
     "@book{efron1993,\n  author    = {Efron, Bradley and Tibshirani, Robert J.},\n  title     = {An Introduction to the Bootstrap},\n"
     "  series    = {Monographs on Statistics and Applied Probability},\n  volume    = {57},\n  publisher = {Chapman \\& Hall},\n"
     "  address   = {New York},\n  year      = {1993}\n}\n"},
    {"schuirmann1987", "Schuirmann, D. J. (1987). A comparison of the two one-sided tests procedure and the power approach for assessing the equivalence of average bioavailability. Journal of Pharmacokinetics and Biopharmaceutics, 15(6), 657-680.",
     "@article{schuirmann1987,\n  author  = {Schuirmann, Donald J.},\n"
     "  title   = {A Comparison of the Two One-Sided Tests Procedure and the Power Approach for Assessing the Equivalence of Average Bioavailability},\n"
     "  journal = {Journal of Pharmacokinetics and Biopharmaceutics},\n  volume  = {15},\n  number  = {6},\n"
     "  pages   = {657--680},\n  year    = {1987},\n  doi     = {10.1007/BF01068419}\n}\n"},
    {"wilcoxon1945", "Wilcoxon, F. (1945). Individual comparisons by ranking methods. Biometrics Bulletin, 1(6), 80-83.",
     "@article{wilcoxon1945,\n  author  = {Wilcoxon, Frank},\n  title   = {Individual Comparisons by Ranking Methods},\n"
     "  journal = {Biometrics Bulletin},\n  volume  = {1},\n  number  = {6},\n  pages   = {80--83},\n  year    = {1945},\n"
     "  doi     = {10.2307/3001968}\n}\n"},
    {"holm1979", "Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics, 6(2), 65-70.",
     "@article{holm1979,\n  author  = {Holm, Sture},\n  title   = {A Simple Sequentially Rejective Multiple Test Procedure},\n"
     "  journal = {Scandinavian Journal of Statistics},\n  volume  = {6},\n  number  = {2},\n  pages   = {65--70},\n  year    = {1979}\n}\n"},
    {"friedman1937", "Friedman, M. (1937). The use of ranks to avoid the assumption of normality implicit in the analysis of variance. Journal of the American Statistical Association, 32(200), 675-701.",
     "@article{friedman1937,\n  author  = {Friedman, Milton},\n"
     "  title   = {The Use of Ranks to Avoid the Assumption of Normality Implicit in the Analysis of Variance},\n"
     "  journal = {Journal of the American Statistical Association},\n  volume  = {32},\n  number  = {200},\n"
     "  pages   = {675--701},\n  year    = {1937},\n  doi     = {10.1080/01621459.1937.10503522}\n}\n"},
    {"iman1980", "Iman, R. L. and Davenport, J. M. (1980). Approximations of the critical region of the Friedman statistic. Communications in Statistics - Theory and Methods, 9(6), 571-595.",
     "@article{iman1980,\n  author  = {Iman, Ronald L. and Davenport, James M.},\n"
     "  title   = {Approximations of the Critical Region of the {Friedman} Statistic},\n"
     "  journal = {Communications in Statistics - Theory and Methods},\n  volume  = {9},\n  number  = {6},\n"
     "  pages   = {571--595},\n  year    = {1980}\n}\n"},
    {"nemenyi1963", "Nemenyi, P. B. (1963). Distribution-free Multiple Comparisons. PhD thesis, Princeton University.",
     "@phdthesis{nemenyi1963,\n  author = {Nemenyi, Peter Bjorn},\n  title  = {Distribution-free Multiple Comparisons},\n"
     "  school = {Princeton University},\n  year   = {1963}\n}\n"},
    {"demsar2006", "Demšar, J. (2006). Statistical comparisons of classifiers over multiple data sets. Journal of Machine Learning Research, 7, 1-30.",
     "@article{demsar2006,\n  author  = {Dem{\\v{s}}ar, Janez},\n  title   = {Statistical Comparisons of Classifiers over Multiple Data Sets},\n"
     "  journal = {Journal of Machine Learning Research},\n  volume  = {7},\n  pages   = {1--30},\n  year    = {2006}\n}\n"},
};

// ---- the mapping table: names used by gapmark -> reference keys ----

/// Fill methods (registry names).
const std::map<std::string, std::vector<std::string>> kMethodKeys = {
    {"pchip", {"fritsch1980"}},          {"akima-weighted", {"akima1970"}},  {"natural-spline", {"deboor1978"}},
    {"kalman", {"durbin2012"}},          {"arima", {"durbin2012"}},          {"low-rank", {"mazumder2010"}},
};

/// Metric columns.
const std::map<std::string, std::vector<std::string>> kColumnKeys = {
    {metric_names::acf::kRms, {"box2008"}},
    {metric_names::acf::kMax, {"box2008"}},
    {metric_names::forecast::kMaseFilled, {"hyndman2006"}},
    {metric_names::forecast::kMaseComplete, {"hyndman2006"}},
    {metric_names::forecast::kMaseCost, {"hyndman2006"}},
    {metric_names::interval::kCrps, {"gneiting2007"}},
};

/// Tests and intervals, by the name methods.md gives them.
const std::map<std::string, std::vector<std::string>> kTestKeys = {
    {test_names::kBootstrapInterval, {"efron1993"}},
    {test_names::kSignedRank, {"wilcoxon1945", "holm1979"}},
    {test_names::kEquivalence, {"schuirmann1987", "holm1979"}},
    {test_names::kFriedman, {"friedman1937"}},
    {test_names::kImanDavenport, {"iman1980"}},
    {test_names::kNemenyi, {"nemenyi1963", "demsar2006"}},
};

std::string call_name(const std::string& label) {
  const auto colon = label.find(':');
  return colon == std::string::npos ? label : label.substr(0, colon);
}

/// The forecaster of the run's "forecast" metric, from its stored spec bound
/// as the run bound it; none when the stored spec cannot be bound (a results
/// file of another version), so that nothing is cited that may not have
/// been used.
std::optional<std::string> forecast_model(const ResultSet& results) {
  namespace fc = metric_names::forecast;
  try {
    for (const auto& m : bind_spec_metrics(results.context.spec, "results: /context/spec"))
      if (m.entry && m.entry->name == fc::kName) return m.params.text(fc::kModel);
  } catch (const InputError&) {
  }
  return std::nullopt;
}

}  // namespace

const std::vector<Reference>& all_references() { return kReferences; }

const Reference* find_reference(const std::string& key) {
  for (const auto& r : kReferences)
    if (r.key == key) return &r;
  return nullptr;
}

std::vector<CitedUse> cited_uses(const ResultSet& results, const Summary& summary) {
  std::vector<CitedUse> uses;
  std::set<std::string> seen_methods;
  for (const auto& t : results.trials) {
    const std::string name = call_name(t.method);
    if (!seen_methods.insert(name).second) continue;
    if (auto it = kMethodKeys.find(name); it != kMethodKeys.end()) uses.push_back({"method", name, it->second});
  }
  for (const auto& c : results.columns)
    if (auto it = kColumnKeys.find(c.name); it != kColumnKeys.end()) {
      auto keys = it->second;
      if (c.name == metric_names::forecast::kMaseFilled && forecast_model(results) == metric_names::forecast::kHoltWinters) keys.push_back("winters1960");
      uses.push_back({"metric", c.name, keys});
    }
  auto test = [&](const std::string& name) { uses.push_back({"test", name, kTestKeys.at(name)}); };
  bool interval = false, vs_best = false, equivalence = false, friedman = false, across = false;
  for (const auto& g : summary.groups) {
    interval = interval || g.replicates >= 2;
    friedman = friedman || std::isfinite(g.friedman_p);
    for (const auto& m : g.methods) {
      vs_best = vs_best || std::isfinite(m.p_vs_best);
      equivalence = equivalence || std::isfinite(m.p_equivalent);
    }
  }
  for (const auto& a : summary.across) across = across || (a.datasets >= 2 && std::isfinite(a.critical_difference));
  if (interval) test(test_names::kBootstrapInterval);
  if (vs_best) test(test_names::kSignedRank);
  if (equivalence) test(test_names::kEquivalence);
  if (friedman || across) test(test_names::kFriedman);
  if (across) {
    test(test_names::kImanDavenport);
    test(test_names::kNemenyi);
  }
  return uses;
}

std::vector<std::string> cited_keys(const std::vector<CitedUse>& uses) {
  std::set<std::string> wanted;
  for (const auto& u : uses) wanted.insert(u.keys.begin(), u.keys.end());
  std::vector<std::string> out;
  for (const auto& r : kReferences)
    if (wanted.count(r.key)) out.push_back(r.key);
  return out;
}

}  // namespace gapmark
