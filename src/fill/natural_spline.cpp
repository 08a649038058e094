// Natural cubic spline through the observed points (knots at their indices on
// the time axis, so gaps make the knots uneven): a C2 piecewise cubic with
// zero second derivative at the first and last knot. The second derivatives
// at the inner knots solve a symmetric positive definite tridiagonal system,
// factored by Eigen's sparse LDLT in natural order (no fill-in: O(n)).
// Gaps inside the observed span are read off the spline; gaps before the
// first or after the last observation follow the edges policy.
#include <Eigen/SparseCholesky>
#include <Eigen/SparseCore>
#include <cmath>
#include <vector>

#include "gapmark/fill/knots.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {
namespace {

const Needs kNeeds{.min_observed = 2};

/// Second derivatives of the natural cubic spline through (x, y); zero at both ends.
std::vector<double> natural_second_derivatives(const Knots& k) {
  const std::size_t m = k.size();
  std::vector<double> M(m, 0.0);
  if (m < 3) return M;
  const std::size_t inner = m - 2;
  std::vector<Eigen::Triplet<double>> entries;
  entries.reserve(3 * inner);
  Eigen::VectorXd rhs(static_cast<Eigen::Index>(inner));
  for (std::size_t i = 1; i + 1 < m; ++i) {
    const double h0 = k.x[i] - k.x[i - 1], h1 = k.x[i + 1] - k.x[i];
    const double d0 = (k.y[i] - k.y[i - 1]) / h0, d1 = (k.y[i + 1] - k.y[i]) / h1;
    const auto r = static_cast<int>(i - 1);
    entries.emplace_back(r, r, 2.0 * (h0 + h1));
    if (i + 2 < m) {
      entries.emplace_back(r + 1, r, h1);  // lower triangle is what LDLT reads
      entries.emplace_back(r, r + 1, h1);
    }
    rhs[r] = 6.0 * (d1 - d0);
  }
  Eigen::SparseMatrix<double> A(static_cast<Eigen::Index>(inner), static_cast<Eigen::Index>(inner));
  A.setFromTriplets(entries.begin(), entries.end());
  Eigen::SimplicialLDLT<Eigen::SparseMatrix<double>, Eigen::Lower, Eigen::NaturalOrdering<int>> solver(A);
  if (solver.info() != Eigen::Success) throw MethodFailure("natural spline: the knot system could not be factored");
  const Eigen::VectorXd sol = solver.solve(rhs);
  if (solver.info() != Eigen::Success || !sol.allFinite())
    throw MethodFailure("natural spline: the knot system has no finite solution (values too large?)");
  for (std::size_t i = 0; i < inner; ++i) M[i + 1] = sol[static_cast<Eigen::Index>(i)];
  return M;
}

class NaturalSpline final : public FillMethod {
public:
  explicit NaturalSpline(std::string edges) : edges_(std::move(edges)) {}

  FillResult fill(const FillRequest& request) const override {
    check_needs(kNeeds, request);
    const Knots k = observed_knots(request.values);
    const std::vector<double> M = natural_second_derivatives(k);
    // Knots are indices, so the gap points between knots j and j+1 are the
    // integers strictly between them: one pass over the intervals, O(n).
    FillResult result;
    result.values.assign(request.values.begin(), request.values.end());
    for (std::size_t j = 0; j + 1 < k.size(); ++j) {
      const double x0 = k.x[j], x1 = k.x[j + 1], h = x1 - x0;
      for (auto i = static_cast<std::size_t>(x0) + 1; i < static_cast<std::size_t>(x1); ++i) {
        const double t = static_cast<double>(i) - x0, u = x1 - static_cast<double>(i);
        result.values[i] = (M[j] * u * u * u + M[j + 1] * t * t * t) / (6.0 * h) +
                           (k.y[j] / h - M[j] * h / 6.0) * u + (k.y[j + 1] / h - M[j + 1] * h / 6.0) * t;
      }
    }
    apply_edges(result.values, edges_);
    return result;
  }

private:
  std::string edges_;
};

const Registration<FillMethod> registration{{
    .name = "natural-spline",
    .summary = "natural cubic spline through the observed points (smooth, may overshoot)",
    .params = {edges_param()},
    .needs = kNeeds,
    .make = [](const ParamValues& p) { return std::make_unique<NaturalSpline>(p.text("edges")); },
}};

}  // namespace
}  // namespace gapmark
