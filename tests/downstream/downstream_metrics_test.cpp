// The registered downstream metrics "acf", "forecast" and "interval": their
// columns, what they compute on open series (against values stored from
// statsmodels and scipy), and the cases where they must write NaN (n/a).
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/forecast/holt_winters.hpp"
#include "gapmark/forecast/mase.hpp"
#include "gapmark/score/metric.hpp"
#include "reference_values.hpp"

using namespace gapmark;

namespace {

constexpr double NaN = std::numeric_limits<double>::quiet_NaN();

std::vector<double> run(const std::string& call, const ScoreInput& in) {
  const auto bound = MetricRegistry::global().bind(CallSpec::parse(call, "test"), "test");
  std::vector<double> out(bound.impl->columns().size(), -12345.0);
  bound.impl->compute(in, out);
  return out;
}

std::vector<std::string> column_names(const std::string& name) {
  const auto bound = MetricRegistry::global().bind(CallSpec::parse(name, "test"), "test");
  std::vector<std::string> names;
  for (const auto& c : bound.impl->columns()) names.push_back(c.name);
  return names;
}

bool all_nan(const std::vector<double>& v) {
  for (double x : v)
    if (!std::isnan(x)) return false;
  return true;
}

struct Case {
  std::vector<double> truth, filled, variance;
  Mask mask;
  std::size_t period = 0, holdout = 0;

  ScoreInput input() const {
    ScoreInput in;
    in.truth = truth;
    in.filled = filled;
    in.variance = variance;
    in.mask = &mask;
    in.period = period;
    in.holdout = holdout;
    return in;
  }
};

}  // namespace

TEST_CASE("downstream metrics are registered with their columns and directions") {
  CHECK(column_names("acf") == std::vector<std::string>{"acf_rms", "acf_max", "var_ratio"});
  CHECK(column_names("forecast") == std::vector<std::string>{"mase_filled", "mase_complete", "mase_cost"});
  CHECK(column_names("interval") == std::vector<std::string>{"coverage", "coverage_error", "crps"});
  const auto acf = MetricRegistry::global().bind(CallSpec::parse("acf", "t"), "t").impl->columns();
  CHECK(acf[2].direction == Direction::OneBest);
  const auto fc = MetricRegistry::global().bind(CallSpec::parse("forecast", "t"), "t").impl->columns();
  CHECK(fc[2].direction == Direction::Lower);
  const auto iv = MetricRegistry::global().bind(CallSpec::parse("interval", "t"), "t").impl->columns();
  CHECK(iv[1].direction == Direction::ZeroBest);
  CHECK(iv[2].direction == Direction::Lower);
}

// ---------------------------------------------------------------- acf

TEST_CASE("acf metric: a mean fill of lynx matches acf_rms, acf_max and var_ratio from statsmodels") {
  // Stored by reference/downstream/acf_statsmodels.py from statsmodels' acf
  // (missing="conservative") and numpy's nanvar; one case where the truth is
  // complete, one where it has gaps of its own.
  const auto ref = test::read_reference("values/acf_statsmodels.json");
  for (const auto& c : ref.at("metric_lynx_mean_fill")) {
    Case k;
    k.truth = test::r_series("lynx");
    for (std::size_t i : c.at("truth_gaps").get<std::vector<std::size_t>>()) k.truth[i] = NaN;
    k.mask.assign(k.truth.size(), 0);
    k.filled = k.truth;
    for (std::size_t i : c.at("masked").get<std::vector<std::size_t>>()) {
      k.mask[i] = 1;
      k.filled[i] = c.at("fill_value");
    }
    // A fill method also fills the truth's own gaps; the metric must ignore those values.
    for (std::size_t i : c.at("truth_gaps").get<std::vector<std::size_t>>()) k.filled[i] = 1e6 + double(i);
    INFO("truth gaps: " << c.at("truth_gaps").size());
    const auto out = run("acf", k.input());  // lynx has no period: L = 24
    CHECK(out[0] == doctest::Approx(c.at("acf_rms").get<double>()).epsilon(1e-12));
    CHECK(out[1] == doctest::Approx(c.at("acf_max").get<double>()).epsilon(1e-12));
    CHECK(out[2] == doctest::Approx(c.at("var_ratio").get<double>()).epsilon(1e-12));
    CHECK(run("acf:lags=24", k.input()) == out);
    CHECK(run("acf:lags=5", k.input())[0] != out[0]);
  }
}

