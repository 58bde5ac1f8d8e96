"""Validation of one `[couple.<id>]` table: raw TOML values -> Couple, or every problem found.

Each problem reads `path:line: couple <id>: field <name>: what was wrong; expected ...`, with the line
of the field (or of the table when the field is missing). The checks follow `schema.FIELD_SPECS`; the
per-field checkers are built once per process and kept small because a 10,000-couple file runs them
about 150,000 times.
"""

import math
import re
from dataclasses import dataclass
from datetime import date, datetime, time
from functools import lru_cache

from ..errors import Problem
from .couple import BondSet, Couple
from .line_index import IndexedOrigin, TableSpan
from .schema import (
    BOND_FIELDS,
    BONDS_EXPECTED,
    DATE_EXPECTED,
    DOI_EXPECTED,
    FIELD_SPECS,
    FIELDS_BY_NAME,
    ID_CHARS,
    ID_RULE,
    REQUIRED_FIELDS,
    FieldSpec,
    closest,
)

_KNOWN = frozenset(FIELDS_BY_NAME)


def is_finite_number(value) -> bool:
    """A TOML int or a finite float (never a bool; an int of any size, which float() may not hold)."""
    t = type(value)
    return t is int or (t is float and math.isfinite(value))


def _huge_integer(value: int) -> str:
    """'1e+400' for an integer too large for a float (str() itself refuses beyond ~4300 digits)."""
    sign = "-" if value < 0 else ""
    if value.bit_length() < 14_000:
        digits = str(abs(value))
        return f"{sign}{digits[0]}.{digits[1:3]}e+{len(digits) - 1}" if digits[1:3].strip("0") else \
            f"{sign}{digits[0]}e+{len(digits) - 1}"
    return f"{sign}about 1e+{int(value.bit_length() * math.log10(2))}"


def describe(value) -> str:
    """A value as a chemist would read it in a message: 'text "abc"', 'true (a boolean)', '4.2'."""
    if isinstance(value, bool):
        return f"{'true' if value else 'false'} (a boolean)"
    if isinstance(value, str):
        shown = value if len(value) <= 40 else value[:37] + "..."
        return f'text "{shown}"'
    if isinstance(value, int):
        if abs(value) < 10**15:
            return str(value)
        try:
            return f"{float(value):g}"
        except OverflowError:  # beyond any float (about 1e308): written from its digits instead
            return _huge_integer(value)
    if isinstance(value, float):
        return f"{value:g}"
    if isinstance(value, list):
        return f"a list of {len(value)}"
    if isinstance(value, dict):
        return "a table"
    if isinstance(value, datetime | date | time):
        return f"a date/time ({value})"
    return type(value).__name__


class _Bad:
    """A checker's verdict that the value is wrong; .message says what, and what was expected."""

    __slots__ = ("message",)

    def __init__(self, message: str):
        self.message = message


def _number_checker(spec: FieldSpec):
    lo, hi = spec.low, spec.high
    lo_open, hi_open = spec.low_open, spec.high_open
    expected = spec.expected()
    unit = f" {spec.unit}" if spec.unit and spec.unit != "log10 units" else ""

    # All number fields have finite bounds, so one chained comparison also rejects nan and inf.
    if lo_open and hi_open:
        def ok(v):
            return lo < v < hi
    elif lo_open:
        def ok(v):
            return lo < v <= hi
    elif hi_open:
        def ok(v):
            return lo <= v < hi
    else:
        def ok(v):
            return lo <= v <= hi

    def check(v):
        t = type(v)
        if t is float:
            if ok(v):
                return v
            if not math.isfinite(v):
                return _Bad(f"got {describe(v)}, not a finite number; expected {expected}")
        elif t is int:
            if ok(v):
                return float(v)
        else:
            return _Bad(f"got {describe(v)}; expected {expected}")
        if spec.name == "k_self" and v <= 0:
            return _Bad(f"got {describe(v)}; expected a rate constant greater than 0 M^-1 s^-1 "
                        "(leave k_self out when it is unknown)")
        return _Bad(f"got {describe(v)}{unit}; expected {expected}")

    return check


