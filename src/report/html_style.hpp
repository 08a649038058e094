#pragma once
// The style sheet of report.html, inlined in the page.
namespace gapmark {
/// CSS for report.html: a calm light page, tables, charts and legends.
const char* report_css();
}  // namespace gapmark
