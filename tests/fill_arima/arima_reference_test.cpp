// ARIMA fits and smoothed fills against stored outside references
// (reference/arima/arima_reference.json, made by reference/arima/r_reference.R
// and statsmodels_reference.py):
//  - R's stats::arima(method = "ML") coefficients, sigma^2 and log-likelihood;
//  - R's stats::KalmanSmooth on R's fitted model at the removed values;
//  - statsmodels SARIMAX estimates.
// Data: R's datasets package (lh, LakeHuron, log UKDriverDeaths), values removed.
#include <cmath>
#include <fstream>
#include <limits>
#include <string>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "gapmark/fill/arima_fit.hpp"

namespace ar = gapmark::arima;

namespace {

const nlohmann::json& reference() {
  static const nlohmann::json doc = [] {
    std::ifstream in(std::string(GAPMARK_SOURCE_DIR) + "/reference/arima/arima_reference.json");
    return nlohmann::json::parse(in);
  }();
  return doc;
}

std::vector<double> numbers(const nlohmann::json& a) {
  std::vector<double> out;
  for (const auto& v : a) out.push_back(v.is_null() ? std::numeric_limits<double>::quiet_NaN() : v.get<double>());
  return out;
}

ar::Order order_of(const nlohmann::json& c) {
  ar::Order o;
  o.p = c["order"][0];
  o.d = c["order"][1];
  o.q = c["order"][2];
  o.seasonal_p = c["seasonal"][0];
  o.seasonal_d = c["seasonal"][1];
  o.seasonal_q = c["seasonal"][2];
  o.period = c["period"];
  o.constant = o.d + o.seasonal_d == 0;  // R's include.mean default
  return o;
}

/// Our coefficients under R's names.
std::map<std::string, double> named(const ar::Fit& f) {
  std::map<std::string, double> m;
  for (std::size_t i = 0; i < f.coefficients.ar.size(); ++i) m["ar" + std::to_string(i + 1)] = f.coefficients.ar[i];
  for (std::size_t i = 0; i < f.coefficients.ma.size(); ++i) m["ma" + std::to_string(i + 1)] = f.coefficients.ma[i];
  for (std::size_t i = 0; i < f.coefficients.seasonal_ar.size(); ++i)
    m["sar" + std::to_string(i + 1)] = f.coefficients.seasonal_ar[i];
  for (std::size_t i = 0; i < f.coefficients.seasonal_ma.size(); ++i)
    m["sma" + std::to_string(i + 1)] = f.coefficients.seasonal_ma[i];
  if (!f.beta.empty()) m["intercept"] = f.beta[0];
  return m;
}

}  // namespace

TEST_CASE("arima: ML fits match R's arima() on open data with values removed") {
  for (const auto& c : reference()["cases"]) {
    const std::string name = c["name"];
    INFO(name);
    const auto y = numbers(c["data"]);
    const ar::Fit f = ar::fit(order_of(c), y);
    const auto& r = c["r"];
    // Likelihood: ours must be at least R's (both maximise the same function;
    // R's kappa = 1e10 stands in for the diffuse prior, which leaves some 1e-6
    // of its value) and within 1e-4 of it.
    CHECK_MESSAGE(f.log_likelihood >= r["loglik"].get<double>() - 1e-5, (f.log_likelihood - r["loglik"].get<double>()));
    CHECK(f.log_likelihood == doctest::Approx(r["loglik"].get<double>()).epsilon(0).scale(1).epsilon(1e-4));
    CHECK(f.sigma2 == doctest::Approx(r["sigma2"].get<double>()).epsilon(2e-3));
    const auto ours = named(f);
    for (const auto& item : r["coef"].items()) {
      const std::string key = item.key();  // not a structured binding: clang 14 cannot capture one in INFO
      const auto& value = item.value();
      INFO(key);
      REQUIRE(ours.count(key) == 1);
      CHECK(ours.at(key) == doctest::Approx(value.get<double>()).epsilon(0).scale(1).epsilon(2e-3));
    }
    CHECK(f.converged);
  }
}

TEST_CASE("arima: smoothed fills match R's KalmanSmooth on R's fitted model") {
  for (const auto& c : reference()["cases"]) {
    const std::string name = c["name"];
    INFO(name);
    const auto y = numbers(c["data"]);
    const auto& r = c["r"];
    ar::Fit f;
    f.order = order_of(c);
    // R's coefficients, so the comparison is of the smoother alone.
    for (const auto& [key, value] : r["coef"].items()) {
      const double v = value.get<double>();
      if (key.rfind("ar", 0) == 0) f.coefficients.ar.push_back(v);
      else if (key.rfind("ma", 0) == 0) f.coefficients.ma.push_back(v);
      else if (key.rfind("sar", 0) == 0) f.coefficients.seasonal_ar.push_back(v);
      else if (key.rfind("sma", 0) == 0) f.coefficients.seasonal_ma.push_back(v);
    }
    f.centre = 0;
    f.scale = 1;
    const ar::Smoothed s = ar::smooth_fit(f, y);
    // The exact diffuse likelihood at R's estimates against R's (kappa = 1e10) value.
    CHECK(s.likelihood.log_likelihood == doctest::Approx(r["loglik"].get<double>()).epsilon(0).scale(1).epsilon(1e-5));
    const auto idx = r["smooth_index"];
    const auto mean = numbers(r["smooth_mean"]);
    const auto var = numbers(r["smooth_var"]);
    // our variance uses our sigma^2 estimate at R's coefficients
    const double sigma_ratio = r["sigma2"].get<double>() / s.likelihood.sigma2;
    for (std::size_t i = 0; i < idx.size(); ++i) {
      const std::size_t t = idx[i].get<std::size_t>() - 1;
      INFO("point " << t + 1);
      CHECK(s.mean[t] == doctest::Approx(mean[i]).epsilon(1e-5));
      CHECK(s.variance[t] * sigma_ratio == doctest::Approx(var[i]).epsilon(1e-4));
    }
  }
}

TEST_CASE("arima: ML coefficients match statsmodels SARIMAX where its likelihood is R's") {
  // statsmodels leaves out the first nd time points' terms, observed or not,
  // and starts the differenced part from a large finite variance; where that
  // changes its likelihood at R's estimates by more than 1e-3, the two
  // maximise different functions and are not compared.
  std::size_t compared = 0;
  for (const auto& c : reference()["cases"]) {
    const std::string name = c["name"];
    INFO(name);
    const auto& sm = c["statsmodels"];
    if (std::abs(sm["loglik_at_r_estimates"].get<double>() - c["r"]["loglik"].get<double>()) > 1e-3) continue;
    ++compared;
    const ar::Fit f = ar::fit(order_of(c), numbers(c["data"]));
    const auto ours = named(f);
    const std::map<std::string, std::string> keys{{"ar.L1", "ar1"}, {"ar.L2", "ar2"}, {"ma.L1", "ma1"},
                                                  {"ar.S.L12", "sar1"}, {"ma.S.L12", "sma1"}};
    for (const auto& item : sm["params"].items()) {
      const std::string key = item.key();  // not a structured binding: clang 14 cannot capture one in INFO
      const auto& value = item.value();
      if (!keys.count(key)) continue;
      INFO(key);
      CHECK(ours.at(keys.at(key)) == doctest::Approx(value.get<double>()).epsilon(0).scale(1).epsilon(5e-3));
    }
    CHECK(f.sigma2 == doctest::Approx(sm["params"]["sigma2"].get<double>()).epsilon(1e-2));
  }
  CHECK(compared >= 4);
}
