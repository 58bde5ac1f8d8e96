"""Checking a Couple built in code (the Python API, a form, dataclasses.replace) by the library's own rules,
so that a negative radius or an unknown medium is an error when the record is made, never a NaN later.

Couples read from a file are checked by validation.validate_couple with line numbers and are built through
Couple.trusted (no second check); everything else goes through Couple.__post_init__ and lands here.
"""

from functools import lru_cache

from ..errors import LibraryError, Problem
from .couple import BondSet
from .schema import BOND_FIELDS, FIELD_SPECS


@lru_cache(maxsize=1)
def _media() -> frozenset:
    from ..core.solvents import solvent_table

    return frozenset(solvent_table())


def _bond_problem(b) -> str | None:
    if not isinstance(b, BondSet):
        return f"holds {type(b).__name__}; expected BondSet(count, delta_d, f_ox, f_red) entries"
    for spec in BOND_FIELDS:
        v = getattr(b, spec.name)
        if spec.integer:
            good = type(v) is int and spec.low <= v <= spec.high
        else:
            good = (type(v) in (int, float) and (spec.low < v <= spec.high if spec.low_open
                                                  else spec.low <= v <= spec.high))
        if not good:
            return f"{spec.name} {v!r}: expected a value from {spec.low:g} to {spec.high:g} {spec.unit}".rstrip()
    return None


def built_couple_problems(couple) -> list[Problem]:
    """Every problem of a Couple's values (empty when it is fine); checked as the library format checks them."""
    from .validation import check_field

    where = couple.origin.path if couple.origin is not None else "Couple(...)"
    cid = couple.id if isinstance(couple.id, str) else repr(couple.id)
    found: list[tuple[str | None, str]] = []
    if not isinstance(couple.id, str) or not couple.id:
        found.append((None, f"id {couple.id!r}: expected a non-empty text id"))
    for spec in FIELD_SPECS:
        name = spec.name
        v = getattr(couple, name)
        if v is None and not spec.required:
            continue
        if name == "tags":
            if not isinstance(v, tuple | list) or not all(isinstance(t, str) and t.strip() for t in v):
                found.append((name, f"got {v!r:.60}; expected a tuple of non-empty texts"))
            continue
        if name == "bonds":
            if not isinstance(v, tuple | list):
                found.append((name, f"got {type(v).__name__}; expected a tuple of BondSet"))
                continue
            for b in v:
                msg = _bond_problem(b)
                if msg:
                    found.append((name, msg))
                    break
            continue
        if name == "notes" and v == "":
            continue
        _, msg = check_field(name, v)
        if msg:
            found.append((name, msg))
        elif name == "medium" and v not in _media():
            found.append((name, f"unknown medium {v!r}; expected one of {', '.join(sorted(_media()))}"))
    zo, zr = couple.charge_ox, couple.charge_red
    if type(zo) is int and type(zr) is int and zo - zr != 1:
        found.append(("charge_ox", f"charge_ox - charge_red = {zo - zr}; expected exactly 1 (a one-electron couple)"))
    if (couple.E00 is None) != (couple.excited_form is None):
        found.append(("excited_form", "E00 and excited_form go together; expected both or neither"))
    return [Problem(where, None, cid, field, msg) for field, msg in found]


def check_built_couple(couple) -> None:
    """LibraryError listing every problem of a Couple built in code."""
    problems = built_couple_problems(couple)
    if problems:
        raise LibraryError(problems)
