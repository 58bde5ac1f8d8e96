"""Screening one library couple against a table of computed candidate couples (library.candidate_table).

The candidates' values are taken as stated at the screen's conditions (computed values carry no
measurement conditions): medium = the conditions' medium or the target's own, temperature and ionic
strength = the conditions' (the ionic strength defaults to the target's). Their potentials are on one
scale (`scale`, related to the target's root scale), each candidate is adiabatic (kappa_el = 1) and its
self-exchange rate is k_self as given, or from lambda_total by the Marcus self-exchange relation
k_ii = Z exp(-(w_ii + lambda/4)/RT) with its work term w_ii. The target is carried to the conditions as in
predict() (services.self_exchange, services.carried_potentials). All pairs go through the core's
vectorized Marcus cross relation with work terms and the diffusion cap (core.cross_rate) in one call; under
the semiclassical model k_act carries the quantum factor of predict() (services.rate_model.apply_inner), each
candidate's inner part of lambda being the default share.
"""

from dataclasses import dataclass

import numpy as np

from ..core.barrier import self_exchange_ln_k
from ..core.constants import ANGSTROM, KJ
from ..core.cross_rate import cross_rate
from ..core.solvents import get_solvent
from ..core.work_terms import work_term
from ..errors import ConditionsError, ScienceError
from ..library.candidate_table import CandidateTable
from ..library.couple_set import CoupleSet
from .conditions import Conditions
from .couple_lambda import lambda_columns
from .rate_model import apply_inner, couple_modes, model_record
from .self_exchange import self_exchange_at

LN10 = float(np.log(10.0))


@dataclass(frozen=True)
class CandidateScreen:
    """The fastest candidates for one target. target, role; medium, temperature_K, ionic_strength_M: the
    conditions used; candidates: rows in the table; partner, log10_k_obs (M^-1 s^-1), dG0_kJ_per_mol,
    diffusion_controlled: the kept rows, fastest first; not_computable: candidates with no finite rate."""

    target: str
    role: str
    medium: str
    temperature_K: float
    ionic_strength_M: float
    scale: str
    candidates: int
    not_computable: int
    partner: tuple[str, ...]
    log10_k_obs: tuple[float, ...]
    dG0_kJ_per_mol: tuple[float, ...]
    diffusion_controlled: tuple[bool, ...]
    #: 'classical' or 'semiclassical' (services.rate_model; the candidates' inner part is the default share).
    rate_model: str = "classical"
    semiclassical: dict | None = None

    def records(self) -> list[dict]:
        return [{"partner": p, "log10_k_obs": k, "dG0_kJ_per_mol": g, "diffusion_controlled": d}
                for p, k, g, d in zip(self.partner, self.log10_k_obs, self.dG0_kJ_per_mol, self.diffusion_controlled,
                                      strict=True)]


