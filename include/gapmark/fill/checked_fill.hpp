#pragma once
// One method run on one series with gaps, the way every caller needs it (a
// trial of a run, the report's example windows, `gapmark fill`): the method's
// needs checked, the method run and timed, the length of its answer checked,
// observed values restored (and the change noted), non-finite fills set to
// NaN, and the target points left unfilled counted.
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/fill/method.hpp"

namespace gapmark {

struct CheckedFill {
  std::vector<double> values;     ///< observed values as given, fills elsewhere, NaN where unfilled; empty when failed
  std::vector<double> variance;   ///< as the method gave it: empty, or one per point
  ModelFit fit;                   ///< the fitted model, when the method reports one
  std::vector<std::vector<double>> draws;  ///< the method's conditional sample paths, as it gave them (draws=M)
  std::size_t targets = 0;        ///< points that should have been filled
  std::size_t unfilled = 0;       ///< of those, left NaN (all of them when the method failed)
  bool observed_changed = false;  ///< the method changed observed values (they were restored)
  std::size_t clipped = 0;        ///< filled points moved into the method's bounds=LO,HI
  std::string failure;            ///< why the method failed; empty when it ran
  UnmetNeed need = UnmetNeed::None;  ///< the unmet need, when that was the failure
  double seconds = 0;             ///< time spent checking needs and filling
  bool failed() const { return !failure.empty(); }
};

/// Runs `method` on `request`. `targets[i]` != 0 marks the points that should
/// be filled (a mask); empty `targets`: every missing point of the request.
/// Any exception from the method (MethodFailure or another) becomes `failure`,
/// except Interrupted (the user stopped the work), which is rethrown.
CheckedFill checked_fill(const Bound<FillMethod>& method, const FillRequest& request,
                         std::span<const std::uint8_t> targets = {});

}  // namespace gapmark
