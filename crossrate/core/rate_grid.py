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

from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass

import numpy as np

from .constants import (
    AVOGADRO,
    BOLTZMANN,
    ELEMENTARY_CHARGE,
    FARADAY,
    GAS_CONSTANT,
    LITRES_PER_M3,
    VACUUM_PERMITTIVITY,
)
from .diffusion import ln_debye_factor
from .regime import (
    ACTIVATIONLESS,
    ACTIVATIONLESS_BAND_RT,
    DIFFUSION_CONTROL_RATIO,
    INVERTED,
    NORMAL,
)
from .screened_debye_table import position_piece, read_table, table_for
from .screened_diffusion import ln_screened_debye_factor
from .work_terms import debye_kappa

#: Pairs per block. Measured on the 2-core target (tests/benchmarks/bench_core.py): 8 float64 scratch arrays
#: of 64k pairs (4 MB) lose a little to cache misses, but smaller blocks lose more to the GIL-held Python
#: part of each numpy call, which the two worker threads cannot overlap.
BLOCK_PAIRS = 65536
#: Worker threads used by default (the target machine has 2 cores).
DEFAULT_WORKERS = 2
# Keeps |w12|/RT away from 0 in the Debye factor a / (1 - e^-a) without changing any representable result.
_TINY = 1e-300
# Above this |w12|/RT the product k_D-prefactor x Debye factor could overflow; the generic path is used.
_SAFE_DELTA = 1e250
_LN_DC_RATIO = float(np.log(DIFFUSION_CONTROL_RATIO))


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


def _scalar(value, name):
    arr = np.asarray(value, dtype=float)
    if arr.ndim != 0:
        raise ValueError(
            f"{name}: the fast path takes one set of conditions (a scalar); use cross_rate() for per-pair conditions"
        )
    return float(arr)


class _Conditions:
    """Scalars shared by every pair, in the units the kernel wants (RT units, prefactors folded in)."""

    def __init__(self, T_K, I_M, eps_r, viscosity_Pa_s, ln_Z):
        T = _scalar(T_K, "T_K")
        eps = _scalar(eps_r, "eps_r")
        eta = _scalar(viscosity_Pa_s, "viscosity_Pa_s")
        self.RT = GAS_CONSTANT * T
        self.ln_Z = _scalar(ln_Z, "ln_Z")
        self.kappa = float(debye_kappa(_scalar(I_M, "I_M"), eps, T))
        # Coulomb energy per unit z1 z2 at distance r is coulomb_RT / r, in units of RT (work_terms.work_term).
        self.coulomb_RT = ELEMENTARY_CHARGE**2 * AVOGADRO / (4.0 * np.pi * VACUUM_PERMITTIVITY * eps) / self.RT
        # 4 pi N_A (D1 + D2) r12 in M^-1 s^-1 with D = k_B T / (6 pi eta a) (Stokes-Einstein).
        self.diff_prefactor = 4.0 * np.pi * AVOGADRO * LITRES_PER_M3 * BOLTZMANN * T / (6.0 * np.pi * eta)
        #: Screened diffusion limit: kappa > 0 (NaN, an unknown ionic strength, keeps the NaN path).
        self.screened = self.kappa > 0.0
        self.f_RT = FARADAY / self.RT


