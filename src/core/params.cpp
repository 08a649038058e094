#include "gapmark/params.hpp"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <utility>

#include "gapmark/error.hpp"
#include "gapmark/number_format.hpp"

namespace gapmark {

namespace {

bool valid_name(std::string_view s) {
  if (s.empty()) return false;
  for (char c : s)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_')) return false;
  return true;
}

const ParamSpec* find_spec(const std::vector<ParamSpec>& schema, const std::string& key) {
  for (const auto& p : schema)
    if (p.name == key) return &p;
  return nullptr;
}

std::string known_keys(const std::vector<ParamSpec>& schema) {
  if (schema.empty()) return "it takes no parameters";
  std::string out = "known: ";
  for (std::size_t i = 0; i < schema.size(); ++i) out += (i ? ", " : "") + schema[i].name;
  return out;
}

ParamValue convert(const ParamSpec& spec, const std::string& text, const std::string& where) {
  const std::string at = where + ": " + spec.name;
  switch (spec.type) {
    case ParamType::Integer: {
      auto v = parse_double(text);
      if (!v || !std::isfinite(*v) || std::floor(*v) != *v)
        throw InputError(at, "expected a whole number, found '" + text + "'");
      if (*v < spec.min || *v > spec.max)
        throw InputError(at, "value " + text + " is outside [" + format_double(spec.min) + ", " +
                                 format_double(spec.max) + "]");
      return static_cast<std::int64_t>(*v);
    }
    case ParamType::Real: {
      auto v = parse_double(text);
      if (!v || !std::isfinite(*v)) throw InputError(at, "expected a number, found '" + text + "'");
      if (*v < spec.min || *v > spec.max)
        throw InputError(at, "value " + text + " is outside [" + format_double(spec.min) + ", " +
                                 format_double(spec.max) + "]");
      return *v;
    }
    case ParamType::Choice: {
      for (const auto& c : spec.choices)
        if (c == text) return text;
      std::string list;
      for (std::size_t i = 0; i < spec.choices.size(); ++i) list += (i ? "|" : "") + spec.choices[i];
      throw InputError(at, "'" + text + "' is not one of " + list);
    }
    case ParamType::Flag: {
      if (text == "true" || text == "1" || text == "yes") return true;
      if (text == "false" || text == "0" || text == "no") return false;
      throw InputError(at, "expected true or false, found '" + text + "'");
    }
    case ParamType::Text:
      return text;
  }
  return text;
}

}  // namespace

ParamSpec choice_param(std::string name, std::string default_value, std::vector<std::string> choices,
                       std::string help) {
  return {.name = std::move(name),
          .type = ParamType::Choice,
          .default_value = std::move(default_value),
          .choices = std::move(choices),
          .help = std::move(help)};
}

CallSpec CallSpec::parse(std::string_view text, const std::string& where) {
  CallSpec call;
  text = trim(text);
  auto colon = text.find(':');
  call.name = std::string(trim(text.substr(0, colon)));
  if (!valid_name(call.name))
    throw InputError(where, "expected NAME or NAME:key=value,..., found '" + std::string(text) + "'");
  if (colon == std::string_view::npos) return call;
  std::string_view rest = text.substr(colon + 1);
  while (!rest.empty()) {
    auto comma = rest.find(',');
    std::string_view item = trim(rest.substr(0, comma));
    rest = comma == std::string_view::npos ? std::string_view{} : rest.substr(comma + 1);
    auto eq = item.find('=');
    // A piece without '=' after key=value continues a list value: "bounds=0,200".
    if (eq == std::string_view::npos && !call.args.empty()) {
      call.args.back().second += "," + std::string(item);
      continue;
    }
    if (eq == std::string_view::npos)
      throw InputError(where, "expected key=value in '" + std::string(text) + "', found '" +
                                  std::string(item) + "'");
    std::string key(trim(item.substr(0, eq)));
    std::string value(trim(item.substr(eq + 1)));
    if (!valid_name(key)) throw InputError(where, "bad parameter name '" + key + "'");
    for (const auto& [k, v] : call.args)
      if (k == key) throw InputError(where, "parameter '" + key + "' given twice");
    call.args.emplace_back(key, value);
  }
  if (text.back() == ',' && !call.args.empty()) call.args.back().second += ",";  // "bounds=0," : open above
  return call;
}

CallSpec CallSpec::from_json(const nlohmann::json& value, const std::string& where,
                             const std::vector<std::string>& skip) {
  if (value.is_string()) return parse(value.get<std::string>(), where);
  if (!value.is_object())
    throw InputError(where, "expected a string \"name:key=value\" or an object with \"name\"");
  auto name = value.find("name");
  if (name == value.end() || !name->is_string())
    throw InputError(where + "/name", "missing or not a string");
  CallSpec call = parse(name->get<std::string>(), where + "/name");
  for (const auto& [key, v] : value.items()) {
    if (key == "name") continue;
    if (std::find(skip.begin(), skip.end(), key) != skip.end()) continue;
    std::string text;
    if (v.is_string()) text = v.get<std::string>();
    else if (v.is_boolean()) text = v.get<bool>() ? "true" : "false";
    else if (v.is_number_integer()) text = std::to_string(v.get<std::int64_t>());
    else if (v.is_number()) text = format_double(v.get<double>());
    else if (v.is_array() && !v.empty() && std::all_of(v.begin(), v.end(), [](const auto& x) { return x.is_number(); }))
      for (const auto& x : v)  // a list of numbers: "bounds": [0, 200]
        text += (text.empty() ? "" : ",") + (x.is_number_integer() ? std::to_string(x.template get<std::int64_t>())
                                                                     : format_double(x.template get<double>()));
    else throw InputError(where + "/" + key, "expected a string, number, boolean or list of numbers");
    for (const auto& [k, old] : call.args)
      if (k == key) throw InputError(where + "/" + key, "parameter given twice");
    call.args.emplace_back(key, text);
  }
  return call;
}

std::optional<std::string> CallSpec::take(const std::string& key) {
  for (auto it = args.begin(); it != args.end(); ++it) {
    if (it->first == key) {
      std::string v = it->second;
      args.erase(it);
      return v;
    }
  }
  return std::nullopt;
}

std::string param_to_text(const ParamValue& value) {
  return std::visit(
      [](const auto& v) -> std::string {
        using T = std::decay_t<decltype(v)>;
        if constexpr (std::is_same_v<T, std::int64_t>) return std::to_string(v);
        else if constexpr (std::is_same_v<T, double>) return format_double(v);
        else if constexpr (std::is_same_v<T, bool>) return v ? "true" : "false";
        else return v;
      },
      value);
}

namespace {
template <class T>
const T& get_as(const std::map<std::string, ParamValue>& values, const std::string& name,
                const char* type) {
  auto it = values.find(name);
  if (it == values.end()) throw std::logic_error("parameter '" + name + "' is not in the schema");
  if (const T* v = std::get_if<T>(&it->second)) return *v;
  throw std::logic_error("parameter '" + name + "' is not " + type);
}
}  // namespace

std::int64_t ParamValues::integer(const std::string& name) const {
  return get_as<std::int64_t>(values_, name, "an integer");
}
double ParamValues::real(const std::string& name) const {
  auto it = values_.find(name);
  if (it != values_.end())
    if (const auto* i = std::get_if<std::int64_t>(&it->second)) return static_cast<double>(*i);
  return get_as<double>(values_, name, "a number");
}
const std::string& ParamValues::text(const std::string& name) const {
  return get_as<std::string>(values_, name, "text");
}
bool ParamValues::flag(const std::string& name) const { return get_as<bool>(values_, name, "a flag"); }
bool ParamValues::given(const std::string& name) const {
  auto it = given_.find(name);
  return it != given_.end() && it->second;
}

void ParamValues::set(const std::string& name, ParamValue value, bool given) {
  values_[name] = std::move(value);
  given_[name] = given;
}

std::string ParamValues::canonical(const std::vector<ParamSpec>& schema) const {
  std::string out;
  for (const auto& spec : schema) {
    if (!given(spec.name)) continue;
    std::string text = param_to_text(values_.at(spec.name));
    if (text == spec.default_value) continue;
    out += (out.empty() ? "" : ",") + spec.name + "=" + text;
  }
  return out;
}

nlohmann::json ParamValues::to_json() const {
  nlohmann::json j = nlohmann::json::object();
  for (const auto& entry : values_)  // not a structured binding: clang before 16 cannot capture one
    std::visit([&](const auto& v) { j[entry.first] = v; }, entry.second);
  return j;
}

ParamValues bind_params(const std::vector<ParamSpec>& schema, const CallSpec& call,
                        const std::string& where) {
  ParamValues out;
  for (const auto& [key, text] : call.args) {
    const ParamSpec* spec = find_spec(schema, key);
    if (!spec) throw InputError(where, "unknown parameter '" + key + "' (" + known_keys(schema) + ")");
    out.set(key, convert(*spec, text, where), true);
  }
  for (const auto& spec : schema) {
    if (out.has(spec.name)) continue;
    if (spec.default_value.empty() && spec.type != ParamType::Text)
      throw InputError(where, "parameter '" + spec.name + "' is required");
    out.set(spec.name, convert(spec, spec.default_value, where), false);
  }
  return out;
}

}  // namespace gapmark
