#include "gapmark/number_format.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace gapmark {

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
