// ARIMA fills: an ARIMA(p,d,q)(P,D,Q)s model, of given order or chosen by
// the stepwise AICc search (arima_order_search.hpp), is fitted by exact
// maximum likelihood with the gaps skipped (arima_fit.hpp), and each gap is
// filled with the smoothed value given all observations; its variance is the
// smoother's (the value itself: an ARIMA has no separate noise term). The
// seasonal period s is the request's. Observed values come back unchanged;
// edges follow the shared policy (with edges=nearest the variance at an edge
// point is the smoothed variance plus the squared distance to the smoothed
// value, as for kalman).
#include <cmath>
#include <limits>
#include <sstream>
#include <string>

#include "gapmark/error.hpp"
#include "gapmark/fill/arima_order_search.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/fill/simulation_smoother.hpp"

namespace gapmark {
namespace {

namespace ar = arima;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr int kMaxOrderTerm = 10;  ///< largest p, q, P or Q accepted in a given order
constexpr int kMaxDifferences = 2;

struct Triple {
  int a = 0, b = 0, c = 0;
};

/// "p,d,q" -> three integers, each checked.
Triple parse_triple(const std::string& text, const std::string& field) {
  Triple t;
  std::istringstream in(text);
  int* slots[3] = {&t.a, &t.b, &t.c};
  for (int i = 0; i < 3; ++i) {
    std::string piece;
    if (!std::getline(in, piece, ',') || piece.empty() ||
        piece.find_first_not_of("0123456789") != std::string::npos || piece.size() > 3)
      throw InputError("arima: " + field, "expected three whole numbers like 1,1,1 or 'auto', found '" + text + "'");
    *slots[i] = std::stoi(piece);
  }
  std::string rest;
  if (std::getline(in, rest))
    throw InputError("arima: " + field, "expected three whole numbers like 1,1,1 or 'auto', found '" + text + "'");
  if (t.a > kMaxOrderTerm || t.c > kMaxOrderTerm || t.b > kMaxDifferences)
    throw InputError("arima: " + field, "each order at most " + std::to_string(kMaxOrderTerm) +
                                            " and differences at most " + std::to_string(kMaxDifferences) +
                                            ", found '" + text + "'");
  return t;
}

class Arima final : public FillMethod {
public:
  Arima(bool automatic, ar::Order order, bool seasonal_given, std::string constant, ar::SearchBounds bounds,
        std::size_t max_seasonal_period, bool edges_nearest, std::size_t draws)
      : automatic_(automatic), order_(order), seasonal_given_(seasonal_given), constant_(std::move(constant)),
        bounds_(bounds), max_seasonal_period_(max_seasonal_period), edges_nearest_(edges_nearest), draws_(draws) {}

