// Gaussian CRPS: closed form (Gneiting & Raftery 2007, eq. 21) at hand-worked
// points, and against scipy.integrate.quad of the defining integral
// int (F(x) - 1{x >= y})^2 dx (values stored by reference/downstream/crps_scipy.py).
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/stats/crps.hpp"
#include "reference_values.hpp"

using gapmark::stats::gaussian_central_half_width;
using gapmark::stats::gaussian_crps;

TEST_CASE("CRPS closed form at hand-worked points") {
  const double pi = std::acos(-1.0);
  // z = 0: sigma * (0 + 2 phi(0) - 1/sqrt(pi)) = sigma * (2/sqrt(2 pi) - 1/sqrt(pi))
  //      = sigma * (sqrt(2) - 1) / sqrt(pi)
  CHECK(gaussian_crps(0, 1, 0) == doctest::Approx((std::sqrt(2.0) - 1) / std::sqrt(pi)).epsilon(1e-14));
  CHECK(gaussian_crps(5, 3, 5) == doctest::Approx(3 * (std::sqrt(2.0) - 1) / std::sqrt(pi)).epsilon(1e-14));
  // z = 1, with Phi(1) = 0.8413447460685429 and phi(1) = exp(-1/2)/sqrt(2 pi)
  // (standard normal table, Abramowitz & Stegun 26.2):
  // 1 * (2 * 0.8413447460685429 - 1) + 2 * 0.24197072451914337 - 0.5641895835477563 = 0.6024413576...
  const double expected = (2 * 0.8413447460685429 - 1) + 2 * std::exp(-0.5) / std::sqrt(2 * pi) - 1 / std::sqrt(pi);
  CHECK(gaussian_crps(0, 1, 1) == doctest::Approx(expected).epsilon(1e-14));
  CHECK(gaussian_crps(0, 1, -1) == doctest::Approx(expected).epsilon(1e-14));  // symmetric in z
  // Scale: CRPS(mu, s*sigma, mu + s*z*sigma) = s * CRPS(0, sigma, z*sigma)
  CHECK(gaussian_crps(2, 4, 6) == doctest::Approx(4 * expected).epsilon(1e-14));
}

TEST_CASE("CRPS with zero spread is the absolute error; invalid input is NaN") {
  CHECK(gaussian_crps(1.5, 0, 4) == 2.5);
  CHECK(gaussian_crps(1.5, 0, -1) == 2.5);
  CHECK(std::isnan(gaussian_crps(0, -1, 0)));
  CHECK(std::isnan(gaussian_crps(0, std::nan(""), 0)));
  CHECK(std::isnan(gaussian_crps(std::nan(""), 1, 0)));
  CHECK(std::isnan(gaussian_crps(0, 1, INFINITY)));
}

TEST_CASE("CRPS closed form agrees with scipy.integrate.quad of the defining integral") {
  const auto ref = gapmark::test::read_reference("values/crps_scipy.json");
  for (const auto& p : ref.at("points")) {
    const double mu = p.at("mu"), sigma = p.at("sigma"), y = p.at("y"), value = p.at("crps");
    INFO("mu=" << mu << " sigma=" << sigma << " y=" << y);
    CHECK(gaussian_crps(mu, sigma, y) == doctest::Approx(value).epsilon(1e-9));
  }
}

TEST_CASE("central interval half-width matches scipy.stats.norm.ppf") {
  const auto ref = gapmark::test::read_reference("values/crps_scipy.json");
  for (const auto& p : ref.at("central_half_width")) {
    const double level = p.at("level"), z = p.at("z");
    INFO("level " << level);
    CHECK(gaussian_central_half_width(level) == doctest::Approx(z).epsilon(1e-13));
  }
  CHECK(std::isnan(gaussian_central_half_width(0)));
  CHECK(std::isnan(gaussian_central_half_width(1)));
}
