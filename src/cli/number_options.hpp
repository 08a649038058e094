#pragma once
// Whole-number options checked as written: "-1" for a seed, "-5" for a
// replicate or "18446744073709551616" for a period is refused with one line,
// instead of wrapping round or saturating during conversion.
#include <CLI/CLI.hpp>
#include <charconv>
#include <cstdint>
#include <string>

namespace gapmark::cli {

/// A check for an option that takes a whole number in [lo, hi] (lo >= 0):
/// digits only, no sign, no overflow.
inline CLI::Validator whole_number(std::int64_t lo, std::int64_t hi) {
  return CLI::Validator(
      [lo, hi](std::string& text) -> std::string {
        const std::string range = "[" + std::to_string(lo) + ", " + std::to_string(hi) + "]";
        std::int64_t value = 0;
        const char* end = text.data() + text.size();
        const auto [ptr, ec] = std::from_chars(text.data(), end, value);
        if (text.empty() || text.find_first_not_of("0123456789") != std::string::npos || ptr != end ||
            ec != std::errc() || value < lo || value > hi)
          return "expected a whole number in " + range + ", found '" + text.substr(0, 40) + "'";
        return {};
      },
      "INT in [" + std::to_string(lo) + ", " + std::to_string(hi) + "]");
}

}  // namespace gapmark::cli
