"""Vectorized predictions for many (oxidant, reductant) pairs at once: no Python loop per pair."""

import numpy as np

from ..core.constants import KJ
from ..core.cross_rate import cross_rate
from ..core.regime import REGIME_NAMES
from ..core.solvents import get_solvent
from ..errors import ConditionsError
from ..library.couple_set import CoupleSet
from .arguments import positions, require_conditions, require_couple_set
from .carried_potentials import potentials_at
from .conditions import Conditions
from .couple_lambda import lambda_columns
from .pair_groups import PairGroup, carry_grouped, condition_groups, linear_sd_grouped
from .prediction_table import PredictionTable
from .rate_model import apply_to_pairs, grid_model
from .self_exchange import self_exchange_at
from .uncertainty import DEFAULT_K_DIFF_LOG10_SD

LN10 = float(np.log(10.0))


def _as_index(cs: CoupleSet, ids, name: str = "ids") -> np.ndarray:
    return positions(cs, ids, name)


def evaluate_pairs(cs: CoupleSet, ox_idx, red_idx, conditions: Conditions | None = None, uncertainty=True):
    """Core evaluation for index arrays of pairs. Returns (CrossRateArrays, sd_log10 or None, problem array).

    Per pair the medium is conditions.medium or the oxidant's own, the ionic strength conditions'
    or the couples' common one. Pairs that cannot be computed get NaN and a reason in `problem`.
    """
    cond = conditions or Conditions()
    a = cs.arrays
    ox = np.asarray(ox_idx, dtype=np.intp)
    red = np.asarray(red_idx, dtype=np.intp)
    n = ox.shape[0]
    T = float(cond.temperature_K)
    ln_Z = float(np.log(cond.Z))
    problem = np.full(n, "", dtype=object)

    same_root = a.scale_root[ox] == a.scale_root[red]
    problem[~same_root] = "potentials on scales that cannot be related"
    mixed = a.medium[ox] != a.medium[red]
    if not cond.allow_mixed_media:
        problem[mixed & (problem == "")] = "couples measured in different media"

    if cond.medium is not None:
        try:
            sol = get_solvent(cond.medium)
        except KeyError as exc:
            raise ConditionsError(str(exc.args[0])) from None
        eps = float(sol.permittivity(T))
        visc = float(sol.viscosity_Pa_s(T))
        per_pair_medium = False
    else:
        media = sorted(set(a.medium.tolist()))
        table = {m: (float(get_solvent(m).permittivity(T)), float(get_solvent(m).viscosity_Pa_s(T))) for m in media}
        per_pair_medium = len(media) > 1
        if per_pair_medium:
            eps_c = np.array([table[m][0] for m in a.medium], dtype=float)
            visc_c = np.array([table[m][1] for m in a.medium], dtype=float)
            eps, visc = eps_c[ox], visc_c[ox]
        else:
            # One medium in the whole set: scalars, so that the per-couple carrying below broadcasts.
            eps, visc = table[media[0]] if media else (float("nan"), float("nan"))

    if cond.ionic_strength_M is not None:
        I = float(cond.ionic_strength_M)
        per_pair_I = False
    else:
        I0o, I0r = a.I0_M[ox], a.I0_M[red]
        agree = np.abs(I0o - I0r) <= 1e-9
        problem[~agree & (problem == "")] = "couples measured at different ionic strengths and no ionic strength given"
        I = np.where(agree, I0o, np.nan)
        per_pair_I = True

    groups = None
    if per_pair_I or per_pair_medium:
        pair_medium = cond.medium if cond.medium is not None else a.medium[ox]
        # Usually a few (I, medium) combinations: carry each couple once per combination, not once per pair.
        groups = condition_groups(pair_medium, I, n, T)
    if groups is not None:
        lnk_ox, sd_ox, lnk_red, sd_red, lnk_by_group = carry_grouped(cs, ox, red, groups, T, ln_Z, cond.medium)
        bad_I = ~np.isfinite(np.asarray(I, dtype=float))
        lnk_ox = np.where(bad_I, np.nan, lnk_ox)
    elif per_pair_I or per_pair_medium:
        se_ox = self_exchange_at(cs, ox, T, I, eps, ln_Z, medium=pair_medium)
        se_red = self_exchange_at(cs, red, T, I, eps, ln_Z, medium=pair_medium)
        lnk_ox, sd_ox, lnk_red, sd_red = se_ox.ln_k, se_ox.ln_k_sd, se_red.ln_k, se_red.ln_k_sd
    else:
        # Same conditions for every pair: carry each couple once, then gather.
        allc = np.arange(len(cs))
        se = self_exchange_at(cs, allc, T, I, eps, ln_Z, medium=cond.medium)
        lnk_ox, sd_ox, lnk_red, sd_red = se.ln_k[ox], se.ln_k_sd[ox], se.ln_k[red], se.ln_k_sd[red]
    # Formal potentials carried to each pair's conditions (same per-couple carrying as predict()).
    pair_medium_E = cond.medium if cond.medium is not None else a.medium[ox]
    act = cond.activity_model
    if groups is None and not (per_pair_I or per_pair_medium):
        pa_all = potentials_at(cs, np.arange(len(cs)), T, I, eps, medium=cond.medium, activity_model=act)
        E_ox, sE1, E_red, sE2 = pa_all.E_root_V[ox], pa_all.E_sd_V[ox], pa_all.E_root_V[red], pa_all.E_sd_V[red]
        other_E = pa_all.other_medium[ox] | pa_all.other_medium[red]
        E_by_group = [pa_all.E_root_V]
    else:
        I_pair = np.broadcast_to(np.nan_to_num(np.asarray(I, dtype=float), nan=0.0), (n,))
        pa_ox = potentials_at(cs, ox, T, I_pair, eps, medium=pair_medium_E, activity_model=act)
        pa_red = potentials_at(cs, red, T, I_pair, eps, medium=pair_medium_E, activity_model=act)
        E_ox, sE1, E_red, sE2 = pa_ox.E_root_V, pa_ox.E_sd_V, pa_red.E_root_V, pa_red.E_sd_V
        other_E = pa_ox.other_medium | pa_red.other_medium
        E_by_group = None
    if not cond.allow_E_other_medium:
        problem[other_E & (problem == "")] = (
            "a potential measured in another medium (not transferable; allow with --allow-E-other-medium)"
        )
    # kappa_el per couple: lambda_ii is read from k_ii / (kappa_el Z) and k12 carries (kappa11 kappa22)^(1/2).
    ln_kap = np.log(lambda_columns(cs).kappa_el)
    no_rate = ~(np.isfinite(lnk_ox) & np.isfinite(lnk_red))
    problem[no_rate & (problem == "")] = "no self-exchange rate or reorganization energy"

    def run(dE1=0.0, dE2=0.0, d1=0.0, d2=0.0):
        return apply_to_pairs(classical(dE1, dE2, d1, d2), cs, ox, red, cond, cond.diffusion)

    def classical(dE1, dE2, d1, d2):
        return cross_rate(
            E_ox + dE1,
            E_red + dE2,
            a.z_ox[ox],
            a.z_red[ox],
            a.z_ox[red],
            a.z_red[red],
            a.radius_m[ox],
            a.radius_m[red],
            lnk_ox + d1,
            lnk_red + d2,
            T,
            I,
            eps,
            visc,
            ln_Z,
            diffusion=cond.diffusion,
            ln_kappa11=ln_kap[ox],
            ln_kappa22=ln_kap[red],
        )

    with np.errstate(invalid="ignore"):
        res = run()
        sd = None
        if uncertainty:
            if groups is None and not (per_pair_I or per_pair_medium):
                groups = [PairGroup(np.arange(n), float(I), cond.medium or "", float(eps), float(visc))]
                lnk_by_group = [se.ln_k]
            if groups is not None:
                # Same central differences on the core fast path (rate_grid), one set of conditions per group.
                if E_by_group is None:
                    E_by_group = [
                        potentials_at(cs, np.arange(len(cs)), T, g.I_M, g.eps_r,
                                      medium=g.medium if cond.medium is None else cond.medium,
                                      activity_model=act).E_root_V
                        for g in groups
                    ]
                sd = linear_sd_grouped(cs, ox, red, groups, lnk_by_group, (sE1, sE2, sd_ox, sd_red), T, ln_Z,
                                       cond.diffusion, E_by_group, grid_model(cs, np.arange(len(cs)), cond)) / LN10
            else:
                var = np.zeros(n)
                for k, (h, s) in enumerate(((1e-4, sE1), (1e-4, sE2), (1e-3, sd_ox), (1e-3, sd_red))):
                    shift = [0.0, 0.0, 0.0, 0.0]
                    shift[k] = h
                    up = run(*shift).ln_k_obs
                    shift[k] = -h
                    dn = run(*shift).ln_k_obs
                    var += ((up - dn) / (2 * h) * s) ** 2
                sd = np.sqrt(var) / LN10
            if cond.diffusion:
                # k_D's own uncertainty: d ln k_obs / d ln k_D = k_obs / k_D exactly (1/k_obs = 1/k_act + 1/k_D).
                share = np.exp(np.asarray(res.ln_k_obs, dtype=float) - np.asarray(res.ln_k_diff, dtype=float))
                sd = np.hypot(sd, share * DEFAULT_K_DIFF_LOG10_SD)
    bad = problem != ""
    return res, sd, problem, bad


