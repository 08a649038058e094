#pragma once
// Text from files and programs, made safe to print and to store:
//  - UTF-8 is checked (a file that is not UTF-8 is refused where it is read,
//    naming the line and column of the first bad byte);
//  - text echoed in a message is cut to a readable length, with control
//    bytes and invalid bytes written as escapes, so a 10 MB cell, a NUL byte
//    or binary output cannot flood or garble the terminal;
//  - text a program printed is kept with invalid bytes replaced (U+FFFD).
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace gapmark {

/// The byte offset of the first byte that does not belong to well-formed
/// UTF-8 (overlong forms, surrogates and code points above U+10FFFF count as
/// ill-formed), or nothing when all of `text` is UTF-8.
std::optional<std::size_t> first_invalid_utf8(std::string_view text);

/// `text` with each ill-formed byte replaced by U+FFFD.
std::string utf8_replaced(std::string_view text);

/// `text` for a one-line message: at most `limit` characters, then "..."
/// (and how many bytes were left out); control bytes as \n, \t, \r, \0 or
/// \xNN; ill-formed UTF-8 bytes as \xNN.
std::string printable(std::string_view text, std::size_t limit = 80);

/// printable(text, limit) in single quotes.
std::string quoted_for_message(std::string_view text, std::size_t limit = 80);

}  // namespace gapmark
