"""Reading the user's CSV files of measured rates and driving-force series, with file:line:column messages.

Three kinds of file share one reader: lines starting with '#' and blank lines are skipped (so a file can
say where its numbers came from), the first other line is the header, and every cell is checked against
its column's rule. Bad input raises InputFileError naming file, line, column and what was expected; all
problems of a file are reported at once (up to a limit) so one run fixes them all.

Columns (units):
* measured rates (`crossrate check`): oxidant, reductant, k_measured (M^-1 s^-1); optional
  k_measured_log10_sd (log10 units), temperature (K), ionic_strength (mol/L), medium (solvent key).
* partner measurements of one unknown (`crossrate solve --from-csv`): partner, k_measured (M^-1 s^-1);
  optional k_measured_log10_sd, role (oxidant|reductant|auto: the unknown's role), temperature,
  ionic_strength, medium.
* driving-force series (`crossrate fit`): dG0_kJ_per_mol or dG0_eV (standard free energy of each step,
  negative = downhill), and either k_obs (a bimolecular series, M^-1 s^-1, with a diffusion limit) or
  k_intra (an intramolecular series, s^-1, no diffusion limit); optional log10_sd (log10 units).
Every kind also accepts free-text columns label, note and source.
"""

import csv
import difflib
import io
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import numpy as np

from ..core.constants import EV, KJ
from ..errors import InputFileError
from .csv_cells import (
    energy_eV,
    energy_kJ,
    identifier,
    ionic_strength,
    log10_sd,
    medium_key,
    positive_rate,
    role,
    temperature,
)

#: Free-text columns every kind of file may carry.
TEXT_COLUMNS = ("label", "note", "source")
#: Most problems listed in one message.
MAX_PROBLEMS = 20


@dataclass(frozen=True)
class Column:
    """One column rule: name, parser (text -> value, ValueError carrying what was expected), required."""

    name: str
    parse: Callable[[str], object]
    required: bool = False


@dataclass(frozen=True)
class CsvRow:
    """One data row: its line in the file and the parsed values (None for an empty optional cell)."""

    line: int
    values: dict


def _read_text(p: Path) -> str:
    """The file's text (UTF-8, an optional byte-order mark dropped); InputFileError naming the file, and
    for bad bytes the line and column, when it cannot be read."""
    if p.is_dir():
        raise InputFileError(f"{p}: cannot be read: it is a folder; expected a CSV file")
    if p.exists() and not p.is_file():  # a FIFO or a device would block or never end
        raise InputFileError(f"{p}: cannot be read: not a regular file (a pipe or a device); expected a CSV file")
    try:
        data = p.read_bytes()
    except FileNotFoundError:
        raise InputFileError(f"{p}: cannot be read: no such file; expected a CSV file") from None
    except OSError as exc:
        raise InputFileError(f"{p}: cannot be read ({(exc.strerror or str(exc)).lower()})") from None
    if data.startswith((b"\xff\xfe", b"\xfe\xff")):
        raise InputFileError(f"{p}:1:1: not a UTF-8 text file (it starts with a UTF-16 byte-order mark); "
                             "expected a UTF-8 encoded CSV file (save it as 'CSV UTF-8' from a spreadsheet)")
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        start = 3 if data.startswith(b"\xef\xbb\xbf") else 0
        before = data[start:exc.start]
        line = before.count(b"\n") + 1
        col = len(before[before.rfind(b"\n") + 1:].decode("utf-8", errors="replace")) + 1
        raise InputFileError(
            f"{p}:{line}:{col}: not a UTF-8 text file (byte 0x{data[exc.start]:02x}); expected a UTF-8 encoded CSV "
            "file (save it as 'CSV UTF-8' from a spreadsheet)"
        ) from None


def _lines(text: str) -> list[str]:
    """Lines split at the line ends editors count (LF, CRLF, CR) only: str.splitlines() also breaks at
    form feeds and Unicode separators, which would shift the line numbers in the messages."""
    return text.replace("\r\n", "\n").replace("\r", "\n").split("\n")


def _locate(path, line, col, name):
    return f"{path}:{line}:{col}: field {name}"


