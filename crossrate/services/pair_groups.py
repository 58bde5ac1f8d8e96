"""Speed helpers for predict_many: pairs grouped by their (ionic strength, medium), so that each couple's
self-exchange rate is carried once per group instead of once per pair, and the linear uncertainty runs on
the core fast path (crossrate.core.rate_grid.ln_k_obs_pairs, same model as cross_rate).

No science of its own: the same self_exchange_at and the same central differences as before, reorganised.
"""

from dataclasses import dataclass

import numpy as np

from ..core.rate_grid import ln_k_obs_pairs
from ..core.screened_debye_table import TABLE_MIN_PAIRS, screened_debye_table
from ..core.solvents import get_solvent
from ..library.couple_set import CoupleSet
from .couple_lambda import lambda_columns
from .self_exchange import self_exchange_at

#: Above this many distinct (I, medium) combinations the per-pair path is used (grouping would not pay).
MAX_GROUPS = 64
#: Central-difference steps for E (V) and ln k_self, as in uncertainty.linear_sd.
STEP_E_V = 1e-4
STEP_LN_K = 1e-3


@dataclass(frozen=True)
class PairGroup:
    """Pairs `rows` (positions in the pair arrays) that share ionic strength I_M (mol/L) and medium."""

    rows: np.ndarray
    I_M: float
    medium: str
    eps_r: float
    viscosity_Pa_s: float


