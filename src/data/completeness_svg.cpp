// The completeness picture (see completeness_svg.hpp). Palette and layout:
//   present value   #24566e  dark blue-teal, solid
//   missing value   #f0b43c  light amber, solid
//   missing record  #2b2b2b  dark hatching on white
// The three differ in lightness (dark, light, textured), so they stay apart
// for every kind of colour vision and in greyscale print.
#include "gapmark/data/completeness_svg.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>

#include "gapmark/time_grid.hpp"

namespace gapmark::data {
namespace {

constexpr const char* kPresent = "#24566e";
constexpr const char* kValue = "#f0b43c";
constexpr const char* kRecordInk = "#2b2b2b";
constexpr const char* kText = "#1f1f1f";
constexpr const char* kFaint = "#c8c8c8";
constexpr std::int64_t kHour = 3600, kDay = 86400;

std::string esc(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '&') out += "&amp;";
    else if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '"') out += "&quot;";
    else out += c;
  }
  return out;
}

std::string num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", v);
  std::string s = buf;
  if (s.size() > 2 && s.compare(s.size() - 2, 2, ".0") == 0) s.resize(s.size() - 2);
  return s;
}

std::string rect(double x, double y, double w, double h, const std::string& fill) {
  return "<rect x=\"" + num(x) + "\" y=\"" + num(y) + "\" width=\"" + num(w) + "\" height=\"" + num(h) +
         "\" fill=\"" + fill + "\"/>\n";
}

std::string text(double x, double y, const std::string& s, const std::string& extra = "") {
  return "<text x=\"" + num(x) + "\" y=\"" + num(y) + "\"" + (extra.empty() ? "" : " " + extra) + ">" + esc(s) +
         "</text>\n";
}

struct Tick {
  std::int64_t t;
  std::string label;
};

// Ticks at calendar boundaries (hours, days, Mondays, months, years) or at
// round integers, at most `most` of them.
std::vector<Tick> ticks(TimeKind kind, std::int64_t lo, std::int64_t hi, std::size_t most) {
  std::vector<Tick> out;
  if (kind == TimeKind::Index) {
    std::int64_t step = 1;
    for (std::int64_t scale = 1;; scale *= 10) {
      bool found = false;
      for (std::int64_t m : {1, 2, 5})
        if ((hi - lo) / (m * scale) + 1 <= std::int64_t(most)) {
          step = m * scale;
          found = true;
          break;
        }
      if (found) break;
    }
    for (std::int64_t t = (lo + step - 1) / step * step; t <= hi; t += step) out.push_back({t, std::to_string(t)});
    return out;
  }
  struct Choice {
    Step step;
    std::size_t from, length;  // the part of the ISO text shown
  };
  const std::array<Choice, 14> choices{{{{Step::Unit::Seconds, kHour}, 5, 11},
                                        {{Step::Unit::Seconds, 3 * kHour}, 5, 11},
                                        {{Step::Unit::Seconds, 6 * kHour}, 5, 11},
                                        {{Step::Unit::Seconds, 12 * kHour}, 5, 11},
                                        {{Step::Unit::Seconds, kDay}, 0, 10},
                                        {{Step::Unit::Seconds, 2 * kDay}, 0, 10},
                                        {{Step::Unit::Seconds, 7 * kDay}, 0, 10},
                                        {{Step::Unit::Seconds, 14 * kDay}, 0, 10},
                                        {{Step::Unit::Months, 1}, 0, 7},
                                        {{Step::Unit::Months, 3}, 0, 7},
                                        {{Step::Unit::Months, 6}, 0, 7},
                                        {{Step::Unit::Months, 12}, 0, 4},
                                        {{Step::Unit::Months, 24}, 0, 4},
                                        {{Step::Unit::Months, 60}, 0, 4}}};
  for (const auto& c : choices) {
    if (kind == TimeKind::Date && c.step.unit == Step::Unit::Seconds && c.step.amount < kDay) continue;
    const Binning bins(kind, c.step, lo);
    std::vector<Tick> candidate;
    std::int64_t t = bins.floor(lo);
    if (t < lo) t = advance(kind, t, c.step, 1);
    for (; t <= hi && candidate.size() <= most; t = advance(kind, t, c.step, 1)) {
      std::string s = format_time(TimeKind::DateTime, t, std::nullopt).substr(c.from, c.length);
      std::replace(s.begin(), s.end(), 'T', ' ');
      candidate.push_back({t, s});
    }
    if (candidate.size() <= most) return candidate;
  }
  return out;
}

}  // namespace