def read_table(path, columns: tuple[Column, ...], one_of: tuple[str, ...] = (),
               also_one_of: tuple[str, ...] = ()) -> list[CsvRow]:
    """Read and check a CSV file against column rules. InputFileError lists every problem found.

    Args:
        path: file to read (UTF-8, a byte-order mark is allowed).
        columns: the column rules; columns not listed (and not label/note/source) are refused.
        one_of: names of which exactly one must be present in the header; also_one_of: a second such group.

    Returns:
        the data rows in file order.
    """
    p = Path(path)
    text = _read_text(p)
    rules = {c.name: c for c in columns}
    for name in TEXT_COLUMNS:
        rules.setdefault(name, Column(name, str))
    problems: list[str] = []
    header: list[str] | None = None
    header_line = 0
    rows: list[CsvRow] = []
    for lineno, raw in enumerate(_lines(text), start=1):
        if not raw.strip() or raw.lstrip().startswith("#"):
            continue
        try:
            cells = next(csv.reader(io.StringIO(raw)))
        except csv.Error as exc:
            problems.append(f"{p}:{lineno}: malformed CSV line ({exc})")
            continue
        cells = [c.strip() for c in cells]
        if header is None:
            header, header_line = cells, lineno
            problems.extend(_check_header(p, lineno, header, rules, one_of))
            if not problems and also_one_of:
                problems.extend(_check_header(p, lineno, header, rules, also_one_of))
            if problems:
                break
            continue
        if raw.count('"') % 2:
            problems.append(f"{p}:{lineno}: a double quote is not closed; expected every quoted cell to end with "
                            "a quote on the same line")
            continue
        if len(cells) != len(header):
            problems.append(
                f"{p}:{lineno}: {len(cells)} fields, expected {len(header)} (the header on line {header_line} "
                f"has {', '.join(header)})"
            )
            continue
        values = {}
        for col, (name, cell) in enumerate(zip(header, cells, strict=True), start=1):
            rule = rules[name]
            if cell == "":
                if rule.required:
                    problems.append(f"{_locate(p, lineno, col, name)}: empty, expected a value")
                values[name] = None
                continue
            try:
                values[name] = rule.parse(cell)
            except ValueError as exc:
                problems.append(f"{_locate(p, lineno, col, name)}: got {cell!r}, expected {exc}")
        rows.append(CsvRow(lineno, values))
        if len(problems) >= MAX_PROBLEMS:
            break
    if header is None and not problems:
        wanted = ([" or ".join(g) for g in (one_of, also_one_of) if g]) + [c.name for c in columns if c.required]
        problems.append(f"{p}: no header line (the file is empty or holds only comments); expected a header "
                        f"with the columns {', '.join(wanted)}, then one line per data row")
    elif header is not None and not rows and not problems:
        problems.append(f"{p}:{header_line}: a header but no data rows")
    if problems:
        more = " (first problems only)" if len(problems) >= MAX_PROBLEMS else ""
        raise InputFileError("\n".join(problems[:MAX_PROBLEMS]) + more)
    return rows


def _check_header(p, lineno, header, rules, one_of):
    out = []
    seen = set()
    for col, name in enumerate(header, start=1):
        if name in seen:
            out.append(f"{p}:{lineno}:{col}: column {name!r} appears twice")
        seen.add(name)
        if name not in rules:
            near = difflib.get_close_matches(name.lower(), list(rules), n=1, cutoff=0.6)
            hint = f"did you mean {near[0]!r}? " if near else ""
            out.append(f"{p}:{lineno}:{col}: unknown column {name!r}; {hint}expected columns: {', '.join(rules)}")
    for name, rule in rules.items():
        if rule.required and name not in seen:
            out.append(f"{p}:{lineno}: missing column {name!r}")
    if one_of:
        present = [n for n in one_of if n in seen]
        if len(present) != 1:
            what = "both" if present else "neither"
            out.append(f"{p}:{lineno}: {what} of {' and '.join(one_of)}; give exactly one of these columns")
    return out


# ---- the three kinds of file -------------------------------------------------------------------------------

MEASURED_COLUMNS = (
    Column("oxidant", identifier, True),
    Column("reductant", identifier, True),
    Column("k_measured", positive_rate, True),
    Column("k_measured_log10_sd", log10_sd),
    Column("temperature", temperature),
    Column("ionic_strength", ionic_strength),
    Column("medium", medium_key),
)

PARTNER_COLUMNS = (
    Column("partner", identifier, True),
    Column("k_measured", positive_rate, True),
    Column("k_measured_log10_sd", log10_sd),
    Column("role", role),
    Column("temperature", temperature),
    Column("ionic_strength", ionic_strength),
    Column("medium", medium_key),
)

