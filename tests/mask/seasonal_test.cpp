// The seasonal scheme: phases respected, shares on and off the phases,
// calendar units, whole windows, errors. Counts of independent hides are
// binomial: mean Np, variance Np(1 - p) (the binomial variance formula,
// common statistics); tolerances are 4 standard deviations (common practice,
// no source). Calendar phases are computed here from the start date alone:
// 2026-03-01 is a Sunday (ISO weekday 7), checked with Python's
// datetime.date(2026, 3, 1).isoweekday().
#include <doctest/doctest.h>

#include <cmath>

#include "gapmark/error.hpp"
#include "gapmark/time_axis.hpp"
#include "mask_test_support.hpp"

using namespace gapmark;
using namespace gapmark::test;

namespace {

Bound<MaskScheme> scheme_call(std::vector<std::pair<std::string, std::string>> args) {
  CallSpec call{.name = "seasonal", .args = std::move(args)};
  return SchemeRegistry::global().bind(call, "test");
}

TimeAxis dated_axis(const char* start, const char* step, std::size_t n) {
  const auto t = parse_time(start);
  REQUIRE(t.has_value());
  return TimeAxis(t->kind, Step::parse(step), t->value, n);
}

}  // namespace

TEST_CASE("seasonal: with concentration 1 every hidden point is on the phases; rate met (binomial)") {
  const auto s = scheme("seasonal:phases=0-5,period=24");
  const auto values = observed_series(24 * 200);  // 1200 points on phases 0-5
  const MaskRequest request{.values = values, .rate = 0.2};  // 960 to hide: p = 0.8 on the phases
  const int draws = 100;
  double total = 0;
  for (int r = 0; r < draws; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    for (std::size_t i = 0; i < mask.size(); ++i)
      if (mask[i]) REQUIRE(i % 24 <= 5);
    total += static_cast<double>(hidden_count(mask));
  }
  CHECK(std::abs(total - draws * 960.0) <= 4 * binomial_sd(draws * 1200.0, 0.8));
}

TEST_CASE("seasonal: the period comes from the request when not given") {
  const auto values = observed_series(7 * 100);
  const MaskRequest request{.values = values, .period = 7, .rate = 0.1};
  const Mask mask = draw(scheme("seasonal:phases=5-6"), request, replicate_seed(0));
  for (std::size_t i = 0; i < mask.size(); ++i)
    if (mask[i]) CHECK(i % 7 >= 5);
  CHECK(mask == draw(scheme("seasonal:phases=5-6,period=7"), request, replicate_seed(0)));
}

TEST_CASE("seasonal: phase lists, '+' and ',' separators and wrapping ranges agree") {
  const auto values = observed_series(24 * 50);
  const MaskRequest request{.values = values, .rate = 0.1};
  const Mask wrapped = draw(scheme("seasonal:phases=22-3,period=24"), request, replicate_seed(5));
  CHECK(wrapped == draw(scheme("seasonal:phases=22+23+0-3,period=24"), request, replicate_seed(5)));
  CHECK(wrapped == draw(scheme_call({{"phases", "0-3,22, 23"}, {"period", "24"}}), request, replicate_seed(5)));
  for (std::size_t i = 0; i < wrapped.size(); ++i)
    if (wrapped[i]) CHECK((i % 24 >= 22 || i % 24 <= 3));
}

TEST_CASE("seasonal: concentration splits the hidden points between on and off phases (binomial)") {
  const auto s = scheme("seasonal:phases=0-5,period=24,concentration=0.7");
  const auto values = observed_series(24 * 200);  // 1200 on, 3600 off
  const MaskRequest request{.values = values, .rate = 0.1};  // 480: 336 on (p 0.28), 144 off (p 0.04)
  const int draws = 100;
  double on = 0, off = 0;
  for (int r = 0; r < draws; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    for (std::size_t i = 0; i < mask.size(); ++i)
      if (mask[i]) (i % 24 <= 5 ? on : off) += 1;
  }
  CHECK(std::abs(on - draws * 336.0) <= 4 * binomial_sd(draws * 1200.0, 0.28));
  CHECK(std::abs(off - draws * 144.0) <= 4 * binomial_sd(draws * 3600.0, 0.04));
}

TEST_CASE("seasonal: unit=hour reads the clock from the time axis") {
  // Starts at 03:00, so index mod 24 and the hour differ by 3.
  const std::size_t n = 24 * 60;
  const auto axis = dated_axis("2026-03-01T03:00", "PT1H", n);
  const auto values = observed_series(n);
  const MaskRequest request{.values = values, .axis = &axis, .rate = 0.15};
  const auto s = scheme("seasonal:phases=0-5,unit=hour");
  std::size_t hidden = 0;
  for (int r = 0; r < 10; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    for (std::size_t i = 0; i < n; ++i)
      if (mask[i]) CHECK((i + 3) % 24 <= 5);
    hidden += hidden_count(mask);
  }
  CHECK(hidden > 0);
}

