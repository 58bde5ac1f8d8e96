"""Couples from a spreadsheet: a CSV file whose columns are the library's field names, into a library file.

The first row that is not blank and not a comment (a row whose first cell starts with '#') is the header:
`id` and any of the field names of schema.FIELD_SPECS, in any order; `layer`, `path` and `line` (written
by `crossrate library export --format csv`) are accepted and ignored. Each further row is one couple, in
the units of the library format (V, M^-1 s^-1, angstrom, kJ/mol, M, K, eV, g/mol). An empty cell leaves the
field out (the target file's [library] defaults then apply to medium, temperature and E_scale). Cells:
numbers as written (1.5e8); charges as whole numbers; `verified` true/false; `tags` separated by ';' (or a
TOML list ["a", "b"] when a tag holds a ';'); `bonds` in their TOML inline form; `date` as YYYY-MM-DD.
Text cells are taken exactly as written (spaces kept), less the apostrophe the export puts before a text
a spreadsheet would take for a formula (=, +, -, @).

Every problem of the file is reported at once as `file:line:column: couple <id>: field <name>: ...` and
nothing is written when there is any; the whole import is one checked write of the safe writer (see
couple_edits.put_couples), which keeps every comment and untouched line of the target file.
"""

import csv
import io
import os
from dataclasses import dataclass
from pathlib import Path

from ..core.potential_scales import PotentialScale, builtin_scales
from ..core.solvents import solvent_table
from ..errors import ColumnProblem, LibraryError, Problem
from .couple import Couple
from .couple_edits import put_couples
from .schema import FIELDS_BY_NAME, closest, parse_field_text
from .spreadsheet_cells import from_spreadsheet_cell
from .toml_loads import loads
from .toml_reader import read_library_file
from .validation import ValidationContext, bad_id_message, validate_couple

#: Columns `library export --format csv` adds that say where a couple was read; ignored on import.
WHERE_COLUMNS = ("layer", "path", "line")
#: Field kinds whose cell is taken exactly as written (no stripping of spaces).
_VERBATIM_KINDS = ("text",)


#: A problem in one CSV cell (column: 1-based position in the row).
CellProblem = ColumnProblem


@dataclass(frozen=True)
class ImportResult:
    """What an import did: ids added and ids replaced (in CSV order), the file written and its new sha256."""

    added: tuple[str, ...]
    replaced: tuple[str, ...]
    path: str
    sha256: str
    created: bool


def parse_tags_cell(text: str) -> list[str]:
    """Tags from a cell: a TOML list when the cell starts with '[', else separated by ';' (spaces trimmed).
    ValueError with an 'expected ...' text for a malformed list."""
    s = text.strip()
    if s.startswith("["):
        try:
            value = loads(f"tags = {s}")["tags"]
        except ValueError:
            raise ValueError(f'{s!r}: expected tags separated by ";" or a TOML list such as ["a", "b"]') from None
        return value
    return [t.strip() for t in s.split(";") if t.strip()]


def _read_text(path: str) -> str:
    """The CSV's text (UTF-8, a spreadsheet's byte-order mark allowed); LibraryError naming file, line and
    column for bytes that are not UTF-8."""
    if os.path.exists(path) and not os.path.isdir(path) and not os.path.isfile(path):
        # a FIFO would wait for a writer forever, a device might never end
        raise LibraryError([Problem(path, None, None, None, "is a pipe or a device, not a regular file; expected a "
                                    "CSV file of couples")])
    try:
        with open(path, "rb") as fh:
            data = fh.read()
    except FileNotFoundError:
        raise LibraryError([Problem(path, None, None, None, "no such file; expected a CSV file of couples")]) from None
    except IsADirectoryError:
        raise LibraryError([Problem(path, None, None, None, "is a folder; expected a CSV file of couples")]) from None
    except OSError as exc:
        raise LibraryError([Problem(path, None, None, None, f"cannot be read ({exc.strerror or exc}); expected a "
                                    "readable CSV file of couples")]) from None
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        start = 3 if data.startswith(b"\xef\xbb\xbf") else 0
        before = data[start:exc.start]
        col = len(before[before.rfind(b"\n") + 1:].decode("utf-8", errors="replace")) + 1
        raise LibraryError([CellProblem(path, before.count(b"\n") + 1, None, None,
                                        f"not UTF-8 text (byte 0x{data[exc.start]:02x}); expected a UTF-8 encoded "
                                        "CSV file (save it as 'CSV UTF-8' from a spreadsheet)", col)]) from None


def _rows(text: str, path: str, problems: list[Problem]):
    """(first line, cells) of each row that is not blank and not a comment; multi-line quoted cells allowed."""
    reader = csv.reader(io.StringIO(text, newline=""), strict=True)
    end = 0
    while True:
        start = end + 1
        try:
            cells = next(reader)
        except StopIteration:
            return
        except csv.Error as exc:
            problems.append(CellProblem(path, start, None, None, f"malformed CSV ({exc}); expected "
                                        "comma-separated cells, text with commas or quotes in double quotes"))
            return
        end = reader.line_num
        if not cells or all(not c.strip() for c in cells) or cells[0].lstrip().startswith("#"):
            continue
        yield start, cells


def _check_header(path: str, line: int, header: list[str], problems: list[Problem]) -> bool:
    ok = True
    seen: dict[str, int] = {}
    for col, name in enumerate(header, start=1):
        if name in seen:
            problems.append(CellProblem(path, line, None, None, f"column {name!r} appears twice (also column "
                                        f"{seen[name]}); expected each column once", col))
            ok = False
        seen.setdefault(name, col)
        if name not in FIELDS_BY_NAME and name != "id" and name not in WHERE_COLUMNS:
            hint = closest(name, ["id", *FIELDS_BY_NAME])
            did = f" (did you mean {hint}?)" if hint else ""
            problems.append(CellProblem(path, line, None, None, f"unknown column {name!r}{did}; expected id and the "
                                        "field names of libraries/README.md", col))
            ok = False
    if "id" not in seen:
        problems.append(CellProblem(path, line, None, None, "no id column; expected a header row with id and the "
                                    "field names (name, charge_ox, charge_red, E, ...)", 1))
        ok = False
    return ok


