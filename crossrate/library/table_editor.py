"""Text-level edits of one `[couple.<id>]` table, every other byte of the file left as it was.

A style-preserving TOML library would keep comments too, but one took about 11 s on a 10,000-table
file (issue 3), so edits work on the text instead: the table's lines are located with the line
index, only the lines whose value changes are rewritten (values formatted by tomli_w), and comment
lines, blank lines, unchanged lines and trailing comments inside the table stay as they were.
Couples are written without sub-tables: bonds as an inline array of inline tables.
"""

import math
import re

import tomli_w

from ..errors import CrossrateError
from .line_index import KEY_LINE, LineIndex
from .schema import FIELD_SPECS
from .toml_loads import loads

_ORDER = {s.name: i for i, s in enumerate(FIELD_SPECS)}
_BARE = re.compile(r"[A-Za-z0-9_-]+\Z")
_HEADER_BRACKETS = re.compile(r"[ \t]*\[[^\]\n]*\]")


class TableEditError(CrossrateError):
    """The requested edit cannot be made in place (the couple is missing, duplicated or written in a
    form crossrate does not rewrite); nothing was changed."""


def format_key(key: str) -> str:
    """A TOML key: bare when it can be, else quoted (as tomli_w quotes it)."""
    if _BARE.match(key):
        return key
    return tomli_w.dumps({key: 0}).rsplit(" = ", 1)[0]


def format_value(value) -> str:
    """TOML text of one value on one line: scalars by tomli_w, lists and tables inline."""
    if isinstance(value, list | tuple):
        return "[" + ", ".join(format_value(v) for v in value) + "]"
    if isinstance(value, dict):
        return "{" + ", ".join(f"{format_key(k)} = {format_value(v)}" for k, v in value.items()) + "}"
    if isinstance(value, float) and math.isfinite(value) and value != 0.0:
        short = _short_float(value)
        if short is not None:
            return short
    return tomli_w.dumps({"v": value})[4:].rstrip("\n")


def _short_float(value: float) -> str | None:
    """Scientific notation for very large or small magnitudes (2.5e8, not 250000000.0), as chemists write
    rate constants; the shortest mantissa that reads back to exactly the same float. None: keep tomli_w's."""
    if 1e-3 <= abs(value) < 1e6:
        return None
    for digits in range(17):
        text = f"{value:.{digits}e}"
        if float(text) == value:
            mantissa, exponent = text.split("e")
            return f"{mantissa}e{int(exponent)}"
    return None


def same_value(a, b) -> bool:
    """TOML-level equality: 4 and 4.0 are the same number, true is not 1, lists compare item by item."""
    if isinstance(a, bool) or isinstance(b, bool):
        return type(a) is type(b) and a == b
    if isinstance(a, int | float) and isinstance(b, int | float):
        return a == b
    if isinstance(a, list | tuple) and isinstance(b, list | tuple):
        return len(a) == len(b) and all(same_value(x, y) for x, y in zip(a, b, strict=True))
    if isinstance(a, dict) and isinstance(b, dict):
        return a.keys() == b.keys() and all(same_value(a[k], b[k]) for k in a)
    return type(a) is type(b) and a == b


def _trailing_comment(line: str, key: str, old) -> str:
    """The ' # ...' that follows the value on a key line ('' when none), found by checking which '#'
    ends the value (a '#' may also stand inside a string)."""
    pos = line.find("#")
    while pos >= 0:
        head = line[:pos]
        try:
            parsed = loads(head + "\n")
        except ValueError:
            parsed = None
        if parsed is not None and key in parsed and same_value(parsed[key], old):
            return head[len(head.rstrip()):] + line[pos:]
        pos = line.find("#", pos + 1)
    return ""


def render_table(couple_id: str, values: dict, eol: str = "") -> list[str]:
    """Lines (without '\n') of a couple table: header, then `key = value` in the documented field order.
    eol: "\r" for a file with CRLF line ends."""
    keys = sorted(values, key=lambda k: _ORDER.get(k, len(_ORDER)))
    out = [f"[couple.{format_key(couple_id)}]{eol}"]
    out += [f"{format_key(k)} = {format_value(values[k])}{eol}" for k in keys]
    return out


