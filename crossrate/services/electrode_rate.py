"""Predicted standard heterogeneous rate constant k0 of a library couple from its self-exchange rate.

k0 follows Marcus' relation between electrode and self-exchange rates (crossrate.core.electrode_rate):
ln(k0/Z_el) = 1/2 [ln(k_ex/Z_sol) + w_ex/RT], with k_ex the couple's self-exchange rate at the chosen
conditions (as every prediction obtains it: crossrate.services.self_exchange), w_ex the Debye-Hueckel-Brønsted
work term of the self-exchange pair, Z_sol the solution collision factor of the prediction (default
1e11 M^-1 s^-1) and Z_el = (RT / 2 pi M)^1/2 from the couple's molar_mass, or DEFAULT_Z_EL_CM_S when none is
given. The work of bringing a charged reactant to the electrode (the double-layer, or Frumkin, correction) is
taken as zero: an approximation that holds best with plenty of supporting electrolyte, and is stated with
every charged couple's result.

The interval combines the uncertainty of k_ex (halved, as k0 goes with its square root) with the scatter of
the relation itself, RELATION_LOG10_SD (common practice: measured k0 agree with this estimate within about
an order of magnitude, so the 95 % band spans about a factor of 10 either way).
"""

from dataclasses import asdict, dataclass

import numpy as np

from ..core.constants import KJ
from ..core.diffusion import stokes_einstein_diffusion
from ..core.electrode_rate import (
    DEFAULT_Z_EL_M_PER_S,
    electrode_collision_factor,
    electrode_lambda,
    ln_k0_from_self_exchange,
)
from ..core.work_terms import work_term
from ..errors import ScienceError
from ..library.couple_set import CoupleSet
from .conditions import Conditions
from .prediction import resolve_conditions
from .self_exchange import self_exchange_at

#: Default electrode collision factor, cm/s (Marcus' usual estimate; common practice).
DEFAULT_Z_EL_CM_S = DEFAULT_Z_EL_M_PER_S * 100.0
#: SD (log10) of the relation itself (common practice: agreement within about an order of magnitude).
RELATION_LOG10_SD = 0.5
#: Two-sided 95 % normal quantile.
Z95 = 1.959963984540054
_LN10 = float(np.log(10.0))

WORK_TERM_NOTE = (
    "charges {z_ox:+d}/{z_red:+d}: the work of bringing the couple to the electrode (the double-layer, or "
    "Frumkin, correction) is taken as zero, an approximation that holds best in excess supporting electrolyte; "
    "the self-exchange work term ({w:.2f} kJ/mol) is removed from k_self"
)
RELATION_TEXT = "k0/Z_el = (k_ex/Z_sol)^1/2 (Marcus 1965), work terms removed, lambda_el = lambda_ex/2"


@dataclass(frozen=True)
class ElectrodeRate:
    """Predicted k0 of one couple.

    log10_k0 (cm/s) with its SD and 95 % interval (log10 cm/s); log10_k_self (M^-1 s^-1) at the conditions with
    its SD (log10); w_self_kJ_per_mol: work term of the self-exchange pair; Z_sol (M^-1 s^-1); Z_el_cm_s and
    where it came from; lambda_self_kJ_per_mol and lambda_el_kJ_per_mol (= half) behind k_self (NaN when not
    known); temperature_K, ionic_strength_M, medium: the conditions used; notes: approximations in words.
    """

    couple: str
    name: str
    temperature_K: float
    ionic_strength_M: float
    medium: str
    log10_k_self: float
    log10_k_self_sd: float
    w_self_kJ_per_mol: float
    Z_sol: float
    Z_el_cm_s: float
    Z_el_source: str
    lambda_self_kJ_per_mol: float
    lambda_el_kJ_per_mol: float
    log10_k0: float
    log10_k0_sd: float
    log10_k0_95: tuple[float, float]
    relation: str
    notes: tuple[str, ...]

    @property
    def k0_cm_s(self) -> float:
        """k0 in cm/s."""
        return 10.0**self.log10_k0

    def to_dict(self) -> dict:
        """JSON-ready dict (units in the key names; NaN written as None)."""
        d = asdict(self)
        d["log10_k0_95"] = list(self.log10_k0_95)
        d["notes"] = list(self.notes)
        d["k0_cm_s"] = self.k0_cm_s
        return {k: (None if isinstance(v, float) and not np.isfinite(v) else v) for k, v in d.items()}


