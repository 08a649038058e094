#pragma once
// Small building blocks for the inline SVG charts of report.html: text
// escaping, coordinates, axis ticks, linear scales and the method styles
// (colour, dash pattern and marker shape, so colour is never the only cue).
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace gapmark::svg {

/// Escapes & < > " ' for HTML text and attribute values.
std::string escape(std::string_view text);
/// Escapes `text` and sets each `name` in backticks (as the verdict's
/// sentences, written for Markdown and the terminal, mark names) as
/// <code>name</code>; an unpaired backtick stays as it is.
std::string escape_with_code(std::string_view text);
/// A coordinate with at most two decimals ("12.5", "-3").
std::string coord(double v);
/// About `target` round tick values (1, 2, 5 x 10^k steps) covering [lo, hi].
std::vector<double> nice_ticks(double lo, double hi, int target = 5);
/// A tick label with up to 4 significant digits.
std::string tick_label(double v);

/// Maps [d0, d1] onto [r0, r1].
struct Scale {
  double d0 = 0, d1 = 1, r0 = 0, r1 = 1;
  double operator()(double v) const { return d1 == d0 ? (r0 + r1) / 2 : r0 + (v - d0) / (d1 - d0) * (r1 - r0); }
};

/// How one method is drawn. Styles 0..kStyles-1 are distinct in colour,
/// lightness, dash pattern and marker; any other index is a neutral grey.
struct Style {
  std::string colour;
  std::string dash;    ///< stroke-dasharray, "" = solid
  std::string marker;  ///< "circle", "square", "triangle", "diamond", "plus", "ring"
};
inline constexpr std::size_t kStyles = 6;
Style style(std::size_t index);

/// A marker of `style` centred at (x, y).
std::string marker(const Style& s, double x, double y, double size = 4);
/// A short legend sample (line and marker) as a standalone inline SVG.
std::string legend_swatch(const Style& s);
/// A polyline through points; NaN y values break it into pieces.
std::string polyline(const std::vector<double>& xs, const std::vector<double>& ys, const Style& s,
                     double width = 2);

/// Neutral colours of the page.
inline constexpr const char* kInk = "#2d3338";       ///< text, truth line
inline constexpr const char* kGrid = "#e3e6e8";      ///< grid lines
inline constexpr const char* kAxis = "#8a9399";      ///< axis lines and ticks
inline constexpr const char* kShade = "#efe6d3";     ///< masked stretches

}  // namespace gapmark::svg