class TableEditor:
    """Edits of one library file's text, one couple table at a time. Each method returns new text."""

    def __init__(self, text: str):
        self.text = text
        self.crlf = "\r\n" in text
        self.index = LineIndex.scan(text)

    def _eol(self) -> str:
        return "\r" if self.crlf else ""

    def render(self, couple_id: str, values: dict) -> list[str]:
        """Lines of a new table in this file's line-ending style."""
        return render_table(couple_id, values, self._eol())

    def _region(self, couple_id: str) -> tuple[int, int]:
        """0-based (header line, end line) of a couple's table; TableEditError when it cannot be edited."""
        span = self.index.couples.get(couple_id)
        if span is None:
            raise TableEditError(f"couple {couple_id}: no [couple.{couple_id}] table in the file; expected the "
                                 "couple written as its own table")
        for cid, _first, again in self.index.duplicates:
            if cid == couple_id:
                raise TableEditError(f"couple {couple_id}: declared twice (lines {span.line} and {again}); "
                                     "expected one table per id: fix the file by hand first")
        for t in self.index.tables:
            if len(t.key) > 2 and t.key[:2] == ("couple", couple_id):
                raise TableEditError(
                    f"couple {couple_id}: has a sub-table [{'.'.join(t.key)}] at line {t.line}; crossrate edits "
                    "couples written without sub-tables (bonds = [{count = ..., delta_d = ..., f_ox = ..., "
                    "f_red = ...}])")
        return span.line - 1, span.end_line - 1

    def _items(self, lines: list[str], start: int, end: int):
        """Items of a table body: ("pass", i, j) for comment/blank/other lines, ("kv", i, j, key, value)."""
        items = []
        i = start + 1
        while i < end:
            ln = lines[i]
            st = ln.strip()
            if not st or st.startswith("#") or not KEY_LINE.match(ln):
                items.append(("pass", i, i + 1))
                i += 1
                continue
            for j in range(i + 1, end + 1):
                try:
                    parsed = loads("\n".join(lines[i:j]) + "\n")
                except ValueError:
                    continue
                if len(parsed) == 1:
                    (key, value), = parsed.items()
                    items.append(("kv", i, j, key, value))
                    i = j
                    break
            else:
                items.append(("pass", i, i + 1))
                i += 1
        return items

    @staticmethod
    def _content_end(items, start: int) -> int:
        kv_ends = [it[2] for it in items if it[0] == "kv"]
        return max(kv_ends) if kv_ends else start + 1

    def insert(self, couple_id: str, values: dict) -> str:
        """Append a new table at the end of the file (after one blank line)."""
        if couple_id in self.index.couples:
            raise TableEditError(f"couple {couple_id}: already in the file at line "
                                 f"{self.index.couples[couple_id].line}; expected a new id")
        text = self.text
        nl = "\r\n" if self.crlf else "\n"
        if text and not text.endswith("\n"):
            text += nl
        if text.strip() and not text.endswith(nl + nl) and text != nl:
            text += nl
        return text + "".join(line + "\n" for line in self.render(couple_id, values))

    def insert_many(self, tables: list[tuple[str, dict]]) -> str:
        """Append several new tables at the end of the file, one blank line before each (as insert does)."""
        if not tables:
            return self.text
        seen = set()
        for cid, _ in tables:
            if cid in self.index.couples:
                raise TableEditError(f"couple {cid}: already in the file at line {self.index.couples[cid].line}; "
                                     "expected a new id")
            if cid in seen:
                raise TableEditError(f"couple {cid}: given twice; expected each new id once")
            seen.add(cid)
        (first_id, first_values), rest = tables[0], tables[1:]
        nl = "\r\n" if self.crlf else "\n"
        parts = [self.insert(first_id, first_values)]
        parts += [nl + "".join(line + "\n" for line in self.render(cid, values)) for cid, values in rest]
        return "".join(parts)

    def replace(self, couple_id: str, values: dict) -> str:
        """Rewrite a table so it holds exactly `values`, changing only the lines that must change."""
        lines = self.text.split("\n")
        start, end = self._region(couple_id)
        items = self._items(lines, start, end)
        stop = self._content_end(items, start)
        eol = self._eol()
        blocks: list[tuple[str | None, list[str]]] = []
        done = set()
        for it in items:
            if it[1] >= stop:
                break
            if it[0] == "pass":
                blocks.append((None, lines[it[1]:it[2]]))
                continue
            _, i, j, key, old = it
            if key not in values or key in done:
                continue
            done.add(key)
            new = values[key]
            if same_value(old, new):
                blocks.append((key, lines[i:j]))
                continue
            first = lines[i]
            indent = first[: len(first) - len(first.lstrip(" \t"))]
            comment = _trailing_comment(first.rstrip("\r"), key, old) if j == i + 1 else ""
            blocks.append((key, [f"{indent}{format_key(key)} = {format_value(new)}{comment}{eol}"]))
        for key in sorted((k for k in values if k not in done), key=lambda k: _ORDER.get(k, len(_ORDER))):
            line = [f"{format_key(key)} = {format_value(values[key])}{eol}"]
            rank = _ORDER.get(key, len(_ORDER))
            at = None
            for n, (k, _) in enumerate(blocks):
                if k is not None and _ORDER.get(k, len(_ORDER)) < rank:
                    at = n + 1
            if at is None:
                first_kv = next((n for n, (k, _) in enumerate(blocks) if k is not None), len(blocks))
                at = first_kv
            blocks.insert(at, (key, line))
            done.add(key)
        body = [ln for _, blk in blocks for ln in blk]
        return "\n".join(lines[: start + 1] + body + lines[stop:])

    def remove(self, couple_id: str) -> str:
        """Delete a table (its header, fields and the comments inside it; one blank line after it too,
        so the blank-line rhythm of the file stays). Comments after its last field are kept."""
        lines = self.text.split("\n")
        start, end = self._region(couple_id)
        stop = self._content_end(self._items(lines, start, end), start)
        before_blank = start == 0 or not lines[start - 1].strip()
        if before_blank and stop < len(lines) - 1 and not lines[stop].strip():
            stop += 1
        elif before_blank and start > 0 and stop == len(lines) - 1 and lines[stop] == "":
            start -= 1  # the last table of the file: drop the blank line that led to it
        return "\n".join(lines[:start] + lines[stop:])

    def rename(self, old_id: str, new_id: str) -> str:
        """Change a table's id on its header line (a comment on that line is kept)."""
        if new_id in self.index.couples:
            raise TableEditError(f"couple {new_id}: already in the file at line {self.index.couples[new_id].line}; "
                                 "expected a new id")
        lines = self.text.split("\n")
        start, _ = self._region(old_id)
        head = lines[start]
        m = _HEADER_BRACKETS.match(head)
        indent = head[: len(head) - len(head.lstrip(" \t"))]
        rest = head[m.end():] if m else self._eol()
        lines[start] = f"{indent}[couple.{format_key(new_id)}]{rest}"
        return "\n".join(lines)
