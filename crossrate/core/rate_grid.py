"""Fast path for many pairs at one set of conditions: ln k_obs (and optionally the regime) only.

Same model and results as :func:`crossrate.core.cross_rate.cross_rate` (Marcus cross relation with
work terms, Debye's diffusion cap with the screened potential), evaluated in its barrier form, which is
algebraically the same as the cross relation. Speed comes from structure, not from a different equation:

* everything that belongs to one couple (its self-exchange work w_ii, lambda_ii, diffusion coefficient,
  F E / RT) is computed once per couple, not once per pair;
* w12 and w21 share the screened-Coulomb distance factor 1 / (eps r12 (1 + kappa r12)), computed once;
* all quantities are carried in units of RT, so no per-pair division by RT;
* at finite ionic strength the screened Debye factor is read from a table along r12 per charge product
  (crossrate.core.screened_diffusion.ScreenedDebyeTable, within 2e-5 in ln k_D), built once per call;
* pairs are processed in row blocks that fit the L2 cache, into preallocated buffers, by a small pool of
  threads (numpy releases the GIL inside its loops).
"""

from dataclasses import dataclass

import numpy as np

from .level_sum import LevelWeights
from .rate_kernel import (
    CoupleSide,
    KernelConditions,
    block_buffers,
    kernel_checks,
    rate_kernel,
    run_blocks,
    side_columns,
    table_columns,
)
from .screened_debye_table import table_for

#: Pairs per block. Measured on the 2-core target (tests/benchmarks/bench_core.py): 8 float64 scratch arrays
#: of 64k pairs (4 MB) lose a little to cache misses, but smaller blocks lose more to the GIL-held Python
#: part of each numpy call, which the two worker threads cannot overlap.
BLOCK_PAIRS = 65536
#: Worker threads used by default (the target machine has 2 cores).
DEFAULT_WORKERS = 2


@dataclass(frozen=True)
class RateGrid:
    """Result of the fast path.

    ln_k_obs: ln of the observed rate constant, ln(M^-1 s^-1) (equals ln k_act when the cap is off);
    regime: int8 regime codes (see crossrate.core.regime) or None when not asked for;
    diffusion_controlled: bool, k_act > DIFFUSION_CONTROL_RATIO x k_D (all False with the cap off), or None.
    """

    ln_k_obs: np.ndarray
    regime: np.ndarray | None
    diffusion_controlled: np.ndarray | None


