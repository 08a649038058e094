#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include "gapmark/error.hpp"
#include "gapmark/params.hpp"

using namespace gapmark;

namespace {
std::vector<ParamSpec> schema() {
  return {{.name = "reach", .type = ParamType::Integer, .default_value = "3", .min = 1, .max = 10},
          {.name = "decay", .type = ParamType::Real, .default_value = "0.5", .min = 0.01, .max = 1},
          {.name = "weights", .type = ParamType::Choice, .default_value = "equal", .choices = {"equal", "triangular"}},
          {.name = "robust", .type = ParamType::Flag, .default_value = "false"}};
}
}  // namespace

TEST_CASE("a call is parsed as name:key=value,key=value") {
  auto call = CallSpec::parse(" window-mean:reach=5, weights=triangular ", "--method");
  CHECK(call.name == "window-mean");
  REQUIRE(call.args.size() == 2);
  CHECK(call.args[0] == std::pair<std::string, std::string>{"reach", "5"});
  CHECK(call.args[1] == std::pair<std::string, std::string>{"weights", "triangular"});
  CHECK(CallSpec::parse("linear", "x").args.empty());
  CHECK_THROWS_WITH_AS(CallSpec::parse("linear:k", "--method"), doctest::Contains("--method: expected key=value"), InputError);
  CHECK_THROWS_WITH_AS(CallSpec::parse("linear:reach=1,reach=2", "--method"), doctest::Contains("given twice"), InputError);
  CHECK_THROWS_AS(CallSpec::parse("", "--method"), InputError);
}

TEST_CASE("the JSON object form gives the same call as the text form") {
  auto j = nlohmann::json::parse(R"({"name": "window-mean", "reach": 5, "weights": "triangular", "robust": true, "rates": [0.1]})");
  auto call = CallSpec::from_json(j, "spec.json: /methods/0", {"rates"});
  CHECK(call.name == "window-mean");
  auto bound = bind_params(schema(), call, "x");
  CHECK(bound.integer("reach") == 5);
  CHECK(bound.text("weights") == "triangular");
  CHECK(bound.flag("robust"));
  CHECK(bound.canonical(schema()) == "reach=5,weights=triangular,robust=true");
  CHECK_THROWS_WITH_AS(CallSpec::from_json(nlohmann::json::parse(R"({"reach": 5})"), "spec.json: /methods/0"),
                       doctest::Contains("spec.json: /methods/0/name"), InputError);
}

TEST_CASE("binding checks names, types and ranges and fills defaults") {
  auto bound = bind_params(schema(), CallSpec::parse("w:decay=0.25", "x"), "x");
  CHECK(bound.integer("reach") == 3);
  CHECK(bound.real("decay") == 0.25);
  CHECK_FALSE(bound.given("reach"));
  CHECK(bound.given("decay"));
  CHECK(bound.canonical(schema()) == "decay=0.25");
  // A given value equal to its default does not change the canonical label.
  CHECK(bind_params(schema(), CallSpec::parse("w:reach=3", "x"), "x").canonical(schema()).empty());
  CHECK_THROWS_WITH_AS(bind_params(schema(), CallSpec::parse("w:kk=3", "x"), "--method"),
                       doctest::Contains("unknown parameter 'kk' (known: reach, decay, weights, robust)"), InputError);
  CHECK_THROWS_WITH_AS(bind_params(schema(), CallSpec::parse("w:reach=2.5", "x"), "m"),
                       doctest::Contains("expected a whole number"), InputError);
  CHECK_THROWS_WITH_AS(bind_params(schema(), CallSpec::parse("w:reach=11", "x"), "m"),
                       doctest::Contains("outside [1, 10]"), InputError);
  CHECK_THROWS_WITH_AS(bind_params(schema(), CallSpec::parse("w:weights=cubic", "x"), "m"),
                       doctest::Contains("not one of equal|triangular"), InputError);
  CHECK_THROWS_WITH_AS(bind_params(schema(), CallSpec::parse("w:decay=abc", "x"), "m"),
                       doctest::Contains("expected a number"), InputError);
}
