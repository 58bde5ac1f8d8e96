"""Reading one library file: bytes -> text -> TOML -> validated couples, or every problem at once.

`read_library_file(path)` returns a LibraryFile (title, defaults, scales, couples with their origin,
the raw text and the sha256 of the bytes read, which the safe writer checks before overwriting).
Anything wrong raises LibraryError whose problems each name the file and the line.
"""

import gc
import hashlib
import os
import re
import stat
from contextlib import contextmanager
from dataclasses import dataclass

from ..core.potential_scales import PotentialScale, builtin_scales
from ..core.solvents import solvent_table
from ..errors import ColumnProblem, LibraryError, Problem
from .couple import Couple
from .library_header import check_top_level, read_library_header
from .line_index import LineIndex
from .schema import FIELDS_BY_NAME
from .toml_loads import TOMLDecodeError, loads
from .validation import ValidationContext, describe, validate_couple

_AT = re.compile(r"\(at line (\d+), column (\d+)\)")


#: A TOML syntax or encoding problem, with its column.
TomlSyntaxProblem = ColumnProblem


@dataclass(frozen=True, eq=False)
class LibraryFile:
    """One validated library file.

    path: as given; layer: "bundled", "group", "personal" or "cli"; defaults: medium / temperature (K) /
    E_scale given in [library]; scales: the file's own potential scales; couples: in file order, each
    with an Origin; text: the file's text; sha256: hex digest of the bytes read; raw: the parsed TOML;
    index: line numbers of tables and fields.
    """

    path: str
    layer: str
    title: str
    description: str
    defaults: dict
    scales: dict[str, PotentialScale]
    couples: list[Couple]
    text: str
    sha256: str
    raw: dict
    index: LineIndex

    def couple(self, couple_id: str) -> Couple | None:
        for c in self.couples:
            if c.id == couple_id:
                return c
        return None


def sha256_of(data: bytes) -> str:
    """Hex sha256 of the file's bytes (what the writer compares against)."""
    return hashlib.sha256(data).hexdigest()


def read_library_bytes(path) -> bytes:
    """The file's bytes; LibraryError (naming the file) when it cannot be read or is not a regular file (a
    FIFO or a device is refused at once: it is opened without waiting for a writer and never read)."""
    p = os.fspath(path)

    def refuse(what: str):
        return LibraryError([Problem(p, None, None, None, f"{what}; expected a library TOML file")])

    try:
        fd = os.open(p, os.O_RDONLY | os.O_NONBLOCK)
    except FileNotFoundError:
        raise refuse("no such file") from None
    except IsADirectoryError:
        raise refuse("is a folder") from None
    except OSError as exc:
        raise LibraryError([Problem(p, None, None, None, f"cannot be read ({exc.strerror or exc}); "
                                    "expected a readable library TOML file")]) from None
    try:
        mode = os.fstat(fd).st_mode
        if stat.S_ISDIR(mode):
            raise refuse("is a folder")
        if not stat.S_ISREG(mode):
            kind = "a named pipe (FIFO)" if stat.S_ISFIFO(mode) else "a socket" if stat.S_ISSOCK(mode) else "a device"
            raise refuse(f"is {kind}, not a regular file")
        with os.fdopen(fd, "rb", closefd=False) as fh:
            return fh.read()
    except OSError as exc:
        raise LibraryError([Problem(p, None, None, None, f"cannot be read ({exc.strerror or exc}); "
                                    "expected a readable library TOML file")]) from None
    finally:
        os.close(fd)


def read_library_file(path, layer: str = "cli",
                      known_scales: dict[str, PotentialScale] | None = None) -> LibraryFile:
    """Read and validate one library file.

    path: file path; layer: layer name recorded in each couple's Origin; known_scales: potential scales
    defined by earlier layers that this file may use. Raises LibraryError listing every problem.
    """
    p = os.fspath(path)
    data = read_library_bytes(p)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = data.count(b"\n", 0, exc.start) + 1
        col = exc.start - (data.rfind(b"\n", 0, exc.start) + 1) + 1
        raise LibraryError([TomlSyntaxProblem(
            p, line, None, None, f"not UTF-8 text (byte 0x{data[exc.start]:02x}); expected a UTF-8 encoded "
            "TOML file", col)]) from None
    return parse_library_text(text, p, layer, known_scales, sha256_of(data))


def _syntax_problem(path: str, exc: Exception, index: LineIndex) -> Problem:
    line = getattr(exc, "lineno", None)
    col = getattr(exc, "colno", None)
    msg = getattr(exc, "msg", None) or str(exc)
    m = _AT.search(str(exc))
    if line is None and m:
        line, col = int(m.group(1)), int(m.group(2))
    msg = _AT.sub("", msg).strip()
    couple = None
    for cid, span in index.couples.items():
        if line is not None and span.line <= line < span.end_line:
            couple = cid
            break
    return TomlSyntaxProblem(path, line, couple, None, f"TOML syntax error: {msg}; expected valid TOML "
                             "(see libraries/README.md for the format)", col)


