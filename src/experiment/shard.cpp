#include "gapmark/experiment/shard.hpp"

#include <charconv>

#include "gapmark/error.hpp"

namespace gapmark {
namespace {

bool parse_count(std::string_view text, std::size_t& out) {
  if (text.empty() || text.size() > 9) return false;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), out);
  return ec == std::errc() && end == text.data() + text.size();
}

}  // namespace

Shard Shard::parse(const std::string& text, const std::string& where) {
  const auto slash = text.find('/');
  Shard s;
  if (slash == std::string::npos || !parse_count(std::string_view(text).substr(0, slash), s.index) ||
      !parse_count(std::string_view(text).substr(slash + 1), s.count))
    throw InputError(where, "expected K/N with whole numbers, e.g. 2/8; found '" + text + "'");
  if (s.count < 1 || s.index < 1 || s.index > s.count)
    throw InputError(where, "shard " + text + ": K must be between 1 and N");
  return s;
}

std::string Shard::text() const { return std::to_string(index) + "/" + std::to_string(count); }

std::vector<std::size_t> Shard::tasks(std::size_t total) const {
  std::vector<std::size_t> out;
  out.reserve(size(total));
  for (std::size_t i = index - 1; i < total; i += count) out.push_back(i);
  return out;
}

std::size_t Shard::size(std::size_t total) const {
  return total >= index ? (total - index) / count + 1 : 0;
}

}  // namespace gapmark
