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

/// Where everything goes: margins, rows, the axis and legend, and the time
/// range every group's grid covers (each point one step wide).
struct Frame {
  double left = 0, right = 36, top = 58;
  double row_h = 0, row_gap = 4, group_gap = 0;
  double plot_w = 0, plot_h = 0, axis_y = 0, legend_y = 0, height = 0;
  std::int64_t lo = 0, hi = 0;
  double span = 1;
  std::size_t columns = 0;  ///< pixel columns of the plot
  double x_of(std::int64_t t) const { return left + plot_w * double(t - lo) / span; }
};

Frame frame_for(const DataProfile& p, const CompletenessStyle& style) {
  Frame f;
  std::size_t longest = 0;
  for (const auto& s : p.series) longest = std::max(longest, s.label.size());
  f.left = std::clamp(double(longest) * 6.6 + 28, 90.0, 300.0);
  f.row_h = style.row_height;
  f.group_gap = p.group_columns.empty() ? 0 : 8;
  f.plot_w = std::max(200.0, double(style.width) - f.left - f.right);
  for (std::size_t k = 0; k < p.series.size(); ++k)
    f.plot_h += f.row_h + f.row_gap + ((k > 0 && p.series[k].group != p.series[k - 1].group) ? f.group_gap : 0);
  f.axis_y = f.top + f.plot_h + 4;
  f.legend_y = f.axis_y + 46;
  f.height = f.legend_y + 40;
  bool any = false;
  for (const auto& g : p.groups) {
    if (g.grid.size() == 0) continue;
    const std::int64_t a = g.grid.at(0), b = advance(p.kind, g.grid.at(g.grid.size() - 1), p.step, 1);
    f.lo = any ? std::min(f.lo, a) : a;
    f.hi = any ? std::max(f.hi, b) : b;
    any = true;
  }
  f.span = any && f.hi > f.lo ? double(f.hi - f.lo) : 1.0;
  f.columns = static_cast<std::size_t>(f.plot_w);
  return f;
}

/// The opening tag, the hatch pattern, the title lines and the row label.
std::string chart_head(const DataProfile& p, const CompletenessStyle& style, const Frame& f) {
  std::string svg;
  svg += "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" + num(style.width) + "\" height=\"" + num(f.height) +
         "\" viewBox=\"0 0 " + num(style.width) + " " + num(f.height) + "\" font-family=\"sans-serif\" font-size=\"11\" fill=\"" +
         kText + "\">\n";
  svg += "<defs><pattern id=\"absent\" width=\"4\" height=\"4\" patternUnits=\"userSpaceOnUse\" "
         "patternTransform=\"rotate(45)\"><rect width=\"4\" height=\"4\" fill=\"#ffffff\"/>"
         "<rect width=\"1.6\" height=\"4\" fill=\"" + std::string(kRecordInk) + "\"/></pattern></defs>\n";
  svg += rect(0, 0, style.width, f.height, "#ffffff");
  svg += text(f.left, 20, "Completeness of " + p.source, "font-size=\"14\" font-weight=\"bold\"");
  svg += text(f.left, 38, std::to_string(p.series.size()) + " series, " + std::to_string(p.groups.size()) + " group" +
                              (p.groups.size() == 1 ? "" : "s") + ", step " + p.step.iso() +
                              "; each row is one series, time runs left to right");
  svg += text(14, f.top + f.plot_h / 2, "series", "font-size=\"12\" text-anchor=\"middle\" transform=\"rotate(-90 14 " +
                                                      num(f.top + f.plot_h / 2) + ")\"");
  return svg;
}

using StateCounts = std::array<std::size_t, 3>;  ///< points per state (present, missing value, missing record)

/// Counts of each state per pixel column of one series; columns between a
/// group's points (coarse steps) take the previous point's counts.
std::vector<StateCounts> column_counts(const DataProfile& p, const SeriesProfile& s, const Frame& f) {
  const auto& grid = p.groups[s.group].grid;
  std::vector<StateCounts> counts(f.columns, {0, 0, 0});
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double x = f.x_of(grid.at(i)) - f.left;
    const std::size_t c = std::min(f.columns - 1, static_cast<std::size_t>(std::max(0.0, x)));
    ++counts[c][static_cast<std::size_t>(s.states[i])];
  }
  const double first_x = grid.size() ? f.x_of(grid.at(0)) - f.left : 0;
  const double last_x = grid.size() ? f.x_of(advance(p.kind, grid.at(grid.size() - 1), p.step, 1)) - f.left : 0;
  StateCounts carry{0, 0, 0};
  for (std::size_t c = 0; c < f.columns; ++c) {
    const std::size_t total = counts[c][0] + counts[c][1] + counts[c][2];
    if (total > 0) carry = counts[c];
    else if (double(c) >= first_x && double(c) < last_x) counts[c] = carry;
  }
  return counts;
}

