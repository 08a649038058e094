#pragma once
// Numbers in and out: shortest text that reads back to the same double,
// short forms for people, and strict parsing of a whole cell.
#include <optional>
#include <string>
#include <string_view>

namespace gapmark {

/// Shortest decimal form that reads back exactly ("0.1", "1e+300", "-2.5").
/// NaN is written as "" by callers that write CSV; this returns "nan" for it.
std::string format_double(double value);

/// Four significant digits for people ("0.1235", "1.235e+05"); "n/a" for NaN.
std::string short_number(double value);

/// Decimal places that show an interval [low, high] with two significant
/// digits of its width: the precision the replicates support. -1 when the
/// width is zero, not finite, or below 1e-9 of the values (numerical noise);
/// then four significant digits are shown instead.
int supported_decimals(double low, double high);
/// `value` with `decimals` places ("0.0637"), or short_number when decimals < 0;
/// never "-0".
std::string fixed_number(double value, int decimals);
/// "mean (95% bootstrap interval lo to hi)" style text: `value`, `low` and
/// `high` rounded to what the interval supports (supported_decimals).
struct RoundedInterval {
  std::string value, low, high;
};
RoundedInterval rounded_interval(double value, double low, double high);

/// A share as a percentage for people: whole percent from 10% up, two
/// significant digits below, as printf's %.2g ("0%", "0.35%", "3.5%", "10%"
/// for 9.96%, "6.7e-11%", "12%", "1039%"); "n/a" when not finite.
std::string rounded_percent(double share);
/// A relative difference the same way, with its sign: "+0.18%", "-3.3%".
std::string signed_percent(double share);

/// Parses the whole of `text` (surrounding blanks allowed) as a finite or
/// infinite double; nullopt when it is not a number.
std::optional<double> parse_double(std::string_view text);

/// True for the spellings of a missing cell: empty, "NA", "NaN" in any case.
bool is_missing_token(std::string_view text);

/// Trims ASCII blanks at both ends.
std::string_view trim(std::string_view text);

}  // namespace gapmark
