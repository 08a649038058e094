// Additive Holt-Winters against statsmodels ExponentialSmoothing(trend="add",
// seasonal="add") on co2 and UKDriverDeaths from R's datasets package
// (values stored by reference/downstream/holt_winters_statsmodels.py):
// initial states, the recursions with fixed smoothing parameters (tight),
// the fitted smoothing parameters (loose, stated below) and the forecast of
// a held-out stretch.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "gapmark/forecast/holt_winters.hpp"
#include "reference_values.hpp"

using namespace gapmark::forecast;

namespace {

const nlohmann::json& reference() {
  static const nlohmann::json ref = gapmark::test::read_reference("values/holt_winters_statsmodels.json");
  return ref;
}

bool close(double a, double b, double rel) { return std::abs(a - b) <= rel * std::max(1.0, std::abs(b)); }

}  // namespace

TEST_CASE("initial states equal statsmodels' simple initialisation") {
  for (const auto& item : reference().at("cases").items()) {
    const std::string name = item.key();  // a copy: lambdas in INFO cannot capture a structured binding (clang 14)
    const auto& c = item.value();
    INFO(name);
    const auto y = gapmark::test::r_series(name);
    const auto s = holt_winters_initial_state(y, c.at("period"));
    REQUIRE(s.has_value());
    CHECK(close(s->level, c.at("initial").at("level"), 1e-13));
    CHECK(close(s->trend, c.at("initial").at("trend"), 1e-12));
    const auto season = c.at("initial").at("season").get<std::vector<double>>();
    REQUIRE(s->season.size() == season.size());
    for (std::size_t j = 0; j < season.size(); ++j) CHECK(close(s->season[j], season[j], 1e-12));
  }
}

TEST_CASE("with fixed smoothing parameters the recursions agree with statsmodels") {
  const std::size_t horizon = reference().at("horizon");
  for (const auto& item : reference().at("cases").items()) {
    const std::string name = item.key();
    const auto& c = item.value();
    const auto y = gapmark::test::r_series(name);
    const auto initial = holt_winters_initial_state(y, c.at("period"));
    REQUIRE(initial.has_value());
    for (const auto& run_ref : c.at("fixed")) {
      const HoltWintersSmoothing p{run_ref.at("alpha"), run_ref.at("beta"), run_ref.at("gamma")};
      INFO(name << " alpha=" << p.alpha << " beta=" << p.beta << " gamma=" << p.gamma);
      const auto run = holt_winters_filter(y, p, *initial);
      const auto fitted = run_ref.at("fitted").get<std::vector<double>>();
      REQUIRE(run.fitted.size() == fitted.size());
      double worst = 0;
      for (std::size_t t = 0; t < fitted.size(); ++t)
        worst = std::max(worst, std::abs(run.fitted[t] - fitted[t]) / std::max(1.0, std::abs(fitted[t])));
      CHECK(worst <= 1e-11);
      CHECK(close(run.sse, run_ref.at("sse"), 1e-9));
      // Final states: statsmodels lists s_{n-m+1} .. s_n; ours holds them in
      // the order of use, season[k] for step n+1+k, which is the same order.
      const auto& fs = run.final_state;
      CHECK(close(fs.level, run_ref.at("final_level"), 1e-11));
      CHECK(close(fs.trend, run_ref.at("final_trend"), 1e-9));
      const auto season_ref = run_ref.at("final_season").get<std::vector<double>>();
      REQUIRE(fs.season.size() == season_ref.size());
      for (std::size_t j = 0; j < season_ref.size(); ++j) CHECK(close(fs.season[j], season_ref[j], 1e-9));

      // Forecast: l_n + h b_n + s_{n+h-m(k+1)}. At h = m, 2m, ... this
      // statsmodels version reuses s_{n-m} instead of the last update s_n, so
      // there we compare with the textbook formula built from statsmodels'
      // own final states; elsewhere with its forecast.
      const std::size_t m = season_ref.size();
      const auto fc = holt_winters_forecast(fs, horizon);
      const auto fc_ref = run_ref.at("forecast").get<std::vector<double>>();
      REQUIRE(fc.size() == fc_ref.size());
      for (std::size_t h = 1; h <= horizon; ++h) {
        const double expected = h % m ? fc_ref[h - 1]
                                      : run_ref.at("final_level").get<double>() +
                                            double(h) * run_ref.at("final_trend").get<double>() + season_ref[m - 1];
        INFO("h=" << h << " ours " << fc[h - 1] << " expected " << expected);
        CHECK(close(fc[h - 1], expected, 1e-11));
      }
    }
  }
}

