#include "gapmark/number_format.hpp"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace gapmark {

int supported_decimals(double low, double high) {
  const double width = high - low;
  const double scale = std::max(std::abs(low), std::abs(high));
  if (!std::isfinite(width) || !(width > 1e-9 * scale) || width <= 0) return -1;
  return std::clamp(1 - static_cast<int>(std::floor(std::log10(width))), 0, 15);
}

std::string fixed_number(double value, int decimals) {
  if (decimals < 0 || !std::isfinite(value)) return short_number(value);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  std::string text = buffer;
  if (text.size() > 24) return short_number(value);  // a huge value: the exponent form reads better
  if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
  return text;
}

RoundedInterval rounded_interval(double value, double low, double high) {
  const int decimals = supported_decimals(low, high);
  return {fixed_number(value, decimals), fixed_number(low, decimals), fixed_number(high, decimals)};
}

std::string rounded_percent(double share) {
  if (!std::isfinite(share)) return "n/a";
  const double p = 100 * share;
  char buffer[48];
  // whole percent from 10% up; below, two significant digits as C's %.2g
  // writes them ("0.18", "3.3", "6.7e-11": a difference at rounding level)
  std::snprintf(buffer, sizeof buffer, std::abs(p) >= 10 ? "%.0f%%" : "%.2g%%", p);
  std::string text = buffer;
  if (text.rfind("-0%", 0) == 0) text.erase(0, 1);
  return text;
}

std::string signed_percent(double share) {
  if (!std::isfinite(share)) return "n/a";
  return (share > 0 ? "+" : "") + rounded_percent(share);
}

std::string format_double(double value) {
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  if (value == 0.0) return std::signbit(value) ? "-0" : "0";
  std::array<char, 64> buffer{};
  auto [end, ec] = std::to_chars(buffer.data(), buffer.data() + buffer.size(), value);
  return std::string(buffer.data(), end);
}

std::string short_number(double value) {
  if (std::isnan(value)) return "n/a";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.4g", value);
  return buffer;
}

std::string_view trim(std::string_view text) {
  const auto blank = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; };
  while (!text.empty() && blank(text.front())) text.remove_prefix(1);
  while (!text.empty() && blank(text.back())) text.remove_suffix(1);
  return text;
}

bool is_missing_token(std::string_view text) {
  text = trim(text);
  if (text.empty()) return true;
  auto lower = [](char c) { return static_cast<char>(c >= 'A' && c <= 'Z' ? c + 32 : c); };
  std::string t;
  for (char c : text) t += lower(c);
  return t == "na" || t == "nan";
}

std::optional<double> parse_double(std::string_view text) {
  text = trim(text);
  if (text.empty()) return std::nullopt;
  if (text.front() == '+') text.remove_prefix(1);
  double value = 0;
  auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ptr != text.data() + text.size()) return std::nullopt;
  if (ec == std::errc::result_out_of_range) {
    // from_chars reports overflow and underflow alike; tell them apart.
    bool tiny = text.find_first_of("eE") != std::string_view::npos &&
                text.find("e-") != std::string_view::npos;
    if (tiny) return text.front() == '-' ? -0.0 : 0.0;
    return text.front() == '-' ? -HUGE_VAL : HUGE_VAL;
  }
  if (ec != std::errc()) return std::nullopt;
  return value;
}

}  // namespace gapmark