class _Side:
    """Per-couple quantities of one side (oxidants or reductants), each a float64 1-D array."""

    def __init__(self, cond: _Conditions, E_V, z_ox, z_red, r_m, ln_k_self, ln_kappa=None):
        E = np.asarray(E_V, dtype=float).ravel()
        self.z_ox = np.asarray(z_ox, dtype=float).ravel()
        self.z_red = np.asarray(z_red, dtype=float).ravel()
        self.r = np.asarray(r_m, dtype=float).ravel()
        ln_k = np.asarray(ln_k_self, dtype=float).ravel()
        n = E.shape[0]
        for name, arr in (("z_ox", self.z_ox), ("z_red", self.z_red), ("r_m", self.r), ("ln_k_self", ln_k)):
            if arr.shape[0] != n:
                raise ValueError(f"{name}: {arr.shape[0]} values for {n} couples")
        # 0.5 ln kappa_el per couple (None: all adiabatic); a pair's ln kappa12 is the sum of its two halves.
        self.half_ln_kappa = None
        if ln_kappa is not None:
            lk = np.broadcast_to(np.asarray(ln_kappa, dtype=float).ravel(), (n,))
            if np.any(lk != 0.0):
                self.half_ln_kappa = 0.5 * lk
                ln_k = ln_k - lk
        d = 2.0 * self.r
        w_self_RT = self.z_ox * self.z_red * cond.coulomb_RT / (d * (1.0 + cond.kappa * d))
        # lambda_ii / (8 RT) from lambda_ii = 4 (RT ln(kappa_ii Z/k_ii) - w_ii); summed over a pair gives
        # lambda12 / (4 RT).
        self.m = 0.5 * (cond.ln_Z - ln_k - w_self_RT)
        # F E / (4 RT): Delta G deg / (4 RT) = (F E2 - F E1) / (4 RT).
        self.fE4 = 0.25 * cond.f_RT * E
        # -(4 pi N_A k_B T / (6 pi eta r)) per couple; negative so that the Debye factor's sign folds in.
        self.neg_kD = -cond.diff_prefactor / self.r
        self.n_el = self.z_ox - self.z_red


