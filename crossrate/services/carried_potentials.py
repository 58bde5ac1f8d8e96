"""Formal potentials of couples carried to the target conditions, with their uncertainty and basis.

What is carried, and how (documented in the README, "Formal potentials at the target conditions"):
1. ionic strength: from the ionic strength E was measured at (E_ionic_strength, default ionic_strength) to the
   target one, with activity coefficients of Ox and Red from the extended Debye-Hueckel equation (the couple's
   radius as the ion-size parameter) or, when the conditions ask for it, the Davies equation, with the target
   solvent's permittivity at the target temperature (crossrate.core.potential_transfer);
2. temperature: with the couple's dE_dT (mV/K) when given; when the temperature differs and none is given,
   E is held and its standard uncertainty grows by DEFAULT_DE_DT_SD_V_PER_K x |Delta T| (in quadrature);
3. solvent: not carried. A potential measured in one medium is not transferable to another (liquid-junction
   and solvation terms are unknown); such a couple is refused unless the caller allows E as measured
   (Conditions.allow_E_other_medium), and then E is used as given, uncorrected, and the outputs say so.
"""

from typing import NamedTuple

import numpy as np

from ..core.potential_transfer import (
    ACTIVITY_MODEL_RANGE_M,
    EXTENDED_DEBYE_HUCKEL,
    ionic_strength_shift_V,
    temperature_shift_V,
)
from ..library.couple_set import CoupleSet
from .uncertainty import DEFAULT_E_SD_V

#: SD of an unknown temperature coefficient of E, V/K: the project's choice. Reaction entropies of outer-sphere
#: couples correspond to about 0 to 2 mV/K (aqua ions at the top; from memory), so 1 mV/K as one SD covers
#: most couples within two SD.
DEFAULT_DE_DT_SD_V_PER_K = 1e-3
#: Activity-coefficient equation used to carry E in ionic strength unless the conditions choose another.
ACTIVITY_MODEL = EXTENDED_DEBYE_HUCKEL
#: Temperature difference (K) below which E is treated as measured at the target temperature.
T_TOLERANCE_K = 1e-6
I_TOLERANCE_M = 1e-9


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class PotentialsAt(NamedTuple):
    """Effective potentials (V on each couple's root scale) of couples idx at target conditions.

    E_root_V: carried potential; E_sd_V: its SD used in the interval (given or default, grown with |Delta T|
    when no dE_dT is given); dE_ionic_V, dE_temperature_V: the two corrections (0 where not carried);
    I_from_M, T_from_K: conditions E was measured at; other_medium: E measured in another medium (not
    carried); no_coefficient: temperature differs and no dE_dT was given.
    """

    E_root_V: np.ndarray
    E_sd_V: np.ndarray
    dE_ionic_V: np.ndarray
    dE_temperature_V: np.ndarray
    I_from_M: np.ndarray
    T_from_K: np.ndarray
    other_medium: np.ndarray
    no_coefficient: np.ndarray


def potentials_at(couple_set: CoupleSet, idx, T_K, I_M, eps_r, medium=None,
                  activity_model: str = ACTIVITY_MODEL) -> PotentialsAt:
    """Carry the potentials of couples idx to temperature T_K (K), ionic strength I_M (mol/L, scalar or per
    idx), in a solvent of relative permittivity eps_r (scalar or per idx) with key medium (scalar, per idx,
    or None: each couple's own), activity coefficients from activity_model (EXTENDED_DEBYE_HUCKEL or DAVIES).
    Arrays broadcast over idx."""
    a = couple_set.arrays
    idx = np.asarray(idx, dtype=np.intp)
    n = idx.shape[0]
    own = a.medium[idx]
    if medium is None:
        other = np.zeros(n, dtype=bool)
    else:
        other = np.asarray(own != np.broadcast_to(np.asarray(medium, dtype=object), (n,)), dtype=bool)
    T = float(T_K)
    T0 = a.T0_K[idx]
    I0 = a.E_I0_M[idx]
    I = np.broadcast_to(np.asarray(I_M, dtype=float), (n,))
    with np.errstate(invalid="ignore"):
        dI = ionic_strength_shift_V(a.z_ox[idx], a.z_red[idx], a.radius_m[idx], I0, I, eps_r, T, activity_model)
    dI = np.where(other | (np.abs(I - I0) <= I_TOLERANCE_M), 0.0, dI)
    coef = a.dE_dT_V_per_K[idx]
    moved = np.abs(T - T0) > T_TOLERANCE_K
    has_coef = np.isfinite(coef)
    dT = np.where(has_coef & moved & ~other, temperature_shift_V(np.nan_to_num(coef), T0, T), 0.0)
    no_coef = moved & ~has_coef & ~other
    sd0 = np.where(np.isfinite(a.E_sd_V[idx]), a.E_sd_V[idx], DEFAULT_E_SD_V)
    sd = np.where(no_coef, np.hypot(sd0, DEFAULT_DE_DT_SD_V_PER_K * np.abs(T - T0)), sd0)
    return PotentialsAt(
        E_root_V=a.E_root_V[idx] + dI + dT,
        E_sd_V=sd,
        dE_ionic_V=dI,
        dE_temperature_V=dT,
        I_from_M=I0,
        T_from_K=T0,
        other_medium=other,
        no_coefficient=no_coef,
    )