def electrode_collision_cm_s(molar_mass_g_per_mol: float | None, T_K: float) -> tuple[float, str]:
    """Z_el in cm/s from a molar mass (g/mol; None: the documented default) and where the value came from."""
    if molar_mass_g_per_mol is None:
        return DEFAULT_Z_EL_CM_S, f"default {DEFAULT_Z_EL_CM_S:g} cm/s (no molar_mass given)"
    z = float(electrode_collision_factor(molar_mass_g_per_mol / 1000.0, T_K)) * 100.0
    return z, f"(RT/2 pi M)^1/2 with M = {molar_mass_g_per_mol:g} g/mol"


def predict_k0(
    couple_set: CoupleSet, couple_id: str, conditions: Conditions | None = None, Z_el_cm_s: float | None = None
) -> ElectrodeRate:
    """Predicted standard heterogeneous rate constant k0 (cm/s) of a couple, with its 95 % interval.

    Args:
        couple_set: the library; couple_id: the couple (UnknownCoupleError with suggestions otherwise).
        conditions: temperature, ionic strength, medium and Z_sol (Conditions.Z, M^-1 s^-1); default the couple's.
        Z_el_cm_s: electrode collision factor in cm/s (None: from molar_mass, else the default).

    Raises:
        ScienceError: the couple has no self-exchange rate and nothing to estimate it from.
    """
    cond = conditions or Conditions()
    c = couple_set[couple_id]
    rc = resolve_conditions(c, c, cond)
    i = int(couple_set.index_of([couple_id])[0])
    se = self_exchange_at(couple_set, [i], rc.temperature_K, rc.ionic_strength_M, rc.eps_r, rc.ln_Z, medium=rc.medium)
    ln_k = float(se.ln_k[0])
    if not np.isfinite(ln_k):
        raise ScienceError(f"no k0 for {couple_id}: {se.reason[0]}")
    T = rc.temperature_K
    w = float(work_term(c.charge_ox, c.charge_red, 2.0 * c.radius * 1e-10, rc.eps_r, T, rc.ionic_strength_M))
    if Z_el_cm_s is None:
        z_el, z_src = electrode_collision_cm_s(c.molar_mass, T)
    else:
        if not (np.isfinite(Z_el_cm_s) and Z_el_cm_s > 0):
            raise ScienceError(f"Z_el {Z_el_cm_s!r} cm/s: expected a positive finite number")
        z_el, z_src = float(Z_el_cm_s), "given"
    ln_k0 = float(ln_k0_from_self_exchange(ln_k, w, T, rc.ln_Z, np.log(z_el)))
    sd_kex = float(se.ln_k_sd[0]) / _LN10
    sd = float(np.hypot(0.5 * sd_kex, RELATION_LOG10_SD))
    lg = ln_k0 / _LN10
    lam = float(se.lambda_J[0]) if se.lambda_J is not None else float("nan")
    notes = []
    if c.charge_ox != 0 or c.charge_red != 0:
        notes.append(WORK_TERM_NOTE.format(z_ox=c.charge_ox, z_red=c.charge_red, w=w / KJ))
    described = se.description(0)
    if described:
        notes.append(described)
    if c.kappa_el is not None and c.kappa_el < 1.0:
        notes.append(f"kappa_el = {c.kappa_el:g} of the self-exchange is carried into k0 through k_self as it is")
    notes.extend(rc.warnings)
    return ElectrodeRate(
        couple=c.id,
        name=c.name,
        temperature_K=T,
        ionic_strength_M=rc.ionic_strength_M,
        medium=rc.medium,
        log10_k_self=ln_k / _LN10,
        log10_k_self_sd=sd_kex,
        w_self_kJ_per_mol=w / KJ,
        Z_sol=rc.Z,
        Z_el_cm_s=z_el,
        Z_el_source=z_src,
        lambda_self_kJ_per_mol=lam / KJ,
        lambda_el_kJ_per_mol=float(electrode_lambda(lam)) / KJ,
        log10_k0=lg,
        log10_k0_sd=sd,
        log10_k0_95=(lg - Z95 * sd, lg + Z95 * sd),
        relation=RELATION_TEXT,
        notes=tuple(notes),
    )


def couple_diffusion_cm2_s(couple_set: CoupleSet, couple_id: str, conditions: Conditions | None = None) -> float:
    """Diffusion coefficient of a couple's forms, cm^2/s: Stokes-Einstein D = k_B T / (6 pi eta a) with the
    couple's radius a and the medium's viscosity at the conditions (the same for Ox and Red)."""
    c = couple_set[couple_id]
    rc = resolve_conditions(c, c, conditions or Conditions())
    return float(stokes_einstein_diffusion(c.radius * 1e-10, rc.viscosity_Pa_s, rc.temperature_K)) * 1e4
