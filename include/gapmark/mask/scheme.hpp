#pragma once
// A masking scheme hides known values the way real gaps look. It sees the
// series (NaN = already missing), chooses which observed points to hide, and
// never touches already-missing points or the last `holdout` points.
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include "gapmark/registry.hpp"
#include "gapmark/rng.hpp"
#include "gapmark/time_axis.hpp"

namespace gapmark {

struct MaskRequest {
  std::span<const double> values;  ///< the series; NaN = missing
  const TimeAxis* axis = nullptr;  ///< its axis (for calendar phases)
  std::size_t period = 0;          ///< seasonal period, 0 = none
  std::size_t holdout = 0;         ///< last points never masked
  double rate = 0.1;               ///< target fraction of eligible points to hide, in (0, 1)
  std::string where = {};          ///< names the task in errors ("demo.json: /schemes/1, series 'x'"); may be empty
  std::string name = {};           ///< the series' own name (its label); may be empty
  /// Other series on the same time axis (same length), by name: schemes that
  /// learn from a sibling's gaps (replay's `from`) read them; others ignore them.
  std::vector<std::string> sibling_names = {};
  std::vector<std::span<const double>> siblings = {};
};

/// 1 where a point is hidden, 0 elsewhere; the length of the series.
using Mask = std::vector<std::uint8_t>;

class MaskScheme {
public:
  static constexpr const char* family = "scheme";
  virtual ~MaskScheme() = default;
  /// Draws a mask. Throws InputError when the request cannot be met (rate too
  /// high for the scheme, series too short).
  virtual Mask draw(const MaskRequest& request, Rng& rng) const = 0;
  /// True when draw() reads the request's siblings; callers gather them only then.
  virtual bool uses_siblings() const { return false; }
};

using SchemeRegistry = Registry<MaskScheme>;

/// What every draw starts from, computed once by draw_basis.
struct DrawBasis {
  std::vector<std::size_t> eligible;  ///< observed and before the holdout; never empty
  std::size_t limit = 0;              ///< the first holdout index (the series' length without holdout)
  std::size_t target = 0;             ///< target_count for the eligible points
};
/// Checks the rate and finds the eligible points; InputError naming the
/// request's `where` when the rate is outside (0, 1) or no point is eligible.
DrawBasis draw_basis(const MaskRequest& request);

/// Positions that may be masked: observed and before the holdout.
std::vector<std::size_t> eligible_positions(const MaskRequest& request);
/// Number of points to hide for a request: round(rate * eligible), at least 1.
std::size_t target_count(const MaskRequest& request, std::size_t eligible);
/// Checks a rate is inside (0, 1); InputError naming `where` otherwise.
void check_rate(double rate, const std::string& where);

/// Applies a mask: a copy of `values` with hidden points set to NaN.
std::vector<double> apply_mask(std::span<const double> values, const Mask& mask);

}  // namespace gapmark
