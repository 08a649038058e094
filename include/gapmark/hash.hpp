#pragma once
#include <filesystem>
#include <string>
#include <string_view>

namespace gapmark {
/// SHA-256 of bytes, as 64 lowercase hex digits.
std::string sha256_hex(std::string_view bytes);
}  // namespace gapmark
