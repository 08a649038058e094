#pragma once
// Sums of numbers as written. Cells like "2.73" are added exactly as
// decimals (a 128-bit integer and a power of ten), so an hourly total of
// 2.73 + 3.15 is written "5.88", not "5.880000000000001". A cell that does
// not fit (an exponent, more than 18 digits) switches the sum to binary
// floating point for good.
#include <cstdint>
#include <string>
#include <string_view>

namespace gapmark::data {

__extension__ typedef __int128 Int128;  ///< a GCC/Clang extension; __extension__ keeps -Wpedantic quiet

class DecimalSum {
public:
  /// Adds a cell already known to hold the number `value`.
  void add(std::string_view cell, double value);
  /// The sum as text: exact decimal digits, or the shortest round-trip form.
  std::string text() const;
  /// The sum as the double nearest to it.
  double value() const;

private:
  bool exact_ = true;
  Int128 units_ = 0;  ///< the sum times 10^scale_
  int scale_ = 0;
  double binary_ = 0;   ///< the same sum in floating point, always kept
};

}  // namespace gapmark::data