def _cell_value(name: str, cell: str):
    """The raw (TOML-like) value of a cell for validate_couple, None for an empty cell. ValueError when the
    cell cannot be read at all."""
    spec = FIELDS_BY_NAME[name]
    if spec.kind in _VERBATIM_KINDS:
        return cell if cell != "" else None
    if not cell.strip():
        return None
    if spec.kind == "text list":
        return parse_tags_cell(cell)
    if spec.kind in ("doi", "date", "medium", "scale", "choice"):
        return cell.strip()
    return parse_field_text(name, cell)


def read_couples_csv(path, defaults: dict | None = None,
                     known_scales: dict[str, PotentialScale] | None = None,
                     taken: dict[str, str] | None = None) -> list[Couple]:
    """Validated couples of a CSV file, in row order, each with its row's line as origin.

    defaults: the target file's [library] defaults (medium, temperature K, E_scale); known_scales: custom
    potential scales the couples may use (the target file's and the layers' below it); taken: ids that are
    refused, each with where it stands already ("lib.toml (line 12)"). Raises LibraryError listing every
    problem of the file (`path:line:column: ...`).
    """
    taken = taken or {}
    p = os.fspath(path)
    text = _read_text(p)
    problems: list[Problem] = []
    ctx = ValidationContext(p, "cli", dict(defaults or {}),
                            frozenset(builtin_scales()) | frozenset(known_scales or ()), frozenset(solvent_table()))
    header: list[str] | None = None
    columns: dict[str, int] = {}
    couples: list[Couple] = []
    first_line: dict[str, int] = {}
    for line, cells in _rows(text, p, problems):
        if header is None:
            header = [c.strip() for c in cells]
            if not _check_header(p, line, header, problems):
                break
            columns = {name: i for i, name in enumerate(header, start=1)}
            continue
        if len(cells) != len(header):
            problems.append(CellProblem(p, line, None, None, f"{len(cells)} cells; expected {len(header)}, one per "
                                        f"column of the header", None))
            continue
        # the apostrophe export puts before a text a spreadsheet would take for a formula is not part of it
        row = dict(zip(header, map(from_spreadsheet_cell, cells), strict=True))
        cid = row["id"].strip()
        id_col = columns["id"]
        bad = bad_id_message(cid)
        if bad:
            problems.append(CellProblem(p, line, cid or None, None, bad, id_col))
            continue
        if cid in first_line:
            problems.append(CellProblem(p, line, cid, None, f"id also on line {first_line[cid]}; expected each id "
                                        "once in the file", id_col))
            continue
        first_line[cid] = line
        if cid in taken:
            problems.append(CellProblem(p, line, cid, None, f"already in {taken[cid]}; expected a new id (import "
                                        "with --replace to rewrite that couple)", id_col))
        raw, unreadable = {}, []
        for name, cell in row.items():
            if name == "id" or name in WHERE_COLUMNS:
                continue
            try:
                value = _cell_value(name, cell)
            except ValueError as exc:
                unreadable.append(CellProblem(p, line, cid, name, f"{exc}", columns[name]))
                continue
            if value is not None:
                raw[name] = value
        res = validate_couple(cid, raw, ctx, None, line)
        if isinstance(res, Couple):
            if not unreadable:
                couples.append(res)
        else:
            problems += [CellProblem(q.path, q.line, q.couple, q.field, q.message, columns.get(q.field))
                         for q in res if not any(u.field == q.field for u in unreadable)]
        problems += unreadable
    if header is not None and not couples and not problems:
        problems.append(Problem(p, None, None, None, "a header but no couples; expected one row per couple"))
    if header is None and not problems:
        problems.append(Problem(p, None, None, None, "no header row (the file is empty or holds only comments); "
                                "expected a header with id and the field names, then one row per couple"))
    if problems:
        problems.sort(key=lambda q: (q.line or 0, getattr(q, "column", None) or 0))
        raise LibraryError(problems)
    return couples


def import_couples_csv(csv_path, into, replace: bool = False,
                       known_scales: dict[str, PotentialScale] | None = None) -> ImportResult:
    """Add the couples of a CSV file to the library file `into` (created when missing) in one checked write.

    replace: ids the file has already are rewritten instead of refused. known_scales: potential scales of the
    layers below the file (the file's own are added). Raises LibraryError listing every problem (the CSV's
    cells, ids already in the file), ConflictError or LibraryWriteError; nothing is written then.
    """
    target = Path(os.fspath(into))
    if target.exists():
        lf = read_library_file(target, known_scales=known_scales)
        sha, defaults, scales = lf.sha256, lf.defaults, {**(known_scales or {}), **lf.scales}
        existing = {c.id: c for c in lf.couples}
    else:
        lf, sha, defaults, scales, existing = None, None, {}, dict(known_scales or {}), {}
    taken = {} if replace else {cid: f"{target} (line {c.origin.line})" for cid, c in existing.items()}
    couples = read_couples_csv(csv_path, defaults, scales, taken)
    new_sha = put_couples(target, couples, sha, known_scales=scales)
    added = tuple(c.id for c in couples if c.id not in existing)
    replaced = tuple(c.id for c in couples if c.id in existing)
    return ImportResult(added, replaced, str(target), new_sha, lf is None)