def basis_text(couple, pa: PotentialsAt, k: int, T_K: float, I_M: float, medium: str,
               activity_model: str = ACTIVITY_MODEL) -> str:
    """How entry k's potential was carried, in one line (the couple record gives radius and units)."""
    if bool(pa.other_medium[k]):
        return (
            f"not carried: E measured in {couple.medium}, used as given in {medium} "
            "(a potential does not transfer between solvents)"
        )
    parts = []
    I0 = float(pa.I_from_M[k])
    if abs(I0 - I_M) > I_TOLERANCE_M:
        size = f", a = {couple.radius:g} A" if activity_model == EXTENDED_DEBYE_HUCKEL else ""
        parts.append(f"I {I0:g} -> {I_M:g} M: {activity_model}{size} ({float(pa.dE_ionic_V[k]) * 1e3:+.1f} mV)")
    T0 = float(pa.T_from_K[k])
    if abs(T0 - T_K) > T_TOLERANCE_K:
        if bool(pa.no_coefficient[k]):
            parts.append(
                f"T {T0:g} -> {T_K:g} K: no dE_dT given, E held, SD grown by "
                f"{DEFAULT_DE_DT_SD_V_PER_K * 1e3:g} mV/K x {abs(T_K - T0):.3g} K"
            )
        else:
            parts.append(
                f"T {T0:g} -> {T_K:g} K: dE_dT {couple.dE_dT:g} mV/K ({float(pa.dE_temperature_V[k]) * 1e3:+.1f} mV)"
            )
    return "; ".join(parts) if parts else "as given (measured at these conditions)"


def potential_warnings(couples, pa: PotentialsAt, T_K: float, I_M: float, medium: str,
                       activity_model: str = ACTIVITY_MODEL) -> tuple[str, ...]:
    """Warnings about the carried potentials of `couples` (entries of pa in the same order)."""
    out = []
    for k, c in enumerate(couples):
        if bool(pa.other_medium[k]):
            out.append(f"{c.id}: E was not carried: measured in {c.medium}, used as given in {medium}")
            continue
        if bool(pa.no_coefficient[k]):
            dT = T_K - float(pa.T_from_K[k])
            out.append(
                f"{c.id}: E measured at {float(pa.T_from_K[k]):g} K, used at {T_K:g} K (Delta T = {dT:+.3g} K) "
                f"without a temperature coefficient (dE_dT); its SD grows by "
                f"{DEFAULT_DE_DT_SD_V_PER_K * 1e3:g} mV/K"
            )
        limit = ACTIVITY_MODEL_RANGE_M[activity_model]
        if float(pa.dE_ionic_V[k]) != 0.0 and max(I_M, float(pa.I_from_M[k])) > limit:
            out.append(
                f"{c.id}: E carried in ionic strength beyond the range of the {activity_model} equation "
                f"(I up to about {limit:g} M): the correction of {float(pa.dE_ionic_V[k]) * 1e3:+.1f} mV is rough"
            )
    return tuple(out)


def other_medium_message(couple, medium: str) -> str:
    """The one-line refusal for a couple whose potential was measured in another medium."""
    return (
        f"{couple.id}: E was measured in {couple.medium} and cannot be carried to {medium} (a formal potential "
        f"does not transfer between solvents); use a couple measured in {medium}, or use E as measured "
        "with --allow-E-other-medium"
    )

