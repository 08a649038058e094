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