def _kernel(c: _Conditions, ox: dict, red: dict, one_electron: bool, safe_delta: bool, diffusion: bool,
            out_ln, out_reg, out_dc, s, table=None):
    """ln k_obs for one block. ox/red values broadcast to the block shape; s holds scratch buffers; table:
    the ScreenedDebyeTable of these conditions (ox/red then carry its position pieces "ta" and "lkd")."""
    r12, g, w, y, t, u = s["r12"], s["g"], s["w"], s["y"], s["t"], s["u"]
    np.add(ox["r"], red["r"], out=r12)
    # Screened-Coulomb distance factor in RT units, shared by w12 and w21.
    if c.kappa != 0.0:  # NaN (unknown ionic strength) must stay NaN, so not "> 0"
        np.multiply(r12, c.kappa, out=g)
        np.add(g, 1.0, out=g)
        np.multiply(g, r12, out=g)
        np.divide(c.coulomb_RT, g, out=g)
    else:
        np.divide(c.coulomb_RT, r12, out=g)
    np.multiply(ox["z_ox"], red["z_red"], out=w)
    if table is not None and diffusion:
        # Table position z1 z2 n + r12 / step + constant; r12 / step is split between the two sides.
        tk = s["tk"]
        np.multiply(w, float(table.n), out=tk)
        np.add(tk, ox["ta"], out=tk)
        np.add(tk, red["ta"], out=tk)
    np.multiply(w, g, out=w)  # w12 / RT
    # y = Delta G deg' / (4 RT) = [Delta G deg + w21 - w12] / (4 RT).
    if one_electron:
        # z_red = z_ox - 1 on both sides: z_red1 z_ox2 - z_ox1 z_red2 = z_ox1 - z_ox2.
        np.subtract(ox["z_ox4"], red["z_ox4"], out=y)
    else:
        np.multiply(ox["z_red4"], red["z_ox"], out=y)
        np.multiply(ox["z_ox4"], red["z_red"], out=t)
        np.subtract(y, t, out=y)
    np.multiply(y, g, out=y)
    np.subtract(y, ox["fE4"], out=y)
    np.add(y, red["fE4"], out=y)
    # m = lambda12 / (4 RT); intrinsic barrier (lambda/4)(1 + dG'/lambda)^2 / RT = (m + y)^2 / m.
    np.add(ox["m"], red["m"], out=t)
    np.add(t, y, out=u)
    if out_reg is not None:
        # Same rules, applied in the same order, as regime.classify_regime, done in int8 arithmetic on 0/1
        # masks (masked assignment is ~50x slower): -dG' < lambda <=> m + y > 0 -> NORMAL else INVERTED.
        mask, tmp = s["mask"], s["i8"]
        bits = mask.view(np.int8)
        np.greater(u, 0.0, out=mask)
        np.multiply(bits, NORMAL - INVERTED, out=out_reg)
        np.add(out_reg, INVERTED, out=out_reg)
        np.multiply(bits, INVERTED - NORMAL, out=tmp)  # tmp = ACTIVATIONLESS - code
        np.add(tmp, ACTIVATIONLESS - INVERTED, out=tmp)
    np.multiply(u, u, out=u)
    np.divide(u, t, out=u)
    if out_reg is not None:
        np.less_equal(u, ACTIVATIONLESS_BAND_RT, out=mask)
        np.multiply(tmp, bits, out=tmp)
        np.add(out_reg, tmp, out=out_reg)
        np.greater(y, 0.0, out=mask)
        np.subtract(1, bits, out=tmp)
        np.multiply(out_reg, tmp, out=out_reg)  # relies on ENDERGONIC == 0 (tested)
    act = s["act"]
    np.add(w, u, out=act)
    np.subtract(c.ln_Z, act, out=act)  # ln k_act = ln Z - (w12 + intrinsic barrier) / RT
    if "lk2" in ox:  # ln kappa12 = (ln kappa11 + ln kappa22) / 2 (non-adiabatic couples present)
        np.add(act, ox["lk2"], out=act)
        np.add(act, red["lk2"], out=act)
    if not diffusion:
        out_ln[...] = act
        if out_dc is not None:
            out_dc[...] = False
        return
    kD = s["kD"]
    if table is not None:
        # ln k_D = [ln F + 2 ln r12] (table, linear interpolation) + (ln P / 2 - ln r1) + (ln P / 2 - ln r2),
        # since 4 pi N_A (D1 + D2) r12 = P r12^2 / (r1 r2) with D from Stokes-Einstein.
        read_table(table, s["tk"], s["idx"], kD, u)
        np.add(kD, ox["lkd"], out=kD)
        np.add(kD, red["lkd"], out=kD)
    elif c.screened:
        # Screened, but no table (charges not integers): Debye's integral pair by pair.
        np.add(ox["neg_kD"], red["neg_kD"], out=kD)
        np.multiply(kD, r12, out=kD)
        np.negative(kD, out=kD)
        np.log(kD, out=kD)
        kD += ln_screened_debye_factor(w, c.kappa * r12)
    elif safe_delta:
        # Debye-Smoluchowski: ln k_D = ln[prefactor (1/r1 + 1/r2) r12 a / (1 - e^-a)] - max(delta, 0), a = |delta|.
        np.abs(w, out=t)
        np.add(t, _TINY, out=t)
        np.negative(t, out=u)
        np.expm1(u, out=u)
        np.divide(t, u, out=u)  # -a / (1 - e^-a)
        np.add(ox["neg_kD"], red["neg_kD"], out=kD)
        np.multiply(kD, r12, out=kD)
        np.multiply(kD, u, out=kD)
        np.log(kD, out=kD)
        np.maximum(w, 0.0, out=t)
        np.subtract(kD, t, out=kD)
    else:
        np.add(ox["neg_kD"], red["neg_kD"], out=kD)
        np.multiply(kD, r12, out=kD)
        np.negative(kD, out=kD)
        np.log(kD, out=kD)
        kD += ln_debye_factor(w)
    if out_dc is not None:
        np.add(kD, _LN_DC_RATIO, out=u)
        np.greater(act, u, out=out_dc)
    # 1/k_obs = 1/k_act + 1/k_D, stably: ln k_obs = min - ln(1 + e^-|ln k_act - ln k_D|).
    np.subtract(act, kD, out=t)
    np.minimum(act, kD, out=kD)
    np.abs(t, out=t)
    np.negative(t, out=t)
    np.exp(t, out=t)
    np.add(t, 1.0, out=t)  # log(1 + e) with e in (0, 1] is within 1.2e-16 of log1p(e) and much faster
    np.log(t, out=t)
    np.subtract(kD, t, out=out_ln)


_SCRATCH = ("r12", "g", "w", "y", "t", "u", "act", "kD", "tk")


