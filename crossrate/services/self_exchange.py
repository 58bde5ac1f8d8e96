"""Self-exchange rate constants of couples at the target conditions, with their uncertainty and provenance.

How k_self at the target is obtained, in order of preference (documented in the README):
1. measured k_self, same solvent: carried to the target temperature and ionic strength with lambda held
   fixed (crossrate.core.condition_transfer; Eyring step where dH_self is given);
2. measured k_self, other solvent: as 1, and lambda changed by rescaling its outer-sphere part by the ratio
   of Pekar factors (target/original). The outer part is lambda(measured) - lambda_in when the couple gives
   lambda_in or bonds (and that difference is positive), else the two-sphere lambda_out in the original
   solvent capped at lambda(measured) (i.e. lambda_in is taken as lambda(measured) - two-sphere lambda_out,
   or 0 where that would be negative). The work term is recomputed;
3. lambda_total (J/mol, in the couple's own solvent; rescaled as in 2 for another solvent);
4. lambda_in or bonds: lambda = lambda_in + two-sphere lambda_out in the target solvent at the target T;
5. none of these: NaN with a reason.
In 3 and 4, k_self = kappa_el Z exp(-(w_self + lambda/4)/RT) (kappa_el as in couple_lambda); in 1 and 2 the
measured k_self is read the same way, lambda = 4 (RT ln(kappa_el Z / k_self) - w_self), which is also how
crossrate.core.cross_rate reads lambda_ii from the carried rate (so the lambda a prediction shows is this one).
Uncertainty of an estimated lambda: DEFAULT_LAMBDA_REL_SD of the estimated part (all of it in 3 and 4, the
Pekar shift in 2), giving sigma(ln k) = sigma(lambda)/(4RT); plus DEFAULT_KAPPA_EL_LOG10_SD for a defaulted
kappa_el.
"""

from typing import NamedTuple

import numpy as np

from ..core.barrier import self_exchange_lambda, self_exchange_ln_k
from ..core.condition_transfer import carry_ln_k_self
from ..core.constants import ANGSTROM, GAS_CONSTANT, KJ
from ..core.reorganization import self_exchange_outer_lambda
from ..core.solvents import get_solvent, per_medium
from ..core.work_terms import work_term
from ..library.couple_set import CoupleSet
from .couple_lambda import (
    DEFAULT_KAPPA_EL_LOG10_SD,
    DEFAULT_KAPPA_EL_NON_ADIABATIC,
    KAPPA_DEFAULT,
    KAPPA_FIELD,
    LAMBDA_IN_BONDS,
    LAMBDA_IN_FIELD,
    lambda_columns,
    pekar_for_media,
)

#: Default SD of log10 k_self when a couple states none (a factor of 2; common practice for tabulated values).
DEFAULT_K_SELF_LOG10_SD = 0.3
#: Default SD of an estimated reorganization energy, as a fraction of lambda (documented in the README).
DEFAULT_LAMBDA_REL_SD = 0.15

#: How k_self was obtained (SelfExchangeAt.method codes).
METHOD_NONE, METHOD_MEASURED, METHOD_MEASURED_OTHER_SOLVENT, METHOD_LAMBDA_TOTAL, METHOD_STRUCTURE = range(5)
METHOD_NAMES = (
    "none",
    "measured",
    "measured, carried to another solvent",
    "from lambda_total",
    "from lambda_in + two-sphere lambda_out",
)
_LN10 = float(np.log(10.0))


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class SelfExchangeAt(NamedTuple):
    """ln k_ii at target conditions for an array of couple indices.

    ln_k: ln(M^-1 s^-1), NaN where it cannot be obtained; ln_k_sd: natural-log SD;
    defaulted_sd: True where the SD is the documented default; estimated: True where k_ii comes from an
    estimated reorganization energy rather than a measurement; reason: why ln_k is NaN (else '').
    Added (optional) columns: method (METHOD_* codes); lambda_J: lambda behind k_ii at the target (J/mol;
    for measured couples the one the measurement implies, solvent shift included); lambda_in_J and
    lambda_out_J: its inner and two-sphere outer parts at the target (J/mol); lambda_shift_J: the Pekar shift
    applied when carried to another solvent (J/mol); lambda_sd_J: SD of the estimated part of lambda (J/mol);
    pekar_from, pekar_to: Pekar factors of the original and target solvent; kappa_el; labels: per-entry
    names behind description().
    Use description(k) for the plain-words account of entry k.
    """

    ln_k: np.ndarray
    ln_k_sd: np.ndarray
    defaulted_sd: np.ndarray
    estimated: np.ndarray
    reason: tuple[str, ...]
    method: np.ndarray | None = None
    lambda_J: np.ndarray | None = None
    lambda_in_J: np.ndarray | None = None
    lambda_out_J: np.ndarray | None = None
    lambda_shift_J: np.ndarray | None = None
    lambda_sd_J: np.ndarray | None = None
    pekar_from: np.ndarray | None = None
    pekar_to: np.ndarray | None = None
    kappa_el: np.ndarray | None = None
    labels: tuple | None = None

    def description(self, k: int) -> str:
        """How entry k's k_self was obtained, when anything estimated went into it: which quantity, from what,
        how uncertain. '' for a measured k_self used in its own solvent (or when no k_self could be had)."""
        if self.method is None or self.labels is None:
            return ""
        return _describe(self, int(k))


