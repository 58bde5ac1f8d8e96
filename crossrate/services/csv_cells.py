"""Cell rules of the user's CSV files: each parser turns a cell's text into a value in the column's fixed
unit, or raises ValueError whose text says what was expected (the reader adds file, line and column)."""

import difflib
import math
import re

from ..core.constants import EV, KJ
from .conditions import IONIC_STRENGTH_MAX_M, TEMPERATURE_RANGE_K

#: A number followed by a word: the unit typed into the cell ("300 K", "1e6 M-1s-1").
_NUMBER_WITH_UNIT = re.compile(r"^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*[^\d\s.+-].*$")


def _number(text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        if _NUMBER_WITH_UNIT.match(text):
            raise ValueError("a plain number without a unit (the column fixes the unit)") from None
        raise ValueError("a number") from None
    if not math.isfinite(value):
        raise ValueError("a finite number")
    return value


def positive_rate(text: str) -> float:
    """A rate constant in M^-1 s^-1: finite and > 0."""
    value = _number(text)
    if value <= 0:
        raise ValueError("a rate constant greater than 0 in M^-1 s^-1")
    return value


def log10_sd(text: str) -> float:
    """A standard deviation in log10 units: finite and > 0 (0.3 is a factor of 2)."""
    value = _number(text)
    if value <= 0:
        raise ValueError("a standard deviation in log10 units greater than 0 (0.3 is a factor of 2)")
    return value


def temperature(text: str) -> float:
    value = _number(text)
    lo, hi = TEMPERATURE_RANGE_K
    if not lo <= value <= hi:
        raise ValueError(f"a temperature from {lo:g} to {hi:g} K")
    return value


def ionic_strength(text: str) -> float:
    value = _number(text)
    if not 0.0 <= value <= IONIC_STRENGTH_MAX_M:
        raise ValueError(f"an ionic strength from 0 to {IONIC_STRENGTH_MAX_M:g} mol/L")
    return value


def identifier(text: str) -> str:
    if not text:
        raise ValueError("a couple id")
    return text


def medium_key(text: str) -> str:
    """A solvent key of the solvent table (crossrate/core/data/solvents.csv; read once, cached there)."""
    from ..core.solvents import solvent_table

    known = solvent_table()
    if text not in known:
        near = difflib.get_close_matches(text.lower(), list(known), n=1, cutoff=0.6)
        hint = f" (did you mean {near[0]!r}?)" if near else ""
        raise ValueError(f"a solvent key{hint}: {', '.join(sorted(known))}")
    return text


def role(text: str) -> str:
    value = text.lower()
    if value not in ("oxidant", "reductant", "auto"):
        raise ValueError("oxidant, reductant or auto")
    return value


#: Largest |Delta G deg| accepted in a series, eV (beyond any one-electron outer-sphere step; catches kJ/mol
#: values typed into the eV column).
MAX_ABS_DG0_EV = 5.0


def energy_eV(text: str) -> float:
    value = _number(text)
    if abs(value) > MAX_ABS_DG0_EV:
        raise ValueError(f"a driving force within +-{MAX_ABS_DG0_EV:g} eV (a value in kJ/mol in the eV column?)")
    return value


def energy_kJ(text: str) -> float:
    value = _number(text)
    limit = MAX_ABS_DG0_EV * EV / KJ
    if abs(value) > limit:
        raise ValueError(f"a driving force within +-{limit:.0f} kJ/mol (a value in J/mol?)")
    return value
