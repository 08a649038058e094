#include <doctest/doctest.h>

#include <cmath>
#include <limits>

#include "gapmark/number_format.hpp"

using namespace gapmark;

TEST_CASE("numbers are written in the shortest form that reads back exactly") {
  for (double x : {0.1, 1.0 / 3.0, 2.5, -7.125, 1e300, 1e-300, 123456789.123456789,
                   std::numeric_limits<double>::denorm_min(), std::numeric_limits<double>::max()}) {
    const std::string text = format_double(x);
    auto back = parse_double(text);
    REQUIRE(back.has_value());
    CHECK(*back == x);
  }
  CHECK(format_double(0.1) == "0.1");
  CHECK(format_double(2.0) == "2");
}

TEST_CASE("cells: missing tokens and strict numbers") {
  for (const char* s : {"", "  ", "NA", "na", "NaN", "nan", "NAN"}) CHECK(is_missing_token(s));
  CHECK_FALSE(is_missing_token("0"));
  CHECK(parse_double(" 1.5 ") == 1.5);
  CHECK(parse_double("+2") == 2.0);
  CHECK_FALSE(parse_double("1.5x").has_value());
  CHECK_FALSE(parse_double("abc").has_value());
  CHECK(std::isinf(*parse_double("1e999")));
}

TEST_CASE("percentages for people: two significant digits below 10%, whole percent above") {
  // Expected texts from Python's printf-style formatting of 100 * share:
  // '%.2g%%' below 10%, '%.0f%%' from 10% up (the C library's rounding).
  CHECK(rounded_percent(0.0018432) == "0.18%");
  CHECK(rounded_percent(0.03342) == "3.3%");
  CHECK(rounded_percent(0.0996) == "10%");
  CHECK(rounded_percent(0.8748) == "87%");
  CHECK(rounded_percent(10.39) == "1039%");
  CHECK(rounded_percent(6.749e-13) == "6.7e-11%");
  CHECK(rounded_percent(-0.033) == "-3.3%");
  CHECK(rounded_percent(0.0) == "0%");
  CHECK(rounded_percent(-0.0) == "0%");
  CHECK(rounded_percent(std::nan("")) == "n/a");
  CHECK(signed_percent(0.0018432) == "+0.18%");
  CHECK(signed_percent(-0.03342) == "-3.3%");
  CHECK(signed_percent(0.0) == "0%");
}

TEST_CASE("a value and its interval rounded to two significant digits of the interval's width") {
  // width 0.0029 -> 4 decimals; width 1.2 -> 1 decimal; zero width -> short_number's 4 significant digits
  const RoundedInterval a = rounded_interval(0.063831, 0.062372, 0.065321);
  CHECK(a.value == "0.0638");
  CHECK(a.low == "0.0624");
  CHECK(a.high == "0.0653");
  const RoundedInterval b = rounded_interval(7.84, 6.81, 8.98);
  CHECK(b.value == "7.8");
  CHECK(b.low == "6.8");
  CHECK(b.high == "9.0");
  const RoundedInterval c = rounded_interval(2.0, 2.0, 2.0);
  CHECK(c.value == "2");
  CHECK(c.low == "2");
}
