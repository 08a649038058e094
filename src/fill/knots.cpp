#include "knots.hpp"

#include <cmath>

#include "gapmark/fill/method.hpp"

namespace gapmark {

Knots observed_knots(std::span<const double> values) {
  Knots k;
  for (std::size_t i = 0; i < values.size(); ++i) {
    if (std::isnan(values[i])) continue;
    k.x.push_back(static_cast<double>(i));
    k.y.push_back(values[i]);
  }
  return k;
}

std::vector<double> fill_inside_span(std::span<const double> values,
                                     const std::function<double(double)>& curve) {
  std::vector<double> out(values.begin(), values.end());
  std::size_t first = 0;
  while (first < out.size() && std::isnan(out[first])) ++first;
  if (first == out.size()) return out;
  std::size_t last = out.size() - 1;
  while (std::isnan(out[last])) --last;
  for (std::size_t i = first + 1; i < last; ++i)
    if (std::isnan(out[i])) out[i] = curve(static_cast<double>(i));
  return out;
}

void apply_edges(std::vector<double>& values, const std::string& edges) {
  if (edges == "nearest") fill_edges_nearest(values);
}

std::vector<double> provisional_linear(std::span<const double> values) {
  std::vector<double> v(values.begin(), values.end());
  const std::size_t n = v.size();
  std::size_t left = n;  // last observed index seen; n = none yet
  for (std::size_t i = 0; i < n; ++i) {
    if (std::isnan(v[i])) continue;
    if (left != n)
      for (std::size_t j = left + 1; j < i; ++j) {
        const double t = static_cast<double>(j - left) / static_cast<double>(i - left);
        v[j] = (1.0 - t) * v[left] + t * v[i];
      }
    left = i;
  }
  fill_edges_nearest(v);
  return v;
}

}  // namespace gapmark