  FillResult fill(const FillRequest& request) const override {
    const auto& x = request.values;
    const std::size_t n = x.size();
    std::size_t observed = 0;
    for (double v : x) {
      if (std::isinf(v)) throw MethodFailure("the observed values include an infinity");
      if (!std::isnan(v)) ++observed;
    }
    if (observed == 0) throw MethodFailure("no observed values");
    FillResult result;
    result.values.assign(x.begin(), x.end());
    result.variance.assign(n, 0.0);
    const auto [first, last] = *observed_span(x);  // observed > 0 above

    bool constant_series = true;
    for (std::size_t t = first; t <= last; ++t)
      if (!std::isnan(x[t]) && x[t] != x[first]) constant_series = false;
    if (constant_series) {  // every model fits exactly; nothing to estimate
      for (std::size_t t = 0; t < n; ++t)
        if (std::isnan(x[t])) set(result, t, (t > first && t < last) || edges_nearest_ ? x[first] : kNaN, 0.0);
      result.draws.assign(draws_, result.values);
      return result;
    }

    const std::size_t search_period = request.period <= max_seasonal_period_ ? request.period : 0;
    const ar::Fit fit = automatic_ ? ar::search_order(x, search_period, bounds_).best : fit_given(request);
    const ar::Smoothed s = ar::smooth_fit(fit, x);
    result.fit = model_fit(fit);
    for (std::size_t t = 0; t < n; ++t) {
      if (!std::isnan(x[t])) continue;
      const double mean = s.mean[t], var = s.variance[t];
      if (!std::isfinite(mean) || std::isinf(var))
        throw MethodFailure("the smoother gave a non-finite value at point " + std::to_string(t + 1));
      if (t > first && t < last) {
        set(result, t, mean, var);
      } else if (edges_nearest_) {
        const std::size_t near = t < first ? first : last;
        const double gap = mean - x[near];
        set(result, t, x[near], in_data_units(var + gap * gap));
      } else {
        set(result, t, kNaN, kNaN);
      }
    }
    if (draws_ > 0) {
      // the conditional sample paths; at an edge point filled with the
      // nearest value, that value plus the draw's distance from the smoothed
      // value (as kalman does); where the fill is left empty, so are the draws
      Rng rng(request.seed);
      result.draws = ar::conditional_draws(fit, x, draws_, rng);
      for (auto& path : result.draws)
        for (std::size_t t = 0; t < n; ++t)
          if (std::isnan(x[t]) && (t < first || t > last))
            path[t] = std::isnan(result.values[t]) ? kNaN : result.values[t] + (path[t] - s.mean[t]);
    }
    return result;
  }

private:
  static ModelFit model_fit(const ar::Fit& f) {
    ModelFit m;
    m.model = "ARIMA" + f.order.text();
    auto add = [&](const char* prefix, const std::vector<double>& c) {
      for (std::size_t i = 0; i < c.size(); ++i) m.parameters.emplace_back(prefix + std::to_string(i + 1), c[i]);
    };
    add("ar", f.coefficients.ar);
    add("ma", f.coefficients.ma);
    add("seasonal_ar", f.coefficients.seasonal_ar);
    add("seasonal_ma", f.coefficients.seasonal_ma);
    if (!f.beta.empty()) m.parameters.emplace_back(f.order.d + f.order.seasonal_d == 0 ? "mean" : "drift", f.beta[0]);
    m.parameters.emplace_back("sigma2", f.sigma2);
    m.log_likelihood = f.log_likelihood;
    m.aicc = f.aicc;
    m.iterations = f.evaluations;
    m.converged = f.converged;
    m.at_bound = f.at_bound;
    return m;
  }

  /// A variance that is no normal double (data beyond ~1e154 or below
  /// ~1e-154, whose squares overflow or vanish) is given as NaN, as kalman does.
  static double in_data_units(double v) { return v > 0 && !std::isnormal(v) ? kNaN : v; }

  static void set(FillResult& r, std::size_t t, double value, double variance) {
    r.values[t] = value;
    r.variance[t] = std::isnan(value) ? kNaN : variance;
  }

  ar::Fit fit_given(const FillRequest& request) const {
    ar::Order o = order_;
    if (seasonal_given_ && (o.seasonal_p || o.seasonal_d || o.seasonal_q)) {
      if (request.period < 2)
        throw MethodFailure("seasonal=" + std::to_string(o.seasonal_p) + "," + std::to_string(o.seasonal_d) + "," +
                            std::to_string(o.seasonal_q) + " needs a seasonal period",
                            UnmetNeed::Period);
      o.period = request.period;
    }
    const int diffs = o.d + o.seasonal_d;
    o.constant = constant_ == "yes" ? true : constant_ == "no" ? false : diffs == 0;
    if (o.constant && diffs > 1)
      throw MethodFailure("constant=yes needs d + D of at most 1 (a mean or a drift); ARIMA" + o.text() + " has " +
                          std::to_string(diffs));
    return ar::fit(o, request.values);
  }