def _parse(text: str, path: str, index: LineIndex) -> tuple[dict | None, list[Problem]]:
    """tomli's dict for the text, with a duplicated [couple.<id>] reported in our own words and the
    rest of the file still parsed (the repeated tables blanked, so line numbers stay)."""
    problems: list[Problem] = []
    for cid, first, again in index.duplicates:
        problems.append(Problem(path, again, cid, None, f"duplicate id: already defined at line {first}; "
                                "expected each id once per file"))
    try:
        return loads(text), problems
    except (TOMLDecodeError, ValueError, RecursionError) as exc:  # ValueError: e.g. an integer of 5,000 digits
        first_exc = exc
    if index.duplicates:
        lines = text.split("\n")
        dup_lines = {again for _, _, again in index.duplicates}
        for span in index.tables:
            if span.line in dup_lines:
                for i in range(span.line - 1, span.end_line - 1):
                    lines[i] = ""
        try:
            return loads("\n".join(lines)), problems
        except (TOMLDecodeError, ValueError, RecursionError) as exc:
            first_exc = exc
    return None, problems + [_syntax_problem(path, first_exc, index)]


def _dotted_id_problems(cid: str, craw, path: str, index: LineIndex, problems: list[Problem]) -> bool:
    """Report `[couple.fe.phen3]` (an id with '.' left unquoted, which TOML reads as nested tables) in
    one line per table instead of a list of missing fields. True when that is what happened."""
    if type(craw) is not dict or not craw:
        return False
    if any(type(v) is not dict or k in FIELDS_BY_NAME for k, v in craw.items()):
        return False
    subs = [t for t in index.tables if len(t.key) > 2 and t.key[:2] == ("couple", cid)]
    if not subs:
        return False
    for t in subs:
        full = ".".join(t.key[1:])
        problems.append(Problem(path, t.line, full, None, "an id containing '.' must be quoted; expected "
                                f'[couple."{full}"]'))
    return True


@contextmanager
def gc_paused():
    """Pause the cyclic garbage collector while a file is parsed and validated.

    Loading allocates ten-odd small objects per field and none of them form cycles; with the collector on,
    each of its passes walks the whole growing tree of tomli's dicts again, which made a 10,000-couple
    load about 40 % slower here. The previous state is restored even on error.
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


def parse_library_text(text: str, path: str, layer: str = "cli",
                       known_scales: dict[str, PotentialScale] | None = None,
                       sha256: str | None = None) -> LibraryFile:
    """Validate a library's text (what read_library_file does after reading; the writer checks new
    text with it before replacing a file). Raises LibraryError listing every problem."""
    with gc_paused():
        return _parse_library_text(text, path, layer, known_scales, sha256)


def _parse_library_text(text, path, layer, known_scales, sha256) -> LibraryFile:
    if sha256 is None:
        sha256 = sha256_of(text.encode("utf-8"))
    if text.startswith("\ufeff"):
        raise LibraryError([TomlSyntaxProblem(path, 1, None, None, "starts with a byte-order mark; expected UTF-8 "
                                              "without BOM (save the file as plain UTF-8)", 1)])
    index = LineIndex.scan(text)
    raw, problems = _parse(text, path, index)
    if raw is None:
        raise LibraryError(problems)
    problems += check_top_level(raw, path, index)
    header, hp = read_library_header(raw, path, index, known_scales)
    problems += hp
    couples_raw = raw.get("couple", {})
    couples: list[Couple] = []
    if type(couples_raw) is not dict:
        span = index.table("couple")
        problems.append(Problem(path, span.line if span else dict(index.top_fields).get("couple"), None, "couple",
                                f"got {describe(couples_raw)}; expected [couple.<id>] tables"))
        couples_raw = {}
    ctx = ValidationContext(
        path=path,
        layer=layer,
        defaults=header.defaults,
        scales=frozenset(builtin_scales()) | frozenset(known_scales or ()) | frozenset(header.scales),
        media=frozenset(solvent_table()),
    )
    spans = index.couples
    couple_table = index.table("couple")
    fallback_line = couple_table.line if couple_table else None
    for cid, craw in couples_raw.items():
        span = spans.get(cid)
        if span is None and _dotted_id_problems(cid, craw, path, index, problems):
            continue
        res = validate_couple(cid, craw, ctx, span, fallback_line)
        if res.__class__ is Couple:
            couples.append(res)
        else:
            problems.extend(res)
    if problems:
        problems.sort(key=lambda q: q.line or 0)
        raise LibraryError(problems)
    return LibraryFile(
        path=path,
        layer=layer,
        title=header.title,
        description=header.description,
        defaults=header.defaults,
        scales=header.scales,
        couples=couples,
        text=text,
        sha256=sha256,
        raw=raw,
        index=index,
    )
