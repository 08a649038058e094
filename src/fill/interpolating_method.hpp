#pragma once
// The shape shared by the methods that draw a curve through the observed
// points (pchip, akima-weighted, natural-spline): a curve inside the observed
// span, then the `edges` policy beyond it. Each method file keeps only its
// curve. The method's needs (its minimum number of observed points) are
// checked by whoever calls fill() (the trial, `gapmark fill`), not again here.
#include <functional>
#include <memory>
#include <span>
#include <string>
#include <vector>

#include "gapmark/fill/method.hpp"

namespace gapmark {

/// Fills the gaps strictly inside the observed span of `values`; observed
/// values come back unchanged and points outside the span stay NaN.
using InsideSpanFill = std::function<std::vector<double>(std::span<const double> values)>;

/// A fill method made of `inside` and the `edges` parameter's value.
std::unique_ptr<FillMethod> interpolating_method(InsideSpanFill inside, const ParamValues& params);

}  // namespace gapmark
