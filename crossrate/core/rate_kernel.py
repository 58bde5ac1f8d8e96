"""The block kernel of the rate grid: ln k_obs of a block of pairs (Marcus cross relation with work terms in its
barrier form, the Debye-Smoluchowski cap), from per-couple columns prepared once per call (KernelConditions,
CoupleSide), into preallocated buffers, with the semiclassical quantum factor added to ln k_act when asked
(crossrate.core.level_sum). crossrate.core.rate_grid arranges the blocks (all pairs, or listed pairs) and
runs them on a few threads (run_blocks).
"""

from concurrent.futures import ThreadPoolExecutor

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
from .level_sum import ln_q_pairs_rt
from .regime import (
    ACTIVATIONLESS,
    ACTIVATIONLESS_BAND_RT,
    DIFFUSION_CONTROL_RATIO,
    INVERTED,
    NORMAL,
)
from .screened_debye_table import position_piece, read_table
from .screened_diffusion import ln_screened_debye_factor
from .work_terms import debye_kappa

# Keeps |w12|/RT away from 0 in the Debye factor a / (1 - e^-a) without changing any representable result.
_TINY = 1e-300
# Above this |w12|/RT the product k_D-prefactor x Debye factor could overflow; the generic path is used.
_SAFE_DELTA = 1e250
_LN_DC_RATIO = float(np.log(DIFFUSION_CONTROL_RATIO))


def scalar_condition(value, name):
    arr = np.asarray(value, dtype=float)
    if arr.ndim != 0:
        raise ValueError(
            f"{name}: the fast path takes one set of conditions (a scalar); use cross_rate() for per-pair conditions"
        )
    return float(arr)


class KernelConditions:
    """Scalars shared by every pair, in the units the kernel wants (RT units, prefactors folded in)."""

    def __init__(self, T_K, I_M, eps_r, viscosity_Pa_s, ln_Z):
        T = scalar_condition(T_K, "T_K")
        eps = scalar_condition(eps_r, "eps_r")
        eta = scalar_condition(viscosity_Pa_s, "viscosity_Pa_s")
        self.RT = GAS_CONSTANT * T
        self.T_K = T
        self.ln_Z = scalar_condition(ln_Z, "ln_Z")
        self.kappa = float(debye_kappa(scalar_condition(I_M, "I_M"), eps, T))
        # Coulomb energy per unit z1 z2 at distance r is coulomb_RT / r, in units of RT (work_terms.work_term).
        self.coulomb_RT = ELEMENTARY_CHARGE**2 * AVOGADRO / (4.0 * np.pi * VACUUM_PERMITTIVITY * eps) / self.RT
        # 4 pi N_A (D1 + D2) r12 in M^-1 s^-1 with D = k_B T / (6 pi eta a) (Stokes-Einstein).
        self.diff_prefactor = 4.0 * np.pi * AVOGADRO * LITRES_PER_M3 * BOLTZMANN * T / (6.0 * np.pi * eta)
        #: Screened diffusion limit: kappa > 0 (NaN, an unknown ionic strength, keeps the NaN path).
        self.screened = self.kappa > 0.0
        self.f_RT = FARADAY / self.RT


class CoupleSide:
    """Per-couple quantities of one side (oxidants or reductants), each a float64 1-D array."""

    def __init__(self, cond: KernelConditions, E_V, z_ox, z_red, r_m, ln_k_self, ln_kappa=None):
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
        #: lambda_v,ii / (8 RT) per couple, and that times the couple's hbar omega / RT (semiclassical model;
        #: set by set_inner).
        self.v = None
        self.hwv = None

    def set_inner(self, lambda_in_J, mode, RT: float, hbar_omega_J=None) -> None:
        """The inner (high-frequency) part of each couple's lambda_ii for the semiclassical model, as
        lambda_v,ii / (8 RT) (summed over a pair: lambda_v12 / (4 RT)), and its mode. lambda_in_J: per couple,
        J/mol, NaN where not given; mode: a level_sum.SemiclassicalMode (its default fraction and cap, the
        rule of crossrate.core.semiclassical.couple_inner_lambda, and its hbar omega); hbar_omega_J: each
        couple's own mode energy, J/mol (NaN or None: the mode's). A pair's hbar omega is the mean of its two
        couples' weighted by their inner lambdas (crossrate.core.semiclassical.pair_hbar_omega)."""
        from .semiclassical import couple_inner_lambda

        lam_in = np.broadcast_to(np.asarray(lambda_in_J, dtype=float).ravel(), self.m.shape)
        self.v = couple_inner_lambda(8.0 * RT * self.m, lam_in, mode.inner_default_fraction,
                                     mode.inner_max_fraction) / (8.0 * RT)
        if hbar_omega_J is not None:  # else every pair has the mode's hbar omega (no per-pair mean needed)
            hw = np.broadcast_to(np.asarray(hbar_omega_J, dtype=float).ravel(), self.m.shape)
            self.hwv = self.v * np.where(np.isfinite(hw), hw, mode.hbar_omega_J_per_mol) / RT


