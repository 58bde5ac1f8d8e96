"""Checks of the Python API's arguments, so a wrong type or an out-of-range position gives crossrate's own
ArgumentError naming the argument and what was expected (not a bare numpy TypeError or IndexError)."""

import numbers

import numpy as np

from ..errors import ArgumentError


def _kind(value) -> str:
    return type(value).__name__


def require_couple_set(value, name: str = "couple_set"):
    """The value when it is a CoupleSet; ArgumentError otherwise."""
    from ..library.couple_set import CoupleSet

    if not isinstance(value, CoupleSet):
        raise ArgumentError(f"{name}: got {_kind(value)}; expected a CoupleSet (from crossrate.load_library())")
    return value


def require_id(value, name: str) -> str:
    """A couple id: a str (the lookup itself reports an unknown one)."""
    if not isinstance(value, str):
        raise ArgumentError(f"{name}: got {_kind(value)} {value!r:.40}; expected a couple id (text)")
    return value


def require_conditions(value, name: str = "conditions", classical_only: str = ""):
    """Conditions or None. classical_only: the name of a service that has no semiclassical model, which
    then refuses conditions asking for it (rather than silently computing the classical rates)."""
    from .conditions import Conditions

    if value is not None and not isinstance(value, Conditions):
        raise ArgumentError(f"{name}: got {_kind(value)}; expected crossrate.Conditions(...) or None")
    if classical_only and value is not None and value.rate_model != "classical":
        from ..errors import ConditionsError

        raise ConditionsError(f"{classical_only} uses the classical model only; expected rate_model='classical' "
                              "(the semiclassical model is available for single predictions)")
    return value


def require_number(value, name: str, unit: str = "") -> float:
    """A real number (not a bool), as float; ArgumentError otherwise (range checks are the caller's)."""
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise ArgumentError(f"{name}: got {_kind(value)} {value!r:.40}; expected a number{f' in {unit}' if unit else ''}")
    return float(value)


def positions(couple_set, values, name: str) -> np.ndarray:
    """Integer positions of couples (ids, or integer positions 0 <= i < len(couple_set)) as an intp array.

    Raises ArgumentError for anything but a list/tuple/array of ids or of whole numbers, or a position out of
    range (negative positions are refused: they would silently count from the end); UnknownCoupleError for
    an unknown id.
    """
    n = len(couple_set)
    if isinstance(values, str | bytes) or not hasattr(values, "__len__"):
        raise ArgumentError(f"{name}: got {_kind(values)}; expected a list or array of couple ids or positions")
    if isinstance(values, np.ndarray):
        if values.ndim != 1:
            raise ArgumentError(f"{name}: got an array of {values.ndim} dimensions; expected one dimension")
        if values.dtype.kind in "iu":
            idx = values.astype(np.intp)
        elif values.dtype.kind in "UO" and all(isinstance(v, str) for v in values.tolist()):
            return couple_set.index_of(values.tolist())
        elif values.size == 0:
            return np.zeros(0, dtype=np.intp)
        else:
            raise ArgumentError(f"{name}: got an array of {values.dtype}; expected couple ids (text) or whole-number "
                                "positions")
    else:
        items = values if isinstance(values, list | tuple) else list(values)
        if not items:
            return np.zeros(0, dtype=np.intp)
        if all(isinstance(v, str) for v in items):
            return couple_set.index_of(items)
        if not all(isinstance(v, numbers.Integral) and not isinstance(v, bool) for v in items):
            odd = [v for v in items if not isinstance(v, str | numbers.Integral) or isinstance(v, bool)]
            what = f"holds {_kind(odd[0])} {odd[0]!r:.40}" if odd else "mixes ids and positions"
            raise ArgumentError(f"{name}: {what}; expected couple ids (text) or whole-number positions, not a mix")
        idx = np.asarray(items, dtype=np.intp)
    if idx.size and (idx.min() < 0 or idx.max() >= n):
        bad = int(idx[(idx < 0) | (idx >= n)][0])
        raise ArgumentError(f"{name}: position {bad} is out of range; expected 0 to {n - 1} (the set holds {n} "
                            "couples)")
    return idx