def _integer_checker(spec: FieldSpec):
    lo, hi = spec.low, spec.high
    expected = spec.expected()

    def check(v):
        if type(v) is int:
            if lo <= v <= hi:
                return v
            return _Bad(f"got {describe(v)}; expected {expected}")
        if type(v) is float and v.is_integer():
            return _Bad(f"got {describe(v)} written as a decimal; expected {expected}, written without a point")
        return _Bad(f"got {describe(v)}; expected {expected}")

    return check


def _text_checker(spec: FieldSpec):
    required = spec.required

    def check(v):
        if type(v) is str:
            if required and not v.strip():
                return _Bad(f"is empty; expected {spec.expected()}")
            return v
        return _Bad(f"got {describe(v)}; expected {spec.expected()}")

    return check


def _choice_checker(spec: FieldSpec):
    choices = spec.choices

    def check(v):
        if type(v) is str and v in choices:
            return v
        return _Bad(f"got {describe(v)}; expected {spec.expected()}")

    return check


def _bool_checker(spec: FieldSpec):
    def check(v):
        if type(v) is bool:
            return v
        return _Bad(f"got {describe(v)}; expected true or false (no quotes)")

    return check


def _tags_checker(spec: FieldSpec):
    def check(v):
        if type(v) is list:
            for i, t in enumerate(v, start=1):
                if type(t) is not str or not t.strip():
                    return _Bad(f"entry {i} is {describe(t)}; expected {spec.expected()}")
            return tuple(v)
        return _Bad(f"got {describe(v)}; expected {spec.expected()}")

    return check


def _bond_entry(i: int, entry) -> BondSet | _Bad:
    if type(entry) is not dict:
        return _Bad(f"entry {i} is {describe(entry)}; expected {BONDS_EXPECTED}")
    unknown = sorted(set(entry) - {b.name for b in BOND_FIELDS})
    if unknown:
        hint = closest(unknown[0], [b.name for b in BOND_FIELDS])
        did = f" (did you mean {hint}?)" if hint else ""
        return _Bad(f"entry {i}: unknown key {unknown[0]}{did}; expected {BONDS_EXPECTED}")
    values = {}
    for b in BOND_FIELDS:
        if b.name not in entry:
            return _Bad(f"entry {i}: missing {b.name}; expected {BONDS_EXPECTED}")
        v = entry[b.name]
        unit = f" {b.unit}" if b.unit else ""
        if b.integer:
            good = type(v) is int and b.low <= v <= b.high
        else:
            good = type(v) in (int, float) and (b.low < v <= b.high if b.low_open else b.low <= v <= b.high)
        if not good:
            if b.integer:
                want = f"a whole number from {b.low:g} to {b.high:g}"
            elif b.low_open:
                want = f"a finite number greater than {b.low:g} and at most {b.high:g}{unit}"
            else:
                want = f"a finite number from {b.low:g} to {b.high:g}{unit}"
            return _Bad(f"entry {i}: {b.name} is {describe(v)}; expected {want} ({b.help})")
        values[b.name] = v if b.integer else float(v)
    return BondSet(**values)


def _bonds_checker(spec: FieldSpec):
    def check(v):
        if type(v) is not list:
            return _Bad(f"got {describe(v)}; expected {BONDS_EXPECTED}")
        out = []
        for i, entry in enumerate(v, start=1):
            b = _bond_entry(i, entry)
            if isinstance(b, _Bad):
                return b
            out.append(b)
        return tuple(out)

    return check


def _set_checker(spec: FieldSpec):
    # medium and E_scale: type checked here, membership in validate_couple (it depends on the file)
    def check(v):
        if type(v) is str and v:
            return v
        return _Bad(f"got {describe(v)}; expected {spec.expected()}")

    return check