SERIES_COLUMNS = (
    Column("dG0_kJ_per_mol", energy_kJ),
    Column("dG0_eV", energy_eV),
    Column("k_obs", positive_rate),
    Column("k_intra", positive_rate),
    Column("log10_sd", log10_sd),
)


@dataclass(frozen=True)
class MeasuredRow:
    """One measured cross rate: ids, k_measured (M^-1 s^-1), its SD (log10) and the row's own conditions
    (temperature K, ionic strength mol/L, medium key; None = the command's), the file and line."""

    path: str
    line: int
    oxidant: str
    reductant: str
    k_measured: float
    k_measured_log10_sd: float | None = None
    temperature: float | None = None
    ionic_strength: float | None = None
    medium: str | None = None
    label: str | None = None


@dataclass(frozen=True)
class PartnerRow:
    """One measurement of an unknown couple with a known partner (same units as MeasuredRow)."""

    path: str
    line: int
    partner: str
    k_measured: float
    k_measured_log10_sd: float | None = None
    role: str | None = None
    temperature: float | None = None
    ionic_strength: float | None = None
    medium: str | None = None
    label: str | None = None


@dataclass(frozen=True)
class SeriesData:
    """A driving-force series: Delta G deg (J/mol), the rates k_obs (M^-1 s^-1 for kind 'bimolecular', s^-1
    for kind 'unimolecular'), log10 SD per point (NaN = not given), file lines and labels of the points."""

    path: str
    dG0_J_per_mol: np.ndarray
    k_obs: np.ndarray
    log10_sd: np.ndarray
    lines: tuple[int, ...]
    labels: tuple[str, ...]
    kind: str = "bimolecular"

    @property
    def has_sd(self) -> bool:
        return bool(np.all(np.isfinite(self.log10_sd)))


def read_measured_csv(path) -> list[MeasuredRow]:
    """Rows of a measured-rates file (columns in the module docstring). InputFileError on bad input."""
    return [
        MeasuredRow(
            path=str(path),
            line=r.line,
            oxidant=r.values["oxidant"],
            reductant=r.values["reductant"],
            k_measured=r.values["k_measured"],
            k_measured_log10_sd=r.values.get("k_measured_log10_sd"),
            temperature=r.values.get("temperature"),
            ionic_strength=r.values.get("ionic_strength"),
            medium=r.values.get("medium"),
            label=r.values.get("label"),
        )
        for r in read_table(path, MEASURED_COLUMNS)
    ]


def read_partner_csv(path) -> list[PartnerRow]:
    """Rows of a partner-measurements file for `solve --from-csv`. InputFileError on bad input."""
    return [
        PartnerRow(
            path=str(path),
            line=r.line,
            partner=r.values["partner"],
            k_measured=r.values["k_measured"],
            k_measured_log10_sd=r.values.get("k_measured_log10_sd"),
            role=r.values.get("role"),
            temperature=r.values.get("temperature"),
            ionic_strength=r.values.get("ionic_strength"),
            medium=r.values.get("medium"),
            label=r.values.get("label"),
        )
        for r in read_table(path, PARTNER_COLUMNS)
    ]


def read_series_csv(path) -> SeriesData:
    """A driving-force series file; Delta G deg converted to J/mol. InputFileError on bad input."""
    rows = read_table(path, SERIES_COLUMNS, one_of=("dG0_kJ_per_mol", "dG0_eV"), also_one_of=("k_obs", "k_intra"))
    rate = "k_intra" if "k_intra" in rows[0].values else "k_obs"
    in_ev = "dG0_eV" in rows[0].values
    key, unit = ("dG0_eV", EV) if in_ev else ("dG0_kJ_per_mol", KJ)
    for col, what in ((key, "the standard free energy of the step"), (rate, "a rate constant")):
        missing = [r.line for r in rows if r.values.get(col) is None]
        if missing:
            raise InputFileError(
                f"{path}:{missing[0]}: field {col}: empty, expected {what}"
                + (f" (also lines {', '.join(map(str, missing[1:6]))})" if len(missing) > 1 else "")
            )
    sd = [r.values.get("log10_sd") for r in rows]
    return SeriesData(
        path=str(path),
        dG0_J_per_mol=np.array([r.values[key] for r in rows], dtype=float) * unit,
        k_obs=np.array([r.values[rate] for r in rows], dtype=float),
        log10_sd=np.array([np.nan if s is None else s for s in sd], dtype=float),
        lines=tuple(r.line for r in rows),
        labels=tuple(r.values.get("label") or "" for r in rows),
        kind="unimolecular" if rate == "k_intra" else "bimolecular",
    )
