"""Line numbers of tables and fields in a library file, by a fast scan of its text.

tomli returns plain dicts without positions, so the reader scans the text once more to learn on which
line each `[couple.<id>]` table and each of its fields stands (for messages, `show`, and the editor).
The scan is line-based: a header is a line starting with `[`, a field a line starting with `key =`.
Headers are found for the whole file at once; the field lines of a table are scanned the first time
someone asks for them (a message, `show`, the editor), which keeps a 10,000-couple file quick to load.
Lines inside multi-line strings are skipped (a slower, eager path used only when the text has any).
"""

import re
from functools import cached_property

from .couple import Origin

_KEY = r'(?:[A-Za-z0-9_-]+|"(?:[^"\\\n]|\\.)*"|\'[^\'\n]*\')'


class _Patterns:
    """The scanner's regular expressions, each compiled on first use: compiling them all costs a cold command
    about 1 ms, and a library read from the load cache (load_cache) is never scanned."""

    @cached_property
    def header_start(self) -> re.Pattern:
        return re.compile(r"^[ \t]*\[", re.M)

    @cached_property
    def simple_couple(self) -> re.Pattern:
        return re.compile(r"[ \t]*\[couple\.([a-z0-9_-]+)\][ \t]*(?:#[^\n]*)?\r?$", re.M)

    @cached_property
    def line(self) -> re.Pattern:
        # One match per line: group 1 a quoted key or header candidate (looked at again), group 2 a bare key.
        return re.compile(r"^[ \t]*(?:([\[\"'])|([A-Za-z0-9_-]+)[ \t]*[=.])?", re.M)

    @cached_property
    def key_line(self) -> re.Pattern:
        """A line that starts with a key (bare or quoted) followed by "=" (or "." of a dotted key)."""
        return re.compile(r"[ \t]*(" + _KEY + r")[ \t]*[=.]")

    @cached_property
    def header(self) -> re.Pattern:
        return re.compile(
            r"^\[(\[)?[ \t]*(" + _KEY + r"(?:[ \t]*\.[ \t]*" + _KEY + r")*)[ \t]*\](\])?[ \t]*(?:#[^\n]*)?\r?$"
        )

    @cached_property
    def key_part(self) -> re.Pattern:
        return re.compile(_KEY)


_RE = _Patterns()


def __getattr__(name: str):
    """KEY_LINE: a line that starts with a key followed by "=" (or "."), compiled on first use (see _Patterns)."""
    if name == "KEY_LINE":
        return _RE.key_line
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")


def _unquote(part: str) -> str:
    if part[0] == "'":
        return part[1:-1]
    if part[0] == '"':
        if "\\" not in part:
            return part[1:-1]
        # here, not at import: only an escaped quoted key needs the parser (not a cache hit)
        from .toml_loads import loads

        try:
            return loads(f"k = {part}")["k"]
        except ValueError:
            return part[1:-1]
    return part


def parse_header(line: str) -> tuple[tuple[str, ...], bool] | None:
    """(key path, is-array) of a table header line, or None when the line is not a header."""
    m = _RE.header.match(line.lstrip(" \t"))
    if m is None:
        return None
    if bool(m.group(1)) != bool(m.group(3)):
        return None
    parts = tuple(_unquote(p) for p in _RE.key_part.findall(m.group(2)))
    return parts, bool(m.group(1))


def _scan_fields(text: str, start: int, end: int, header_line: int) -> tuple[tuple[str, int], ...]:
    """(key, line) of the key lines in text[start:end], start being the first line after a header."""
    out = []
    lineno = header_line
    lines = None
    for other, key in _RE.line.findall(text, start, end):
        lineno += 1
        if key:
            out.append((key, lineno))
        elif other and other != "[":
            if lines is None:
                lines = text[start:end].split("\n")
            m = _RE.key_line.match(lines[lineno - header_line - 1])
            if m:
                out.append((_unquote(m.group(1)), lineno))
    return tuple(out)


