// `gapmark methods`, `gapmark schemes`, `gapmark metrics`: what the registries
// hold, as a readable table or as JSON. Read from the registries themselves,
// so the listing never drifts from the code.
#include <algorithm>
#include <iostream>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "gapmark/fill/method.hpp"
#include "gapmark/mask/scheme.hpp"
#include "gapmark/registry_listing.hpp"
#include "gapmark/score/metric.hpp"

namespace gapmark::cli {
namespace {

std::string range_text(const ParamSpec& p) {
  if (p.type != ParamType::Integer && p.type != ParamType::Real) return "";
  std::string s;
  if (p.min > -1e300) s += ">= " + param_to_text(p.min);
  if (p.max < 1e300) s += std::string(s.empty() ? "" : ", ") + "<= " + param_to_text(p.max);
  return s;
}

std::string needs_text(const Needs& n) {
  std::string s;
  if (n.period) s += "period";
  if (n.siblings) s += std::string(s.empty() ? "" : ", ") + "siblings";
  if (n.min_observed > 1)
    s += std::string(s.empty() ? "" : ", ") + std::to_string(n.min_observed) + "+ observed";
  return s.empty() ? "-" : s;
}

void print_param(const ParamSpec& p, const char* empty_default) {
  std::cout << "    " << p.name << " = " << (p.default_value.empty() ? empty_default : p.default_value) << "  ("
            << param_type_text(p);
  const std::string r = range_text(p);
  if (!r.empty()) std::cout << "; " << r;
  std::cout << ")  " << p.help << "\n";
}

/// The family's parameters that every entry takes whatever it needs (listed once, at the end).
template <class Interface>
std::vector<ParamSpec> universal_params() {
  if constexpr (HasCommonParams<Interface>) return Interface::common_params(Needs{});
  return {};
}

template <class Interface>
void print_table(const Registry<Interface>& registry, bool with_needs) {
  const auto universal = universal_params<Interface>();
  const auto is_universal = [&](const ParamSpec& p) {
    return std::any_of(universal.begin(), universal.end(), [&](const ParamSpec& u) { return u.name == p.name; });
  };
  for (const auto* e : registry.list()) {
    std::cout << e->name;
    if (with_needs) std::cout << "  [needs: " << needs_text(e->needs) << "]";
    std::cout << "\n    " << e->summary << "\n";
    for (const auto& p : Registry<Interface>::schema(*e))
      if (!is_universal(p)) print_param(p, "(required)");
    std::cout << "\n";
  }
  if (universal.empty()) return;
  std::cout << "Every " << Interface::family << " also takes:\n";
  for (const auto& p : universal) print_param(p, "(none)");
  std::cout << "\n";
}

template <class Interface>
void add_list(CLI::App& app, Action& action, const std::string& name, const std::string& what,
              bool with_needs) {
  auto* cmd = app.add_subcommand(name, "List the " + what + " with their parameters");
  auto json_flag = std::make_shared<bool>(false);
  cmd->add_flag("--json", *json_flag, "Print as JSON");
  cmd->callback([&action, json_flag, with_needs] {
    action = [json_flag, with_needs] {
      const auto& registry = Registry<Interface>::global();
      if (*json_flag) {
        std::cout << registry_json(registry).dump(2) << "\n";
      } else {
        print_table(registry, with_needs);
      }
      return kOk;
    };
  });
}

}  // namespace

void add_methods(CLI::App& app, Action& action) {
  add_list<FillMethod>(app, action, "methods", "fill methods", true);
}
void add_schemes(CLI::App& app, Action& action) {
  add_list<MaskScheme>(app, action, "schemes", "masking schemes", false);
}
void add_metrics(CLI::App& app, Action& action) {
  add_list<Metric>(app, action, "metrics", "metrics", false);
}

}  // namespace gapmark::cli