def predict_many(
    couple_set: CoupleSet, oxidants, reductants, conditions: Conditions | None = None, uncertainty: bool = True
) -> PredictionTable:
    """Predict k12 for many pairs (ids or integer positions; equal lengths), vectorized.

    Same model as predict() (Marcus cross relation, work terms, diffusion cap; the semiclassical quantum
    factor with conditions.rate_model='semiclassical'); uncertainty is the
    first-order (linear) SD of log10 k_obs from E, k_self and k_D (DEFAULT_K_DIFF_LOG10_SD, with the cap on).
    Pairs that cannot be computed are NaN with a reason.
    """
    require_couple_set(couple_set)
    require_conditions(conditions)
    ox = _as_index(couple_set, oxidants, "oxidants")
    red = _as_index(couple_set, reductants, "reductants")
    if ox.shape != red.shape:
        raise ConditionsError(f"{len(ox)} oxidants but {len(red)} reductants: give equal numbers")
    res, sd, problem, bad = evaluate_pairs(couple_set, ox, red, conditions, uncertainty)
    ids = np.asarray(couple_set.arrays.ids, dtype=object)

    def col(x, scale=1.0):
        v = np.asarray(x, dtype=float) / scale
        return tuple(np.where(bad, np.nan, v).tolist())

    names = np.asarray(REGIME_NAMES, dtype=object)[res.regime]
    return PredictionTable(
        oxidant=tuple(ids[ox].tolist()),
        reductant=tuple(ids[red].tolist()),
        dG0_kJ_per_mol=col(res.dG0, KJ),
        dG0_prime_kJ_per_mol=col(res.dG0_prime, KJ),
        lambda_kJ_per_mol=col(res.lambda12, KJ),
        log10_k_act=col(res.ln_k_act, LN10),
        log10_k_diff=col(res.ln_k_diff, LN10),
        log10_k_obs=col(res.ln_k_obs, LN10),
        log10_k_obs_sd_linear=col(sd if sd is not None else np.full(len(ox), np.nan)),
        regime=tuple(np.where(bad, "", names).tolist()),
        diffusion_controlled=tuple((np.asarray(res.diffusion_controlled) & ~bad).tolist()),
        problem=tuple(problem.tolist()),
    )
