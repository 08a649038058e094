#pragma once
// Stored outside values for the downstream checks, read from
// reference/downstream/ (produced there by committed R and Python scripts).
#include <fstream>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <string>
#include <vector>

#include "../reference_json.hpp"

namespace gapmark::test {

inline nlohmann::json read_reference(const std::string& relative) {
  return gapmark::test::reference_json("downstream/" + relative);
}

/// An open series exported from R's datasets package.
inline std::vector<double> r_series(const std::string& name) {
  static const nlohmann::json data = read_reference("data/r_datasets.json");
  return data.at("series").at(name).at("values").get<std::vector<double>>();
}

}  // namespace gapmark::test
