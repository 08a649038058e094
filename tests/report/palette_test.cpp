// The method colours of report.html stay distinguishable for readers with a
// colour-vision deficiency. Source: reference/report/palette.json, made by
// reference/report/palette_check.py with colorspacious (CAM02-UCS colour
// difference, Machado 2009 simulation at severity 100; CAM02-UCS lightness
// for greyscale). The thresholds (10 between lines, 6 between lightness
// steps) are common practice for telling thin lines apart, with no published
// source.
#include <doctest/doctest.h>

#include <fstream>
#include <nlohmann/json.hpp>

#include "report/svg.hpp"

TEST_CASE("the stored palette check is of the palette in use, and every pair stays apart") {
  std::ifstream in(std::string(GAPMARK_SOURCE_DIR) + "/reference/report/palette.json");
  REQUIRE(in);
  const auto ref = nlohmann::json::parse(in);
  REQUIRE(ref["palette"].size() == gapmark::svg::kStyles);
  for (std::size_t i = 0; i < gapmark::svg::kStyles; ++i)
    CHECK(ref["palette"][i].get<std::string>() == gapmark::svg::style(i).colour);
  for (const char* vision : {"normal", "protanomaly", "deuteranomaly", "tritanomaly"}) {
    INFO(vision);
    CHECK(ref["vision"][vision]["min_pair_delta_e"].get<double>() >= 10.0);
    CHECK(ref["vision"][vision]["min_background_delta_e"].get<double>() >= 20.0);
  }
  // In greyscale only lightness is left: each colour a step of at least 6 (J') from the next.
  CHECK(ref["greyscale"]["min_lightness_step"].get<double>() >= 6.0);
  CHECK(ref["passed"].get<bool>());
  // Colour is never the only cue: dash patterns and markers differ too.
  for (std::size_t i = 0; i < gapmark::svg::kStyles; ++i)
    for (std::size_t j = i + 1; j < gapmark::svg::kStyles; ++j) {
      CHECK(gapmark::svg::style(i).dash != gapmark::svg::style(j).dash);
      CHECK(gapmark::svg::style(i).marker != gapmark::svg::style(j).marker);
    }
}
