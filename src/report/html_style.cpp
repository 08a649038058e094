#include "html_style.hpp"

namespace gapmark {

// long: one stylesheet, kept whole so it reads as CSS.
const char* report_css() {
  return R"css(
:root { --ink: #2d3338; --muted: #5f6a71; --paper: #fbfaf7; --card: #ffffff; --line: #dde1e3;
        --accent: #274571; --tied: #eef4ea; --warn: #fbf3e2; --warn-line: #d9b66a; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
       font: 15px/1.5 system-ui, "Segoe UI", "Noto Sans", "DejaVu Sans", sans-serif; }
main { max-width: 1020px; margin: 0 auto; padding: 24px 20px 48px; }
header.page { border-bottom: 3px solid var(--accent); margin-bottom: 18px; padding-bottom: 10px; }
h1 { font-size: 1.6rem; margin: 0 0 4px; font-weight: 650; }
h2 { font-size: 1.3rem; margin: 34px 0 8px; padding-top: 8px; border-top: 1px solid var(--line); }
h3 { font-size: 1.05rem; margin: 22px 0 6px; color: var(--accent); }
h4 { font-size: 0.95rem; margin: 14px 0 4px; }
p { margin: 6px 0 10px; }
.facts { color: var(--muted); font-size: 0.86rem; }
.facts code, code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.84em;
                    background: #f0f1ee; padding: 0 3px; border-radius: 3px; word-break: break-all; }
nav.toc { background: var(--card); border: 1px solid var(--line); border-radius: 6px; padding: 8px 14px;
          font-size: 0.9rem; }
nav.toc a { color: var(--accent); margin-right: 14px; text-decoration: none; white-space: nowrap; }
nav.toc a:hover { text-decoration: underline; }
.caution { background: var(--warn); border-left: 4px solid var(--warn-line); padding: 8px 14px;
           border-radius: 0 6px 6px 0; margin: 14px 0; }
.caution strong { display: block; margin-bottom: 2px; }
.card { background: var(--card); border: 1px solid var(--line); border-radius: 6px; padding: 10px 14px;
        margin: 10px 0; }
.recommend { border-left: 4px solid var(--accent); }
.recommend .best { font-weight: 650; }
.scroll { overflow-x: auto; }
table { border-collapse: collapse; font-size: 0.84rem; font-variant-numeric: tabular-nums; margin: 6px 0; }
caption { text-align: left; color: var(--muted); font-size: 0.82rem; padding-bottom: 4px; }
th, td { padding: 3px 9px; border-bottom: 1px solid var(--line); text-align: right; white-space: nowrap; }
th { font-weight: 600; background: #f3f4f1; position: sticky; top: 0; }
td.name, th.name { text-align: left; }
tr.tied td { background: var(--tied); }
td.mark { text-align: center; font-weight: 650; }
td.mark.good { color: #2f6b34; }
td.mark.better { color: #274571; }
td.mark.worse { color: #8a4b2a; font-weight: 500; }
td.mark.open { color: var(--muted); font-weight: 500; }
details.more { margin: 0 0 14px; }
details.more > summary { font-weight: 500; font-size: 0.88rem; color: var(--accent); }
details.more p.note { font-size: 0.8rem; color: var(--muted); margin: 2px 0 0; }
td.failed { color: #952e17; }
details { margin: 6px 0; }
details > summary { cursor: pointer; font-weight: 600; padding: 4px 0; }
details > summary .sub { font-weight: 400; color: var(--muted); }
.chart { width: 100%; max-width: 660px; height: auto; display: block; background: var(--card);
         border: 1px solid var(--line); border-radius: 6px; }
.chart text { font-family: system-ui, "DejaVu Sans", sans-serif; }
.chart .axis-title { fill: var(--muted); }
.figure { margin: 8px 0 16px; }
.figure p.note { font-size: 0.84rem; color: var(--muted); max-width: 660px; margin: 4px 0 0; }
.legend { display: flex; flex-wrap: wrap; gap: 4px 16px; font-size: 0.85rem; margin: 4px 0 8px; }
.legend span { display: inline-flex; align-items: center; gap: 5px; }
.swatch { flex: none; }
.grid2 { display: grid; grid-template-columns: minmax(0, 660px); gap: 4px; }
.empty { color: var(--muted); font-style: italic; }
ul.warnings li { margin-bottom: 6px; }
footer { margin-top: 40px; font-size: 0.8rem; color: var(--muted); border-top: 1px solid var(--line);
         padding-top: 8px; }
@media print { nav.toc { display: none; } details { display: block; } h2 { break-before: page; } }
)css";
}

}  // namespace gapmark
