#include "gapmark/experiment/record_checks.hpp"

#include <cmath>
#include <cstdint>

#include "gapmark/error.hpp"
#include "gapmark/text_safety.hpp"

namespace gapmark {

namespace {
std::string shown(const nlohmann::json& value) { return quoted_for_message(value.dump(), 40); }
}  // namespace

std::size_t stored_count(const nlohmann::json& value, const std::string& where, const std::string& field) {
  // (a document built in memory holds an int where a parsed one holds an unsigned)
  if (!value.is_number_unsigned() && !(value.is_number_integer() && value.get<std::int64_t>() >= 0))
    throw InputError(where, field + ": expected a whole number >= 0, found " + shown(value));
  return value.get<std::size_t>();
}

double stored_metric(const nlohmann::json& value, const std::string& where, const std::string& field) {
  if (value.is_null()) return std::nan("");
  if (!value.is_number()) throw InputError(where, field + ": expected a number or null, found " + shown(value));
  return value.get<double>();
}

double stored_alpha(const nlohmann::json& value, const std::string& where) {
  if (!value.is_number() || !(value.get<double>() > 0 && value.get<double>() < 0.5))
    throw InputError(where, "alpha: expected a number in (0, 0.5), found " + shown(value));
  return value.get<double>();
}

// ---------------------------------------------------------------- StoredObject

StoredObject::StoredObject(const nlohmann::json& value, std::string source, Pointer pointer)
    : value_(value), source_(std::move(source)), pointer_(std::move(pointer)) {
  if (!value_.is_object())
    throw InputError(source_, (pointer_.empty() ? std::string("/") : pointer_.to_string()) +
                                  ": expected an object, found " + shown(value_));
}

bool StoredObject::has(const std::string& key) const { return value_.contains(key); }

std::string StoredObject::where(const std::string& key) const { return source_ + ": " + pointer(key).to_string(); }

void StoredObject::fail(const std::string& key, const std::string& what) const {
  throw InputError(source_, pointer(key).to_string() + ": " + what);
}

const nlohmann::json& StoredObject::at(const std::string& key) const {
  const auto it = value_.find(key);
  if (it == value_.end()) fail(key, "missing");
  return *it;
}

std::string StoredObject::text(const std::string& key) const {
  const auto& v = at(key);
  if (!v.is_string()) fail(key, "expected a string, found " + shown(v));
  return v.get<std::string>();
}

std::size_t StoredObject::count(const std::string& key) const {
  return stored_count(at(key), source_, pointer(key).to_string());
}

double StoredObject::number(const std::string& key) const {
  const auto& v = at(key);
  if (!v.is_number() || !std::isfinite(v.get<double>())) fail(key, "expected a number, found " + shown(v));
  return v.get<double>();
}

const nlohmann::json& StoredObject::array(const std::string& key) const {
  const auto& v = at(key);
  if (!v.is_array()) fail(key, "expected an array, found " + shown(v));
  return v;
}

std::vector<double> StoredObject::numbers(const std::string& key) const {
  const auto& values = array(key);
  std::vector<double> out;
  out.reserve(values.size());
  for (std::size_t i = 0; i < values.size(); ++i)
    out.push_back(stored_metric(values[i], source_, (pointer(key) / i).to_string()));
  return out;
}

StoredObject StoredObject::object(const std::string& key) const { return StoredObject(at(key), source_, pointer(key)); }

std::vector<StoredObject> StoredObject::objects(const std::string& key) const {
  const auto& values = array(key);
  std::vector<StoredObject> out;
  out.reserve(values.size());
  for (std::size_t i = 0; i < values.size(); ++i) out.emplace_back(values[i], source_, pointer(key) / i);
  return out;
}

}  // namespace gapmark