TEST_CASE("acf metric: a perfect fill scores zero distortion and a variance ratio of one") {
  Case k;
  k.truth = test::r_series("co2");
  k.filled = k.truth;
  k.mask.assign(k.truth.size(), 0);
  for (std::size_t i = 3; i < k.truth.size(); i += 7) k.mask[i] = 1;
  k.period = 12;
  const auto out = run("acf", k.input());
  CHECK(out == std::vector<double>{0.0, 0.0, 1.0});
}

TEST_CASE("acf metric: lags=1 reduces both summaries to |r1(filled) - r1(complete)|") {
  // truth 1 2 3 4 (r1 = 0.25, see acf_test); filled 1 2 2 4: mean 2.25,
  // centred -1.25 -0.25 -0.25 1.75, c0 = (1.5625+0.0625+0.0625+3.0625)/4 = 1.1875,
  // c1 = (0.3125 + 0.0625 - 0.4375)/4 = -0.015625, r1 = -0.013157894736842105
  Case k{.truth = {1, 2, 3, 4}, .filled = {1, 2, 2, 4}, .variance = {}, .mask = {0, 0, 1, 0}};
  const auto out = run("acf:lags=1", k.input());
  const double d = std::abs(-0.015625 / 1.1875 - 0.25);
  CHECK(out[0] == doctest::Approx(d).epsilon(1e-14));
  CHECK(out[1] == doctest::Approx(d).epsilon(1e-14));
  CHECK(out[2] == doctest::Approx(1.1875 / 1.25).epsilon(1e-14));
}

TEST_CASE("acf metric writes NaN when a masked point is left unfilled or the truth is constant") {
  Case k{.truth = {1, 2, 3, 4, 5, 1}, .filled = {1, 2, NaN, 4, 5, 1}, .variance = {}, .mask = {0, 0, 1, 0, 0, 0}};
  CHECK(all_nan(run("acf", k.input())));
  Case flat{.truth = {2, 2, 2, 2}, .filled = {2, 2, 2, 2}, .variance = {}, .mask = {0, 1, 0, 0}};
  CHECK(all_nan(run("acf", flat.input())));
}

// ---------------------------------------------------------------- forecast

TEST_CASE("forecast metric, seasonal naive: mase_complete from statsmodels' forecast and pandas' scale") {
  // co2, first 430 points, holdout 30: the complete series' forecast is the
  // statsmodels seasonal random walk forecast stored for train_n = 400.
  const auto ref = test::read_reference("values/seasonal_naive_statsmodels.json");
  const auto& c = ref.at("cases").at("co2");
  const std::size_t train_n = c.at("train_n"), horizon = ref.at("horizon");
  Case k;
  k.truth = test::r_series("co2");
  k.truth.resize(train_n + horizon);
  k.filled = k.truth;
  k.mask.assign(k.truth.size(), 0);
  k.period = 12;
  k.holdout = horizon;
  const auto fc = c.at("forecast").get<std::vector<double>>();
  double abs_sum = 0;
  for (std::size_t h = 0; h < horizon; ++h) abs_sum += std::abs(k.truth[train_n + h] - fc[h]);
  const double expected = abs_sum / double(horizon) / c.at("scale").get<double>();

  const auto oracle = run("forecast:model=seasonal-naive", k.input());
  CHECK(oracle[1] == doctest::Approx(expected).epsilon(1e-12));
  CHECK(oracle[0] == oracle[1]);
  CHECK(oracle[2] == 0.0);

  // Damage the last training season: the seasonal naive forecast copies it,
  // so step h moves by the damage done to its source point. co2 rises, the
  // forecast already falls short, and lowering the copied points hurts.
  std::vector<double> shift(12, 0.0);
  for (std::size_t j = 0; j < 12; j += 2) {
    const std::size_t t = train_n - 12 + j;
    k.mask[t] = 1;
    k.filled[t] = k.truth[t] - 3.0;
    shift[j] = -3.0;
  }
  double hurt_sum = 0;
  for (std::size_t h = 0; h < horizon; ++h) hurt_sum += std::abs(k.truth[train_n + h] - (fc[h] + shift[h % 12]));
  const auto hurt = run("forecast:model=seasonal-naive", k.input());
  CHECK(hurt[0] == doctest::Approx(hurt_sum / double(horizon) / c.at("scale").get<double>()).epsilon(1e-12));
  CHECK(hurt[1] == doctest::Approx(expected).epsilon(1e-12));  // complete side unchanged
  CHECK(hurt[0] > hurt[1]);
  CHECK(hurt[2] == doctest::Approx(hurt[0] - hurt[1]).epsilon(1e-15));

  // horizon=6 scores only the first six held-out points.
  double six = 0;
  for (std::size_t h = 0; h < 6; ++h) six += std::abs(k.truth[train_n + h] - fc[h]);
  CHECK(run("forecast:model=seasonal-naive,horizon=6", k.input())[1] ==
        doctest::Approx(six / 6 / c.at("scale").get<double>()).epsilon(1e-12));
}