def _side_columns(side: _Side, with_kappa: bool = False):
    """The per-couple columns the kernel reads (charges also pre-divided by 4 for the RT/4 units of y);
    with_kappa adds "lk2", 0.5 ln kappa_el per couple (zeros for a side that is all adiabatic)."""
    cols = {
        "r": side.r,
        "z_ox": side.z_ox,
        "z_red": side.z_red,
        "z_ox4": 0.25 * side.z_ox,
        "z_red4": 0.25 * side.z_red,
        "fE4": side.fE4,
        "m": side.m,
        "neg_kD": side.neg_kD,
    }
    if with_kappa:
        cols["lk2"] = side.half_ln_kappa if side.half_ln_kappa is not None else np.zeros_like(side.r)
    return cols


def _table_columns(c: _Conditions, side: _Side, table, first: bool) -> dict:
    """Per-couple pieces of a pair's table position ("ta") and of ln k_D outside the table ("lkd")."""
    return {"ta": position_piece(table, side.r, first), "lkd": 0.5 * np.log(c.diff_prefactor) - np.log(side.r)}


def _checks(c, ox, red):
    one_electron = bool(np.all(ox.n_el == 1.0) and np.all(red.n_el == 1.0))
    zmax = max(np.max(np.abs(ox.z_ox), initial=0.0), np.max(np.abs(ox.z_red), initial=0.0))
    zmax2 = max(np.max(np.abs(red.z_ox), initial=0.0), np.max(np.abs(red.z_red), initial=0.0))
    rmin = np.min(ox.r, initial=np.inf) + np.min(red.r, initial=np.inf)
    with np.errstate(divide="ignore", invalid="ignore"):
        bound = zmax * zmax2 * c.coulomb_RT / rmin
    safe = bool(np.isfinite(bound) and bound < _SAFE_DELTA)
    return one_electron, safe


def _run(n_blocks, block_fn, workers):
    settings = np.geterr()

    def work(k0):
        # numpy's error state is per thread (context): carry the caller's into each worker.
        with np.errstate(**settings):
            scratch = {}
            for k in range(k0, n_blocks, workers):
                block_fn(k, scratch)

    if workers <= 1 or n_blocks <= 1:
        workers = 1
        work(0)
        return
    with ThreadPoolExecutor(max_workers=workers) as pool:
        for f in [pool.submit(work, k0) for k0 in range(workers)]:
            f.result()


def _buffers(scratch, shape):
    size = int(np.prod(shape))
    if scratch.get("_size", 0) < size:
        for name in _SCRATCH:
            scratch[name] = np.empty(size)
        scratch["mask"] = np.empty(size, dtype=bool)
        scratch["i8"] = np.empty(size, dtype=np.int8)
        scratch["idx"] = np.empty(size, dtype=np.intp)
        scratch["_size"] = size
    return {name: scratch[name][:size].reshape(shape) for name in (*_SCRATCH, "mask", "i8", "idx")}


