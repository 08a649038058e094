// The masking schemes are listed in the registry with a summary and a
// documented, bindable parameter schema (what `gapmark schemes` shows).
#include <doctest/doctest.h>

#include "gapmark/mask/scheme.hpp"

using namespace gapmark;

TEST_CASE("schemes: each is listed with a summary and documented parameters") {
  for (const char* name : {"random", "blocks", "seasonal", "value-dependent"}) {
    CAPTURE(name);
    const auto* entry = SchemeRegistry::global().find(name);
    REQUIRE(entry != nullptr);
    CHECK_FALSE(entry->hidden);
    CHECK_FALSE(entry->summary.empty());
    for (const auto& p : entry->params) {
      CAPTURE(p.name);
      CHECK_FALSE(p.help.empty());
    }
  }
  // Every default except seasonal's required phases binds as it stands.
  for (const char* name : {"random", "blocks", "value-dependent"})
    CHECK(SchemeRegistry::global().bind(CallSpec::parse(name, "test"), "test").label == name);
}