TEST_CASE("forecast metric, Holt-Winters: oracle fill costs nothing, a bad fill costs something") {
  const auto ref = test::read_reference("values/holt_winters_statsmodels.json");
  const auto& h = ref.at("cases").at("co2").at("holdout");
  Case k;
  k.truth = test::r_series("co2");
  k.filled = k.truth;
  k.mask.assign(k.truth.size(), 0);
  k.period = 12;
  k.holdout = k.truth.size() - h.at("train_n").get<std::size_t>();
  const auto oracle = run("forecast", k.input());  // holt-winters is the default
  CHECK(std::isfinite(oracle[1]));
  CHECK(oracle[0] == oracle[1]);
  CHECK(oracle[2] == 0.0);

  // Loose check of mase_complete against the forecast of statsmodels' own fit
  // on the same training part (its parameters differ slightly from ours):
  // same scale and forecasts within 1e-4 relative (holt_winters_test), but
  // statsmodels reuses s_{n-m} at h = m, 2m (see there), so only 2% here.
  std::vector<double> train(k.truth.begin(), k.truth.end() - static_cast<std::ptrdiff_t>(k.holdout));
  const double scale = forecast::seasonal_naive_scale(train, 12);
  const auto actual = h.at("actual").get<std::vector<double>>();
  const double theirs = forecast::mase(actual, h.at("forecast").get<std::vector<double>>(), scale);
  CHECK(oracle[1] == doctest::Approx(theirs).epsilon(0.02));

  // A fill that flattens the last two training years to their mean.
  const std::size_t train_n = train.size();
  double mean = 0;
  for (std::size_t t = train_n - 24; t < train_n; ++t) mean += k.truth[t] / 24;
  for (std::size_t t = train_n - 24; t < train_n; ++t) {
    k.mask[t] = 1;
    k.filled[t] = mean;
  }
  const auto hurt = run("forecast", k.input());
  CHECK(hurt[1] == oracle[1]);
  CHECK(hurt[2] > 0);
}

TEST_CASE("forecast metric writes NaN (n/a) where it does not apply, and never throws") {
  Case k;
  k.truth = test::r_series("UKDriverDeaths");  // 192 points, period 12
  k.filled = k.truth;
  k.mask.assign(k.truth.size(), 0);
  k.period = 12;

  k.holdout = 0;
  CHECK(all_nan(run("forecast", k.input())));
  CHECK(all_nan(run("forecast:model=seasonal-naive", k.input())));

  k.holdout = 192 - 23;  // training part of 23 < two seasons of 12
  CHECK(all_nan(run("forecast", k.input())));
  k.holdout = 192 - 24;  // exactly two seasons: applicable
  CHECK_FALSE(all_nan(run("forecast", k.input())));

  k.holdout = 12;
  k.period = 0;  // Holt-Winters needs a season; seasonal naive falls back to naive
  CHECK(all_nan(run("forecast", k.input())));
  CHECK_FALSE(all_nan(run("forecast:model=seasonal-naive", k.input())));
  k.period = 12;

  k.filled[50] = NaN;  // the method left a training point unfilled
  k.mask[50] = 1;
  CHECK(all_nan(run("forecast", k.input())));
  CHECK(all_nan(run("forecast:model=seasonal-naive", k.input())));
}

TEST_CASE("forecast metric: the complete series' own gaps are bridged the same way for every method") {
  Case k;
  k.truth = test::r_series("UKDriverDeaths");
  const double before = k.truth[39], after = k.truth[42];
  k.truth[40] = NaN;  // a real gap of two points in the truth
  k.truth[41] = NaN;
  k.truth[185] = NaN;  // a real gap in the holdout: skipped when scoring
  k.mask.assign(k.truth.size(), 0);
  k.period = 12;
  k.holdout = 12;

  // The reference: the complete series with the training gap bridged by
  // linear interpolation by hand (point 185 stays missing and is skipped).
  Case bridged = k;
  bridged.truth[40] = before + (after - before) / 3;
  bridged.truth[41] = before + 2 * (after - before) / 3;
  bridged.filled = bridged.truth;
  const auto expected = run("forecast", bridged.input());

  // Two methods that guess the real gap differently: same mase_complete,
  // and with the masked points perfect, zero cost.
  for (double guess : {1500.0, 2500.0}) {
    k.filled = k.truth;
    k.filled[40] = k.filled[41] = k.filled[185] = guess;
    const auto out = run("forecast", k.input());
    INFO("guess " << guess);
    CHECK(out[1] == expected[1]);
    CHECK(out[0] == out[1]);
    CHECK(out[2] == 0.0);
  }
}

