// The replay masking scheme: exact counts, blocks that stay apart from real
// gaps, determinism, and the check that it reproduces the gap-length
// distribution of its source: over many draws, a chi-square goodness-of-fit
// test (Boost.Math chi_squared) of the masked gap lengths against the
// source's empirical length distribution does not reject at the 1% level.
#include <doctest/doctest.h>

#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <map>
#include <vector>

#include "mask_test_support.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/rng.hpp"

using namespace gapmark;

namespace {

constexpr std::size_t kHours = 24 * 400;

/// An hourly series with real gaps: lengths from a fixed distribution, 80%
/// of them starting between 00:00 and 05:00, never touching each other.
struct Source {
  TimeAxis axis;
  std::vector<double> values;
  std::map<std::size_t, std::size_t> lengths;  // interior gap lengths
  double night_share = 0;                      // share of gaps starting 00-05h
};

Source make_source() {
  Source s;
  s.axis = TimeAxis(TimeKind::DateTime, Step::parse("PT1H"), 1772323200 /* 2026-03-01T00:00 */, kHours);
  s.values.resize(kHours);
  for (std::size_t i = 0; i < kHours; ++i) s.values[i] = 10 + std::sin(double(i) * 0.26);
  Rng rng(99);
  const std::size_t lengths[] = {1, 1, 1, 2, 2, 3, 4, 6, 8, 12, 24};
  std::size_t night = 0, gaps = 0;
  for (std::size_t tries = 0; tries < 400; ++tries) {
    const std::size_t len = lengths[rng.below(std::size(lengths))];
    std::size_t start = 24 * (1 + rng.below(397));
    start += rng.uniform() < 0.8 ? rng.below(6) : 6 + rng.below(18);
    bool clear = start + len + 1 < kHours;
    for (std::size_t i = start - 1; clear && i <= start + len; ++i) clear = !std::isnan(s.values[i]);
    if (!clear) continue;
    for (std::size_t i = start; i < start + len; ++i) s.values[i] = std::nan("");
    ++s.lengths[len];
    ++gaps;
    night += s.axis.hour_of_day(start) < 6;
  }
  s.night_share = double(night) / double(gaps);
  return s;
}

Bound<MaskScheme> replay(const std::string& args = "") {
  return SchemeRegistry::global().bind(CallSpec::parse("replay" + args, "test"), "test");
}

/// Runs of hidden points: (start, length).
std::vector<std::pair<std::size_t, std::size_t>> runs(const Mask& mask) {
  std::vector<std::pair<std::size_t, std::size_t>> out;
  for (std::size_t i = 0; i < mask.size();) {
    if (!mask[i]) {
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j < mask.size() && mask[j]) ++j;
    out.emplace_back(i, j - i);
    i = j;
  }
  return out;
}

}  // namespace

TEST_CASE("replay hides exactly the target count in blocks that are gaps of their own") {
  const Source s = make_source();
  const auto scheme = replay();
  MaskRequest request{s.values, &s.axis, 24, 48, 0.1};
  const std::size_t target = target_count(request, eligible_positions(request).size());
  for (std::uint64_t seed = 1; seed <= 5; ++seed) {
    Rng rng(seed);
    const Mask mask = scheme.impl->draw(request, rng);
    std::size_t hidden = 0;
    for (std::size_t i = 0; i < mask.size(); ++i) {
      hidden += mask[i];
      if (mask[i]) CHECK_FALSE(std::isnan(s.values[i]));
    }
    CHECK(hidden == target);
    std::size_t foreign = 0;
    for (const auto& [start, len] : runs(mask)) {
      REQUIRE(start > 0);
      CHECK_FALSE(std::isnan(s.values[start - 1]));      // an observed point before
      CHECK_FALSE(std::isnan(s.values[start + len]));    // and after
      CHECK(start + len <= kHours - 48);                 // never in the holdout
      foreign += s.lengths.count(len) == 0;              // a length the source lacks
    }
    CHECK(foreign <= 1);                                 // only the last block is cut
  }
}

TEST_CASE("replay is deterministic by seed") {
  const Source s = make_source();
  const auto scheme = replay();
  MaskRequest request{s.values, &s.axis, 24, 0, 0.08};
  Rng a(7), b(7), c(8);
  const Mask ma = scheme.impl->draw(request, a);
  CHECK(ma == scheme.impl->draw(request, b));
  CHECK(ma != scheme.impl->draw(request, c));
}