def screen_candidates(couple_set: CoupleSet, target: str, role: str, table: CandidateTable, scale: str = "SHE",
                      conditions: Conditions | None = None, top: int = 20) -> CandidateScreen:
    """Rank the candidates of `table` as partners of library couple `target` in `role` ("oxidant": Ox_target +
    Red_candidate; "reductant": Ox_candidate + Red_target). scale: the candidates' potential scale key.
    Raises UnknownCoupleError, ConditionsError (scales that cannot be related, bad conditions) or ScienceError
    (the target has no self-exchange data)."""
    if role not in ("oxidant", "reductant"):
        raise ConditionsError(f"role {role!r}: expected oxidant or reductant")
    cond = conditions or Conditions()
    c = couple_set[target]
    ti = couple_set.index_of([target])
    medium = cond.medium or c.medium
    try:
        sol = get_solvent(medium)
    except KeyError as exc:
        raise ConditionsError(str(exc.args[0])) from None
    T = float(cond.temperature_K)
    I = float(cond.ionic_strength_M if cond.ionic_strength_M is not None else c.ionic_strength)
    eps, visc, ln_Z = float(sol.permittivity(T)), float(sol.viscosity_Pa_s(T)), float(np.log(cond.Z))
    if scale not in couple_set.scales:
        raise ConditionsError(f"candidate scale {scale!r}: unknown; expected one of "
                              f"{', '.join(sorted(couple_set.scales.keys()))}")
    root, offset = couple_set.scales.resolve(scale)
    t_root = couple_set.arrays.scale_root[ti[0]]
    if root != t_root:
        raise ConditionsError(f"candidate scale {scale} (root {root}) cannot be related to the target's "
                              f"{c.E_scale} (root {t_root}); expected potentials on related scales")
    from .carried_potentials import potentials_at

    se = self_exchange_at(couple_set, ti, T, I, eps, ln_Z, medium=medium)
    if not np.isfinite(se.ln_k[0]):
        raise ScienceError(f"{target}: {se.reason[0] or 'no self-exchange rate'}; expected k_self, lambda_total, "
                           "lambda_in or bonds")
    pa = potentials_at(couple_set, ti, T, I, eps, medium=medium, activity_model=cond.activity_model)
    if pa.other_medium[0] and not cond.allow_E_other_medium:
        raise ConditionsError(f"{target}: its potential was measured in {c.medium}, not {medium}; expected the "
                              "same medium (or allow it with --allow-E-other-medium)")
    E_t = float(pa.E_root_V[0])
    ln_kap_t = float(np.log(lambda_columns(couple_set).kappa_el[ti[0]]))
    r_c = table.radius_A * ANGSTROM
    z_ox, z_red = table.z_ox.astype(float), table.z_red.astype(float)
    if table.rate_column == "k_self":
        ln_k_c = np.log(table.rate)
    else:
        w_self = work_term(z_ox, z_red, 2.0 * r_c, eps, T, I)
        ln_k_c = self_exchange_ln_k(table.rate * KJ, w_self, T, ln_Z)
    E_c = table.E_V + offset
    t = (E_t, float(c.charge_ox), float(c.charge_red), float(c.radius) * ANGSTROM, float(se.ln_k[0]), ln_kap_t)
    k = (E_c, z_ox, z_red, r_c, ln_k_c, 0.0)
    one, two = (t, k) if role == "oxidant" else (k, t)
    with np.errstate(invalid="ignore", over="ignore"):
        res = cross_rate(one[0], two[0], one[1], one[2], two[1], two[2], one[3], two[3], one[4], two[4], T, I, eps,
                         visc, ln_Z, diffusion=cond.diffusion, ln_kappa11=one[5], ln_kappa22=two[5])
        if cond.rate_model == "semiclassical":
            # The target's own lambda_in (or bonds) and mode; each candidate's inner part is the default share of
            # its lambda, its mode the option's or the default.
            lin_t = float(lambda_columns(couple_set).lambda_in_J[ti[0]])
            hw_t = float(couple_modes(couple_set, ti, cond.hbar_omega_cm1)[0][0])
            lin = (lin_t, np.nan) if role == "oxidant" else (np.nan, lin_t)
            hws = (hw_t, None) if role == "oxidant" else (None, hw_t)
            res = apply_inner(res, lin[0], lin[1], cond, cond.diffusion, *hws)
    log10_k = np.broadcast_to(np.asarray(res.ln_k_obs, dtype=float) / LN10, (len(table),))
    finite = np.isfinite(log10_k)
    keyed = np.where(finite, log10_k, -np.inf)
    n_top = min(int(top), len(table))
    part = np.argpartition(-keyed, n_top - 1)[:n_top] if n_top < len(table) else np.arange(len(table))
    order = part[np.argsort(-keyed[part], kind="stable")]
    order = order[finite[order]]
    dG0 = np.broadcast_to(np.asarray(res.dG0, dtype=float) / KJ, (len(table),))
    dc = np.broadcast_to(np.asarray(res.diffusion_controlled, dtype=bool), (len(table),))
    record = model_record(couple_set, ti, cond)
    if record is not None:
        record["couples_with_default_inner"] += len(table)  # every candidate
    return CandidateScreen(target, role, medium, T, I, scale, len(table), int((~finite).sum()),
                           tuple(table.id_text(i) for i in order), tuple(float(x) for x in log10_k[order]),
                           tuple(float(x) for x in dG0[order]), tuple(bool(x) for x in dc[order]),
                           cond.rate_model, record)