TEST_CASE("seasonal: unit=weekday hides weekends (ISO 6-7) and unit=month wraps over the new year") {
  const std::size_t days = 7 * 80;
  const auto axis = dated_axis("2026-03-01", "P1D", days);  // a Sunday
  const auto values = observed_series(days);
  const Mask mask = draw(scheme("seasonal:phases=6-7,unit=weekday"),
                         MaskRequest{.values = values, .axis = &axis, .rate = 0.2}, replicate_seed(0));
  for (std::size_t i = 0; i < days; ++i) {
    const std::size_t weekday = (i + 6) % 7 + 1;  // day 0 is Sunday = 7
    if (mask[i]) CHECK(weekday >= 6);
  }
  CHECK(hidden_count(mask) > 0);

  const std::size_t months = 12 * 30;
  const auto monthly = dated_axis("2026-01-01", "P1M", months);
  const auto mvalues = observed_series(months);
  const Mask winter = draw(scheme("seasonal:phases=12-2,unit=month"),
                           MaskRequest{.values = mvalues, .axis = &monthly, .rate = 0.1}, replicate_seed(0));
  for (std::size_t i = 0; i < months; ++i) {
    const std::size_t month = i % 12 + 1;
    if (winter[i]) CHECK((month == 12 || month <= 2));
  }
}

TEST_CASE("seasonal: contiguous hides whole windows and meets the count exactly") {
  const auto s = scheme("seasonal:phases=22-3,period=24,contiguous=true");
  auto values = observed_series(24 * 100 + 10);
  values[24 * 7 + 23] = kNaN;  // an already-missing point inside a night
  const std::size_t holdout = 10;
  const MaskRequest request{.values = values, .holdout = holdout, .rate = 0.1};
  std::size_t eligible = 0;
  for (std::size_t i = 0; i + holdout < values.size(); ++i) eligible += std::isnan(values[i]) ? 0 : 1;
  const auto target = static_cast<std::size_t>(std::llround(0.1 * static_cast<double>(eligible)));
  for (int r = 0; r < 20; ++r) {
    const Mask mask = draw(s, request, replicate_seed(r));
    REQUIRE(respects_eligibility(mask, values, holdout));
    CHECK(hidden_count(mask) == target);
    // Windows: the night from 22:00 to 03:00 (index phase), the first one
    // only 0-3. Each is hidden whole (all its observed points) or not at all,
    // except at most one cut short.
    std::size_t partial = 0;
    for (std::size_t start = 0; start < values.size() - holdout; start += 24) {
      std::size_t seen = 0, hid = 0;
      for (std::size_t i = start == 0 ? 0 : start - 2; i <= start + 3 && i + holdout < values.size(); ++i) {
        if (std::isnan(values[i])) continue;
        ++seen;
        hid += mask[i];
      }
      if (hid != 0 && hid != seen) ++partial;
    }
    CHECK(partial <= 1);
    for (std::size_t i = 0; i < mask.size(); ++i)
      if (mask[i]) CHECK((i % 24 >= 22 || i % 24 <= 3));
  }
}

TEST_CASE("seasonal: never hides missing or holdout points") {
  const auto values = gappy_series(24 * 40);
  for (const char* text : {"seasonal:phases=0-5,period=24", "seasonal:phases=0-5,period=24,concentration=0.5",
                           "seasonal:phases=0-5,period=24,contiguous=true"}) {
    const auto s = scheme(text);
    for (int r = 0; r < 10; ++r)
      CHECK(respects_eligibility(draw(s, MaskRequest{.values = values, .holdout = 30, .rate = 0.15}, replicate_seed(r)),
                                 values, 30));
  }
}

TEST_CASE("seasonal: same seed gives the same mask, other replicates differ") {
  const auto s = scheme("seasonal:phases=0-5,period=24,concentration=0.8");
  const auto values = observed_series(24 * 30);
  const MaskRequest request{.values = values, .rate = 0.1};
  CHECK(draw(s, request, replicate_seed(1)) == draw(s, request, replicate_seed(1)));
  CHECK(draw(s, request, replicate_seed(1)) != draw(s, request, replicate_seed(2)));
}

TEST_CASE("seasonal: unreachable rates and bad parameters are input errors") {
  const auto values = observed_series(24 * 30);
  // Phases 0-5 hold 25% of the points; with concentration 1 a rate of 30% cannot fit.
  CHECK_THROWS_WITH_AS(draw(scheme("seasonal:phases=0-5,period=24"),
                            MaskRequest{.values = values, .rate = 0.3, .where = "x.json: /schemes/0"}, 1),
                       doctest::Contains("x.json: /schemes/0: rate 0.3 cannot be reached on phases 0-5"), InputError);
  // Phases 0-21 leave 2 of 24 off the phases; concentration 0 sends everything there.
  CHECK_THROWS_WITH_AS(draw(scheme("seasonal:phases=0-21,period=24,concentration=0"),
                            MaskRequest{.values = values, .rate = 0.2}, 1),
                       doctest::Contains("raise the concentration"), InputError);
  CHECK_THROWS_WITH_AS(draw(scheme("seasonal:phases=0-30,period=24"), MaskRequest{.values = values, .rate = 0.1}, 1),
                       doctest::Contains("phase 30"), InputError);
  CHECK_THROWS_WITH_AS(draw(scheme("seasonal:phases=0-5"), MaskRequest{.values = values, .rate = 0.1}, 1),
                       doctest::Contains("needs a period"), InputError);
  const auto index_axis = TimeAxis::index(values.size());
  CHECK_THROWS_WITH_AS(draw(scheme("seasonal:phases=0-5,unit=hour"),
                            MaskRequest{.values = values, .axis = &index_axis, .rate = 0.1}, 1),
                       doctest::Contains("needs dates"), InputError);
  CHECK_THROWS_AS(scheme("seasonal"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=night"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=0-5+"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=0-24,unit=hour"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=0,unit=weekday"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=1-5,unit=weekday,period=7"), InputError);
  CHECK_THROWS_AS(scheme("seasonal:phases=1,concentration=1.5"), InputError);
}
