#include "gapmark/experiment/spec.hpp"

#include <algorithm>
#include <cstdint>
#include <set>
#include <type_traits>

#include "gapmark/error.hpp"
#include "gapmark/hash.hpp"
#include "gapmark/json_strict.hpp"
#include "gapmark/text_safety.hpp"
#include "gapmark/number_format.hpp"
#include "gapmark/table_io.hpp"

namespace gapmark {
namespace {

using nlohmann::json;

const std::set<std::string> kTopLevel = {"name",    "seed",    "replicates", "holdout", "output",
                                         "data",    "schemes", "methods",    "metrics", "rank_by",
                                         "alpha",   "equivalence", "description", "units"};
const std::set<std::string> kDataKeys = {"file", "columns", "time_column", "step", "period", "periods", "groups"};

struct Ctx {
  std::string source;
  std::string at(const std::string& pointer) const { return source + ": " + pointer; }
};

const json& require(const json& obj, const std::string& key, const Ctx& ctx, const std::string& base) {
  auto it = obj.find(key);
  if (it == obj.end()) throw InputError(ctx.at(base + "/" + key), "required field is missing");
  return *it;
}

std::int64_t get_integer(const json& v, const Ctx& ctx, const std::string& pointer, std::int64_t lo,
                         std::int64_t hi) {
  if (!v.is_number_integer()) throw InputError(ctx.at(pointer), "expected a whole number");
  auto x = v.get<std::int64_t>();
  if (x < lo || x > hi)
    throw InputError(ctx.at(pointer), "value " + std::to_string(x) + " is outside [" +
                                          std::to_string(lo) + ", " + std::to_string(hi) + "]");
  return x;
}

std::string get_string(const json& v, const Ctx& ctx, const std::string& pointer) {
  if (!v.is_string()) throw InputError(ctx.at(pointer), "expected a string");
  return v.get<std::string>();
}

const json& get_array(const json& v, const Ctx& ctx, const std::string& pointer) {
  if (!v.is_array() || v.empty()) throw InputError(ctx.at(pointer), "expected a non-empty array");
  return v;
}

std::size_t line_of(const std::string& text, std::size_t byte) {
  std::size_t line = 1;
  for (std::size_t i = 0; i < byte && i < text.size(); ++i)
    if (text[i] == '\n') ++line;
  return line;
}

/// Refuses the last element of `items` when it repeats an earlier one: a
/// repeated entry would count the same replicates twice.
template <class T>
void refuse_repeat(const std::vector<T>& items, const Ctx& ctx, const std::string& pointer, const std::string& what) {
  for (std::size_t i = 0; i + 1 < items.size(); ++i)
    if (items[i] == items.back()) {
      std::string shown;
      if constexpr (std::is_same_v<T, std::string>) shown = " " + quoted_for_message(items.back());
      else shown = " " + format_double(items.back());
      throw InputError(ctx.at(pointer), what + shown + " is listed twice (also at position " + std::to_string(i) +
                                            "); a repeated entry would count the same trials twice");
    }
}

DataSource parse_data(const json& v, const Ctx& ctx, const std::string& pointer,
                      const std::filesystem::path& base_dir) {
  DataSource d;
  d.where = pointer;
  json obj = v;
  if (v.is_string()) obj = json{{"file", v}};
  if (!obj.is_object()) throw InputError(ctx.at(pointer), "expected a file name or an object with \"file\"");
  for (const auto& [key, value] : obj.items())
    if (!kDataKeys.count(key))
      throw InputError(ctx.at(pointer + "/" + key),
                       "unknown field (known: file, columns, time_column, step, period, periods, groups)");
  d.label = get_string(require(obj, "file", ctx, pointer), ctx, pointer + "/file");
  d.path = std::filesystem::path(d.label).is_absolute() ? std::filesystem::path(d.label)
                                                         : base_dir / d.label;
  if (auto it = obj.find("columns"); it != obj.end()) {
    const auto& cols = get_array(*it, ctx, pointer + "/columns");
    for (std::size_t i = 0; i < cols.size(); ++i) {
      d.columns.push_back(get_string(cols[i], ctx, pointer + "/columns/" + std::to_string(i)));
      refuse_repeat(d.columns, ctx, pointer + "/columns/" + std::to_string(i), "column");
    }
  }
  if (auto it = obj.find("time_column"); it != obj.end())
    d.time_column = get_string(*it, ctx, pointer + "/time_column");
  if (auto it = obj.find("step"); it != obj.end())
    d.step = Step::parse(get_string(*it, ctx, pointer + "/step"), ctx.at(pointer + "/step"));
  if (auto it = obj.find("period"); it != obj.end())
    d.period = static_cast<std::size_t>(get_integer(*it, ctx, pointer + "/period", 0, 1000000));
  if (auto it = obj.find("periods"); it != obj.end()) {
    if (!it->is_object()) throw InputError(ctx.at(pointer + "/periods"), "expected an object {\"column\": period}");
    for (const auto& [column, value] : it->items())
      d.column_periods[column] =
          static_cast<std::size_t>(get_integer(value, ctx, pointer + "/periods/" + column, 0, 1000000));
  }
  if (auto it = obj.find("groups"); it != obj.end()) {
    const auto& groups = get_array(*it, ctx, pointer + "/groups");
    for (std::size_t i = 0; i < groups.size(); ++i) {
      d.groups.push_back(get_string(groups[i], ctx, pointer + "/groups/" + std::to_string(i)));
      refuse_repeat(d.groups, ctx, pointer + "/groups/" + std::to_string(i), "group column");
    }
  }
  return d;
}

/// The spec's JSON; an error names the line of a syntax error or of a number
/// out of range.
json parse_document(const std::string& text, const std::string& source) {
  try {
    return parse_json_strict(text, source);
  } catch (const json::parse_error& e) {
    std::string what = e.what();
    auto pos = what.find("syntax error");
    throw InputError(source + ":" + std::to_string(line_of(text, e.byte)),
                     "invalid JSON: " + (pos == std::string::npos ? what : what.substr(pos)));
  } catch (const json::out_of_range& e) {  // a number too large for a double, such as 1e999
    std::string what = e.what();
    what = what.substr(what.find(']') + 2);  // drop "[json.exception.out_of_range.406] "
    const auto quote = what.find('\'');
    const auto at = quote == std::string::npos
                        ? std::string::npos
                        : text.find(what.substr(quote + 1, what.size() - quote - 2));
    throw InputError(at == std::string::npos ? source : source + ":" + std::to_string(line_of(text, at)),
                     "invalid JSON: " + what);
  }
}

/// name, seed, replicates, holdout, output, alpha, equivalence and units.
void parse_settings(const json& j, const Ctx& ctx, const std::filesystem::path& base_dir, ExperimentSpec& spec) {
  if (auto it = j.find("name"); it != j.end()) spec.name = get_string(*it, ctx, "/name");
  if (auto it = j.find("seed"); it != j.end())
    spec.seed = static_cast<std::uint64_t>(get_integer(*it, ctx, "/seed", 0, INT64_MAX));
  if (auto it = j.find("replicates"); it != j.end())
    spec.replicates = static_cast<int>(get_integer(*it, ctx, "/replicates", 1, 100000));
  if (auto it = j.find("holdout"); it != j.end())
    spec.holdout = static_cast<std::size_t>(get_integer(*it, ctx, "/holdout", 0, 100000000));
  if (auto it = j.find("output"); it != j.end()) {
    std::filesystem::path out = get_string(*it, ctx, "/output");
    spec.output = out.is_absolute() ? out : base_dir / out;
  } else {
    spec.output = base_dir / "gapmark-out";
  }
  if (auto it = j.find("alpha"); it != j.end()) {
    if (!it->is_number() || !(it->get<double>() > 0 && it->get<double>() < 0.5))
      throw InputError(ctx.at("/alpha"), "expected a number in (0, 0.5)");
    spec.alpha = it->get<double>();
  }
  if (auto it = j.find("equivalence"); it != j.end()) {
    if (!it->is_number() || !(it->get<double>() > 0 && it->get<double>() < 1))
      throw InputError(ctx.at("/equivalence"),
                       "expected a number in (0, 1): the relative margin on the ranking metric (0.05 = within 5% of the best)");
    spec.equivalence = it->get<double>();
  }
  if (auto it = j.find("units"); it != j.end()) {
    if (!it->is_object()) throw InputError(ctx.at("/units"), "expected an object {\"column\": \"units\"}, e.g. {\"flow\": \"m3/s\"}");
    for (const auto& item : it->items()) {
      const std::string pointer = "/units/" + item.key();
      const std::string text = get_string(item.value(), ctx, pointer);
      if (text.empty() || text.size() > 40 ||
          std::any_of(text.begin(), text.end(), [](char c) { return static_cast<unsigned char>(c) < 0x20; }))
        throw InputError(ctx.at(pointer), "expected units as short text (1 to 40 bytes, no control characters)");
      spec.units[item.key()] = text;
    }
  }
}

void parse_data_list(const json& j, const Ctx& ctx, const std::filesystem::path& base_dir, ExperimentSpec& spec) {
  const auto& data = get_array(require(j, "data", ctx, ""), ctx, "/data");
  for (std::size_t i = 0; i < data.size(); ++i) {
    spec.data.push_back(parse_data(data[i], ctx, "/data/" + std::to_string(i), base_dir));
    const auto& added = spec.data.back();
    for (std::size_t k = 0; k + 1 < spec.data.size(); ++k)
      if (spec.data[k].path.lexically_normal() == added.path.lexically_normal())
        throw InputError(ctx.at("/data/" + std::to_string(i)),
                         "the data file " + quoted_for_message(added.label) + " is listed twice (also /data/" +
                             std::to_string(k) + "); list it once, with all the columns wanted");
  }
}

/// One scheme entry: the bound scheme and its rates ("rates": [...], or rate=R in a call).
SchemePlan parse_scheme(const json& entry, const Ctx& ctx, const std::string& pointer) {
  CallSpec call = CallSpec::from_json(entry, ctx.at(pointer), {"rates"});
  SchemePlan plan;
  std::vector<double> rates;
  if (entry.is_object() && entry.contains("rates")) {
    const auto& r = get_array(entry["rates"], ctx, pointer + "/rates");
    for (std::size_t k = 0; k < r.size(); ++k) {
      const std::string rp = pointer + "/rates/" + std::to_string(k);
      if (!r[k].is_number()) throw InputError(ctx.at(rp), "expected a number");
      rates.push_back(r[k].get<double>());
      check_rate(rates.back(), ctx.at(rp));
      refuse_repeat(rates, ctx, rp, "rate");
    }
  } else if (auto rate = call.take("rate")) {
    auto v = parse_double(*rate);
    if (!v) throw InputError(ctx.at(pointer), "rate: expected a number, found '" + *rate + "'");
    check_rate(*v, ctx.at(pointer));
    rates.push_back(*v);
  } else {
    throw InputError(ctx.at(pointer + "/rates"), "required field is missing (e.g. \"rates\": [0.1, 0.3])");
  }
  plan.scheme = SchemeRegistry::global().bind(call, ctx.at(pointer));
  plan.rates = std::move(rates);
  return plan;
}

void parse_schemes(const json& j, const Ctx& ctx, ExperimentSpec& spec) {
  const auto& schemes = get_array(require(j, "schemes", ctx, ""), ctx, "/schemes");
  for (std::size_t i = 0; i < schemes.size(); ++i) {
    const std::string pointer = "/schemes/" + std::to_string(i);
    SchemePlan plan = parse_scheme(schemes[i], ctx, pointer);
    for (const auto& earlier : spec.schemes)
      if (earlier.scheme.label == plan.scheme.label)
        throw InputError(ctx.at(pointer), "scheme " + quoted_for_message(plan.scheme.label) +
                                              " is listed twice; give one entry with all its rates");
    spec.schemes.push_back(std::move(plan));
  }
}

void parse_methods(const json& j, const Ctx& ctx, ExperimentSpec& spec) {
  const auto& methods = get_array(require(j, "methods", ctx, ""), ctx, "/methods");
  std::set<std::string> method_labels;
  for (std::size_t i = 0; i < methods.size(); ++i) {
    const std::string pointer = "/methods/" + std::to_string(i);
    auto bound = MethodRegistry::global().bind(CallSpec::from_json(methods[i], ctx.at(pointer)),
                                               ctx.at(pointer));
    if (!method_labels.insert(bound.label).second)
      throw InputError(ctx.at(pointer), "method '" + bound.label + "' is listed twice");
    spec.methods.push_back(std::move(bound));
  }
}

/// The metrics (the defaults when the spec names none), then rank_by, which
/// must name one of their columns.
std::vector<Bound<Metric>> bind_metrics(const json& j, const Ctx& ctx) {
  std::vector<std::pair<std::string, json>> metric_calls;
  if (auto it = j.find("metrics"); it != j.end()) {
    const auto& metrics = get_array(*it, ctx, "/metrics");
    for (std::size_t i = 0; i < metrics.size(); ++i)
      metric_calls.emplace_back("/metrics/" + std::to_string(i), metrics[i]);
  } else {
    for (const auto& name : default_metric_calls()) metric_calls.emplace_back("(default metrics)", name);
  }
  std::vector<Bound<Metric>> bound;
  for (const auto& [pointer, value] : metric_calls)
    bound.push_back(MetricRegistry::global().bind(CallSpec::from_json(value, ctx.at(pointer)), ctx.at(pointer)));
  return bound;
}

void parse_metrics(const json& j, const Ctx& ctx, ExperimentSpec& spec) {
  spec.metrics = bind_metrics(j, ctx);
  std::set<std::string> column_names;
  for (const auto& m : spec.metrics)
    for (const auto& c : m.impl->columns()) column_names.insert(c.name);
  if (auto it = j.find("rank_by"); it != j.end()) spec.rank_by = get_string(*it, ctx, "/rank_by");
  if (!column_names.count(spec.rank_by)) {
    std::string known;
    for (const auto& c : column_names) known += (known.empty() ? "" : ", ") + c;
    throw InputError(ctx.at("/rank_by"), "no metric column '" + spec.rank_by + "' (known: " + known + ")");
  }
}

}  // namespace

ExperimentSpec parse_spec(const std::string& text, const std::string& source,
                          const std::filesystem::path& base_dir) {
  const Ctx ctx{source};
  ExperimentSpec spec;
  spec.source = source;
  spec.base_dir = base_dir;
  spec.text = text;
  spec.sha256 = sha256_hex(text);
  spec.json = parse_document(text, source);
  const json& j = spec.json;
  if (!j.is_object()) throw InputError(ctx.at("/"), "expected a JSON object");
  for (const auto& [key, value] : j.items())
    if (!kTopLevel.count(key)) throw InputError(ctx.at("/" + key), "unknown field");
  parse_settings(j, ctx, base_dir, spec);
  parse_data_list(j, ctx, base_dir, spec);
  parse_schemes(j, ctx, spec);
  parse_methods(j, ctx, spec);
  parse_metrics(j, ctx, spec);
  return spec;
}

std::vector<Bound<Metric>> bind_spec_metrics(const nlohmann::json& spec, const std::string& source) {
  return bind_metrics(spec, Ctx{source});
}

ExperimentSpec load_spec(const std::filesystem::path& path) {
  const std::string text = read_text_file(path);
  auto base = path.parent_path();
  if (base.empty()) base = ".";
  return parse_spec(text, path.string(), base);
}

}  // namespace gapmark
