#include "svg.hpp"

#include <cmath>
#include <cstdio>

namespace gapmark::svg {

std::string escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string escape_with_code(std::string_view text) {
  std::string out;
  std::size_t from = 0;
  for (std::size_t open = text.find('`'); open != std::string_view::npos; open = text.find('`', from)) {
    const std::size_t close = text.find('`', open + 1);
    if (close == std::string_view::npos) break;
    out += escape(text.substr(from, open - from)) + "<code>" + escape(text.substr(open + 1, close - open - 1)) + "</code>";
    from = close + 1;
  }
  return out + escape(text.substr(from));
}

std::string coord(double v) {
  if (!std::isfinite(v)) return "0";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2f", v);
  std::string s = buffer;
  while (!s.empty() && s.back() == '0') s.pop_back();
  if (!s.empty() && s.back() == '.') s.pop_back();
  if (s == "-0") s = "0";
  return s;
}

std::vector<double> nice_ticks(double lo, double hi, int target) {
  std::vector<double> ticks;
  if (!std::isfinite(lo) || !std::isfinite(hi) || target < 1) return ticks;
  if (hi < lo) std::swap(lo, hi);
  if (hi == lo) return {lo};
  const double raw = (hi - lo) / target;
  const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
  double step = magnitude;
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0}) {
    step = m * magnitude;
    if (step >= raw) break;
  }
  const double first = std::ceil(lo / step - 1e-9) * step;
  for (double t = first; t <= hi + step * 1e-9; t += step) ticks.push_back(std::abs(t) < step * 1e-9 ? 0.0 : t);
  return ticks;
}

std::string tick_label(double v) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.4g", v);
  return buffer;
}

Style style(std::size_t index) {
  // The project's own six colours, found by a seeded search
  // (reference/report/palette_search.py) for the largest smallest CAM02-UCS
  // difference between any two of them under normal, protan, deutan and
  // tritan vision, with lightness steps of at least 7 (J') so that they stay
  // apart in greyscale, in moderate chroma, each well away from the white
  // background; checked by reference/report/palette_check.py. Ordered dark to
  // light, and each has its own dash pattern and marker, so colour is never
  // the only cue.
  static const Style styles[kStyles] = {
      {"#274571", "", "circle"},          // navy
      {"#952e17", "7 3", "square"},       // rust
      {"#8553d7", "2 3", "triangle"},     // violet
      {"#cd5f76", "9 3 2 3", "diamond"},  // rose
      {"#5fa7d8", "4 2", "plus"},         // sky
      {"#c8b514", "1 3", "ring"},         // mustard
  };
  if (index < kStyles) return styles[index];
  return {"#a3aab0", "", "ring"};
}

std::string marker(const Style& s, double x, double y, double size) {
  const std::string c = s.colour;
  if (s.marker == "square")
    return "<rect x=\"" + coord(x - size) + "\" y=\"" + coord(y - size) + "\" width=\"" + coord(2 * size) +
           "\" height=\"" + coord(2 * size) + "\" fill=\"" + c + "\"/>";
  if (s.marker == "triangle")
    return "<path d=\"M" + coord(x) + " " + coord(y - 1.2 * size) + "L" + coord(x + 1.1 * size) + " " +
           coord(y + 0.9 * size) + "L" + coord(x - 1.1 * size) + " " + coord(y + 0.9 * size) + "Z\" fill=\"" + c +
           "\"/>";
  if (s.marker == "diamond")
    return "<path d=\"M" + coord(x) + " " + coord(y - 1.3 * size) + "L" + coord(x + 1.3 * size) + " " + coord(y) +
           "L" + coord(x) + " " + coord(y + 1.3 * size) + "L" + coord(x - 1.3 * size) + " " + coord(y) +
           "Z\" fill=\"" + c + "\"/>";
  if (s.marker == "plus")
    return "<path d=\"M" + coord(x - 1.2 * size) + " " + coord(y) + "H" + coord(x + 1.2 * size) + "M" + coord(x) +
           " " + coord(y - 1.2 * size) + "V" + coord(y + 1.2 * size) + "\" stroke=\"" + c +
           "\" stroke-width=\"2.2\" fill=\"none\"/>";
  if (s.marker == "ring")
    return "<circle cx=\"" + coord(x) + "\" cy=\"" + coord(y) + "\" r=\"" + coord(size) + "\" fill=\"#fff\" stroke=\"" +
           c + "\" stroke-width=\"1.8\"/>";
  return "<circle cx=\"" + coord(x) + "\" cy=\"" + coord(y) + "\" r=\"" + coord(size) + "\" fill=\"" + c + "\"/>";
}

std::string legend_swatch(const Style& s) {
  std::string out = "<svg class=\"swatch\" viewBox=\"0 0 34 12\" width=\"34\" height=\"12\" aria-hidden=\"true\">";
  out += "<line x1=\"1\" y1=\"6\" x2=\"33\" y2=\"6\" stroke=\"" + s.colour + "\" stroke-width=\"2\"";
  if (!s.dash.empty()) out += " stroke-dasharray=\"" + s.dash + "\"";
  out += "/>" + marker(s, 17, 6, 3.2) + "</svg>";
  return out;
}

std::string polyline(const std::vector<double>& xs, const std::vector<double>& ys, const Style& s, double width) {
  std::string out, points;
  std::size_t count = 0;
  auto flush = [&] {
    if (count >= 2) {
      out += "<polyline fill=\"none\" stroke=\"" + s.colour + "\" stroke-width=\"" + coord(width) + "\"";
      if (!s.dash.empty()) out += " stroke-dasharray=\"" + s.dash + "\"";
      out += " stroke-linejoin=\"round\" points=\"" + points + "\"/>";
    }
    points.clear();
    count = 0;
  };
  for (std::size_t i = 0; i < xs.size() && i < ys.size(); ++i) {
    if (!std::isfinite(ys[i]) || !std::isfinite(xs[i])) {
      flush();
      continue;
    }
    if (count) points += ' ';
    points += coord(xs[i]) + "," + coord(ys[i]);
    ++count;
  }
  flush();
  return out;
}

}  // namespace gapmark::svg