TEST_CASE("replay reproduces the gap-length distribution of its source (chi-square, 1%)") {
  const Source s = make_source();
  const auto scheme = replay();
  MaskRequest request{s.values, &s.axis, 24, 0, 0.05};
  std::map<std::size_t, std::size_t> observed;
  std::size_t blocks = 0, night = 0, cut = 0;
  for (std::uint64_t draw = 0; draw < 40; ++draw) {
    Rng rng(task_seed(2026, "replay-gof-" + std::to_string(draw)));
    for (const auto& [start, len] : runs(scheme.impl->draw(request, rng))) {
      // The block cut short to hit the count exactly (the last of a mask)
      // may have a length the source lacks: such blocks are left out.
      if (!s.lengths.count(len)) {
        ++cut;
        continue;
      }
      ++observed[len];
      ++blocks;
      night += s.axis.hour_of_day(start) < 6;
    }
  }
  CHECK(cut <= 40);
  REQUIRE(blocks > 2000);
  std::size_t source_total = 0;
  for (const auto& [len, n] : s.lengths) source_total += n;
  // Bins: the source's lengths from the longest down, pooled until each
  // expected count is at least 5 (a pooled remainder joins the last bin).
  std::vector<double> expected_bins, observed_bins;
  double e = 0, o = 0;
  for (auto it = s.lengths.rbegin(); it != s.lengths.rend(); ++it) {
    e += double(blocks) * double(it->second) / double(source_total);
    o += double(observed.count(it->first) ? observed.at(it->first) : 0);
    if (e >= 5) {
      expected_bins.push_back(e);
      observed_bins.push_back(o);
      e = o = 0;
    }
  }
  if (e > 0) {
    expected_bins.back() += e;
    observed_bins.back() += o;
  }
  double chi2 = 0;
  for (std::size_t k = 0; k < expected_bins.size(); ++k)
    chi2 += (observed_bins[k] - expected_bins[k]) * (observed_bins[k] - expected_bins[k]) / expected_bins[k];
  const double df = double(expected_bins.size() - 1);
  const double p = boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), chi2));
  MESSAGE("replay gap lengths: " << blocks << " blocks in " << expected_bins.size() << " bins, chi2 = " << chi2
                                 << ", df = " << df << ", p = " << p);
  CHECK(expected_bins.size() >= 5);
  CHECK(p > 0.01);
  // Start phases follow the source: about 80% of its gaps start at night.
  const double share = double(night) / double(blocks);
  MESSAGE("night starts: source " << s.night_share << ", replay " << share);
  CHECK(std::abs(share - s.night_share) < 0.1);
}

TEST_CASE("replay needs real gaps, and a calendar phase needs dated times") {
  std::vector<double> full(200, 1.0);
  const TimeAxis axis = TimeAxis::index(200);
  MaskRequest request{full, &axis, 0, 0, 0.1, "spec.json: /schemes/0, series 'x'"};
  Rng rng(1);
  CHECK(test::error_of([&] { replay().impl->draw(request, rng); }) ==
        "spec.json: /schemes/0, series 'x': replay: the series has no gaps between observed values to learn from; use "
        "blocks or random");
  full[50] = std::nan("");
  CHECK(test::error_of([&] { replay(":phase=hour").impl->draw(request, rng); }).find("needs dated times") !=
        std::string::npos);
  // On an integer axis without a period there is no phase: the one-point gap is replayed anywhere.
  const Mask mask = replay().impl->draw(request, rng);
  std::size_t hidden = 0;
  for (auto m : mask) hidden += m;
  CHECK(hidden == 20);
  for (const auto& r : runs(mask)) CHECK(r.second == 1);
}

TEST_CASE("replay from a sibling: a complete series gets gaps shaped like its sibling's") {
  const Source s = make_source();
  const std::vector<double> complete(kHours, 5.0);  // no gaps of its own
  MaskRequest request{complete, &s.axis, 24, 48, 0.1, "spec.json: /schemes/0, series 'pen1'"};
  request.name = "pen1";
  request.sibling_names = {"pen2"};
  request.siblings = {std::span<const double>(s.values)};
  const auto scheme = replay(":from=pen2");
  std::map<std::size_t, std::size_t> seen;
  for (std::uint64_t seed = 1; seed <= 20; ++seed) {
    Rng rng(seed);
    const Mask mask = scheme.impl->draw(request, rng);
    std::size_t hidden = 0;
    for (auto m : mask) hidden += m;
    CHECK(hidden == target_count(request, eligible_positions(request).size()));
    std::size_t foreign = 0;  // lengths the sibling lacks: only the block placed last may be cut to fit
    for (const auto& [start, len] : runs(mask)) {
      foreign += s.lengths.count(len) == 0;
      ++seen[len];
    }
    CHECK(foreign <= 1);
  }
  CHECK(seen.size() >= 5);  // many of the sibling's lengths appear

  // Naming the series itself learns from its own gaps: none here.
  Rng rng(1);
  CHECK(test::error_of([&] { replay(":from=pen1").impl->draw(request, rng); }).find("no gaps between observed") !=
        std::string::npos);
  CHECK(test::error_of([&] { replay(":from=pen9").impl->draw(request, rng); }) ==
        "spec.json: /schemes/0, series 'pen1': replay: no series 'pen9' beside this one to learn gaps from (there are: "
        "pen2)");
  const std::vector<double> shorter(100, 1.0);
  request.siblings = {std::span<const double>(shorter)};
  CHECK(test::error_of([&] { scheme.impl->draw(request, rng); }).find("not on this series' time axis") !=
        std::string::npos);
}
