"""The cross reaction of an unknown couple with a known partner, set up once for the solvers.

Holds the resolved conditions, both couples' potentials on their common root scale (carried to the
conditions as in predict(), crossrate.services.carried_potentials), charges, radii, the
partner's self-exchange rate at the conditions and the pair's diffusion limit, and evaluates the full
cross relation (f12 and work terms included, crossrate.core.cross_rate) for trial values of the unknown's
potential and self-exchange rate.
"""

import math
from dataclasses import dataclass, replace

import numpy as np

from ..core.constants import ANGSTROM, FARADAY, GAS_CONSTANT, KJ
from ..core.cross_rate import CrossRateArrays, cross_rate
from ..errors import ConditionsError, ScienceError
from ..library.couple import Couple
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set, require_id, require_number
from .carried_potentials import potential_warnings
from .conditions import Conditions
from .measured_check import DEFAULT_MEASURED_LOG10_SD, require_positive
from .prediction import ResolvedConditions, carry_potentials, resolve_conditions
from .results import UsedConditions
from .self_exchange import self_exchange_at
from .uncertainty import DEFAULT_K_DIFF_LOG10_SD

LN10 = math.log(10.0)
ROLES = ("oxidant", "reductant", "auto")


@dataclass(frozen=True)
class PairSetup:
    """Unknown + partner under resolved conditions. Potentials in V on the common root scale, ln of rate
    constants in ln(M^-1 s^-1) at the conditions (NaN where the couple gives none), radii in m."""

    unknown: Couple
    partner: Couple
    role: str
    role_reason: str
    rc: ResolvedConditions
    E_unknown: float
    E_partner: float
    E_unknown_sd: float
    E_partner_sd: float
    ln_k_partner: float
    ln_k_partner_sd: float
    ln_k_unknown: float
    ln_k_unknown_sd: float
    ln_k_diff: float
    warnings: tuple[str, ...]
    #: ln kappa_el of the unknown and of the partner (0 for adiabatic couples).
    ln_kappa_unknown: float = 0.0
    ln_kappa_partner: float = 0.0
    #: Correction carrying the unknown's library potential to the conditions (ionic strength, temperature), V.
    E_unknown_shift: float = 0.0
    #: SD of ln k_D (the project's DEFAULT_K_DIFF_LOG10_SD with the cap on, 0 without it), ln units.
    ln_k_diff_sd: float = 0.0

    @property
    def RT(self) -> float:
        """RT at the conditions, J/mol."""
        return GAS_CONSTANT * self.rc.temperature_K

    def evaluate(self, E_unknown=None, ln_k_unknown=None, E_partner=None, ln_k_partner=None) -> CrossRateArrays:
        """The cross relation (no diffusion cap) with trial values of the unknown (and partner)."""
        Eu = self.E_unknown if E_unknown is None else E_unknown
        Ep = self.E_partner if E_partner is None else E_partner
        lu = self.ln_k_unknown if ln_k_unknown is None else ln_k_unknown
        lp = self.ln_k_partner if ln_k_partner is None else ln_k_partner
        u, p = self.unknown, self.partner
        ku, kp = self.ln_kappa_unknown, self.ln_kappa_partner
        first, second = (
            ((u, Eu, lu, ku), (p, Ep, lp, kp)) if self.role == "oxidant" else ((p, Ep, lp, kp), (u, Eu, lu, ku))
        )
        rc = self.rc
        return cross_rate(
            first[1], second[1],
            first[0].charge_ox, first[0].charge_red, second[0].charge_ox, second[0].charge_red,
            first[0].radius * ANGSTROM, second[0].radius * ANGSTROM,
            first[2], second[2],
            rc.temperature_K, rc.ionic_strength_M, rc.eps_r, rc.viscosity_Pa_s, rc.ln_Z,
            diffusion=False, ln_kappa11=first[3], ln_kappa22=second[3],
        )

    def ln_k_act(self, **trial) -> float:
        return float(np.asarray(self.evaluate(**trial).ln_k_act))

    def E_from_dG0(self, dG0_J_per_mol: float) -> float:
        """The unknown's root-scale potential giving a cross-reaction Delta G deg (J/mol), Nernst relation."""
        # Delta G deg = -F (E_ox - E_red): the unknown is E_ox when it is the oxidant.
        if self.role == "oxidant":
            return self.E_partner - dG0_J_per_mol / FARADAY
        return self.E_partner + dG0_J_per_mol / FARADAY

    def to_own_scale(self, E_root: float, registry) -> float:
        """A root-scale effective potential of the unknown as its library field E on its own E_scale, V."""
        _, offset = registry.resolve(self.unknown.E_scale)
        return E_root - offset - (self.unknown.effective_E - self.unknown.E) - self.E_unknown_shift

    def used_conditions(self) -> UsedConditions:
        rc = self.rc
        return UsedConditions(
            temperature_K=rc.temperature_K, ionic_strength_M=rc.ionic_strength_M, medium=rc.medium, Z=rc.Z,
            relative_permittivity=rc.eps_r, viscosity_mPa_s=rc.viscosity_Pa_s * 1e3,
            refractive_index=rc.refractive_index, diffusion=rc.diffusion,
        )


