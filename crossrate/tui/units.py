"""Display units of the workbench: energies shown in kJ/mol, kcal/mol or eV, and number formatting."""

import math

# Conversion factors from kJ/mol, from the core's constants (kept in a function so importing this module
# does not import scipy before the first paint).
ENERGY_UNITS = ("kJ/mol", "kcal/mol", "eV")


def energy_factor(unit: str) -> float:
    """Multiply an energy in kJ/mol by this to get it in `unit`."""
    from ..core.constants import EV, KCAL, KJ

    return {"kJ/mol": 1.0, "kcal/mol": KJ / KCAL, "eV": KJ / EV}[unit]


def energy_text(value_kJ: float, unit: str, signed: bool = True) -> str:
    """An energy given in kJ/mol, formatted in `unit` with the unit."""
    v = value_kJ * energy_factor(unit)
    digits = 3 if unit == "eV" else 1
    return f"{v:{'+' if signed else ''}.{digits}f} {unit}"


def next_unit(unit: str) -> str:
    return ENERGY_UNITS[(ENERGY_UNITS.index(unit) + 1) % len(ENERGY_UNITS)]


SUPERSCRIPT = str.maketrans("0123456789-+", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻⁺")


def power_of_ten(exponent: int) -> str:
    """10 to an integer power as text, e.g. 10⁵ or 10⁻³."""
    return "10" + str(int(exponent)).translate(SUPERSCRIPT)


def rate_text(log10_k: float | None) -> str:
    """A rate constant from its log10, e.g. '3.2e+05' (None or non-finite: '-')."""
    if log10_k is None or not math.isfinite(log10_k):
        return "-"
    mant_exp = 10.0**log10_k if abs(log10_k) < 300 else math.inf
    if not math.isfinite(mant_exp):
        return f"10^{log10_k:.2f}"
    return f"{mant_exp:.2e}"
