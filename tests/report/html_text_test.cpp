// Text set into report.html: escaping, and names marked with backticks in the
// verdict's sentences set as code.
#include <doctest/doctest.h>

#include "report/svg.hpp"

using gapmark::svg::escape;
using gapmark::svg::escape_with_code;

TEST_CASE("escape_with_code: paired backticks become code, everything else is escaped, an unpaired one stays") {
  CHECK(escape_with_code("plain <b> & 'q'") == escape("plain <b> & 'q'"));
  CHECK(escape_with_code("than the `mean` baseline's") == "than the <code>mean</code> baseline&#39;s");
  CHECK(escape_with_code("`a<b` and `c&d`") == "<code>a&lt;b</code> and <code>c&amp;d</code>");
  CHECK(escape_with_code("one ` alone") == "one ` alone");
  CHECK(escape_with_code("`x` then ` alone") == "<code>x</code> then ` alone");
  CHECK(escape_with_code("``") == "<code></code>");
  CHECK(escape_with_code("") == "");
}