def ln_k_obs_grid(
    E1_V, z_ox1, z_red1, r1_m, ln_k11,
    E2_V, z_ox2, z_red2, r2_m, ln_k22,
    T_K, I_M, eps_r, viscosity_Pa_s, ln_Z,
    diffusion=True, classify=False, workers=DEFAULT_WORKERS, ln_kappa1=None, ln_kappa2=None, debye_table=None,
    semiclassical=None, lambda_in1_J=None, lambda_in2_J=None, level_weights=None, hbar_omega1_J=None,
    hbar_omega2_J=None,
) -> RateGrid:
    """ln k_obs for every pair (oxidant i, reductant j): an (n_ox x n_red) grid, one set of conditions.

    Equal (to rounding, ~1e-13 in ln k) to ``cross_rate(E1[:, None], ..., E2[None, :], ...).ln_k_obs`` with
    the same argument names and units: the Marcus cross relation with work terms (barrier form
    Delta G double-dagger = w12 + (lambda12/4)(1 + Delta G deg'/lambda12)^2) and the Debye-Smoluchowski cap
    1/k_obs = 1/k_act + 1/k_D.

    Args:
        E1_V, z_ox1, z_red1, r1_m, ln_k11: 1-D per-oxidant-couple potential (V), charges, radius (m) and ln
            self-exchange rate carried to these conditions (ln(M^-1 s^-1)).
        E2_V, z_ox2, z_red2, r2_m, ln_k22: the same for the reductant couples (same potential scale).
        T_K (K), I_M (mol/L), eps_r, viscosity_Pa_s (Pa s), ln_Z (ln(M^-1 s^-1)): scalars.
        diffusion: apply the diffusion cap. classify: also return regime codes and the diffusion flag.
        workers: threads to use.
        ln_kappa1, ln_kappa2: ln kappa_el per oxidant / reductant couple (None: adiabatic), as
            cross_rate's ln_kappa11 / ln_kappa22.
        debye_table: a ScreenedDebyeTable from screened_debye_table() for these conditions, used when it
            covers these pairs (otherwise one is made when there are TABLE_MIN_PAIRS pairs or more).
        semiclassical: a level_sum.SemiclassicalMode for the semiclassical model (k_act times the quantum
            factor Q of crossrate.core.semiclassical.ln_quantum_factor, within level_sum.LEVEL_SUM_TOLERANCE
            in ln Q), None for the classical one. lambda_in1_J, lambda_in2_J: each couple's inner lambda_in,
            J/mol (NaN or None: the mode's default fraction of lambda_ii). hbar_omega1_J, hbar_omega2_J: each
            couple's own mode energy, J/mol (NaN or None: the mode's); a pair's is the mean of its couples'
            weighted by their inner lambdas. level_weights: a level_sum.LevelWeights of this T to reuse
            between calls (row blocks of one map).

    Returns:
        RateGrid with arrays of shape (n_ox, n_red).
    """
    c = KernelConditions(T_K, I_M, eps_r, viscosity_Pa_s, ln_Z)
    ox = CoupleSide(c, E1_V, z_ox1, z_red1, r1_m, ln_k11, ln_kappa1)
    red = CoupleSide(c, E2_V, z_ox2, z_red2, r2_m, ln_k22, ln_kappa2)
    levels = _semiclassical_sides(c, semiclassical, ((ox, lambda_in1_J, hbar_omega1_J), (red, lambda_in2_J, hbar_omega2_J)),
                                  level_weights)
    with_kappa = ox.half_ln_kappa is not None or red.half_ln_kappa is not None
    one_electron, safe = kernel_checks(c, ox, red)
    table = table_for(ox.z_ox, ox.r, red.z_red, red.r, c.coulomb_RT, c.kappa if diffusion else 0.0,
                      ox.r.size * red.r.size, debye_table)
    n_ox, n_red = ox.r.shape[0], red.r.shape[0]
    out = np.empty((n_ox, n_red))
    reg = np.empty((n_ox, n_red), dtype=np.int8) if classify else None
    dc = np.empty((n_ox, n_red), dtype=bool) if classify else None
    rows = max(1, BLOCK_PAIRS // max(n_red, 1))
    n_blocks = -(-n_ox // rows) if n_red else 0
    ox_c, red_c = side_columns(ox, with_kappa), side_columns(red, with_kappa)
    if table is not None:
        ox_c.update(table_columns(c, ox, table, True))
        red_c.update(table_columns(c, red, table, False))
    ox_cols = {k: v[:, None] for k, v in ox_c.items()}
    red_cols = {k: v[None, :] for k, v in red_c.items()}

    def block(k, scratch):
        i0, i1 = k * rows, min(n_ox, (k + 1) * rows)
        s = block_buffers(scratch, (i1 - i0, n_red))
        rate_kernel(
            c, {n: v[i0:i1] for n, v in ox_cols.items()}, red_cols, one_electron, safe, bool(diffusion),
            out[i0:i1], None if reg is None else reg[i0:i1], None if dc is None else dc[i0:i1], s, table, levels,
        )

    run_blocks(n_blocks, block, workers)
    return RateGrid(out, reg, dc)


def _semiclassical_sides(c: KernelConditions, mode, sides, level_weights):
    """(LevelWeights, hbar omega / RT) to use (None: classical), after giving each side its inner lambda
    column (and, where any couple has a mode of its own, each couple's mode)."""
    if mode is None:
        return None
    own = any(h is not None and np.any(np.isfinite(h)) for _, _, h in sides)
    for side, lambda_in, hbar_omega in sides:
        side.set_inner(np.nan if lambda_in is None else lambda_in, mode, c.RT,
                       (np.nan if hbar_omega is None else hbar_omega) if own else None)
    hw_RT = float(mode.hbar_omega_J_per_mol) / c.RT
    if level_weights is not None and level_weights.T_K == c.T_K:
        return level_weights, hw_RT
    return LevelWeights(c.T_K), hw_RT


def semiclassical_weights(E_V, z_ox, z_red, r_m, ln_k_self, T_K, I_M, eps_r, viscosity_Pa_s, ln_Z, semiclassical,
                          lambda_in_J=None, ln_kappa=None) -> LevelWeights:
    """A level_sum.LevelWeights for the semiclassical grids over these couples (arguments as one side of
    ln_k_obs_grid, all couples of a map), its zero-driving-force table built once over the exact ranges of
    every pair: a pair's lambda_s and lambda_v are the means of its two couples', so they lie between the
    couples' extremes. Pass it as level_weights to each row block's ln_k_obs_grid."""
    from .level_sum import ZERO_TABLE_MIN_PAIRS

    c = KernelConditions(T_K, I_M, eps_r, viscosity_Pa_s, ln_Z)
    side = CoupleSide(c, E_V, z_ox, z_red, r_m, ln_k_self, ln_kappa)
    side.set_inner(np.nan if lambda_in_J is None else lambda_in_J, semiclassical, c.RT)
    w = LevelWeights(c.T_K)
    hw = float(semiclassical.hbar_omega_J_per_mol) / c.RT
    ls, S = 8.0 * (side.m - side.v), 8.0 * side.v / hw
    ok = np.isfinite(ls) & np.isfinite(S) & (ls > 0) & (S > 0)
    if ok.sum() ** 2 >= ZERO_TABLE_MIN_PAIRS:
        w.zero_table(hw, 1.0 / float(ls[ok].max()), 1.0 / float(ls[ok].min()), float(S[ok].min()),
                     float(S[ok].max()))
    return w


def ln_k_obs_pairs(
    ox_index, red_index,
    E_V, z_ox, z_red, r_m, ln_k_self,
    T_K, I_M, eps_r, viscosity_Pa_s, ln_Z,
    diffusion=True, classify=False, workers=DEFAULT_WORKERS, ln_kappa=None, debye_table=None,
    semiclassical=None, lambda_in_J=None, level_weights=None, hbar_omega_J=None,
) -> RateGrid:
    """ln k_obs for listed pairs (ox_index[k], red_index[k]) of one couple list, one set of conditions.

    Equal (to rounding) to ``cross_rate(E[ox], E[red], z_ox[ox], z_red[ox], z_ox[red], z_red[red], r[ox],
    r[red], ln_k[ox], ln_k[red], ...).ln_k_obs`` (Marcus cross relation with work terms, Debye-Smoluchowski cap).

    Args:
        ox_index, red_index: integer arrays of equal length, positions in the couple columns.
        E_V (V), z_ox, z_red, r_m (m), ln_k_self (ln(M^-1 s^-1), at these conditions): 1-D per-couple columns.
        T_K, I_M, eps_r, viscosity_Pa_s, ln_Z, diffusion, classify, workers: as for ln_k_obs_grid.
        ln_kappa: ln kappa_el per couple (None: adiabatic), as cross_rate's ln_kappa11 / ln_kappa22.
        debye_table: as for ln_k_obs_grid.
        semiclassical, level_weights: as for ln_k_obs_grid; lambda_in_J, hbar_omega_J: each couple's inner
            lambda_in and own mode energy, J/mol (NaN or None: the default fraction, the mode's).

    Returns:
        RateGrid with 1-D arrays, one value per pair.
    """
    c = KernelConditions(T_K, I_M, eps_r, viscosity_Pa_s, ln_Z)
    side = CoupleSide(c, E_V, z_ox, z_red, r_m, ln_k_self, ln_kappa)
    levels = _semiclassical_sides(c, semiclassical, ((side, lambda_in_J, hbar_omega_J),), level_weights)
    with_kappa = side.half_ln_kappa is not None
    ox_i = np.asarray(ox_index, dtype=np.intp).ravel()
    red_i = np.asarray(red_index, dtype=np.intp).ravel()
    if ox_i.shape != red_i.shape:
        raise ValueError(f"{ox_i.shape[0]} oxidant positions but {red_i.shape[0]} reductant positions")
    # Checked over the whole couple list (cheaper than finding the couples actually used).
    one_electron, safe = kernel_checks(c, side, side)
    table = table_for(side.z_ox, side.r, side.z_red, side.r, c.coulomb_RT, c.kappa if diffusion else 0.0,
                      np.asarray(ox_index).size, debye_table)
    n = ox_i.shape[0]
    out = np.empty(n)
    reg = np.empty(n, dtype=np.int8) if classify else None
    dc = np.empty(n, dtype=bool) if classify else None
    cols = side_columns(side, with_kappa)
    n_c = side.r.shape[0]
    for name, pos in (("ox_index", ox_i), ("red_index", red_i)):
        if pos.size and (pos.min() < 0 or pos.max() >= n_c):
            raise IndexError(f"{name}: positions must lie in 0..{n_c - 1} for {n_c} couples")
    # Only the columns the kernel reads from each side are gathered.
    extra = (("lk2",) if with_kappa else ()) + (("v",) if levels is not None else ()) + (
        ("hwv",) if side.hwv is not None else ())
    ox_names = ("r", "z_ox", "z_ox4", "fE4", "m", "neg_kD") + (() if one_electron else ("z_red4",)) + extra
    red_names = ("r", "z_red", "z_ox4", "fE4", "m", "neg_kD") + (() if one_electron else ("z_ox",)) + extra
    ox_cols, red_cols = cols, cols
    if table is not None:
        ox_cols = {**cols, **table_columns(c, side, table, True)}
        red_cols = {**cols, **table_columns(c, side, table, False)}
        ox_names += ("ta", "lkd")
        red_names += ("ta", "lkd")
    n_blocks = -(-n // BLOCK_PAIRS)

    def gather(names, idx, scratch, tag):
        cols = ox_cols if tag == "ox" else red_cols
        got = {}
        for name in names:
            key = f"{tag}_{name}"
            if scratch.get(key) is None or scratch[key].shape[0] < idx.shape[0]:
                scratch[key] = np.empty(BLOCK_PAIRS)
            # mode="clip" avoids take's internal buffering; the positions were bounds-checked above.
            got[name] = np.take(cols[name], idx, out=scratch[key][: idx.shape[0]], mode="clip")
        return got

    def block(k, scratch):
        i0, i1 = k * BLOCK_PAIRS, min(n, (k + 1) * BLOCK_PAIRS)
        s = block_buffers(scratch, (i1 - i0,))
        ox_b = gather(ox_names, ox_i[i0:i1], scratch, "ox")
        red_b = gather(red_names, red_i[i0:i1], scratch, "red")
        rate_kernel(
            c, ox_b, red_b, one_electron, safe, bool(diffusion),
            out[i0:i1], None if reg is None else reg[i0:i1], None if dc is None else dc[i0:i1], s, table, levels,
        )

    run_blocks(n_blocks, block, workers)
    return RateGrid(out, reg, dc)

