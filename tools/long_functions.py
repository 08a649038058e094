#!/usr/bin/env python3
"""Lists the functions of src/ longer than a limit (default 60 lines), longest
first, with a mark where the lines just above the function give a reason
(a comment containing "long:"). Heuristic: braces are matched after comments
and strings are blanked; a block whose head has a parameter list and sits at
namespace or class level is a function (lambdas count inside their function).
Usage: tools/long_functions.py [--limit N] [DIR...]"""
import argparse
import pathlib
import re
import sys


def blank(text):
    """Comments and string/char literals replaced by spaces (newlines kept)."""
    out, i, n = [], 0, len(text)
    while i < n:
        c = text[i]
        if text.startswith('//', i):
            j = text.find('\n', i)
            j = n if j < 0 else j
            out.append(' ' * (j - i)); i = j
        elif text.startswith('/*', i):
            j = text.find('*/', i + 2)
            j = n if j < 0 else j + 2
            out.append(re.sub(r'[^\n]', ' ', text[i:j])); i = j
        elif text.startswith('R"', i):
            m = re.match(r'R"([^(]*)\(', text[i:])
            end = text.find(')' + m.group(1) + '"', i) if m else -1
            j = n if end < 0 else end + len(m.group(1)) + 2
            out.append(re.sub(r'[^\n]', ' ', text[i:j])); i = j
        elif c in '"\'':
            j = i + 1
            while j < n and text[j] != c:
                j += 2 if text[j] == '\\' else 1
            out.append(' ' * (j + 1 - i)); i = j + 1
        else:
            out.append(c); i += 1
    return ''.join(out)


def functions(path):
    raw = path.read_text(encoding='utf-8', errors='replace')
    text = blank(raw)
    lines = raw.split('\n')
    stack, head_start = [], 0
    for i, c in enumerate(text):
        if c in ';':
            head_start = i + 1
        elif c == '{':
            head = text[head_start:i]
            parent = stack[-1][0] if stack else 'namespace'
            if parent in ('namespace', 'type'):
                if re.search(r'\bnamespace\b', head) or re.search(r'extern\s*$', head.strip()[:0] + head):
                    kind = 'namespace'
                elif re.search(r'\b(class|struct|union|enum)\b', head) and '(' not in head.split(':')[0]:
                    kind = 'type'
                elif ')' in head and not re.search(r'=\s*$', head.strip()):
                    kind = 'function'
                else:
                    kind = 'other'
            else:
                kind = 'inner'
            stack.append((kind, i, head))
            head_start = i + 1
        elif c == '}':
            if stack:
                kind, start, head = stack.pop()
                if kind == 'function':
                    first = text.count('\n', 0, start - len(head.lstrip('\n '))) + 1
                    # the line where the head's text begins
                    h = head.strip()
                    first = text.count('\n', 0, head_start if False else start) + 1 - head.strip().count('\n')
                    last = text.count('\n', 0, i) + 1
                    name = re.sub(r'\s+', ' ', h)[:90]
                    above = '\n'.join(lines[max(0, first - 6):first - 1])
                    yield first, last, name, 'long:' in above
            head_start = i + 1


def main():
    ap = argparse.ArgumentParser(description=__doc__.split('\n')[0])
    ap.add_argument('--limit', type=int, default=60)
    ap.add_argument('dirs', nargs='*', default=['src'])
    a = ap.parse_args()
    rows = []
    for d in a.dirs:
        for p in sorted(pathlib.Path(d).rglob('*.[ch]pp')):
            for first, last, name, reason in functions(p):
                length = last - first + 1
                if length > a.limit:
                    rows.append((length, f'{p}:{first}-{last}', name, reason))
    rows.sort(key=lambda r: (-r[0], r[1]))
    for length, where, name, reason in rows:
        print(f'{length:5d}  {where}  {"(reason given) " if reason else ""}{name}')
    print(f'{len(rows)} functions over {a.limit} lines, {sum(1 for r in rows if not r[3])} without a reason',
          file=sys.stderr)


if __name__ == '__main__':
    main()
