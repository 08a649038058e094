#pragma once

namespace gapmark {
/// The tool's version ("0.1.0").
const char* version();
/// The source commit it was built from, or "unknown".
const char* commit();
}  // namespace gapmark
