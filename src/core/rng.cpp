#include "gapmark/rng.hpp"

#include <cmath>
#include <cstring>

#include "gapmark/hash.hpp"

namespace gapmark {

std::uint64_t splitmix64(std::uint64_t& state) {
  std::uint64_t z = (state += 0x9E3779B97F4A7C15ULL);
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

std::uint64_t stable_hash(std::string_view text) {
  const std::string hex = sha256_hex(text);
  return std::stoull(hex.substr(0, 16), nullptr, 16);
}

Rng::Rng(std::uint64_t seed) {
  std::uint64_t state = seed;
  for (auto& s : s_) s = splitmix64(state);
}

namespace {
inline std::uint64_t rotl(std::uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
}  // namespace

std::uint64_t Rng::next() {  // xoshiro256**
  const std::uint64_t result = rotl(s_[1] * 5, 7) * 9;
  const std::uint64_t t = s_[1] << 17;
  s_[2] ^= s_[0];
  s_[3] ^= s_[1];
  s_[1] ^= s_[2];
  s_[0] ^= s_[3];
  s_[2] ^= t;
  s_[3] = rotl(s_[3], 45);
  return result;
}

double Rng::uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }

std::uint64_t Rng::below(std::uint64_t n) {
  // Lemire's method with rejection: unbiased.
  __uint128_t m = static_cast<__uint128_t>(next()) * n;
  auto low = static_cast<std::uint64_t>(m);
  if (low < n) {
    const std::uint64_t threshold = (0 - n) % n;
    while (low < threshold) {
      m = static_cast<__uint128_t>(next()) * n;
      low = static_cast<std::uint64_t>(m);
    }
  }
  return static_cast<std::uint64_t>(m >> 64);
}

double Rng::normal() {
  if (has_spare_) {
    has_spare_ = false;
    return spare_;
  }
  double u = 0, v = 0, s = 0;
  do {
    u = 2 * uniform() - 1;
    v = 2 * uniform() - 1;
    s = u * u + v * v;
  } while (s >= 1 || s == 0);
  const double factor = std::sqrt(-2 * std::log(s) / s);
  spare_ = v * factor;
  has_spare_ = true;
  return u * factor;
}

std::uint64_t Rng::geometric(double mean) {
  if (!(mean > 1.0)) return 1;
  // P(L = k) = (1-p)^(k-1) p with p = 1/mean; inverse CDF.
  const double p = 1.0 / mean;
  double u = uniform();
  if (u <= 0.0) u = 0x1.0p-53;
  return 1 + static_cast<std::uint64_t>(std::floor(std::log(u) / std::log1p(-p)));
}

std::uint64_t task_seed(std::uint64_t spec_seed, std::string_view task_key) {
  std::uint64_t state = spec_seed ^ stable_hash(task_key);
  return splitmix64(state);
}

}  // namespace gapmark