TEST_CASE("fitted smoothing parameters agree with statsmodels within 0.001 and fit no worse") {
  // Tolerance: the SSE surface is flat near its minimum, so two optimisers
  // stop at slightly different points (here they differ by about 2e-6); we
  // allow 0.001 absolute, a rule of thumb of our own (no source). The SSE
  // is the sharper check: ours may not exceed statsmodels' (L-BFGS-B) by
  // more than 1e-6 relative. statsmodels also imposes beta <= alpha and gamma <= 1 - alpha;
  // our box [0, 1]^3 contains that region, so our SSE can only be lower.
  for (const auto& item : reference().at("cases").items()) {
    const std::string name = item.key();
    const auto& c = item.value();
    INFO(name);
    const auto y = gapmark::test::r_series(name);
    const auto fit = holt_winters_fit(y, c.at("period"));
    REQUIRE(fit.has_value());
    const auto& f = c.at("fit");
    CHECK(std::abs(fit->smoothing.alpha - f.at("alpha").get<double>()) <= 1e-3);
    CHECK(std::abs(fit->smoothing.beta - f.at("beta").get<double>()) <= 1e-3);
    CHECK(std::abs(fit->smoothing.gamma - f.at("gamma").get<double>()) <= 1e-3);
    CHECK(fit->run.sse <= f.at("sse").get<double>() * (1 + 1e-6));
  }
}

TEST_CASE("forecast of a held-out stretch agrees with statsmodels' fitted model") {
  // Loose: the two fits differ slightly in their parameters (see above); the
  // forecasts must agree within 1e-4 relative.
  for (const auto& item : reference().at("cases").items()) {
    const std::string name = item.key();
    const auto& c = item.value();
    INFO(name);
    auto y = gapmark::test::r_series(name);
    const auto& h = c.at("holdout");
    y.resize(h.at("train_n").get<std::size_t>());
    const auto fit = holt_winters_fit(y, c.at("period"));
    REQUIRE(fit.has_value());
    const auto theirs = h.at("forecast").get<std::vector<double>>();
    const auto ours = holt_winters_forecast(fit->run.final_state, theirs.size());
    const std::size_t m = c.at("period");
    for (std::size_t k = 0; k < theirs.size(); ++k)
      if ((k + 1) % m) CHECK(close(ours[k], theirs[k], 1e-4));  // h = m, 2m: see the fixed-parameter case
  }
}

TEST_CASE("Holt-Winters is not applicable to short, seasonless or incomplete input") {
  const std::vector<double> y{1, 2, 3, 4, 5, 6, 7};
  CHECK_FALSE(holt_winters_initial_state(y, 4).has_value());  // 7 < two seasons of 4
  CHECK_FALSE(holt_winters_initial_state(y, 1).has_value());
  CHECK_FALSE(holt_winters_fit(y, 0).has_value());
  CHECK(holt_winters_fit(y, 3).has_value());
  std::vector<double> gappy{1, 2, 3, 4, std::nan(""), 6, 7};
  CHECK_FALSE(holt_winters_fit(gappy, 3).has_value());
}

TEST_CASE("Holt-Winters fit stays in the unit box and is deterministic") {
  const auto y = gapmark::test::r_series("UKDriverDeaths");
  const auto a = holt_winters_fit(y, 12), b = holt_winters_fit(y, 12);
  REQUIRE(a.has_value());
  REQUIRE(b.has_value());
  for (double v : {a->smoothing.alpha, a->smoothing.beta, a->smoothing.gamma}) {
    CHECK(v >= 0);
    CHECK(v <= 1);
  }
  CHECK(a->smoothing.alpha == b->smoothing.alpha);
  CHECK(a->run.sse == b->run.sse);
}