def ln_k_obs_grid(
    E1_V, z_ox1, z_red1, r1_m, ln_k11,
    E2_V, z_ox2, z_red2, r2_m, ln_k22,
    T_K, I_M, eps_r, viscosity_Pa_s, ln_Z,
    diffusion=True, classify=False, workers=DEFAULT_WORKERS, ln_kappa1=None, ln_kappa2=None, debye_table=None,
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

    Returns:
        RateGrid with arrays of shape (n_ox, n_red).
    """
    c = _Conditions(T_K, I_M, eps_r, viscosity_Pa_s, ln_Z)
    ox = _Side(c, E1_V, z_ox1, z_red1, r1_m, ln_k11, ln_kappa1)
    red = _Side(c, E2_V, z_ox2, z_red2, r2_m, ln_k22, ln_kappa2)
    with_kappa = ox.half_ln_kappa is not None or red.half_ln_kappa is not None
    one_electron, safe = _checks(c, ox, red)
    table = table_for(ox.z_ox, ox.r, red.z_red, red.r, c.coulomb_RT, c.kappa if diffusion else 0.0,
                      ox.r.size * red.r.size, debye_table)
    n_ox, n_red = ox.r.shape[0], red.r.shape[0]
    out = np.empty((n_ox, n_red))
    reg = np.empty((n_ox, n_red), dtype=np.int8) if classify else None
    dc = np.empty((n_ox, n_red), dtype=bool) if classify else None
    rows = max(1, BLOCK_PAIRS // max(n_red, 1))
    n_blocks = -(-n_ox // rows) if n_red else 0
    ox_c, red_c = _side_columns(ox, with_kappa), _side_columns(red, with_kappa)
    if table is not None:
        ox_c.update(_table_columns(c, ox, table, True))
        red_c.update(_table_columns(c, red, table, False))
    ox_cols = {k: v[:, None] for k, v in ox_c.items()}
    red_cols = {k: v[None, :] for k, v in red_c.items()}

    def block(k, scratch):
        i0, i1 = k * rows, min(n_ox, (k + 1) * rows)
        s = _buffers(scratch, (i1 - i0, n_red))
        _kernel(
            c, {n: v[i0:i1] for n, v in ox_cols.items()}, red_cols, one_electron, safe, bool(diffusion),
            out[i0:i1], None if reg is None else reg[i0:i1], None if dc is None else dc[i0:i1], s, table,
        )

    _run(n_blocks, block, workers)
    return RateGrid(out, reg, dc)


def ln_k_obs_pairs(
    ox_index, red_index,
    E_V, z_ox, z_red, r_m, ln_k_self,
    T_K, I_M, eps_r, viscosity_Pa_s, ln_Z,
    diffusion=True, classify=False, workers=DEFAULT_WORKERS, ln_kappa=None, debye_table=None,
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

    Returns:
        RateGrid with 1-D arrays, one value per pair.
    """
    c = _Conditions(T_K, I_M, eps_r, viscosity_Pa_s, ln_Z)
    side = _Side(c, E_V, z_ox, z_red, r_m, ln_k_self, ln_kappa)
    with_kappa = side.half_ln_kappa is not None
    ox_i = np.asarray(ox_index, dtype=np.intp).ravel()
    red_i = np.asarray(red_index, dtype=np.intp).ravel()
    if ox_i.shape != red_i.shape:
        raise ValueError(f"{ox_i.shape[0]} oxidant positions but {red_i.shape[0]} reductant positions")
    # Checked over the whole couple list (cheaper than finding the couples actually used).
    one_electron, safe = _checks(c, side, side)
    table = table_for(side.z_ox, side.r, side.z_red, side.r, c.coulomb_RT, c.kappa if diffusion else 0.0,
                      np.asarray(ox_index).size, debye_table)
    n = ox_i.shape[0]
    out = np.empty(n)
    reg = np.empty(n, dtype=np.int8) if classify else None
    dc = np.empty(n, dtype=bool) if classify else None
    cols = _side_columns(side, with_kappa)
    n_c = side.r.shape[0]
    for name, pos in (("ox_index", ox_i), ("red_index", red_i)):
        if pos.size and (pos.min() < 0 or pos.max() >= n_c):
            raise IndexError(f"{name}: positions must lie in 0..{n_c - 1} for {n_c} couples")
    # Only the columns the kernel reads from each side are gathered.
    extra = ("lk2",) if with_kappa else ()
    ox_names = ("r", "z_ox", "z_ox4", "fE4", "m", "neg_kD") + (() if one_electron else ("z_red4",)) + extra
    red_names = ("r", "z_red", "z_ox4", "fE4", "m", "neg_kD") + (() if one_electron else ("z_ox",)) + extra
    ox_cols, red_cols = cols, cols
    if table is not None:
        ox_cols = {**cols, **_table_columns(c, side, table, True)}
        red_cols = {**cols, **_table_columns(c, side, table, False)}
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
        s = _buffers(scratch, (i1 - i0,))
        ox_b = gather(ox_names, ox_i[i0:i1], scratch, "ox")
        red_b = gather(red_names, red_i[i0:i1], scratch, "red")
        _kernel(
            c, ox_b, red_b, one_electron, safe, bool(diffusion),
            out[i0:i1], None if reg is None else reg[i0:i1], None if dc is None else dc[i0:i1], s, table,
        )

    _run(n_blocks, block, workers)
    return RateGrid(out, reg, dc)