std::string completeness_svg(const DataProfile& p, const CompletenessStyle& style) {
  // Layout.
  std::size_t longest = 0;
  for (const auto& s : p.series) longest = std::max(longest, s.label.size());
  const double left = std::clamp(double(longest) * 6.6 + 28, 90.0, 300.0);
  const double right = 36, top = 58;
  const double row_h = style.row_height, row_gap = 4, group_gap = p.group_columns.empty() ? 0 : 8;
  const double plot_w = std::max(200.0, double(style.width) - left - right);
  double plot_h = 0;
  for (std::size_t k = 0; k < p.series.size(); ++k)
    plot_h += row_h + row_gap + ((k > 0 && p.series[k].group != p.series[k - 1].group) ? group_gap : 0);
  const double axis_y = top + plot_h + 4;
  const double legend_y = axis_y + 46;
  const double height = legend_y + 40;

  // The time range: every group's grid, each point covering one step.
  std::int64_t lo = 0, hi = 0;
  bool any = false;
  for (const auto& g : p.groups) {
    if (g.grid.size() == 0) continue;
    const std::int64_t a = g.grid.at(0), b = advance(p.kind, g.grid.at(g.grid.size() - 1), p.step, 1);
    lo = any ? std::min(lo, a) : a;
    hi = any ? std::max(hi, b) : b;
    any = true;
  }
  const double span = any && hi > lo ? double(hi - lo) : 1.0;
  const auto x_of = [&](std::int64_t t) { return left + plot_w * double(t - lo) / span; };
  const std::size_t columns = static_cast<std::size_t>(plot_w);

  std::string svg;
  svg += "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" + num(style.width) + "\" height=\"" + num(height) +
         "\" viewBox=\"0 0 " + num(style.width) + " " + num(height) + "\" font-family=\"sans-serif\" font-size=\"11\" fill=\"" +
         kText + "\">\n";
  svg += "<defs><pattern id=\"absent\" width=\"4\" height=\"4\" patternUnits=\"userSpaceOnUse\" "
         "patternTransform=\"rotate(45)\"><rect width=\"4\" height=\"4\" fill=\"#ffffff\"/>"
         "<rect width=\"1.6\" height=\"4\" fill=\"" + std::string(kRecordInk) + "\"/></pattern></defs>\n";
  svg += rect(0, 0, style.width, height, "#ffffff");
  svg += text(left, 20, "Completeness of " + p.source, "font-size=\"14\" font-weight=\"bold\"");
  svg += text(left, 38, std::to_string(p.series.size()) + " series, " + std::to_string(p.groups.size()) + " group" +
                            (p.groups.size() == 1 ? "" : "s") + ", step " + p.step.iso() +
                            "; each row is one series, time runs left to right");
  svg += text(14, top + plot_h / 2, "series", "font-size=\"12\" text-anchor=\"middle\" transform=\"rotate(-90 14 " +
                                                 num(top + plot_h / 2) + ")\"");

  double y = top;
  for (std::size_t k = 0; k < p.series.size(); ++k) {
    const auto& s = p.series[k];
    if (k > 0 && s.group != p.series[k - 1].group) y += group_gap;
    const auto& grid = p.groups[s.group].grid;
    svg += text(left - 6, y + row_h - 3, s.label, "text-anchor=\"end\"");
    svg += rect(left, y + row_h / 2 - 0.5, plot_w, 1, kFaint);
    // Counts of each state per pixel column.
    std::vector<std::array<std::size_t, 3>> counts(columns, {0, 0, 0});
    for (std::size_t i = 0; i < grid.size(); ++i) {
      const double x = x_of(grid.at(i)) - left;
      const std::size_t c = std::min(columns - 1, static_cast<std::size_t>(std::max(0.0, x)));
      ++counts[c][static_cast<std::size_t>(s.states[i])];
    }
    // Columns between a group's points (coarse steps) take the previous point's counts.
    const double first_x = grid.size() ? x_of(grid.at(0)) - left : 0;
    const double last_x = grid.size() ? x_of(advance(p.kind, grid.at(grid.size() - 1), p.step, 1)) - left : 0;
    std::array<std::size_t, 3> carry{0, 0, 0};
    for (std::size_t c = 0; c < columns; ++c) {
      const std::size_t total = counts[c][0] + counts[c][1] + counts[c][2];
      if (total > 0) carry = counts[c];
      else if (double(c) >= first_x && double(c) < last_x) counts[c] = carry;
    }
    // Draw: runs of columns with one pure state as one bar, mixed columns stacked.
    const char* fills[3] = {kPresent, kValue, "url(#absent)"};
    for (std::size_t c = 0; c < columns;) {
      const auto& n = counts[c];
      const std::size_t total = n[0] + n[1] + n[2];
      if (total == 0) {
        ++c;
        continue;
      }
      int pure = -1;
      for (int st = 0; st < 3; ++st)
        if (n[st] == total) pure = st;
      if (pure >= 0) {
        std::size_t e = c + 1;
        while (e < columns && counts[e][pure] > 0 && counts[e][pure] == counts[e][0] + counts[e][1] + counts[e][2]) ++e;
        svg += rect(left + double(c), y, double(e - c), row_h, fills[pure]);
        c = e;
        continue;
      }
      double yy = y;
      for (int st = 0; st < 3; ++st) {
        if (!n[st]) continue;
        const double h = row_h * double(n[st]) / double(total);
        svg += rect(left + double(c), yy, 1, h, fills[st]);
        yy += h;
      }
      ++c;
    }
    y += row_h + row_gap;
  }

  // Time axis.
  svg += rect(left, axis_y, plot_w, 1, kText);
  for (const auto& t : ticks(p.kind, lo, hi, 8)) {
    const double x = x_of(t.t);
    svg += rect(x - 0.5, axis_y, 1, 5, kText);
    svg += rect(x - 0.25, top, 0.5, plot_h, "#e6e6e6");
    const bool near_end = x > left + plot_w - 3.2 * double(t.label.size());
    svg += text(near_end ? left + plot_w + right - 4 : x, axis_y + 17, t.label,
                near_end ? "text-anchor=\"end\"" : "text-anchor=\"middle\"");
  }
  svg += text(left + plot_w / 2, axis_y + 34,
              std::string("time (") + (p.kind == TimeKind::Index ? "index" : "as written") + ", step " + p.step.iso() + ")",
              "font-size=\"12\" text-anchor=\"middle\"");

  // Legend, from the left edge.
  double lx = 14;
  const std::array<std::pair<const char*, const char*>, 3> legend{{
      {kPresent, "value present"},
      {kValue, "missing value (row there, cell empty)"},
      {"url(#absent)", "missing record (no row at that time)"}}};
  for (const auto& [fill, label] : legend) {
    svg += rect(lx, legend_y, 22, row_h, fill);
    svg += "<rect x=\"" + num(lx) + "\" y=\"" + num(legend_y) + "\" width=\"22\" height=\"" + num(row_h) +
           "\" fill=\"none\" stroke=\"#7a7a7a\" stroke-width=\"0.5\"/>\n";
    svg += text(lx + 28, legend_y + row_h - 3, label);
    lx += 28 + double(std::string(label).size()) * 5.9 + 18;
  }
  svg += rect(lx, legend_y + row_h / 2 - 0.5, 22, 1, kFaint);
  svg += text(lx + 28, legend_y + row_h - 3, "outside the group's span");
  svg += "</svg>\n";
  return svg;
}

}  // namespace gapmark::data