class TableSpan:
    """One table header and the lines it governs.

    key: the header's key path, e.g. ("couple", "fe-aqua"); line: 1-based line of the header;
    end_line: 1-based line of the next header (or one past the last line); array: a [[...]] header;
    fields: (first key part, 1-based line) of each key line under the header, in file order.
    """

    __slots__ = ("key", "line", "end_line", "array", "_text", "_start", "_end", "_fields")

    def __init__(self, key, line, end_line, array, fields=None, text="", start=0, end=0):
        self.key: tuple[str, ...] = key
        self.line: int = line
        self.end_line: int = end_line
        self.array: bool = array
        self._fields = fields
        self._text, self._start, self._end = text, start, end

    @property
    def fields(self) -> tuple[tuple[str, int], ...]:
        if self._fields is None:
            self._fields = _scan_fields(self._text, self._start, self._end, self.line)
            self._text = ""  # the span no longer needs the file's text
        return self._fields

    def field_line(self, name: str) -> int:
        """Line of a field (the header's line when the field has no line of its own)."""
        for k, ln in self.fields:
            if k == name:
                return ln
        return self.line

    def __eq__(self, other):
        if not isinstance(other, TableSpan):
            return NotImplemented
        return (self.key, self.line, self.end_line, self.array, self.fields) == (
            other.key, other.line, other.end_line, other.array, other.fields)

    __hash__ = None

    def __repr__(self):
        return (f"TableSpan(key={self.key!r}, line={self.line}, end_line={self.end_line}, "
                f"array={self.array}, fields={self.fields!r})")


class IndexedOrigin(Origin):
    """An Origin whose field_lines are read from the file's line index on first use.

    Behaves as Origin in every way (equality with any Origin, hash, repr, line_of, pickling).
    """

    def __init__(self, path: str, line: int, layer: str = "cli", field_lines=None, *, span: TableSpan | None = None):
        object.__setattr__(self, "path", path)
        object.__setattr__(self, "line", line)
        object.__setattr__(self, "layer", layer)
        object.__setattr__(self, "_span", span)
        object.__setattr__(self, "_lines", None if field_lines is None else tuple(field_lines))

    @property
    def field_lines(self) -> tuple[tuple[str, int], ...]:  # type: ignore[override]
        if self._lines is None:
            object.__setattr__(self, "_lines", self._span.fields if self._span is not None else ())
        return self._lines

    def __eq__(self, other):
        if not isinstance(other, Origin):
            return NotImplemented
        return (self.path, self.line, self.layer, self.field_lines) == (
            other.path, other.line, other.layer, other.field_lines)

    def __hash__(self):
        return hash((self.path, self.line, self.layer, self.field_lines))

    def __reduce__(self):
        return (Origin, (self.path, self.line, self.layer, self.field_lines))


