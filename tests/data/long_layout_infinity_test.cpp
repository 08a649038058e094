// Regression: the long-layout reader took "inf", "-Infinity" and "1e999"
// (which reads as an infinity) as numbers, so a spec over long data ran on
// infinite values where the wide reader refuses them. Now both refuse them
// in one line naming the file, line and column.
#include <doctest/doctest.h>

#include <string>

#include "gapmark/long_layout.hpp"
#include "gapmark/error.hpp"

using namespace gapmark;

TEST_CASE("long layout: an infinite value is refused with the file, line and column") {
  LongReadOptions options;
  options.group_columns = {"site"};
  for (const std::string cell : {"inf", "-Infinity", "1e999", "-1e999"}) {
    CAPTURE(cell);
    const std::string text = "site,time,level\nA,1,1.5\nA,2," + cell + "\nA,3,2.5\nB,1,4\nB,2,5\nB,3,6\n";
    try {
      (void)read_long_series(parse_csv(text, "panel.csv"), options);
      FAIL("an infinite value was accepted");
    } catch (const InputError& e) {
      const std::string message = e.what();
      CHECK(message == "panel.csv:3: column 'level': not a finite number: '" + cell + "'");
    }
  }
  // The same table with a finite value reads (the refusal is about the value).
  const std::string fine = "site,time,level\nA,1,1.5\nA,2,2\nA,3,2.5\nB,1,4\nB,2,5\nB,3,6\n";
  CHECK(read_long_series(parse_csv(fine, "panel.csv"), options).size() == 2);
}
