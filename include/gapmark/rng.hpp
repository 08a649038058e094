#pragma once
// Random numbers that give the same stream on every platform and compiler:
// SplitMix64 to spread seeds, xoshiro256** for the stream, and our own
// uniform, geometric and Bernoulli draws (the standard library's
// distributions differ between implementations).
#include <cstdint>
#include <string_view>

namespace gapmark {

/// One SplitMix64 step: advances `state` and returns a well-mixed value.
std::uint64_t splitmix64(std::uint64_t& state);

/// A stable 64-bit hash of text (the first 8 bytes of its SHA-256).
std::uint64_t stable_hash(std::string_view text);

class Rng {
public:
  explicit Rng(std::uint64_t seed);
  std::uint64_t next();
  /// Uniform on [0, 1) with 53 random bits.
  double uniform();
  /// Uniform integer in [0, n); n > 0.
  std::uint64_t below(std::uint64_t n);
  bool bernoulli(double p) { return uniform() < p; }
  /// Geometric on {1, 2, ...} with the given mean (>= 1).
  std::uint64_t geometric(double mean);
  /// Standard normal, by Marsaglia's polar method (uniform pairs in the
  /// unit disc; sqrt and log only). Draws come in pairs: the second of a
  /// pair is kept for the next call.
  double normal();

private:
  std::uint64_t s_[4];
  double spare_ = 0;
  bool has_spare_ = false;
};

/// The seed of one task: a hash of the spec seed and the task's key, so the
/// stream does not depend on run order, thread count or shard.
std::uint64_t task_seed(std::uint64_t spec_seed, std::string_view task_key);

}  // namespace gapmark
