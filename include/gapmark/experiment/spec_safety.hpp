#pragma once
// What a spec received from someone else may do: the programs it would start
// (its "external" methods, which need the user's consent on the command
// line) and whether its "output" stays inside its own folder.
#include <string>
#include <vector>

#include "gapmark/experiment/spec.hpp"

namespace gapmark {

/// The commands of the spec's "external" methods, in method order: each
/// starts a program on this machine (docs/external-methods.md).
std::vector<std::string> external_commands(const ExperimentSpec& spec);

/// Why the spec's "output" may not be used as it stands (absolute, or leading
/// out of the spec's folder with ".."), as one message naming the field; empty
/// when it is fine or absent. The CLI refuses such a spec unless --out names
/// the folder.
std::string spec_output_problem(const ExperimentSpec& spec);

}  // namespace gapmark
