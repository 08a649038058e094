#pragma once
// A shard: one machine's share of an experiment's task grid. Shard K of N
// (1-based K) runs the tasks whose index i (in canonical task order) has
// i mod N == K - 1, so every shard gets a mix of series and schemes and the
// shares differ in size by at most one task. A run without --shard is the
// single shard 1/1.
#include <cstddef>
#include <string>
#include <vector>

namespace gapmark {

struct Shard {
  std::size_t index = 1;  ///< K, 1-based
  std::size_t count = 1;  ///< N

  /// Parses "K/N" (1 <= K <= N); InputError naming `where` otherwise.
  static Shard parse(const std::string& text, const std::string& where);
  std::string text() const;  ///< "K/N"
  bool whole() const { return count == 1; }
  bool owns(std::size_t task) const { return task % count == index - 1; }
  /// The task indices this shard runs out of `total`, ascending.
  std::vector<std::size_t> tasks(std::size_t total) const;
  /// How many of `total` tasks this shard runs.
  std::size_t size(std::size_t total) const;

  friend bool operator==(const Shard&, const Shard&) = default;
};

}  // namespace gapmark
