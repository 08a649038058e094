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

/// Parses the whole of `text` (surrounding blanks allowed) as a finite or
/// infinite double; nullopt when it is not a number.
std::optional<double> parse_double(std::string_view text);

/// True for the spellings of a missing cell: empty, "NA", "NaN" in any case.
bool is_missing_token(std::string_view text);

/// Trims ASCII blanks at both ends.
std::string_view trim(std::string_view text);

}  // namespace gapmark
