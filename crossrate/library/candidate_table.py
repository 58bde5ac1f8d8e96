"""A table of computed candidate couples (CSV) read as numpy columns, for screening sets too large for TOML.

Columns (header row; any order; units as the library's fields): id, charge_ox, charge_red, E (V, all on one
potential scale the screen names), radius (angstrom), and exactly one of k_self (M^-1 s^-1) or
lambda_total (kJ/mol, the self-exchange reorganization energy); name, source and notes may be present and
are not read. Lines starting with '#' and blank lines are skipped. Every cell is checked with the rules of
the library format (schema.FIELD_SPECS ranges, charge_ox - charge_red = 1, ids of the allowed characters
and each id once). A plain ASCII file is read in one vectorized pass (numpy.loadtxt) and checked on whole columns;
when that pass finds anything wrong (or cannot read the file), a second, row-by-row pass lists every
problem as `file:line:column: ...` (LibraryError), so speed never costs a clear message.
"""

import csv
import io
import os
import warnings
from dataclasses import dataclass

import numpy as np

from ..errors import LibraryError, Problem
from .couple_import import CellProblem, _read_text
from .schema import FIELDS_BY_NAME, ID_CHARS, closest
from .validation import bad_id_message

REQUIRED = ("id", "charge_ox", "charge_red", "E", "radius")
RATE_COLUMNS = ("k_self", "lambda_total")
IGNORED = ("name", "source", "notes")
#: Widest id read in the vectorized pass (a wider one sends the file to the row-by-row pass).
ID_BYTES = 64
#: Most problems listed.
MAX_PROBLEMS = 50


@dataclass(frozen=True, eq=False)
class CandidateTable:
    """Columns of a candidate table. ids: numpy array of ids (bytes or str); z_ox, z_red: charges; E_V: V on
    the screen's scale; radius_A: angstrom; rate_column: "k_self" or "lambda_total"; rate: its values
    (M^-1 s^-1 or kJ/mol); path: the file."""

    path: str
    ids: np.ndarray
    z_ox: np.ndarray
    z_red: np.ndarray
    E_V: np.ndarray
    radius_A: np.ndarray
    rate_column: str
    rate: np.ndarray

    def __len__(self) -> int:
        return int(self.E_V.shape[0])

    def id_text(self, i: int) -> str:
        v = self.ids[i]
        return v.decode("ascii") if isinstance(v, bytes | np.bytes_) else str(v)


def _header(text: str, path: str) -> tuple[int, list[str]]:
    for lineno, raw in enumerate(io.StringIO(text, newline=""), start=1):
        if raw.strip() and not raw.lstrip().startswith("#"):
            return lineno, [c.strip() for c in next(csv.reader([raw]))]
    raise LibraryError([Problem(path, None, None, None, "no header row (empty or only comments); expected "
                                f"a header with {', '.join(REQUIRED)} and k_self or lambda_total")])


def _check_header(path: str, line: int, header: list[str]) -> str:
    problems = []
    known = (*REQUIRED, *RATE_COLUMNS, *IGNORED)
    for col, name in enumerate(header, start=1):
        if name not in known:
            hint = closest(name, known)
            problems.append(CellProblem(path, line, None, None, f"unknown column {name!r}"
                                        f"{f' (did you mean {hint}?)' if hint else ''}; expected "
                                        f"{', '.join(REQUIRED)}, k_self or lambda_total (and name, source, notes)",
                                        col))
        elif header.index(name) != col - 1:
            problems.append(CellProblem(path, line, None, None, f"column {name!r} appears twice", col))
    for name in REQUIRED:
        if name not in header:
            problems.append(CellProblem(path, line, None, None, f"missing column {name!r}", None))
    rates = [r for r in RATE_COLUMNS if r in header]
    if len(rates) != 1:
        problems.append(CellProblem(path, line, None, None, "expected exactly one of the columns k_self "
                                    f"(M^-1 s^-1) and lambda_total (kJ/mol); got {len(rates)}", None))
    if problems:
        raise LibraryError(problems)
    return rates[0]


def _in_range(name: str, v: np.ndarray) -> np.ndarray:
    s = FIELDS_BY_NAME[name]
    ok = np.isfinite(v)
    if s.low is not None:
        ok &= v > s.low if s.low_open else v >= s.low
    if s.high is not None:
        ok &= v < s.high if s.high_open else v <= s.high
    return ok