#: 10.<registrant, 4-9 digits, optionally with sub-numbers>/<suffix without spaces> (the DOI handbook's form).
_DOI = re.compile(r"10\.\d{4,9}(?:\.\d+)*/\S+\Z")
_ISO_DATE = re.compile(r"\d{4}-\d{2}-\d{2}\Z")


def _doi_checker(spec: FieldSpec):
    def check(v):
        if type(v) is not str:
            return _Bad(f"got {describe(v)}; expected {DOI_EXPECTED}")
        if _DOI.match(v):
            return v
        low = v.strip().lower()
        for prefix in ("https://doi.org/", "http://doi.org/", "https://dx.doi.org/", "http://dx.doi.org/", "doi:"):
            if low.startswith(prefix) and _DOI.match(v.strip()[len(prefix):].strip()):
                return _Bad(f'got {describe(v)}; expected the DOI alone: "{v.strip()[len(prefix):].strip()}"')
        return _Bad(f"got {describe(v)}; expected {DOI_EXPECTED}")

    return check


def _date_checker(spec: FieldSpec):
    def check(v):
        if type(v) is str:
            if not _ISO_DATE.match(v):
                return _Bad(f"got {describe(v)}; expected {DATE_EXPECTED}")
            try:
                v = date.fromisoformat(v)
            except ValueError as exc:
                return _Bad(f"got {describe(v)} ({exc}); expected {DATE_EXPECTED}")
        elif type(v) is not date:
            return _Bad(f"got {describe(v)}; expected {DATE_EXPECTED}")
        if v > date.today():
            return _Bad(f"got {v.isoformat()}, which is in the future (today is {date.today().isoformat()}); "
                        f"expected {DATE_EXPECTED}")
        return v

    return check


_FACTORIES = {
    "number": _number_checker,
    "integer": _integer_checker,
    "text": _text_checker,
    "choice": _choice_checker,
    "boolean": _bool_checker,
    "text list": _tags_checker,
    "bonds": _bonds_checker,
    "medium": _set_checker,
    "scale": _set_checker,
    "doi": _doi_checker,
    "date": _date_checker,
}


@lru_cache(maxsize=1)
def _checkers() -> dict:
    return {s.name: _FACTORIES[s.kind](s) for s in FIELD_SPECS}


def check_field(name: str, value):
    """(converted value, None) or (None, 'what was wrong; expected ...') for one field on its own.

    For forms: checks type and range; membership of medium and E_scale is checked by validate_couple.
    """
    chk = _checkers().get(name)
    if chk is None:
        hint = closest(name, _KNOWN)
        return None, f"unknown field{f' (did you mean {hint}?)' if hint else ''}"
    out = chk(value)
    if isinstance(out, _Bad):
        return None, out.message
    return out, None


@dataclass(frozen=True)
class ValidationContext:
    """What a couple is checked against: its file (path, layer), the file's defaults, the known
    potential scale keys and solvent keys."""

    path: str
    layer: str
    defaults: dict
    scales: frozenset
    media: frozenset


def bad_id_message(couple_id: str) -> str | None:
    """Why an id is not allowed (None when it is fine)."""
    if not couple_id:
        return f"empty id; expected {ID_RULE}"
    if not ID_CHARS.issuperset(couple_id):
        bad = sorted(set(couple_id) - ID_CHARS)
        shown = ", ".join(repr(c) for c in bad[:5])
        return f"bad id {couple_id!r} (character {shown} not allowed); expected {ID_RULE}"
    return None


def _membership(name: str, value: str, known: frozenset) -> str:
    what = "medium" if name == "medium" else "potential scale"
    hint = closest(value, known)
    did = f' (did you mean "{hint}"?)' if hint else ""
    listed = ", ".join(sorted(known))
    extra = "" if name == "medium" else "; or define it under [library.scales]"
    return f'unknown {what} "{value}"{did}; expected one of {listed}{extra}'


