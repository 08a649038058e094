#pragma once
// A completeness picture of a profile as SVG: time across, one row per
// series (grouped by group) down, and three marks that differ in lightness
// and texture as well as hue, so they read without colour: a dark solid bar
// where a value is present, a light solid bar where the row is there but the
// value is empty, and a hatched bar where the row itself is absent. Beyond a
// group's own span nothing is expected and only a thin line is drawn. When
// there are more grid points than pixels, each pixel column shows the shares
// of the three states stacked.
#include <string>

#include "gapmark/data/profile.hpp"

namespace gapmark::data {

struct CompletenessStyle {
  int width = 960;       ///< total width in pixels
  int row_height = 14;
};

std::string completeness_svg(const DataProfile& profile, const CompletenessStyle& style = {});

}  // namespace gapmark::data