def rate_kernel(c: KernelConditions, ox: dict, red: dict, one_electron: bool, safe_delta: bool, diffusion: bool,
            out_ln, out_reg, out_dc, s, table=None, levels=None):
    """ln k_obs for one block. ox/red values broadcast to the block shape; s holds scratch buffers; table:
    the ScreenedDebyeTable of these conditions (ox/red then carry its position pieces "ta" and "lkd");
    levels: (level_sum.LevelWeights, hbar omega / RT) of the semiclassical model (ox/red then carry "v", and
    "hwv" where couples have modes of their own), None: classical."""
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
    if levels is not None:
        # Semiclassical: k_act times the quantum factor Q(Delta G deg', lambda12, lambda_v12) (level_sum), here
        # where y = Delta G deg' / (4 RT) and t = lambda12 / (4 RT) are at hand; the cap below then applies.
        lv = s["lv"]
        np.add(ox["v"], red["v"], out=lv)
        hw = levels[1]
        if "hwv" in ox:
            hw = s["hw"]
            np.add(ox["hwv"], red["hwv"], out=hw)
            with np.errstate(invalid="ignore", divide="ignore"):
                hw /= lv  # the inner-lambda-weighted mean of the two modes (NaN where lv = 0, Q = 1 there)
            hw = hw.reshape(-1)
        act += ln_q_pairs_rt(4.0 * y.reshape(-1), 4.0 * t.reshape(-1), 4.0 * lv.reshape(-1), hw,
                             levels[0]).reshape(act.shape)
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


_SCRATCH = ("r12", "g", "w", "y", "t", "u", "act", "kD", "tk", "lv", "hw")


def side_columns(side: CoupleSide, with_kappa: bool = False):
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
    if side.v is not None:
        cols["v"] = side.v
    if side.hwv is not None:
        cols["hwv"] = side.hwv
    if with_kappa:
        cols["lk2"] = side.half_ln_kappa if side.half_ln_kappa is not None else np.zeros_like(side.r)
    return cols


def table_columns(c: KernelConditions, side: CoupleSide, table, first: bool) -> dict:
    """Per-couple pieces of a pair's table position ("ta") and of ln k_D outside the table ("lkd")."""
    return {"ta": position_piece(table, side.r, first), "lkd": 0.5 * np.log(c.diff_prefactor) - np.log(side.r)}


def kernel_checks(c, ox, red):
    one_electron = bool(np.all(ox.n_el == 1.0) and np.all(red.n_el == 1.0))
    zmax = max(np.max(np.abs(ox.z_ox), initial=0.0), np.max(np.abs(ox.z_red), initial=0.0))
    zmax2 = max(np.max(np.abs(red.z_ox), initial=0.0), np.max(np.abs(red.z_red), initial=0.0))
    rmin = np.min(ox.r, initial=np.inf) + np.min(red.r, initial=np.inf)
    with np.errstate(divide="ignore", invalid="ignore"):
        bound = zmax * zmax2 * c.coulomb_RT / rmin
    safe = bool(np.isfinite(bound) and bound < _SAFE_DELTA)
    return one_electron, safe


def run_blocks(n_blocks, block_fn, workers):
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


def block_buffers(scratch, shape):
    size = int(np.prod(shape))
    if scratch.get("_size", 0) < size:
        for name in _SCRATCH:
            scratch[name] = np.empty(size)
        scratch["mask"] = np.empty(size, dtype=bool)
        scratch["i8"] = np.empty(size, dtype=np.int8)
        scratch["idx"] = np.empty(size, dtype=np.intp)
        scratch["_size"] = size
    return {name: scratch[name][:size].reshape(shape) for name in (*_SCRATCH, "mask", "i8", "idx")}
