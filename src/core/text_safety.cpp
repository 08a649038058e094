#include "gapmark/text_safety.hpp"

#include <cstdio>

namespace gapmark {
namespace {

/// Length of the well-formed UTF-8 sequence starting at text[i], or 0.
std::size_t sequence_length(std::string_view text, std::size_t i) {
  const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char c = byte(i);
  if (c < 0x80) return 1;
  std::size_t n = 0;
  unsigned char lo = 0x80, hi = 0xBF;  // allowed range of the second byte
  if (c >= 0xC2 && c <= 0xDF) n = 2;
  else if (c == 0xE0) { n = 3; lo = 0xA0; }
  else if (c >= 0xE1 && c <= 0xEC) n = 3;
  else if (c == 0xED) { n = 3; hi = 0x9F; }  // no surrogates
  else if (c >= 0xEE && c <= 0xEF) n = 3;
  else if (c == 0xF0) { n = 4; lo = 0x90; }
  else if (c >= 0xF1 && c <= 0xF3) n = 4;
  else if (c == 0xF4) { n = 4; hi = 0x8F; }  // at most U+10FFFF
  else return 0;
  if (i + n > text.size()) return 0;
  if (byte(i + 1) < lo || byte(i + 1) > hi) return 0;
  for (std::size_t k = 2; k < n; ++k)
    if (byte(i + k) < 0x80 || byte(i + k) > 0xBF) return 0;
  return n;
}

}  // namespace

std::optional<std::size_t> first_invalid_utf8(std::string_view text) {
  std::size_t i = 0;
  while (i < text.size()) {
    // Fast path over plain ASCII.
    if (static_cast<unsigned char>(text[i]) < 0x80) {
      ++i;
      continue;
    }
    const std::size_t n = sequence_length(text, i);
    if (n == 0) return i;
    i += n;
  }
  return std::nullopt;
}

std::string utf8_replaced(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  std::size_t i = 0;
  while (i < text.size()) {
    const std::size_t n = sequence_length(text, i);
    if (n == 0) {
      out += "\xEF\xBF\xBD";
      ++i;
    } else {
      out.append(text.substr(i, n));
      i += n;
    }
  }
  return out;
}

std::string printable(std::string_view text, std::size_t limit) {
  std::string out;
  std::size_t shown = 0, i = 0;
  char escape[8];
  while (i < text.size() && shown < limit) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    if (c < 0x20 || c == 0x7F) {
      switch (c) {
        case '\n': out += "\\n"; break;
        case '\t': out += "\\t"; break;
        case '\r': out += "\\r"; break;
        case '\0': out += "\\0"; break;
        default:
          std::snprintf(escape, sizeof escape, "\\x%02X", c);
          out += escape;
      }
      ++i;
    } else if (c < 0x80) {
      out += static_cast<char>(c);
      ++i;
    } else {
      const std::size_t n = sequence_length(text, i);
      if (n == 0) {
        std::snprintf(escape, sizeof escape, "\\x%02X", c);
        out += escape;
        ++i;
      } else {
        out.append(text.substr(i, n));
        i += n;
      }
    }
    ++shown;
  }
  if (i < text.size()) out += "... (" + std::to_string(text.size() - i) + " more bytes)";
  return out;
}

std::string quoted_for_message(std::string_view text, std::size_t limit) {
  return "'" + printable(text, limit) + "'";
}

}  // namespace gapmark