class LineIndex:
    """Where each table and field of one library file stands.

    tables: every header in file order; couples: id -> the first `[couple.<id>]` span;
    duplicates: (id, first line, repeated line) for ids declared twice; top_fields: key lines before
    the first header; n_lines: number of lines.
    """

    def __init__(self, tables, top_fields, n_lines):
        self.tables: list[TableSpan] = tables
        self.top_fields: tuple[tuple[str, int], ...] = top_fields
        self.n_lines: int = n_lines
        self.couples: dict[str, TableSpan] = {}
        self.duplicates: list[tuple[str, int, int]] = []
        for t in tables:
            if len(t.key) == 2 and t.key[0] == "couple":
                first = self.couples.get(t.key[1])
                if first is None:
                    self.couples[t.key[1]] = t
                else:
                    self.duplicates.append((t.key[1], first.line, t.line))

    @classmethod
    def scan(cls, text: str) -> "LineIndex":
        """Scan a file's text (lines split on '\\n', as TOML counts them)."""
        if '"""' in text or "'''" in text:
            return cls._scan_slow(text)
        count, find = text.count, text.find
        simple = _RE.simple_couple.match
        heads = []  # (start offset, line, key, array)
        line, last = 1, 0
        for m in _RE.header_start.finditer(text):
            s = m.start()
            line += count("\n", last, s)
            last = s
            sm = simple(text, s)
            if sm is not None:
                heads.append((s, line, ("couple", sm.group(1)), False))
                continue
            eol = find("\n", s)
            parsed = parse_header(text[s:eol if eol >= 0 else len(text)])
            if parsed is not None:
                heads.append((s, line, parsed[0], parsed[1]))
        n_lines = count("\n") + 1
        tables = []
        for i, (s, ln, key, array) in enumerate(heads):
            nxt = heads[i + 1] if i + 1 < len(heads) else None
            body = find("\n", s)
            body = len(text) if body < 0 else body + 1
            end = nxt[0] if nxt else len(text)
            tables.append(TableSpan(key, ln, nxt[1] if nxt else n_lines + 1, array, None, text, body, end))
        top_end = heads[0][0] if heads else len(text)
        top = _scan_fields(text, 0, top_end, 0)
        return cls(tables, top, n_lines)

    @classmethod
    def _scan_slow(cls, text: str) -> "LineIndex":
        tables: list[TableSpan] = []
        cur_key: tuple[str, ...] | None = None
        cur_line, cur_array = 0, False
        fields: list[tuple[str, int]] = []
        top: tuple[tuple[str, int], ...] = ()
        state: str | None = None
        lines = text.split("\n")
        for lineno, line in enumerate(lines, start=1):
            if state is None:
                stripped = line.lstrip(" \t")
                if stripped[:1] == "[":
                    parsed = parse_header(stripped)
                    if parsed is not None:
                        if cur_key is None:
                            top = tuple(fields)
                        else:
                            tables.append(TableSpan(cur_key, cur_line, lineno, cur_array, tuple(fields)))
                        cur_key, cur_array = parsed
                        cur_line, fields = lineno, []
                else:
                    m = _RE.key_line.match(line)
                    if m:
                        fields.append((_unquote(m.group(1)), lineno))
            if state is not None or '"""' in line or "'''" in line:
                state = _opens_multiline(line, state)
        n_lines = len(lines)
        if cur_key is None:
            top = tuple(fields)
        else:
            tables.append(TableSpan(cur_key, cur_line, n_lines + 1, cur_array, tuple(fields)))
        return cls(tables, top, n_lines)

    def table(self, *key: str) -> TableSpan | None:
        """The first span with exactly this header key path."""
        for t in self.tables:
            if t.key == key:
                return t
        return None

    def couple_line(self, couple_id: str) -> int | None:
        span = self.couples.get(couple_id)
        return span.line if span else None

    def field_line(self, couple_id: str, name: str) -> int | None:
        """Line of a couple's field (the table's line when the field is not on its own line)."""
        span = self.couples.get(couple_id)
        return span.field_line(name) if span else None


def _opens_multiline(line: str, state: str | None) -> str | None:
    """Multi-line string delimiter still open at the end of `line` (None when closed), given the state
    at its start. A small tokenizer: it knows comments, one-line strings and triple-quoted strings."""
    i, n = 0, len(line)
    while i < n:
        if state is not None:
            j = line.find(state, i)
            if j < 0:
                return state
            # a run of more than three quotes closes with the last three
            j += 3
            while j < n and line[j] == state[0]:
                j += 1
            i, state = j, None
            continue
        c = line[i]
        if c == "#":
            return None
        if c in "\"'":
            if line.startswith(c * 3, i):
                state, i = c * 3, i + 3
                continue
            j = i + 1
            while j < n and line[j] != c:
                j += 2 if (c == '"' and line[j] == "\\") else 1
            i = j + 1
            continue
        i += 1
    return state
