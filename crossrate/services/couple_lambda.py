"""Per-couple reorganization data the library's numpy view does not carry: inner-sphere lambda (from the
lambda_in field or from bond sets), the energy of the high-frequency mode (hbar_omega) and the electronic
transmission factor kappa_el.

kappa_el: the couple's own `kappa_el` when given; DEFAULT_KAPPA_EL_NON_ADIABATIC for a couple tagged
non-adiabatic without a value (an order-of-magnitude choice, common practice for weakly coupled couples,
with DEFAULT_KAPPA_EL_LOG10_SD as its uncertainty); 1 (adiabatic) otherwise.
"""

import weakref
from typing import NamedTuple

import numpy as np

from ..core.constants import ANGSTROM, KJ
from ..core.reorganization import self_exchange_inner_lambda
from ..core.solvents import per_medium
from ..library.couple import Couple
from ..library.couple_set import CoupleSet

#: kappa_el assumed for a couple tagged non-adiabatic that gives no kappa_el (common practice, order of magnitude).
DEFAULT_KAPPA_EL_NON_ADIABATIC = 0.1
#: SD of log10 kappa_el when the default above is used (a factor of about 3 either way).
DEFAULT_KAPPA_EL_LOG10_SD = 0.5
#: Tags that mark a couple as non-adiabatic.
NON_ADIABATIC_TAGS = ("non-adiabatic", "nonadiabatic", "non_adiabatic", "non adiabatic")

#: Codes of where a couple's inner-sphere lambda comes from.
LAMBDA_IN_NONE, LAMBDA_IN_FIELD, LAMBDA_IN_BONDS = 0, 1, 2
#: Codes of where kappa_el comes from.
KAPPA_ADIABATIC, KAPPA_FIELD, KAPPA_DEFAULT = 0, 1, 2


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class LambdaColumns(NamedTuple):
    """Columns over the couples of a set (set order).

    lambda_in_J: inner-sphere lambda of the self-exchange, J/mol (NaN where the couple gives none);
    lambda_in_from: LAMBDA_IN_* code; kappa_el: transmission factor used (1 for adiabatic);
    kappa_from: KAPPA_* code; hbar_omega_cm1: the couple's own high-frequency mode, cm^-1 (NaN where not given;
    the bonds' force constants give no frequency without the atoms' masses, which the library does not hold).
    """

    lambda_in_J: np.ndarray
    lambda_in_from: np.ndarray
    kappa_el: np.ndarray
    kappa_from: np.ndarray
    hbar_omega_cm1: np.ndarray


def couple_lambda_in(c: Couple) -> tuple[float, int]:
    """(inner-sphere lambda of c's self-exchange in J/mol or NaN, LAMBDA_IN_* code). lambda_in wins over bonds."""
    if c.lambda_in is not None:
        return float(c.lambda_in) * KJ, LAMBDA_IN_FIELD
    if c.bonds:
        lam = self_exchange_inner_lambda(
            [b.count for b in c.bonds],
            [b.delta_d * ANGSTROM for b in c.bonds],
            [b.f_ox for b in c.bonds],
            [b.f_red for b in c.bonds],
        )
        return lam, LAMBDA_IN_BONDS
    return float("nan"), LAMBDA_IN_NONE


def couple_kappa(c: Couple) -> tuple[float, int]:
    """(kappa_el, KAPPA_* code) of one couple."""
    if c.kappa_el is not None:
        return float(c.kappa_el), KAPPA_FIELD
    if any(t.lower() in NON_ADIABATIC_TAGS for t in c.tags):
        return DEFAULT_KAPPA_EL_NON_ADIABATIC, KAPPA_DEFAULT
    return 1.0, KAPPA_ADIABATIC


_CACHE: "weakref.WeakKeyDictionary[CoupleSet, LambdaColumns]" = weakref.WeakKeyDictionary()


def lambda_columns(couple_set: CoupleSet) -> LambdaColumns:
    """LambdaColumns of a set, computed once per set object."""
    try:
        return _CACHE[couple_set]
    except KeyError:
        pass
    lam = [couple_lambda_in(c) for c in couple_set]
    kap = [couple_kappa(c) for c in couple_set]
    cols = LambdaColumns(
        lambda_in_J=np.array([x[0] for x in lam], dtype=float),
        lambda_in_from=np.array([x[1] for x in lam], dtype=np.int8),
        kappa_el=np.array([x[0] for x in kap], dtype=float),
        kappa_from=np.array([x[1] for x in kap], dtype=np.int8),
        hbar_omega_cm1=np.array([np.nan if c.hbar_omega is None else float(c.hbar_omega) for c in couple_set],
                                dtype=float),
    )
    _CACHE[couple_set] = cols
    return cols


def pekar_for_media(media, T_K) -> np.ndarray:
    """Pekar factor 1/n^2 - 1/eps_s per entry of `media` (solvent keys) at temperatures T_K (K, broadcast)."""
    return per_medium(media, T_K, "pekar_factor")