/// One row's bars at height `y`: runs of columns with one pure state as one
/// bar, mixed columns stacked.
std::string row_bars(const std::vector<StateCounts>& counts, const Frame& f, double y) {
  const char* fills[3] = {kPresent, kValue, "url(#absent)"};
  std::string svg;
  for (std::size_t c = 0; c < counts.size();) {
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
      while (e < counts.size() && counts[e][pure] > 0 &&
             counts[e][pure] == counts[e][0] + counts[e][1] + counts[e][2])
        ++e;
      svg += rect(f.left + double(c), y, double(e - c), f.row_h, fills[pure]);
      c = e;
      continue;
    }
    double yy = y;
    for (int st = 0; st < 3; ++st) {
      if (!n[st]) continue;
      const double h = f.row_h * double(n[st]) / double(total);
      svg += rect(f.left + double(c), yy, 1, h, fills[st]);
      yy += h;
    }
    ++c;
  }
  return svg;
}

std::string time_axis(const DataProfile& p, const Frame& f) {
  std::string svg = rect(f.left, f.axis_y, f.plot_w, 1, kText);
  for (const auto& t : ticks(p.kind, f.lo, f.hi, 8)) {
    const double x = f.x_of(t.t);
    svg += rect(x - 0.5, f.axis_y, 1, 5, kText);
    svg += rect(x - 0.25, f.top, 0.5, f.plot_h, "#e6e6e6");
    const bool near_end = x > f.left + f.plot_w - 3.2 * double(t.label.size());
    svg += text(near_end ? f.left + f.plot_w + f.right - 4 : x, f.axis_y + 17, t.label,
                near_end ? "text-anchor=\"end\"" : "text-anchor=\"middle\"");
  }
  svg += text(f.left + f.plot_w / 2, f.axis_y + 34,
              std::string("time (") + (p.kind == TimeKind::Index ? "index" : "as written") + ", step " + p.step.iso() + ")",
              "font-size=\"12\" text-anchor=\"middle\"");
  return svg;
}

/// The legend, from the left edge.
std::string legend(const Frame& f) {
  std::string svg;
  double lx = 14;
  const std::array<std::pair<const char*, const char*>, 3> entries{{
      {kPresent, "value present"},
      {kValue, "missing value (row there, cell empty)"},
      {"url(#absent)", "missing record (no row at that time)"}}};
  for (const auto& [fill, label] : entries) {
    svg += rect(lx, f.legend_y, 22, f.row_h, fill);
    svg += "<rect x=\"" + num(lx) + "\" y=\"" + num(f.legend_y) + "\" width=\"22\" height=\"" + num(f.row_h) +
           "\" fill=\"none\" stroke=\"#7a7a7a\" stroke-width=\"0.5\"/>\n";
    svg += text(lx + 28, f.legend_y + f.row_h - 3, label);
    lx += 28 + double(std::string(label).size()) * 5.9 + 18;
  }
  svg += rect(lx, f.legend_y + f.row_h / 2 - 0.5, 22, 1, kFaint);
  svg += text(lx + 28, f.legend_y + f.row_h - 3, "outside the group's span");
  return svg;
}

}  // namespace

std::string completeness_svg(const DataProfile& p, const CompletenessStyle& style) {
  const Frame f = frame_for(p, style);
  std::string svg = chart_head(p, style, f);
  double y = f.top;
  for (std::size_t k = 0; k < p.series.size(); ++k) {
    const auto& s = p.series[k];
    if (k > 0 && s.group != p.series[k - 1].group) y += f.group_gap;
    svg += text(f.left - 6, y + f.row_h - 3, s.label, "text-anchor=\"end\"");
    svg += rect(f.left, y + f.row_h / 2 - 0.5, f.plot_w, 1, kFaint);
    svg += row_bars(column_counts(p, s, f), f, y);
    y += f.row_h + f.row_gap;
  }
  svg += time_axis(p, f);
  svg += legend(f);
  svg += "</svg>\n";
  return svg;
}

}  // namespace gapmark::data