def _describe(se: SelfExchangeAt, k: int) -> str:
    ids, med_from, med_to, radius_A, in_from, kappa_from = (lab[k] for lab in se.labels)
    m = int(se.method[k])
    if m in (METHOD_NONE, METHOD_MEASURED):
        return ""
    kj = lambda x: float(x) / KJ  # noqa: E731
    sd_log = float(se.ln_k_sd[k]) / _LN10
    lgk = float(se.ln_k[k]) / _LN10
    pct = f"default {DEFAULT_LAMBDA_REL_SD * 100:g} % SD"
    if in_from == LAMBDA_IN_FIELD:
        in_src = "lambda_in field"
    elif in_from == LAMBDA_IN_BONDS:
        in_src = "bond data"
    else:
        in_src = "inferred: lambda - two-sphere lambda_out, at least 0"
    if kappa_from == KAPPA_FIELD:
        kap = f"; kappa_el = {float(se.kappa_el[k]):g} (given)"
    elif kappa_from == KAPPA_DEFAULT:
        kap = (
            f"; kappa_el = {DEFAULT_KAPPA_EL_NON_ADIABATIC:g} (default for couples tagged non-adiabatic, "
            f"SD {DEFAULT_KAPPA_EL_LOG10_SD:g} in log10)"
        )
    else:
        kap = ""
    shift = ""
    if med_from != med_to and m in (METHOD_MEASURED_OTHER_SOLVENT, METHOD_LAMBDA_TOTAL):
        shift = (
            f"carried from {med_from} to {med_to}: outer-sphere part rescaled by the Pekar factors "
            f"{float(se.pekar_from[k]):.3f} -> {float(se.pekar_to[k]):.3f}, lambda shifted by "
            f"{kj(se.lambda_shift_J[k]):+.1f} +/- {DEFAULT_LAMBDA_REL_SD * abs(kj(se.lambda_shift_J[k])):.1f} kJ/mol "
            f"({pct}), inner part {kj(se.lambda_in_J[k]):.0f} kJ/mol kept ({in_src}), work term recomputed"
        )
    if m == METHOD_MEASURED_OTHER_SOLVENT:
        return f"k_self of {ids} {shift}: log10 k_self = {lgk:.2f} +/- {sd_log:.2f}"
    if m == METHOD_LAMBDA_TOTAL:
        head = (
            f"k_self of {ids} from lambda_total = {kj(se.lambda_J[k] - se.lambda_shift_J[k]):.0f} kJ/mol "
            f"(+/- {kj(se.lambda_sd_J[k]):.0f} kJ/mol, "
            f"{pct}){kap}"
        )
        return f"{head}; {shift}: log10 k_self = {lgk:.2f} +/- {sd_log:.2f}" if shift else (
            f"{head}: log10 k_self = {lgk:.2f} +/- {sd_log:.2f}"
        )
    return (
        f"k_self of {ids} from lambda = lambda_in {kj(se.lambda_in_J[k]):.0f} ({in_src}) + lambda_out "
        f"{kj(se.lambda_out_J[k]):.0f} (two-sphere, a = {radius_A:g} A, {med_to}, Pekar {float(se.pekar_to[k]):.3f}) "
        f"= {kj(se.lambda_J[k]):.0f} +/- {kj(se.lambda_sd_J[k]):.0f} kJ/mol ({pct}){kap}: "
        f"log10 k_self = {lgk:.2f} +/- {sd_log:.2f}"
    )


def _per_couple_permittivity(mediums, T0):
    return per_medium(mediums, T0, "permittivity")


def _target_media(a, idx, medium):
    """Target solvent key per entry: each couple's own when medium is None."""
    own = a.medium[idx]
    if medium is None:
        return own
    if isinstance(medium, str):
        return np.full(own.shape, medium, dtype=object)
    return np.broadcast_to(np.asarray(medium, dtype=object), own.shape)