def validate_couple(couple_id: str, raw, ctx: ValidationContext, span: TableSpan | None,
                    table_line: int | None = None) -> Couple | list[Problem]:
    """The Couple of one table, or the list of every problem in it.

    raw: the table as tomli returned it; span: where its [couple.<id>] header stands (None when the
    couple is not written as its own table: table_line is then used for every message).
    """
    path = ctx.path
    line = span.line if span is not None else table_line
    if type(raw) is not dict:
        return [Problem(path, line, couple_id, None,
                        f"is {describe(raw)}, not a table; expected a [couple.{couple_id}] table of fields")]
    found: list[tuple[str | None, str]] = []  # (field, message); lines are looked up only if needed
    bad = bad_id_message(couple_id)
    if bad:
        found.append((None, bad))
    checkers = _checkers()
    values = {}
    for name, v in raw.items():
        chk = checkers.get(name)
        if chk is None:
            found.append((name, _unknown_field_message(couple_id, name, v)))
            continue
        out = chk(v)
        if out.__class__ is _Bad:
            found.append((name, out.message))
        else:
            values[name] = out
    missing = []
    if len(raw) < len(REQUIRED_FIELDS) or not REQUIRED_FIELDS.issubset(raw):
        for spec in FIELD_SPECS:
            n = spec.name
            if spec.required and n not in raw:
                if spec.library_default and n in ctx.defaults:
                    continue
                where = " here or as a default in [library]" if spec.library_default else ""
                missing.append((n, f"missing; expected {spec.expected()}{where}"))
    defaults = ctx.defaults
    if defaults:
        for n in ("medium", "E_scale", "temperature"):
            if n not in raw and n in defaults:
                values[n] = defaults[n]
    _cross_checks(values, raw, ctx, found)
    if found or missing:
        lines = dict(span.fields) if span is not None else {}
        if "E00" in lines:  # a missing excited_form is pointed out on the E00 line
            lines.setdefault("excited_form", lines["E00"])
        problems = [Problem(path, lines.get(n, line) if n else line, couple_id, n, msg) for n, msg in found]
        problems += [Problem(path, line, couple_id, n, msg) for n, msg in missing]
        problems.sort(key=lambda p: p.line or 0)
        return problems
    return Couple.trusted(id=couple_id, origin=IndexedOrigin(path, line or 0, ctx.layer, span=span), **values)


def _unknown_field_message(couple_id, name, value) -> str:
    hint = closest(name, _KNOWN)
    if hint:
        return f"unknown field (did you mean {hint}?); expected one of the fields listed in libraries/README.md"
    if type(value) is dict:
        return ("unknown field (a table); expected only the fields listed in libraries/README.md "
                f"(an id containing '.' must be quoted: [couple.\"{couple_id}.{name}\"])")
    return "unknown field; expected one of the fields listed in libraries/README.md"


def _cross_checks(values, raw, ctx, found):
    zo, zr = values.get("charge_ox"), values.get("charge_red")
    if zo is not None and zr is not None and zo - zr != 1:
        found.append(("charge_ox", f"charge_ox - charge_red = {zo} - ({zr}) = {zo - zr}; expected exactly 1 "
                      "(a one-electron couple: charge_ox = charge_red + 1)"))
    medium = values.get("medium")
    if medium is not None and medium not in ctx.media:
        found.append(("medium", _membership("medium", medium, ctx.media)))
    scale = values.get("E_scale")
    if scale is not None and scale not in ctx.scales:
        found.append(("E_scale", _membership("E_scale", scale, ctx.scales)))
    if values.get("invented") is True and values.get("verified") is True:
        found.append(("verified", "true while invented = true; expected verified = false (or left out): made-up "
                      "values cannot be checked against a primary source"))
    has_e00 = "E00" in raw
    if has_e00 and "excited_form" not in raw:
        found.append(("excited_form", 'missing while E00 is given; expected "ox" or "red": the form that is excited'))
    elif "excited_form" in raw and not has_e00:
        found.append(("excited_form", "given without E00; expected E00 (eV) beside it, or no excited_form"))
