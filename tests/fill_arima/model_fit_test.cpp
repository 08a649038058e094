// Fitted parameters on record: ModelFit's JSON form, and what the arima and
// kalman methods put in it. The Nile check: Durbin & Koopman (2012) publish
// the local level's ML variances for the Nile flow (R datasets::Nile) as
// 15099 (irregular) and 1469.1 (level), quoted from memory.
#include <cmath>
#include <fstream>
#include <sstream>
#include <string>

#include <doctest/doctest.h>

#include "gapmark/error.hpp"
#include "gapmark/fill/arima_fit.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/params.hpp"

using namespace gapmark;

namespace {
std::shared_ptr<const FillMethod> make(const std::string& name,
                                       const std::vector<std::pair<std::string, std::string>>& args) {
  CallSpec call;
  call.name = name;
  call.args = args;
  return MethodRegistry::global().bind(call, "test").impl;
}

double parameter(const ModelFit& f, const std::string& name) {
  for (const auto& [n, v] : f.parameters)
    if (n == name) return v;
  FAIL("no parameter " << name);
  return 0;
}

/// Nile from reference/kalman/data.csv (series,index,value).
std::vector<double> nile() {
  std::ifstream in(std::string(GAPMARK_SOURCE_DIR) + "/reference/kalman/data.csv");
  std::string line;
  std::vector<double> out;
  std::getline(in, line);
  while (std::getline(in, line))
    if (line.rfind("\"nile\"", 0) == 0 || line.rfind("nile,", 0) == 0) out.push_back(std::stod(line.substr(line.rfind(',') + 1)));
  return out;
}
}  // namespace

TEST_CASE("ModelFit: JSON round trip and refusals") {
  ModelFit f;
  f.model = "ARIMA(1,0,0) with mean";
  f.parameters = {{"ar1", 0.5}, {"mean", 2.25}, {"sigma2", std::nan("")}};
  f.log_likelihood = -12.5;
  f.iterations = 17;
  f.at_bound = true;
  const auto j = fit_to_json(f);
  CHECK(j["aicc"].is_null());
  CHECK(j["parameters"]["sigma2"].is_null());
  const ModelFit back = fit_from_json(j, "x");
  CHECK(back.model == f.model);
  CHECK(back.parameters.size() == 3);
  CHECK(back.parameters[0].second == 0.5);
  CHECK(std::isnan(back.parameters[2].second));
  CHECK(back.iterations == 17);
  CHECK(back.at_bound);
  auto bad = j;
  bad["extra"] = 1;
  CHECK_THROWS_AS(fit_from_json(bad, "x"), InputError);
  bad = j;
  bad["iterations"] = -1;
  CHECK_THROWS_AS(fit_from_json(bad, "x"), InputError);
  bad = j;
  bad["parameters"]["ar1"] = "0.5";
  CHECK_THROWS_AS(fit_from_json(bad, "x"), InputError);
  bad = j;
  bad.erase("converged");
  CHECK_THROWS_AS(fit_from_json(bad, "x"), InputError);
}

TEST_CASE("fit on record: kalman's local level on the full Nile gives the published variances") {
  const auto y = nile();
  REQUIRE(y.size() == 100);
  TimeAxis axis = TimeAxis::index(y.size());
  FillRequest req{.values = y, .axis = &axis};
  const FillResult r = make("kalman", {})->fill(req);  // nothing to fill: the fit is still on record
  CHECK(r.fit.model == "level");
  CHECK(parameter(r.fit, "variance_irregular") == doctest::Approx(15099).epsilon(1e-3));
  CHECK(parameter(r.fit, "variance_level") == doctest::Approx(1469.1).epsilon(1e-3));
  CHECK(std::isfinite(r.fit.log_likelihood));
  CHECK(std::isfinite(r.fit.aicc));
  CHECK(r.fit.converged);
  CHECK_FALSE(r.fit.at_bound);  // both variances well inside the search's ratio bounds
}

TEST_CASE("fit on record: a variance estimated at zero is flagged as on a bound") {
  // An invented straight line with small noise: the local linear trend needs
  // no level or slope disturbance, so those variances go to the bottom of
  // their search range (ratio 1e-10 to the irregular's).
  std::vector<double> y(120);
  for (std::size_t t = 0; t < y.size(); ++t) y[t] = 2.0 + 0.5 * static_cast<double>(t) + 0.1 * std::sin(1.7 * t * t);
  y[40] = y[41] = std::nan("");
  TimeAxis axis = TimeAxis::index(y.size());
  FillRequest req{.values = y, .axis = &axis};
  const FillResult r = make("kalman", {{"model", "trend"}})->fill(req);
  MESSAGE("variances: irregular " << parameter(r.fit, "variance_irregular") << ", level "
                                  << parameter(r.fit, "variance_level") << ", slope " << parameter(r.fit, "variance_slope"));
  CHECK(parameter(r.fit, "variance_slope") < 1e-8 * parameter(r.fit, "variance_irregular"));
  CHECK(r.fit.at_bound);
  CHECK(r.fit.converged);
}

TEST_CASE("fit on record: arima's fit is the fitted model's") {
  auto y = nile();
  y[20] = y[21] = std::nan("");
  TimeAxis axis = TimeAxis::index(y.size());
  FillRequest req{.values = y, .axis = &axis};
  const FillResult r = make("arima", {{"order", "1,0,1"}})->fill(req);
  arima::Order o;
  o.p = 1;
  o.q = 1;
  o.constant = true;
  const arima::Fit f = arima::fit(o, y);
  CHECK(r.fit.model == "ARIMA(1,0,1) with mean");
  CHECK(parameter(r.fit, "ar1") == doctest::Approx(f.coefficients.ar[0]).epsilon(1e-12));
  CHECK(parameter(r.fit, "ma1") == doctest::Approx(f.coefficients.ma[0]).epsilon(1e-12));
  CHECK(parameter(r.fit, "mean") == doctest::Approx(f.beta[0]).epsilon(1e-12));
  CHECK(parameter(r.fit, "sigma2") == doctest::Approx(f.sigma2).epsilon(1e-12));
  CHECK(r.fit.log_likelihood == doctest::Approx(f.log_likelihood).epsilon(1e-12));
  CHECK(r.fit.aicc == doctest::Approx(f.aicc).epsilon(1e-12));
  CHECK(r.fit.iterations == f.evaluations);
}