  bool automatic_;
  ar::Order order_;
  bool seasonal_given_;
  std::string constant_;
  ar::SearchBounds bounds_;
  std::size_t max_seasonal_period_;
  bool edges_nearest_;
  std::size_t draws_;
};

ParamSpec bound_param(const char* name, int value, int max, const char* help) {
  return {.name = name,
          .type = ParamType::Integer,
          .default_value = std::to_string(value),
          .min = 0,
          .max = static_cast<double>(max),
          .choices = {},
          .help = help};
}

const Registration<FillMethod> registration{{
    .name = "arima",
    .summary = "smoothed values of an ARIMA(p,d,q)(P,D,Q)s model fitted by exact maximum likelihood with the gaps "
               "skipped; order given or chosen by a stepwise AICc search",
    .params = {{.name = "order",
                .type = ParamType::Text,
                .default_value = "auto",
                .choices = {},
                .help = "p,d,q (AR order, differences, MA order), e.g. 1,1,1; auto: chosen by the stepwise search "
                        "(differences by KPSS tests, then AICc)"},
               {.name = "seasonal",
                .type = ParamType::Text,
                .default_value = "auto",
                .choices = {},
                .help = "P,D,Q of the seasonal part at the series' period, e.g. 0,1,1; auto: searched with "
                        "order=auto, none with a given order; 0,0,0: none (also with order=auto)"},
               {.name = "constant",
                .type = ParamType::Choice,
                .default_value = "auto",
                .choices = {"auto", "yes", "no"},
                .help = "a mean (d + D = 0) or drift (d + D = 1); auto: a mean without differencing for a given "
                        "order, searched with order=auto"},
               bound_param("max_p", 5, kMaxOrderTerm, "order=auto: largest AR order p"),
               bound_param("max_q", 5, kMaxOrderTerm, "order=auto: largest MA order q"),
               bound_param("max_seasonal_p", 2, kMaxOrderTerm, "order=auto: largest seasonal AR order P"),
               bound_param("max_seasonal_q", 2, kMaxOrderTerm, "order=auto: largest seasonal MA order Q"),
               bound_param("max_d", 2, kMaxDifferences, "order=auto: most differences d"),
               bound_param("max_seasonal_d", 1, 1, "order=auto: most seasonal differences D"),
               bound_param("max_terms", 5, 4 * kMaxOrderTerm, "order=auto: largest p + q + P + Q"),
               bound_param("max_models", 60, 500, "order=auto: most models fitted in the search"),
               bound_param("max_seasonal_period", 12, 1000,
                           "order=auto: longest period whose seasonal part is searched (a seasonal model's state "
                           "grows with the period: about 1 s per fit at 24 and 2,000 points); longer periods are "
                           "searched without a seasonal part"),
               edges_param(), draws_param()},
    .needs = {.period = false, .uses_period = true, .siblings = false, .min_observed = 3},
    .make = [](const ParamValues& p) {
      const bool automatic = p.text("order") == "auto";
      const bool seasonal_auto = p.text("seasonal") == "auto";
      ar::Order o;
      if (!automatic) {
        const Triple t = parse_triple(p.text("order"), "order");
        o.p = t.a;
        o.d = t.b;
        o.q = t.c;
      } else if (!seasonal_auto && p.text("seasonal") != "0,0,0") {
        throw InputError("arima: seasonal", "with order=auto, seasonal is auto or 0,0,0 (no seasonal part); a "
                                            "given seasonal order needs a given order (order=p,d,q)");
      } else if (p.text("constant") != "auto") {
        throw InputError("arima: constant", "order=auto searches the constant; give an order to fix it");
      }
      if (!seasonal_auto) {
        const Triple t = parse_triple(p.text("seasonal"), "seasonal");
        if (t.b > 1) throw InputError("arima: seasonal", "at most one seasonal difference, found '" +
                                                             p.text("seasonal") + "'");
        o.seasonal_p = t.a;
        o.seasonal_d = t.b;
        o.seasonal_q = t.c;
      }
      ar::SearchBounds b;
      b.max_p = static_cast<int>(p.integer("max_p"));
      b.max_q = static_cast<int>(p.integer("max_q"));
      b.max_seasonal_p = static_cast<int>(p.integer("max_seasonal_p"));
      b.max_seasonal_q = static_cast<int>(p.integer("max_seasonal_q"));
      b.max_d = static_cast<int>(p.integer("max_d"));
      b.max_seasonal_d = static_cast<int>(p.integer("max_seasonal_d"));
      b.max_terms = static_cast<int>(p.integer("max_terms"));
      b.max_models = static_cast<std::size_t>(p.integer("max_models"));
      if (automatic && !seasonal_auto) b.max_seasonal_p = b.max_seasonal_q = b.max_seasonal_d = 0;
      return std::make_unique<Arima>(automatic, o, !seasonal_auto, p.text("constant"), b,
                                     static_cast<std::size_t>(p.integer("max_seasonal_period")),
                                     p.text("edges") == "nearest", static_cast<std::size_t>(p.integer("draws")));
    },
}};

}  // namespace
}  // namespace gapmark
