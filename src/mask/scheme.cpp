#include "gapmark/mask/scheme.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {

std::vector<std::size_t> eligible_positions(const MaskRequest& request) {
  const std::size_t n = request.values.size();
  const std::size_t end = request.holdout >= n ? 0 : n - request.holdout;
  std::vector<std::size_t> out;
  out.reserve(end);
  for (std::size_t i = 0; i < end; ++i)
    if (!std::isnan(request.values[i])) out.push_back(i);
  return out;
}

std::size_t target_count(const MaskRequest& request, std::size_t eligible) {
  if (eligible == 0) return 0;
  auto k = static_cast<std::size_t>(std::llround(request.rate * static_cast<double>(eligible)));
  return std::clamp<std::size_t>(k, 1, eligible);
}

void check_rate(double rate, const std::string& where) {
  if (!(rate > 0.0 && rate < 1.0))
    throw InputError(where, "rate " + format_double(rate) + " is outside (0, 1)");
}

DrawBasis draw_basis(const MaskRequest& request) {
  check_rate(request.rate, request.where);
  DrawBasis basis;
  basis.eligible = eligible_positions(request);
  if (basis.eligible.empty()) throw InputError(request.where, "no observed points before the holdout to hide");
  const std::size_t n = request.values.size();
  basis.limit = request.holdout >= n ? 0 : n - request.holdout;
  basis.target = target_count(request, basis.eligible.size());
  return basis;
}

std::vector<double> apply_mask(std::span<const double> values, const Mask& mask) {
  std::vector<double> out(values.begin(), values.end());
  for (std::size_t i = 0; i < out.size() && i < mask.size(); ++i)
    if (mask[i]) out[i] = std::numeric_limits<double>::quiet_NaN();
  return out;
}

}  // namespace gapmark
