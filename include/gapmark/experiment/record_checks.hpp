#pragma once
// Strict reading of stored records (checkpoint lines, results files): a
// file from someone else is data, and a value out of range is refused with
// one line naming the file and field, instead of wrapping round (-4 as a
// count) or turning into something else ("abc" read as a missing metric).
#include <cstddef>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace gapmark {

/// A count: a whole number >= 0 (InputError naming `where` and `field`).
std::size_t stored_count(const nlohmann::json& value, const std::string& where, const std::string& field);
/// A metric value: a number, or null for "not applicable" (NaN).
double stored_metric(const nlohmann::json& value, const std::string& where, const std::string& field);
/// The significance level of a stored run: a number in (0, 0.5), as a spec allows.
double stored_alpha(const nlohmann::json& value, const std::string& where);

/// A stored JSON object whose members are read strictly. Every error is one
/// line naming the file and the JSON pointer of the member at fault
/// ("results.json: /context/seed: expected a whole number >= 0, found \"x\"").
class StoredObject {
public:
  using Pointer = nlohmann::json::json_pointer;
  /// `value` found in `source` (a file, or "file:line") at `pointer`;
  /// InputError unless it is an object.
  StoredObject(const nlohmann::json& value, std::string source, Pointer pointer = Pointer());

  bool has(const std::string& key) const;
  /// The member; InputError when it is missing.
  const nlohmann::json& at(const std::string& key) const;
  std::string text(const std::string& key) const;
  std::size_t count(const std::string& key) const;
  /// A finite number.
  double number(const std::string& key) const;
  /// An array of numbers and nulls (NaN).
  std::vector<double> numbers(const std::string& key) const;
  /// The member `key` as an object of its own.
  StoredObject object(const std::string& key) const;
  /// The elements of the array member `key`, each as an object.
  std::vector<StoredObject> objects(const std::string& key) const;
  /// The member's array; InputError unless it is one.
  const nlohmann::json& array(const std::string& key) const;

  const std::string& source() const { return source_; }
  Pointer pointer(const std::string& key) const { return pointer_ / key; }
  /// "source: /pointer/key", the place errors about the member name.
  std::string where(const std::string& key) const;
  /// An InputError about the member `key`.
  [[noreturn]] void fail(const std::string& key, const std::string& what) const;

private:
  const nlohmann::json& value_;
  std::string source_;
  Pointer pointer_;
};

}  // namespace gapmark
