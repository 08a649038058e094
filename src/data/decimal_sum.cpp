// Exact decimal sums of cells as written (see decimal_sum.hpp).
#include "decimal_sum.hpp"

#include <optional>

#include "gapmark/number_format.hpp"

namespace gapmark::data {
namespace {

constexpr int kMaxScale = 12;
constexpr int kMaxDigits = 18;

struct Decimal {
  Int128 units;
  int scale;
};

/// "-12.340" -> (-12340, 3); nullopt for exponents, too many digits, or anything else.
std::optional<Decimal> parse_decimal(std::string_view text) {
  text = trim(text);
  std::size_t i = 0;
  bool negative = false;
  if (i < text.size() && (text[i] == '+' || text[i] == '-')) negative = text[i++] == '-';
  Int128 units = 0;
  int digits = 0, scale = 0;
  bool point = false, any = false;
  for (; i < text.size(); ++i) {
    const char c = text[i];
    if (c == '.' && !point) {
      point = true;
      continue;
    }
    if (c < '0' || c > '9') return std::nullopt;
    any = true;
    if (units > 0 || c != '0') ++digits;
    if (digits > kMaxDigits) return std::nullopt;
    units = units * 10 + (c - '0');
    if (point && ++scale > kMaxScale) return std::nullopt;
  }
  if (!any) return std::nullopt;
  return Decimal{negative ? -units : units, scale};
}

Int128 power10(int n) {
  Int128 p = 1;
  while (n-- > 0) p *= 10;
  return p;
}

}  // namespace

void DecimalSum::add(std::string_view cell, double value) {
  binary_ += value;
  if (!exact_) return;
  const auto d = parse_decimal(cell);
  if (!d) {
    exact_ = false;
    return;
  }
  if (d->scale > scale_) {
    units_ *= power10(d->scale - scale_);
    scale_ = d->scale;
  }
  units_ += d->units * power10(scale_ - d->scale);
  // 10^30 leaves ample room below the 128-bit limit for any further cell.
  if (units_ > power10(30) || units_ < -power10(30)) exact_ = false;
}

std::string DecimalSum::text() const {
  if (!exact_) return format_double(binary_);
  const bool negative = units_ < 0;
  Int128 u = negative ? -units_ : units_;
  std::string digits;
  do {
    digits.insert(digits.begin(), char('0' + int(u % 10)));
    u /= 10;
  } while (u > 0);
  if (int(digits.size()) <= scale_) digits.insert(digits.begin(), std::size_t(scale_ + 1 - int(digits.size())), '0');
  std::string whole = digits.substr(0, digits.size() - std::size_t(scale_));
  std::string fraction = digits.substr(digits.size() - std::size_t(scale_));
  while (!fraction.empty() && fraction.back() == '0') fraction.pop_back();
  const std::string out = fraction.empty() ? whole : whole + "." + fraction;
  return (negative && out != "0") ? "-" + out : out;
}

double DecimalSum::value() const {
  if (!exact_) return binary_;
  return parse_double(text()).value_or(binary_);
}

}  // namespace gapmark::data
