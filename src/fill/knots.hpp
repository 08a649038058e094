#pragma once
// Observed points of a series as (x, y) knots for the interpolating fill
// methods: x is the point's index on the regular time axis, y its value.
// Also the shared way those methods write a curve back into the gaps.
#include <cstddef>
#include <functional>
#include <span>
#include <string>
#include <vector>

namespace gapmark {

struct Knots {
  std::vector<double> x;  ///< indices of the observed points, increasing
  std::vector<double> y;  ///< their values
  std::size_t size() const { return x.size(); }
};

/// The observed (non-NaN) points of `values` as knots.
Knots observed_knots(std::span<const double> values);

/// A copy of `values` where each missing point i strictly between the first
/// and the last observed point is set to curve(i). Observed points are copied
/// unchanged; points outside the observed span stay NaN.
std::vector<double> fill_inside_span(std::span<const double> values,
                                     const std::function<double(double)>& curve);

/// Applies the shared `edges` parameter: "nearest" fills the leading and
/// trailing gaps with the nearest observed value, "leave" leaves them NaN.
void apply_edges(std::vector<double>& values, const std::string& edges);

/// Straight lines between observed points and the nearest observed value
/// beyond them: the provisional filling that seasonal estimates start from.
std::vector<double> provisional_linear(std::span<const double> values);

}  // namespace gapmark
