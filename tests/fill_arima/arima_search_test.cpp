// The automatic order: KPSS statistics against statsmodels'
// (reference/arima/arima_reference.json), and the stepwise search on
// invented series simulated from known models.
#include <cmath>
#include <fstream>
#include <limits>
#include <random>
#include <string>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "gapmark/fill/arima_order_search.hpp"
#include "gapmark/rng.hpp"

namespace ar = gapmark::arima;

namespace {

const nlohmann::json& reference() {
  static const nlohmann::json doc = [] {
    std::ifstream in(std::string(GAPMARK_SOURCE_DIR) + "/reference/arima/arima_reference.json");
    return nlohmann::json::parse(in);
  }();
  return doc;
}

/// Invented: an ARMA(1,1) series with phi, theta, integrated d times, with
/// a fixed seed (normal draws by Box-Muller from the project's generator).
std::vector<double> simulate(double phi, double theta, int d, std::size_t n, std::uint64_t seed) {
  gapmark::Rng rng(seed);
  auto normal = [&] {
    const double u1 = rng.uniform(), u2 = rng.uniform();
    return std::sqrt(-2.0 * std::log(1.0 - u1)) * std::cos(2.0 * 3.141592653589793 * u2);
  };
  std::vector<double> x(n + 100);
  double prev_x = 0, prev_e = 0;
  for (auto& v : x) {
    const double e = normal();
    v = phi * prev_x + e + theta * prev_e;
    prev_x = v;
    prev_e = e;
  }
  x.erase(x.begin(), x.begin() + 100);
  for (int k = 0; k < d; ++k)
    for (std::size_t t = 1; t < n; ++t) x[t] += x[t - 1];
  for (auto& v : x) v += 50.0;
  return x;
}

}  // namespace

TEST_CASE("kpss: statistic matches statsmodels' kpss on open series") {
  for (const auto& c : reference()["kpss"]) {
    const std::string name = c["name"];
    INFO(name << " d=" << c["differences"].get<int>());
    std::vector<double> x = c["data"].get<std::vector<double>>();
    if (c["differences"].get<int>() == 1) {
      std::vector<double> dx(x.size(), std::numeric_limits<double>::quiet_NaN());
      for (std::size_t t = 1; t < x.size(); ++t) dx[t] = x[t] - x[t - 1];
      x = dx;
    }
    CHECK(ar::kpss_statistic(x) == doctest::Approx(c["statistic"].get<double>()).epsilon(1e-9));
  }
}

TEST_CASE("arima search: differencing and order on invented series of known models") {
  SUBCASE("stationary AR(1): no difference, the AR(1) with mean found, no neighbour better") {
    auto x = simulate(0.7, 0.0, 0, 300, 11);
    for (std::size_t t = 40; t < 52; ++t) x[t] = std::numeric_limits<double>::quiet_NaN();
    const ar::SearchResult r = ar::search_order(x, 0, {});
    CHECK(r.best.order.d == 0);
    CHECK(r.best.order.p == 1);
    CHECK(r.best.order.q == 0);
    CHECK(r.best.order.constant);
    // the stepwise end point is a local optimum: every neighbour has a higher AICc
    for (auto [dp, dq] : {std::pair{1, 0}, {0, 1}, {-1, 0}, {1, 1}}) {
      ar::Order o = r.best.order;
      o.p += dp;
      o.q += dq;
      CHECK(ar::fit(o, x).aicc > r.best.aicc);
    }
    ar::Order o = r.best.order;
    o.constant = false;
    CHECK(ar::fit(o, x).aicc > r.best.aicc);
    CHECK(r.models < 30);
  }
  SUBCASE("integrated ARMA(1,1): one difference") {
    const auto x = simulate(0.5, 0.4, 1, 400, 5);
    const ar::SearchResult r = ar::search_order(x, 0, {});
    CHECK(r.best.order.d == 1);
    CHECK(r.kpss.size() == 2);
    CHECK(r.kpss[0] > 0.463);
    CHECK(r.kpss[1] <= 0.463);
  }
  SUBCASE("bounds are respected") {
    const auto x = simulate(0.5, 0.4, 0, 300, 3);
    ar::SearchBounds b;
    b.max_p = 1;
    b.max_q = 0;
    b.max_d = 0;
    const ar::SearchResult r = ar::search_order(x, 0, b);
    CHECK(r.best.order.p <= 1);
    CHECK(r.best.order.q == 0);
    CHECK(r.best.order.d == 0);
  }
}

TEST_CASE("arima search: a strong season gets a seasonal difference") {
  // invented: period 12, fixed seasonal pattern plus AR(1) noise
  auto x = simulate(0.5, 0.0, 0, 240, 9);
  for (std::size_t t = 0; t < x.size(); ++t) x[t] += 5.0 * std::sin(2 * 3.141592653589793 * (t % 12) / 12.0);
  CHECK(ar::seasonal_strength(x, 12) > 0.64);
  const ar::SearchResult r = ar::search_order(x, 12, {});
  CHECK(r.best.order.seasonal_d == 1);
  const auto noise = simulate(0.5, 0.0, 0, 240, 9);
  CHECK(ar::seasonal_strength(noise, 12) < 0.64);
}
