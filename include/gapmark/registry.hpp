#pragma once
// One registry shape for every family: schemes, methods, metrics, reporters.
// Each entry has a name, a one-line summary, a parameter schema, what it
// needs, and a factory. Entries register themselves from their own file:
//
//   namespace { const gapmark::Registration<gapmark::FillMethod> reg{{
//       .name = "linear", .summary = "...", .params = {...},
//       .make = [](const gapmark::ParamValues& p) { return std::make_unique<Linear>(p); }}}; }
#include <algorithm>
#include <concepts>
#include <cstddef>
#include <functional>
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "gapmark/error.hpp"
#include "gapmark/params.hpp"

namespace gapmark {

/// What an entry needs from the data (shown by `gapmark methods`).
struct Needs {
  bool period = false;          ///< a seasonal period
  bool uses_period = false;     ///< uses a period when there is one (some settings need it)
  bool siblings = false;        ///< other series on the same time axis
  std::size_t min_observed = 1; ///< observed values at the least
};

template <class Interface>
struct Entry {
  std::string name;
  std::string summary;
  std::vector<ParamSpec> params;
  Needs needs{};
  std::function<std::unique_ptr<Interface>(const ParamValues&)> make;
  bool hidden = false;  ///< test-only entries: not listed
};

/// An entry bound to parameters: what a spec names, ready to use.
template <class Interface>
struct Bound {
  const Entry<Interface>* entry = nullptr;
  ParamValues params;
  std::shared_ptr<const Interface> impl;
  std::string label;  ///< canonical "name" or "name:key=value,..."
};

/// A family may give every entry the same extra parameters, bound and
/// applied in one place rather than per entry (methods: period, bounds,
/// transform). It declares `static std::vector<ParamSpec> common_params(const
/// Needs&)` and `static std::unique_ptr<Interface> wrap(std::unique_ptr<Interface>,
/// const ParamValues&, const Needs&)`, which applies the given ones.
template <class Interface>
concept HasCommonParams = requires(const Needs& needs, const ParamValues& values, std::unique_ptr<Interface> impl) {
  { Interface::common_params(needs) } -> std::same_as<std::vector<ParamSpec>>;
  { Interface::wrap(std::move(impl), values, needs) } -> std::same_as<std::unique_ptr<Interface>>;
};

/// Edit distance, for "did you mean" hints.
std::size_t edit_distance(const std::string& a, const std::string& b);

template <class Interface>
class Registry {
public:
  static Registry& global() {
    static Registry instance;
    return instance;
  }

  void add(Entry<Interface> entry) {
    std::string name = entry.name;
    entries_[name] = std::move(entry);
  }

  const Entry<Interface>* find(const std::string& name) const {
    auto it = entries_.find(name);
    return it == entries_.end() ? nullptr : &it->second;
  }

  /// The entry or an InputError "unknown <family> 'x' (did you mean 'y'?)".
  const Entry<Interface>& at(const std::string& name, const std::string& where) const {
    if (const auto* e = find(name)) return *e;
    std::string best;
    std::size_t best_d = 3;
    for (const auto& [n, e] : entries_) {
      if (e.hidden) continue;
      std::size_t d = edit_distance(n, name);
      if (d < best_d) { best_d = d; best = n; }
    }
    std::string msg = "unknown " + std::string(Interface::family) + " '" + name + "'";
    if (!best.empty()) msg += " (did you mean '" + best + "'?)";
    else msg += "; `gapmark " + std::string(Interface::family) + "s` lists them";
    throw InputError(where, msg);
  }

  /// Listed entries, sorted by name.
  std::vector<const Entry<Interface>*> list() const {
    std::vector<const Entry<Interface>*> out;
    for (const auto& [n, e] : entries_)
      if (!e.hidden) out.push_back(&e);
    return out;
  }

  /// Every parameter an entry takes: its own, then the family's common ones.
  static std::vector<ParamSpec> schema(const Entry<Interface>& entry) {
    std::vector<ParamSpec> all = entry.params;
    if constexpr (HasCommonParams<Interface>)
      for (auto& p : Interface::common_params(entry.needs)) all.push_back(std::move(p));
    return all;
  }

  Bound<Interface> bind(const CallSpec& call, const std::string& where) const {
    const auto& entry = at(call.name, where);
    const std::vector<ParamSpec> all = schema(entry);
    Bound<Interface> b;
    b.entry = &entry;
    b.params = bind_params(all, call, where + " (" + call.name + ")");
    std::unique_ptr<Interface> impl = entry.make(b.params);
    if constexpr (HasCommonParams<Interface>) {
      try {
        impl = Interface::wrap(std::move(impl), b.params, entry.needs);
      } catch (const InputError& e) {
        throw InputError(where + " (" + call.name + ")", e.what());
      }
    }
    b.impl = std::move(impl);
    std::string args = b.params.canonical(all);
    b.label = args.empty() ? entry.name : entry.name + ":" + args;
    return b;
  }

private:
  std::map<std::string, Entry<Interface>> entries_;
};

/// Registers an entry at static-initialisation time.
template <class Interface>
struct Registration {
  explicit Registration(Entry<Interface> entry) { Registry<Interface>::global().add(std::move(entry)); }
};

}  // namespace gapmark
