"""Self-exchange rate constants of couples at the target conditions, with their uncertainty and provenance.

A measured k_self is carried to the target temperature, ionic strength and solvent with lambda held fixed
(crossrate.core.condition_transfer). A couple that gives lambda_total instead is turned into a k_self by the
Marcus self-exchange relation. Couples with neither get NaN and a reason.
"""

from dataclasses import dataclass

import numpy as np

from ..core.barrier import self_exchange_ln_k
from ..core.condition_transfer import carry_ln_k_self
from ..core.constants import GAS_CONSTANT
from ..core.solvents import get_solvent
from ..core.work_terms import work_term
from ..library.couple_set import CoupleSet

#: Default SD of log10 k_self when a couple states none (a factor of 2; common practice for tabulated values).
DEFAULT_K_SELF_LOG10_SD = 0.3
#: Default SD of an estimated reorganization energy, as a fraction of lambda (documented in the README).
DEFAULT_LAMBDA_REL_SD = 0.15


@dataclass(frozen=True)
class SelfExchangeAt:
    """ln k_ii at target conditions for an array of couple indices.

    ln_k: ln(M^-1 s^-1), NaN where it cannot be obtained; ln_k_sd: natural-log SD;
    defaulted_sd: True where the SD is the documented default; estimated: True where k_ii comes from an
    estimated reorganization energy rather than a measurement; reason: why ln_k is NaN (else '').
    """

    ln_k: np.ndarray
    ln_k_sd: np.ndarray
    defaulted_sd: np.ndarray
    estimated: np.ndarray
    reason: tuple[str, ...]


def _per_couple_permittivity(mediums, T0):
    return np.array([get_solvent(m).permittivity(t) for m, t in zip(mediums, T0, strict=True)], dtype=float)


def self_exchange_at(couple_set: CoupleSet, idx, T_K, I_M, eps_target, ln_Z) -> SelfExchangeAt:
    """Self-exchange ln k of couples idx carried to temperature T_K (K), ionic strength I_M (mol/L, scalar or
    per idx) and solvent permittivity eps_target (scalar or per idx), for collision factor ln_Z."""
    a = couple_set.arrays
    idx = np.asarray(idx, dtype=np.intp)
    eps0 = _per_couple_permittivity(a.medium[idx], a.T0_K[idx])
    ln_k0 = a.ln_k_self[idx]
    measured = np.isfinite(ln_k0)
    ln_k = carry_ln_k_self(
        np.where(measured, ln_k0, 0.0),
        a.z_ox[idx],
        a.z_red[idx],
        a.radius_m[idx],
        a.T0_K[idx],
        a.I0_M[idx],
        eps0,
        T_K,
        I_M,
        eps_target,
        ln_Z,
        dH_self_J_per_mol=a.dH_self_J[idx],
    )
    sd = a.ln_k_self_sd[idx]
    defaulted = ~np.isfinite(sd)
    sd = np.where(defaulted, DEFAULT_K_SELF_LOG10_SD * np.log(10.0), sd)

    lam_tot = a.lambda_total_J[idx]
    from_lambda = ~measured & np.isfinite(lam_tot)
    w_self = work_term(a.z_ox[idx], a.z_red[idx], 2.0 * a.radius_m[idx], eps_target, T_K, I_M)
    ln_k_lam = self_exchange_ln_k(np.where(from_lambda, lam_tot, 0.0), w_self, T_K, ln_Z)
    RT = GAS_CONSTANT * np.asarray(T_K, dtype=float)
    sd_lam = DEFAULT_LAMBDA_REL_SD * np.abs(lam_tot) / (4.0 * RT)

    ln_k = np.where(measured, ln_k, np.where(from_lambda, ln_k_lam, np.nan))
    sd = np.where(measured, sd, np.where(from_lambda, sd_lam, np.nan))
    missing = np.flatnonzero(~(measured | from_lambda))
    reason = [""] * len(idx)
    for k in missing.tolist():
        reason[k] = (
            f"couple {a.ids[idx[k]]} has no k_self and no reorganization energy (lambda_total, lambda_in or bonds)"
        )
    reason = tuple(reason)
    return SelfExchangeAt(
        ln_k=np.broadcast_to(ln_k, np.broadcast(ln_k, sd).shape).copy(),
        ln_k_sd=np.broadcast_to(sd, np.broadcast(ln_k, sd).shape).copy(),
        defaulted_sd=defaulted & measured,
        estimated=from_lambda,
        reason=reason,
    )