def _fast(text: str, path: str, line: int, header: list[str], rate: str) -> CandidateTable | None:
    """The table from one numpy pass, or None when anything needs the row-by-row pass."""
    if not text.isascii():
        # numpy's text reader (2.4) has crashed the whole process on some non-ASCII input (characters beyond
        # the Basic Multilingual Plane) in the fuzz tests. Ids and numbers are ASCII, so such a file is
        # unusual and the row-by-row pass, which reports each cell, reads it instead.
        return None
    cols = [*REQUIRED, rate]
    kinds = {"id": f"S{ID_BYTES}", "charge_ox": "i8", "charge_red": "i8"}
    dtype = [(c, kinds.get(c, "f8")) for c in cols]
    try:
        with warnings.catch_warnings():
            # "input contained no data": a header-only file, told in one line by the row-by-row pass
            warnings.simplefilter("ignore", UserWarning)
            a = np.loadtxt(io.StringIO(text), delimiter=",", comments="#", skiprows=line, quotechar='"', ndmin=1,
                           usecols=[header.index(c) for c in cols], dtype=dtype, encoding=None)
    except ValueError:
        return None
    if a.shape[0] == 0:
        return None
    ids = np.ascontiguousarray(a["id"])
    raw = ids.view(np.uint8).reshape(ids.shape[0], ID_BYTES)
    allowed = np.zeros(256, dtype=bool)
    allowed[[ord(ch) for ch in ID_CHARS]] = True
    allowed[0] = True  # padding after a shorter id
    if raw[:, -1].any() or not allowed[raw].all() or not raw[:, 0].all():
        return None
    z_ox, z_red = a["charge_ox"], a["charge_red"]
    ok = ((z_ox >= -10) & (z_ox <= 10) & (z_red >= -10) & (z_red <= 10) & (z_ox - z_red == 1)
          & _in_range("E", a["E"]) & _in_range("radius", a["radius"]) & _in_range(rate, a[rate]))
    if not ok.all() or _has_duplicates(raw):
        return None
    return CandidateTable(path, ids, z_ox, z_red, a["E"], a["radius"], rate, a[rate])


def _has_duplicates(raw: np.ndarray) -> bool:
    """Whether any two ids (rows of bytes) are equal: a 64-bit hash of each, sorted; equal hashes are
    compared byte for byte."""
    words = raw.view("<u8")
    h = words[:, 0].copy()
    with np.errstate(over="ignore"):
        for k in range(1, words.shape[1]):
            h = (h * np.uint64(0x100000001B3)) ^ words[:, k]
    order = np.argsort(h, kind="stable")
    hs = h[order]
    same = np.flatnonzero(hs[1:] == hs[:-1])
    return any(bytes(raw[order[i]]) == bytes(raw[order[i + 1]]) for i in same)


def _slow(text: str, path: str, line: int, header: list[str], rate: str) -> CandidateTable:
    """Row by row with the csv module: every problem with its line and column, or the table."""
    problems: list[Problem] = []
    col = {name: i for i, name in enumerate(header)}
    reader = csv.reader(io.StringIO(text, newline=""))
    values = {c: [] for c in (*REQUIRED, rate)}
    seen: dict[str, int] = {}
    end = 0
    for cells in reader:
        start, end = end + 1, reader.line_num
        if start <= line or not cells or all(not c.strip() for c in cells) or cells[0].lstrip().startswith("#"):
            continue
        if len(problems) >= MAX_PROBLEMS:
            break
        if len(cells) != len(header):
            problems.append(CellProblem(path, start, None, None, f"{len(cells)} cells; expected {len(header)}"))
            continue
        cid = cells[col["id"]].strip()
        bad = bad_id_message(cid) or (f"id also on line {seen[cid]}; expected each id once" if cid in seen else None)
        if bad:
            problems.append(CellProblem(path, start, cid or None, None, bad, col["id"] + 1))
        seen.setdefault(cid, start)
        row = {"id": cid}
        for name in (*REQUIRED[1:], rate):
            spec, cell = FIELDS_BY_NAME[name], cells[col[name]].strip()
            where = (path, start, cid, name)
            try:
                v = int(cell) if spec.kind == "integer" else float(cell)
            except ValueError:
                what = "empty" if not cell else f"got {cell!r}"
                problems.append(CellProblem(*where, f"{what}; expected {spec.expected()}", col[name] + 1))
                continue
            if not spec.in_range(v) or v != v:
                problems.append(CellProblem(*where, f"got {cell}; expected {spec.expected()}", col[name] + 1))
            row[name] = v
        zo, zr = row.get("charge_ox"), row.get("charge_red")
        if zo is not None and zr is not None and zo - zr != 1:
            problems.append(CellProblem(path, start, cid, "charge_ox", f"charge_ox - charge_red = {zo - zr}; "
                                        "expected exactly 1 (a one-electron couple)", col["charge_ox"] + 1))
        if not problems:
            for k, v in row.items():
                values[k].append(v)
    if not problems and not values["id"]:
        problems.append(Problem(path, None, None, None, "a header but no candidates; expected one row each"))
    if problems:
        more = [] if len(problems) < MAX_PROBLEMS else [Problem(path, None, None, None, "(first problems only)")]
        raise LibraryError(problems[:MAX_PROBLEMS] + more)
    return CandidateTable(path, np.array(values["id"], dtype=object), np.array(values["charge_ox"]),
                          np.array(values["charge_red"]), np.array(values["E"], dtype=float),
                          np.array(values["radius"], dtype=float), rate, np.array(values[rate], dtype=float))


def read_candidate_table(path) -> CandidateTable:
    """The candidate couples of a CSV file (columns in the module docstring). LibraryError listing every
    problem as file:line:column (nothing is computed from a file with any)."""
    p = os.fspath(path)
    text = _read_text(p)
    line, header = _header(text, p)
    rate = _check_header(p, line, header)
    return _fast(text, p, line, header, rate) or _slow(text, p, line, header, rate)