TEST_CASE("forecast metric: a gap at the start of the complete series takes the first observed value") {
  Case k;
  k.truth = test::r_series("co2");
  k.truth.resize(120);
  k.mask.assign(k.truth.size(), 0);
  k.period = 12;
  k.holdout = 12;
  Case bridged = k;
  bridged.filled = bridged.truth;
  bridged.truth[0] = bridged.filled[0] = k.truth[1];
  k.truth[0] = NaN;
  k.filled = k.truth;
  k.filled[0] = 999;  // the method's guess is not used
  CHECK(run("forecast", k.input()) == run("forecast", bridged.input()));
}

// ---------------------------------------------------------------- interval

TEST_CASE("interval metric: coverage and CRPS on masked points match scipy's values") {
  // The masked points are exactly the (mu, sigma, y) points whose CRPS scipy
  // integrated numerically (reference/downstream/crps_scipy.py); coverage
  // counts |y - mu| <= z sigma with z = norm.ppf(0.95) from scipy.
  const auto ref = test::read_reference("values/crps_scipy.json");
  double z90 = 0;
  for (const auto& p : ref.at("central_half_width"))
    if (p.at("level").get<double>() == 0.9) z90 = p.at("z");
  Case k;
  double crps_sum = 0;
  std::size_t inside = 0, count = 0;
  for (const auto& p : ref.at("points")) {
    const double mu = p.at("mu"), sigma = p.at("sigma"), y = p.at("y");
    k.truth.push_back(y);
    k.filled.push_back(mu);
    k.variance.push_back(sigma * sigma);
    k.mask.push_back(1);
    // an observed point between masked points: not scored
    k.truth.push_back(42);
    k.filled.push_back(42);
    k.variance.push_back(0);
    k.mask.push_back(0);
    crps_sum += p.at("crps").get<double>();
    inside += std::abs(y - mu) <= z90 * sigma;
    ++count;
  }
  REQUIRE(inside > 0);
  REQUIRE(inside < count);
  const auto out = run("interval", k.input());
  CHECK(out[0] == doctest::Approx(double(inside) / double(count)).epsilon(1e-15));
  CHECK(out[1] == doctest::Approx(double(inside) / double(count) - 0.9).epsilon(1e-15));
  CHECK(out[2] == doctest::Approx(crps_sum / double(count)).epsilon(1e-9));
}

TEST_CASE("interval metric: level changes the interval; zero variance scores the absolute error") {
  // mu = 0, sigma = 1, y = 1: inside the 90% interval (z = 1.645), outside
  // the 50% one (z = 0.674).
  Case k{.truth = {1, 3}, .filled = {0, 3.5}, .variance = {1, 0}, .mask = {1, 1}};
  const auto wide = run("interval", k.input());
  const auto narrow = run("interval:level=0.5", k.input());
  // Second point: zero variance, |3 - 3.5| = 0.5 > 0: outside every interval.
  CHECK(wide[0] == 0.5);
  CHECK(narrow[0] == 0.0);
  CHECK(narrow[1] == -0.5);
  // CRPS: (0.6024413576... + 0.5) / 2, the first from the closed form at z = 1.
  CHECK(wide[2] == doctest::Approx((0.60244135762761 + 0.5) / 2).epsilon(1e-12));
  CHECK(wide[2] == narrow[2]);
}

TEST_CASE("interval metric is n/a without a variance, never zero") {
  Case k{.truth = {1, 2, 3}, .filled = {1, 2, 3}, .variance = {}, .mask = {0, 1, 0}};
  CHECK(all_nan(run("interval", k.input())));  // a perfect fill without variance is still n/a
  k.variance = {0, -1, 0};                       // invalid variance
  CHECK(all_nan(run("interval", k.input())));
  k.variance = {0, 0.5, 0};
  k.filled = {1, NaN, 3};                        // masked point left unfilled
  CHECK(all_nan(run("interval", k.input())));
  k.filled = {1, 2, 3};
  k.mask = {0, 0, 0};                            // nothing masked
  CHECK(all_nan(run("interval", k.input())));
}