def self_exchange_at(couple_set: CoupleSet, idx, T_K, I_M, eps_target, ln_Z, medium=None) -> SelfExchangeAt:
    """Self-exchange ln k of couples idx carried to temperature T_K (K), ionic strength I_M (mol/L, scalar or
    per idx) and solvent permittivity eps_target (scalar or per idx), for collision factor ln_Z.

    medium: the target solvent key (scalar or per idx). It decides the Pekar factor of two-sphere lambda_out
    estimates and whether a measured k_self is carried to another solvent. None keeps each couple in its own
    solvent (no solvent carrying; lambda_out of structural estimates in the couple's own solvent).
    """
    a = couple_set.arrays
    lc = lambda_columns(couple_set)
    idx = np.asarray(idx, dtype=np.intp)
    n = idx.shape[0]
    T = np.asarray(T_K, dtype=float)
    RT = GAS_CONSTANT * T
    ln_Z = float(ln_Z)

    # Per-couple values are computed over the whole set once, then gathered (idx may repeat millions of times).
    eps0 = _per_couple_permittivity(a.medium, a.T0_K)[idx]
    pekar0 = pekar_for_media(a.medium, a.T0_K)[idx]
    med_from = a.medium[idx]
    med_to = _target_media(a, idx, medium)
    if medium is None:
        pekar_t = pekar_for_media(a.medium, T)[idx] if T.ndim == 0 else pekar_for_media(med_to, T)
        other = np.zeros(n, dtype=bool)
    elif isinstance(medium, str):
        pekar_t = np.full(n, float(get_solvent(medium).pekar_factor(T)))
        other = med_from != medium
    else:
        pekar_t = pekar_for_media(med_to, T)
        other = med_from != med_to
    other = np.asarray(other, dtype=bool)

    z_ox, z_red, r = a.z_ox[idx], a.z_red[idx], a.radius_m[idx]
    T0, I0 = a.T0_K[idx], a.I0_M[idx]
    kappa = lc.kappa_el[idx]
    ln_kappa = np.log(kappa)
    lam_in_data = lc.lambda_in_J[idx]
    has_in = np.isfinite(lam_in_data)
    lam_out0 = self_exchange_outer_lambda(r, pekar0)
    lam_out_t = self_exchange_outer_lambda(r, pekar_t)
    w0 = work_term(z_ox, z_red, 2.0 * r, eps0, T0, I0)
    w_t = work_term(z_ox, z_red, 2.0 * r, eps_target, T, I_M)

    ln_k0 = a.ln_k_self[idx]
    measured = np.isfinite(ln_k0)
    dH = a.dH_self_J[idx]
    eps_T0 = None
    if np.any(np.isfinite(dH)):
        # The Eyring route takes the ionic-strength/solvent step at T0: the target solvent's permittivity at
        # T0, i.e. eps_target scaled by that solvent's own eps(T0)/eps(T) (1 for solvents held at 25 degC).
        eps_T0 = np.asarray(eps_target, dtype=float) * (
            _per_couple_permittivity(med_to, T0) / _per_couple_permittivity(med_to, np.broadcast_to(T, (n,)))
        )
    # lambda is read with kappa_el Z as the pre-exponential, as in crossrate.core.cross_rate.
    ln_k_carry = carry_ln_k_self(
        np.where(measured, ln_k0, 0.0), z_ox, z_red, r, T0, I0, eps0, T_K, I_M, eps_target, ln_Z + ln_kappa,
        dH_self_J_per_mol=dH, eps_at_T0=eps_T0,
    )
    sd_meas = a.ln_k_self_sd[idx]
    defaulted = ~np.isfinite(sd_meas)
    sd_meas = np.where(defaulted, DEFAULT_K_SELF_LOG10_SD * _LN10, sd_meas)

    lam_tot = a.lambda_total_J[idx]
    from_total = ~measured & np.isfinite(lam_tot)
    from_struct = ~measured & ~from_total & has_in

    # lambda in the couple's own solvent (measured or given), its outer part, and the Pekar shift.
    with np.errstate(invalid="ignore"):
        lam_meas = self_exchange_lambda(np.where(measured, ln_k0, 0.0) - ln_kappa, w0, T0, ln_Z)
    lam_base = np.where(measured, lam_meas, lam_tot)
    # Without usable inner-sphere data the outer part is the two-sphere lambda_out, capped at the whole lambda
    # (an inferred inner part is never negative: where the measured lambda is below the two-sphere value, all
    # of it is treated as solvent reorganization).
    outer_from_data = has_in & (lam_base - np.nan_to_num(lam_in_data) > 0)
    lam_out_base = np.where(
        outer_from_data, lam_base - np.nan_to_num(lam_in_data), np.clip(np.minimum(lam_out0, lam_base), 0.0, None)
    )
    lam_in_kept = np.where(has_in, lam_in_data, lam_base - lam_out_base)
    shift = np.where(other, lam_out_base * (pekar_t / pekar0 - 1.0), 0.0)
    sd_shift = DEFAULT_LAMBDA_REL_SD * np.abs(shift)

    lam_struct = np.nan_to_num(lam_in_data) + lam_out_t
    lam_est = np.where(from_total, lam_tot + shift, lam_struct)
    sd_lam_est = np.where(
        from_total, np.hypot(DEFAULT_LAMBDA_REL_SD * np.abs(lam_tot), sd_shift), DEFAULT_LAMBDA_REL_SD * lam_struct
    )
    estimated = from_total | from_struct
    kappa_var = np.where(lc.kappa_from[idx] == KAPPA_DEFAULT, (DEFAULT_KAPPA_EL_LOG10_SD * _LN10) ** 2, 0.0)
    with np.errstate(invalid="ignore"):
        ln_k_est = ln_kappa + self_exchange_ln_k(np.where(estimated, lam_est, 0.0), w_t, T_K, ln_Z)
        sd_est = np.sqrt((sd_lam_est / (4.0 * RT)) ** 2 + kappa_var)
        ln_k_meas = ln_k_carry - shift / (4.0 * RT)
        sd_m = np.hypot(sd_meas, sd_shift / (4.0 * RT))

    ln_k = np.where(measured, ln_k_meas, np.where(estimated, ln_k_est, np.nan))
    sd = np.where(measured, sd_m, np.where(estimated, sd_est, np.nan))
    method = np.select(
        [measured & ~other, measured & other, from_total, from_struct],
        [METHOD_MEASURED, METHOD_MEASURED_OTHER_SOLVENT, METHOD_LAMBDA_TOTAL, METHOD_STRUCTURE],
        METHOD_NONE,
    ).astype(np.int8)
    lam_used = np.where(measured, lam_meas + shift, np.where(estimated, lam_est, np.nan))
    lam_in_used = np.where(from_struct, lam_in_data, np.where(measured | from_total, lam_in_kept, np.nan))
    lam_sd = np.where(measured, sd_shift, np.where(estimated, sd_lam_est, np.nan))

    # A k_self at or above kappa_el Z exp(-w/RT) leaves no barrier: lambda <= 0, outside the Marcus model.
    # Refuse it with a reason rather than return a meaningless rate.
    with np.errstate(invalid="ignore"):
        lam_target = self_exchange_lambda(ln_k - ln_kappa, w_t, T_K, ln_Z)
    no_barrier = np.broadcast_to(np.isfinite(lam_target) & (lam_target <= 0.0), (n,))
    ln_k = np.where(no_barrier, np.nan, ln_k)
    sd = np.where(no_barrier, np.nan, sd)

    missing = np.flatnonzero(method == METHOD_NONE)
    reason = [""] * n
    for k in missing.tolist():
        reason[k] = (
            f"couple {a.ids[idx[k]]} has no k_self and no reorganization energy (lambda_total, lambda_in or bonds)"
        )
    for k in np.flatnonzero(no_barrier).tolist():
        reason[k] = (
            f"couple {a.ids[idx[k]]}: its self-exchange rate at these conditions is at or above the limit "
            f"kappa_el Z exp(-w/RT) (Z = {np.exp(ln_Z):.3g} M^-1 s^-1, kappa_el = {float(kappa[k]):g}), "
            "which leaves no barrier (lambda <= 0); "
            "check k_self, its ionic strength and radius, or raise Z"
        )
    shape = np.broadcast(ln_k, sd).shape
    ids = np.asarray(a.ids, dtype=object)[idx]
    labels = (ids, med_from, med_to, r / ANGSTROM, lc.lambda_in_from[idx], lc.kappa_from[idx])
    return SelfExchangeAt(
        ln_k=np.broadcast_to(ln_k, shape).copy(),
        ln_k_sd=np.broadcast_to(sd, shape).copy(),
        defaulted_sd=defaulted & measured,
        estimated=estimated,
        reason=tuple(reason),
        method=method,
        lambda_J=lam_used,
        lambda_in_J=lam_in_used,
        lambda_out_J=np.where(measured | from_total, lam_out_base + shift, lam_out_t),
        lambda_shift_J=shift,
        lambda_sd_J=lam_sd,
        pekar_from=pekar0,
        pekar_to=pekar_t,
        kappa_el=kappa,
        labels=labels,
    )