def setup_pair(
    couple_set: CoupleSet, unknown_id: str, partner_id: str, role: str = "auto", conditions: Conditions | None = None
) -> PairSetup:
    """Set up the cross reaction of unknown with partner.

    Args:
        couple_set: the loaded couples (UnknownCoupleError for unknown ids).
        unknown_id: the couple solved for; partner_id: the known partner.
        role: the unknown's role, 'oxidant' (its oxidized form takes the electron), 'reductant', or 'auto'
            (the downhill direction with the library potentials).
        conditions: conditions of the measurement (default: the couples' own).
    """
    if role not in ROLES:
        raise ConditionsError(f"role {role!r}: expected oxidant, reductant or auto")
    if unknown_id == partner_id:
        raise ConditionsError(f"{unknown_id!r} is both the unknown and the partner: choose a different partner")
    cond = conditions or Conditions()
    u, p = couple_set[unknown_id], couple_set[partner_id]
    Eu, root_u = couple_set.E_on_root(u)
    Ep, root_p = couple_set.E_on_root(p)
    if root_u != root_p:
        raise ConditionsError(
            f"potentials on scales that cannot be related: {u.id} on {u.E_scale!r}, {p.id} on {p.E_scale!r}; "
            "define an offset between the scales in the library"
        )
    if role == "auto":
        role = "oxidant" if Eu >= Ep else "reductant"
        reason = f"auto: {u.id} taken as the {role}, the downhill direction with the library potentials"
    else:
        reason = f"{u.id} is the {role} (as given)"
    ox, red = (u, p) if role == "oxidant" else (p, u)
    rc = resolve_conditions(ox, red, cond)
    i_u, i_p = (int(i) for i in couple_set.index_of([u.id, p.id]))
    # Same carrying as predict(): to the resolved medium (Pekar rescaling where a couple was measured elsewhere).
    se = self_exchange_at(
        couple_set, [i_u, i_p], rc.temperature_K, rc.ionic_strength_M, rc.eps_r, rc.ln_Z, medium=rc.medium
    )
    if se.reason[1]:
        raise ScienceError(f"partner {se.reason[1]}; the partner's self-exchange rate is needed")
    pa = carry_potentials(couple_set, ox, red, rc, cond)
    k_u, k_p = (0, 1) if role == "oxidant" else (1, 0)
    shift_u = float(pa.dE_ionic_V[k_u] + pa.dE_temperature_V[k_u])
    notes = rc.warnings + potential_warnings(
        (ox, red), pa, rc.temperature_K, rc.ionic_strength_M, rc.medium, rc.activity_model
    )

    setup = PairSetup(
        unknown=u, partner=p, role=role, role_reason=reason, rc=rc,
        E_unknown=float(pa.E_root_V[k_u]), E_partner=float(pa.E_root_V[k_p]),
        E_unknown_sd=float(pa.E_sd_V[k_u]), E_partner_sd=float(pa.E_sd_V[k_p]),
        ln_k_partner=float(se.ln_k[1]), ln_k_partner_sd=float(se.ln_k_sd[1]),
        ln_k_unknown=float(se.ln_k[0]), ln_k_unknown_sd=float(se.ln_k_sd[0]),
        ln_k_diff=float("nan"), warnings=notes, E_unknown_shift=shift_u,
        ln_kappa_unknown=float(np.log(se.kappa_el[0])), ln_kappa_partner=float(np.log(se.kappa_el[1])),
        ln_k_diff_sd=DEFAULT_K_DIFF_LOG10_SD * LN10 if rc.diffusion else 0.0,
    )
    # k_D depends only on radii, charges and solvent, not on E or k_self: evaluate once with placeholders.
    probe = setup.evaluate(ln_k_unknown=0.0 if not np.isfinite(setup.ln_k_unknown) else None)
    return replace(setup, ln_k_diff=float(np.asarray(probe.ln_k_diff)))


