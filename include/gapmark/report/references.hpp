#pragma once
// The published methods, metrics and tests gapmark uses, and the one table
// that maps their names to references. methods.md cites from it and
// references.bib writes the BibTeX of the entries a run used.
#include <string>
#include <vector>

#include "gapmark/experiment/record.hpp"
#include "gapmark/analysis/summary.hpp"

namespace gapmark {

struct Reference {
  std::string key;       ///< BibTeX key ("fritsch1980")
  std::string citation;  ///< one line for a reference list
  std::string bibtex;    ///< the full entry
};

/// Every known reference, in a fixed order.
const std::vector<Reference>& all_references();
/// The entry for a key; nullptr when unknown.
const Reference* find_reference(const std::string& key);

/// What a name is ("method", "metric", "test", "interval").
struct CitedUse {
  std::string kind;
  std::string name;                 ///< method or metric name, or a test's name
  std::vector<std::string> keys;
};

/// The uses a run makes of published work, read from its results and
/// summary: the methods in its trials, its metric columns, the tests whose
/// outcomes its summary holds. Deterministic order.
std::vector<CitedUse> cited_uses(const ResultSet& results, const Summary& summary);
/// The distinct keys of `uses`, in the order of all_references().
std::vector<std::string> cited_keys(const std::vector<CitedUse>& uses);

}  // namespace gapmark
