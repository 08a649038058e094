#pragma once
// Parameters of schemes, methods and metrics. On the command line a call is
// written "name:key=value,key=value"; in a JSON spec it is either that string
// or an object {"name": ..., "key": value, ...}. Either way it is checked
// against the parameter schema of what it names.
#include <cstdint>
#include <map>
#include <nlohmann/json_fwd.hpp>
#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

namespace gapmark {

enum class ParamType { Integer, Real, Text, Choice, Flag };

/// One parameter: its name, type, default, range or choices, and what it does.
struct ParamSpec {
  std::string name;
  ParamType type = ParamType::Real;
  std::string default_value;          ///< as text; "" = required
  double min = -1e308;                ///< inclusive bounds for Integer and Real
  double max = 1e308;
  std::vector<std::string> choices;   ///< for Choice
  std::string help;
};

/// A Choice parameter: one of `choices`, `default_value` when not given.
ParamSpec choice_param(std::string name, std::string default_value, std::vector<std::string> choices,
                       std::string help);

/// A call as written: a name and its key=value arguments in written order.
struct CallSpec {
  std::string name;
  std::vector<std::pair<std::string, std::string>> args;

  /// Parses "name" or "name:key=value,key=value". `where` names the source
  /// for errors ("--method", "spec.json: /methods/2").
  static CallSpec parse(std::string_view text, const std::string& where);
  /// Accepts a string (parsed as above) or an object with "name" and
  /// scalar members. Keys listed in `skip` are left out (e.g. "rates").
  static CallSpec from_json(const nlohmann::json& value, const std::string& where,
                            const std::vector<std::string>& skip = {});
  /// Removes and returns argument `key` if present.
  std::optional<std::string> take(const std::string& key);
};

using ParamValue = std::variant<std::int64_t, double, std::string, bool>;

/// Parameters bound to a schema: every parameter has a typed value.
class ParamValues {
public:
  std::int64_t integer(const std::string& name) const;
  double real(const std::string& name) const;
  const std::string& text(const std::string& name) const;
  bool flag(const std::string& name) const;
  bool has(const std::string& name) const { return values_.count(name) != 0; }
  /// True when the parameter was given rather than defaulted.
  bool given(const std::string& name) const;

  void set(const std::string& name, ParamValue value, bool given);
  /// "key=value,key=value" for the given (non-default) values in schema order.
  std::string canonical(const std::vector<ParamSpec>& schema) const;
  /// All values as a JSON object.
  nlohmann::json to_json() const;

private:
  std::map<std::string, ParamValue> values_;
  std::map<std::string, bool> given_;
};

/// Checks a call's arguments against a schema: unknown keys, bad numbers,
/// out-of-range values and missing required values are InputErrors naming
/// `where` and the key. Defaults fill what is not given.
ParamValues bind_params(const std::vector<ParamSpec>& schema, const CallSpec& call,
                        const std::string& where);

/// Formats a parameter value as text.
std::string param_to_text(const ParamValue& value);

}  // namespace gapmark
