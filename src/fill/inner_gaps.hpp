#pragma once
// Finding the gaps of a series quickly: missing values (NaN) are gathered 64
// at a time into a bit mask, and the starts and ends of the gaps are read off
// the masks' bit transitions. The loop then branches once per gap end rather
// than once per point, which matters when gaps come at random (a test per
// point is mispredicted at every gap).
#include <algorithm>
#include <bit>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <span>
#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace gapmark {

/// Bit k set when x[k] is missing (NaN), for `count` <= 64 points.
inline std::uint64_t missing_bits(const double* x, std::size_t count) {
  std::uint64_t bits = 0;
#if defined(__SSE2__)
  if (count == 64) {
    // Four points per mask: NaN is unordered with itself, and the upper
    // halves of two pairs' comparison results carry one sign bit per point.
    for (std::size_t k = 0; k < 64; k += 4) {
      const __m128d a = _mm_loadu_pd(x + k), b = _mm_loadu_pd(x + k + 2);
      const __m128 nan_a = _mm_castpd_ps(_mm_cmpunord_pd(a, a)), nan_b = _mm_castpd_ps(_mm_cmpunord_pd(b, b));
      bits |= static_cast<std::uint64_t>(_mm_movemask_ps(_mm_shuffle_ps(nan_a, nan_b, _MM_SHUFFLE(3, 1, 3, 1)))) << k;
    }
    return bits;
  }
#endif
  for (std::size_t k = 0; k < count; ++k) bits |= static_cast<std::uint64_t>(std::isnan(x[k])) << k;
  return bits;
}

/// Calls gap(left, right) for every gap with an observation on both sides,
/// in order: x[left] and x[right] observed, every point strictly between
/// missing. Gaps before the first or after the last observation are skipped.
template <class Gap>
void for_each_inner_gap(std::span<const double> x, Gap&& gap) {
  const std::size_t n = x.size();
  std::uint64_t previous_missing = 0;  // 1 when the point before this block is missing
  std::size_t left = 0;                // the observation before the open gap...
  bool has_left = false;               // ...if there is one
  for (std::size_t base = 0; base < n; base += 64) {
    const std::size_t count = std::min<std::size_t>(64, n - base);
    const std::uint64_t in_block = count == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << count) - 1;
    const std::uint64_t missing = missing_bits(x.data() + base, count);
    const std::uint64_t before = (missing << 1) | previous_missing;  // bit k: point k - 1 is missing
    const std::uint64_t starts = missing & ~before;                  // first point of a gap
    const std::uint64_t ends = ~missing & before & in_block;         // first observation after a gap
    previous_missing = missing >> 63;
    for (std::uint64_t events = starts | ends; events != 0; events &= events - 1) {
      const int k = std::countr_zero(events);
      const std::size_t i = base + static_cast<std::size_t>(k);
      if ((ends >> k) & 1) {
        if (has_left) gap(left, i);
      } else {
        has_left = i > 0;
        left = i - 1;
      }
    }
  }
}

}  // namespace gapmark
