#include "gapmark/compare/tolerance.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <set>

#include "gapmark/error.hpp"
#include "gapmark/json_strict.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {

double Tolerance::allowed(double baseline_badness) const {
  const double rel = std::isfinite(baseline_badness) ? relative * std::abs(baseline_badness) : 0.0;
  return std::max(absolute, rel);
}

std::string Tolerance::describe() const {
  auto text = [](double v) {
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.6g", v);
    return std::string(buffer);
  };
  std::string out;
  if (relative > 0) out = text(100 * relative) + "% relative";
  if (absolute > 0 || out.empty()) out += (out.empty() ? "" : ", at least ") + text(absolute) + " absolute";
  return out;
}

const Tolerance& Tolerances::of(const std::string& metric) const {
  auto it = per_metric.find(metric);
  return it == per_metric.end() ? fallback : it->second;
}

nlohmann::json Tolerances::to_json() const {
  nlohmann::json out = {{"*", {{"absolute", fallback.absolute}, {"relative", fallback.relative}, {"all", all}}}};
  for (const auto& [name, t] : per_metric) out[name] = {{"absolute", t.absolute}, {"relative", t.relative}};
  return out;
}

namespace {

void set(Tolerances& t, const std::string& metric, const Tolerance& value) {
  if (metric == "*") t.fallback = value, t.all = true;
  else t.per_metric[metric] = value;
}

double non_negative(const std::string& text, const std::string& where) {
  auto v = parse_double(text);
  if (!v || !std::isfinite(*v) || *v < 0)
    throw InputError(where, "expected a number >= 0 or a percentage such as 5%, found '" + text + "'");
  return *v;
}

}  // namespace

Tolerances parse_tolerance_text(const std::string& text, const std::string& where, Tolerances base) {
  std::set<std::string> given;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t end = text.find(',', start);
    if (end == std::string::npos) end = text.size();
    const std::string item{trim(std::string_view(text).substr(start, end - start))};
    start = end + 1;
    if (item.empty()) {
      if (end == text.size()) break;
      continue;
    }
    const auto eq = item.find('=');
    if (eq == std::string::npos || eq == 0)
      throw InputError(where, "expected metric=amount (e.g. rmse=5% or mae=0.01), found '" + item + "'");
    const std::string metric{trim(std::string_view(item).substr(0, eq))};
    if (!given.insert(metric).second)
      throw InputError(where, "the tolerance of '" + metric + "' is given twice; give each metric once");
    std::string amount{trim(std::string_view(item).substr(eq + 1))};
    Tolerance t;
    if (!amount.empty() && amount.back() == '%') {
      amount.pop_back();
      t.relative = non_negative(amount, where + " (" + metric + ")") / 100.0;
    } else {
      t.absolute = non_negative(amount, where + " (" + metric + ")");
    }
    set(base, metric, t);
    if (end == text.size()) break;
  }
  return base;
}

Tolerances read_tolerance_file(const std::filesystem::path& path, Tolerances base) {
  const std::string source = path.string();
  nlohmann::json j;
  try {
    j = parse_json_strict(read_text_file(path), source);
  } catch (const nlohmann::json::parse_error& e) {
    throw InputError(source, std::string("invalid JSON: ") + e.what());
  } catch (const nlohmann::json::out_of_range& e) {  // a number too large for a double, such as 1e999
    throw InputError(source, std::string("invalid JSON: ") + e.what());
  }
  if (!j.is_object()) throw InputError(source, "expected an object {\"metric\": {\"relative\": 0.05}}");
  for (const auto& [metric, value] : j.items()) {
    const std::string at = source + ": /" + metric;
    if (!value.is_object()) throw InputError(at, "expected an object with \"absolute\" and/or \"relative\"");
    Tolerance t;
    bool any = false;
    for (const auto& [key, v] : value.items()) {
      if (key != "absolute" && key != "relative")
        throw InputError(at + "/" + key, "unknown field (known: absolute, relative)");
      if (!v.is_number() || !(v.get<double>() >= 0) || !std::isfinite(v.get<double>()))
        throw InputError(at + "/" + key, "expected a number >= 0");
      (key == "absolute" ? t.absolute : t.relative) = v.get<double>();
      any = true;
    }
    if (!any) throw InputError(at, "expected \"absolute\" and/or \"relative\"");
    set(base, metric, t);
  }
  return base;
}

void check_tolerance_metrics(const Tolerances& tolerances, const std::vector<std::string>& columns,
                             const std::string& where) {
  for (const auto& [metric, t] : tolerances.per_metric)
    if (std::find(columns.begin(), columns.end(), metric) == columns.end()) {
      std::string known;
      for (const auto& c : columns) known += (known.empty() ? "" : ", ") + c;
      throw InputError(where, "no metric '" + metric + "' in the results (known: " + known + ")");
    }
}

}  // namespace gapmark
