// references.bib: BibTeX for the published methods, metrics and tests this
// run used (see report/references.hpp), and nothing else.
#include "gapmark/report/references.hpp"
#include "gapmark/report/reporter.hpp"

namespace gapmark {
namespace {

class ReferencesBib final : public Reporter {
public:
  std::string file_name() const override { return "references.bib"; }

  std::string render(const ResultSet& results, const Summary& summary) const override {
    const auto uses = cited_uses(results, summary);
    std::string out = "% References for the methods, metrics and tests used in this gapmark run.\n"
                      "% Entries were written from memory and have not been checked against the publishers'\n"
                      "% records: check each before citing it.\n";
    for (const auto& u : uses) {
      out += "% " + u.kind + " " + u.name + ":";
      for (const auto& k : u.keys) out += " " + k;
      out += "\n";
    }
    for (const auto& key : cited_keys(uses))
      if (const auto* r = find_reference(key)) out += "\n" + r->bibtex;
    return out;
  }
};

const Registration<Reporter> registration{{
    .name = "references-bib",
    .summary = "BibTeX entries of the published methods, metrics and tests the run used",
    .params = {},
    .make = [](const ParamValues&) { return std::make_unique<ReferencesBib>(); },
}};

}  // namespace
}  // namespace gapmark