def activation_target(setup: PairSetup, ln_k_measured: float) -> tuple[float, bool]:
    """ln k_act that gives the measured ln k_obs through 1/k_obs = 1/k_act + 1/k_D, and whether the
    measured rate is diffusion-limited (k_act > 10 k_D). ScienceError when k_measured >= k_D."""
    if not setup.rc.diffusion:
        return ln_k_measured, False
    gap = ln_k_measured - setup.ln_k_diff
    if gap >= 0:
        raise ScienceError(
            f"measured rate 10^{ln_k_measured / LN10:.2f} M^-1 s^-1 is at or above the diffusion limit of this pair "
            f"(k_D = 10^{setup.ln_k_diff / LN10:.2f} M^-1 s^-1): no activation rate, and so no k_self or E, can be "
            "backed out; check the units (M^-1 s^-1) and concentrations, or use --no-diffusion if k_D is known "
            "to be higher"
        )
    ln_act = ln_k_measured - math.log1p(-math.exp(gap))
    return ln_act, ln_act > setup.ln_k_diff + LN10


def activation_target_nudged_k_diff(setup: PairSetup, ln_k_measured: float, d_ln_k_diff: float) -> float | None:
    """ln k_act as activation_target() gives it with ln k_D moved by d_ln_k_diff (ln units), for propagating
    the SD of k_D; None when the moved k_D falls to or below the measured rate (no activation rate there)."""
    try:
        return activation_target(replace(setup, ln_k_diff=setup.ln_k_diff + d_ln_k_diff), ln_k_measured)[0]
    except ScienceError:
        return None


def brentq_solver():
    """scipy.optimize.brentq, imported only when a solve actually runs (keeps scipy off other commands' start)."""
    from scipy.optimize import brentq

    return brentq


def measured_sd(sd) -> tuple[float, bool]:
    """(SD of log10 k_measured, whether it is the default) from a user's value or None."""
    if sd is None:
        return DEFAULT_MEASURED_LOG10_SD, True
    return require_positive(sd, "measured SD", "a positive number in log10 units"), False


def check_measured_rate(k) -> float:
    """The measured cross rate, M^-1 s^-1, refused unless a finite number above 0."""
    return require_positive(k, "measured rate", "a rate constant greater than 0 in M^-1 s^-1")


def checked_measurement(couple_set, unknown, partner, k_measured, k_measured_log10_sd, role, conditions):
    """The solvers' common arguments checked and the pair set up: (PairSetup, k_measured M^-1 s^-1, SD of
    log10 k_measured, whether that SD is the default). ArgumentError/ScienceError on bad input."""
    require_couple_set(couple_set)
    require_id(unknown, "unknown")
    require_id(partner, "partner")
    require_number(k_measured, "k_measured", "M^-1 s^-1")
    require_conditions(conditions)
    k = check_measured_rate(k_measured)
    sd, defaulted = measured_sd(k_measured_log10_sd)
    return setup_pair(couple_set, unknown, partner, role, conditions), k, sd, defaulted


def lambda_kJ(setup: PairSetup, ln_k_self: float, which: str = "unknown") -> float:
    """lambda_ii (kJ/mol) implied by a self-exchange ln k at the setup's conditions."""
    res = setup.evaluate(ln_k_unknown=ln_k_self) if which == "unknown" else setup.evaluate()
    lam = res.lambda11 if (setup.role == "oxidant") == (which == "unknown") else res.lambda22
    return float(np.asarray(lam)) / KJ