def condition_groups(medium_pair, I_pair, n: int, T_K: float) -> list[PairGroup] | None:
    """Groups of the n pairs with equal (I, medium); None when there are more than MAX_GROUPS of them.

    medium_pair: solvent key per pair (or one str); I_pair: ionic strength per pair (or one float), mol/L;
    NaN ionic strengths (pairs already flagged as not computable) are grouped with I = 0 and stay flagged.
    """
    I = np.broadcast_to(np.nan_to_num(np.asarray(I_pair, dtype=float), nan=0.0), (n,))
    med = np.broadcast_to(np.asarray(medium_pair, dtype=object), (n,))
    names = sorted(set(med.tolist()))
    lookup = {m: k for k, m in enumerate(names)}
    med_code = np.fromiter(map(lookup.__getitem__, med.tolist()), dtype=np.intp, count=n)
    I_values, I_code = np.unique(I, return_inverse=True)
    key = med_code * len(I_values) + I_code.ravel()
    order = np.argsort(key, kind="stable")
    bounds = np.flatnonzero(np.diff(key[order])) + 1
    if bounds.size + 1 > MAX_GROUPS:
        return None
    groups = []
    for rows in np.split(order, bounds):
        if rows.size == 0:
            continue
        k = int(key[rows[0]])
        m = names[k // len(I_values)]
        sol = get_solvent(m)
        groups.append(PairGroup(rows, float(I_values[k % len(I_values)]), m,
                                float(sol.permittivity(T_K)), float(sol.viscosity_Pa_s(T_K))))
    return groups


def carry_grouped(cs: CoupleSet, ox, red, groups: list[PairGroup], T_K: float, ln_Z: float, medium_given):
    """(ln k_ox, sd_ox, ln k_red, sd_red) per pair, and ln k per couple for each group.

    self_exchange_at runs over every couple once per group and is gathered for the pairs.
    medium_given: the conditions' medium (None: each group's own medium is the target solvent).
    """
    n = ox.shape[0]
    out = [np.full(n, np.nan) for _ in range(4)]
    per_group = []
    allc = np.arange(len(cs))
    for g in groups:
        se = self_exchange_at(cs, allc, T_K, g.I_M, g.eps_r, ln_Z, medium=g.medium if medium_given is None else medium_given)
        o, r = ox[g.rows], red[g.rows]
        out[0][g.rows] = se.ln_k[o]
        out[1][g.rows] = se.ln_k_sd[o]
        out[2][g.rows] = se.ln_k[r]
        out[3][g.rows] = se.ln_k_sd[r]
        per_group.append(se.ln_k)
    return (*out, per_group)


def linear_sd_grouped(cs: CoupleSet, ox, red, groups, ln_k_by_group, sds, T_K, ln_Z, diffusion, E_by_group,
                      model=None):
    """First-order SD of ln k_obs per pair by central differences (uncertainty.linear_sd, vectorized).

    sds: (sE1, sE2, s_lnk11, s_lnk22) per pair; ln_k_by_group: ln k_self per couple for each group;
    E_by_group: potential per couple carried to each group's conditions (V, root scale).
    In the cross relation E1 and E2 enter only as E1 - E2 (Delta G deg), and ln k11, ln k22 only as their
    sum (in ln k12 and in ln f12), so d/dE2 = -d/dE1 and d/d ln k22 = d/d ln k11: two derivatives give
    all four slopes. The oxidant's inputs are shifted on a doubled couple list (oxidant copies first,
    reductant copies after). Returns the SD of ln k_obs (natural log) per pair.
    model: keyword arguments of the semiclassical model (services.rate_model.grid_model; {} or None:
    classical). Its quantum factor depends on E1 - E2 alone, but on ln k11 and ln k22 apart (a couple's default
    inner part follows its own lambda), so the two k_self slopes are then taken one by one.
    """
    a = cs.arrays
    N = len(cs)
    var = np.zeros(ox.shape[0])
    z_ox = np.concatenate([a.z_ox, a.z_ox])
    z_red = np.concatenate([a.z_red, a.z_red])
    r = np.concatenate([a.radius_m, a.radius_m])
    ln_kap = np.log(lambda_columns(cs).kappa_el)
    ln_kap2 = np.concatenate([ln_kap, ln_kap]) if np.any(ln_kap != 0.0) else None
    sE = np.hypot(sds[0], sds[1])
    sK = np.hypot(sds[2], sds[3])
    semi = {}
    steps = ((0, STEP_E_V, sE, slice(0, N)), (1, STEP_LN_K, sK, slice(0, N)))
    if model:
        lam_in = np.concatenate([model["lambda_in_J"], model["lambda_in_J"]])
        own = model["hbar_omega_J"]
        semi = {"semiclassical": model["semiclassical"], "lambda_in_J": lam_in,
                "hbar_omega_J": None if own is None else np.concatenate([own, own])}
        steps = ((0, STEP_E_V, sE, slice(0, N)), (1, STEP_LN_K, sds[2], slice(0, N)),
                 (1, STEP_LN_K, sds[3], slice(N, 2 * N)))
    for g, lnk, E_g in zip(groups, ln_k_by_group, E_by_group, strict=True):
        o, rr = ox[g.rows], red[g.rows] + N
        E2 = np.concatenate([E_g, E_g])
        k2 = np.concatenate([lnk, lnk])
        # k_D does not move with E or k_self: one screened-diffusion table serves the four shifted evaluations.
        table = screened_debye_table(z_ox, r, z_red, r, T_K, g.I_M, g.eps_r) \
            if diffusion and o.size >= TABLE_MIN_PAIRS else None
        for which, h, spread, side in steps:
            vals = []
            for sign in (1.0, -1.0):
                E, lk = E2, k2
                if which == 0:
                    E = E2.copy()
                    E[side] += sign * h
                else:
                    lk = k2.copy()
                    lk[side] += sign * h
                with np.errstate(invalid="ignore"):
                    vals.append(ln_k_obs_pairs(o, rr, E, z_ox, z_red, r, lk, T_K, g.I_M, g.eps_r,
                                               g.viscosity_Pa_s, ln_Z, diffusion=diffusion,
                                               ln_kappa=ln_kap2, debye_table=table, **semi).ln_k_obs)
            var[g.rows] += ((vals[0] - vals[1]) / (2.0 * h) * spread[g.rows]) ** 2
    return np.sqrt(var)
