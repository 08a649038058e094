#include "gapmark/stats/studentized_range.hpp"

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/roots.hpp>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>

namespace gapmark::stats {

namespace {

constexpr unsigned kMaxDepth = 20;
constexpr double kInnerTolerance = 1e-13;
constexpr double kOuterTolerance = 1e-12;
constexpr double kNormalReach = 9.5;
constexpr double kChiTail = 1e-17;  // mass of the scale distribution left outside the window

void check_arguments(int k, double df, const char* who) {
  if (k < 2) throw std::invalid_argument(std::string(who) + ": k must be at least 2");
  if (std::isnan(df) || df <= 0)
    throw std::invalid_argument(std::string(who) + ": df must be positive");
}

// P(range of k standard normals <= q) = k * int phi(z) [Phi(z) - Phi(z - q)]^(k-1) dz.
double range_cdf_infinite(double q, int k) {
  if (!(q > 0)) return 0.0;
  if (std::isinf(q)) return 1.0;
  const boost::math::normal standard;
  auto integrand = [&](double z) {
    const double inner = boost::math::cdf(standard, z) - boost::math::cdf(standard, z - q);
    if (inner <= 0) return 0.0;
    return boost::math::pdf(standard, z) * std::pow(inner, k - 1);
  };
  // phi(z) < 1e-19 outside [-kNormalReach, kNormalReach] and the bracket is
  // at most 1, so the window loses less than 1e-18 of the integral.
  const double value = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
      integrand, -kNormalReach, kNormalReach, kMaxDepth, kInnerTolerance);
  return std::clamp(k * value, 0.0, 1.0);
}

// With finite df: the scaled range Q = R / s, s = sqrt(chi2_df / df), so
// P(Q <= q) = int_0^inf f_s(s) P(R <= q s) ds, f_s(s) = 2 df s * chi2_pdf(df s^2).
double range_cdf_finite(double q, int k, double df) {
  if (!(q > 0)) return 0.0;
  if (std::isinf(q)) return 1.0;
  const boost::math::chi_squared chi2(df);
  auto integrand = [&](double s) {
    if (s <= 0) return 0.0;
    const double density = 2.0 * df * s * boost::math::pdf(chi2, df * s * s);
    if (density == 0) return 0.0;
    return density * range_cdf_infinite(q * s, k);
  };
  // Integrate s over the window holding all but 2 * kChiTail of its mass,
  // split at s = 1, where the density concentrates for large df.
  const double s_low = std::sqrt(boost::math::quantile(chi2, kChiTail) / df);
  const double s_high =
      std::sqrt(boost::math::quantile(boost::math::complement(chi2, kChiTail)) / df);
  const double below = boost::math::quadrature::gauss_kronrod<double, 31>::integrate(
      integrand, s_low, 1.0, kMaxDepth, kOuterTolerance);
  const double above = boost::math::quadrature::gauss_kronrod<double, 31>::integrate(
      integrand, 1.0, s_high, kMaxDepth, kOuterTolerance);
  return std::clamp(below + above, 0.0, 1.0);
}

}  // namespace

double studentized_range_cdf(double q, int k, double df) {
  check_arguments(k, df, "studentized_range_cdf");
  if (std::isnan(q)) return q;
  return std::isinf(df) ? range_cdf_infinite(q, k) : range_cdf_finite(q, k, df);
}

double studentized_range_quantile(double probability, int k, double df) {
  check_arguments(k, df, "studentized_range_quantile");
  if (!(probability > 0 && probability < 1))
    throw std::invalid_argument("studentized_range_quantile: probability must lie in (0, 1)");
  auto f = [&](double q) { return studentized_range_cdf(q, k, df) - probability; };
  // Bracket the root by doubling from q = 4, then solve with TOMS 748.
  double low = 0, high = 4;
  while (f(high) < 0) {
    low = high;
    high *= 2;
    if (high > 1e7)
      throw std::invalid_argument("studentized_range_quantile: quantile beyond 1e7");
  }
  std::uintmax_t iterations = 200;
  const auto [a, b] = boost::math::tools::toms748_solve(
      f, low, high, boost::math::tools::eps_tolerance<double>(48), iterations);
  return 0.5 * (a + b);
}

double studentized_range_critical(double alpha, int k, double df) {
  return studentized_range_quantile(1.0 - alpha, k, df);
}

}  // namespace gapmark::stats
